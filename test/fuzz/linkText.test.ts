/**
 * Link text under hostile editing (DESIGN.md §3, §4; issue 7). Near-misses are
 * built from valid canonical links (enumerated through the bundle's own LINK):
 * case, spacing, token order, µ vs u, missing, duplicated or conflicting
 * tokens, corrupted numbers, stray characters.
 *
 *   - Edits the grammar says keep the meaning (any order, any case, any
 *     spacing, GI in µs/us) give exactly the canonical link's answer, in every
 *     function that takes a link.
 *   - Every other edit gives an answer or a refusal whose message starts with
 *     the link argument's name.
 *
 * Generic over functions.json: every parameter named link or *_link is fuzzed.
 */
import fc from "fast-check";
import {
  fcOptions,
  invoke,
  meaningPreservingEdit,
  metadata,
  nearMissLinkText,
  plausibleArgsFor,
  validLinkText,
  VALID_LINKS,
  violations,
  type FunctionMeta,
  type Outcome,
} from "./fuzzLib";

const withLinks = metadata.functions
  .map((fn) => ({ fn, at: fn.parameters.map((p, i) => (/(^|_)link$/.test(p.name) ? i : -1)).filter((i) => i >= 0) }))
  .filter((x) => x.at.length > 0);

/** Link-text vocabulary of DESIGN.md §3, and its near relatives, for token soup. */
const TOKEN = fc.oneof(
  fc.constantFrom("DSSS", "HR-DSSS", "OFDM", "ERP-OFDM", "HT", "VHT", "HE", "EHT", "he", "Vht", "ERP", "HR", "HX", "802.11ax"),
  fc.integer({ min: -1, max: 80 }).map((n) => `MCS${n}`),
  fc.integer({ min: 0, max: 17 }).map((n) => `${n}SS`),
  fc.constantFrom(5, 10, 20, 40, 80, 160, 240, 320, 640).map((n) => `${n}MHz`),
  fc.constantFrom("0.4", "0.8", "1.6", "3.2", "0", "0.40", "800ns", "0.8µs", "0.8us", "1.6μs", "9").map((g) => `GI${g}`),
  fc.constantFrom("2.4", "5", "6", "2.45", "60", "0").map((b) => `${b}GHz`),
  fc.constantFrom("1", "2", "5.5", "11", "6", "9", "54", "600", "0").map((r) => `${r}Mbps`),
  fc.constantFrom("SGI", "LGI", "LDPC", "BCC", "STBC", "GF", "MF", "1xLTF", "2xLTF", "4xLTF", "8xLTF", "PE0", "PE8", "PE16", "PE20", "SU", "ER", "DCM"),
  fc.constantFrom("RU26", "RU52", "RU106", "RU242", "RU484", "RU996", "RU2x996", "RU4x996", "short", "long", "Mb/s", ",", "-"),
);
const tokenSoup = fc.array(TOKEN, { minLength: 0, maxLength: 9 }).map((ts) => ts.join(" "));

function outcomeKey(o: Outcome): string {
  if (o.crash !== undefined) return `crash ${String(o.crash)}`;
  if (o.error) return `${o.error.code}`;
  return JSON.stringify(o.value);
}

function expectObeys(fn: FunctionMeta, args: unknown[]): boolean {
  const problems = violations(fn, args, invoke(fn.id, args));
  if (problems.length > 0) throw new Error(problems.join("\n"));
  return true;
}

describe("link text under hostile editing", () => {
  it("has a pool of valid canonical links to build near-misses from (LINK accepts a broad grid)", () => {
    expect(VALID_LINKS.length).toBeGreaterThan(500);
    const families = new Set(VALID_LINKS.map((l) => l.family));
    expect([...families].sort()).toEqual(["DSSS", "EHT", "ERP-OFDM", "HE", "HR-DSSS", "HT", "OFDM", "VHT"]);
  });

  it("LINK's canonical text is a fixed point: the link text of the parts LINK printed reads back to itself", () => {
    // The canonical form (DESIGN.md §3) must be accepted by every function as is: RATE(LINK(...)) never refuses the link.
    fc.assert(
      fc.property(validLinkText, (text) => {
        const o = invoke("RATE", [text]);
        if (o.error) throw new Error(`RATE refused LINK's own output "${text}": ${o.error.message}`);
        return true;
      }),
      fcOptions(300),
    );
  });

  for (const { fn, at } of withLinks) {
    describe(fn.id, () => {
      for (const i of at) {
        const name = fn.parameters[i].name;

        it(`gives the canonical answer for ${name} text edited in case, spacing, order or µ/u`, () => {
          fc.assert(
            fc.property(plausibleArgsFor(fn), meaningPreservingEdit, (args, edit) => {
              const canonical = args[i] as string;
              const edited = [...args];
              edited[i] = edit(canonical);
              const a = invoke(fn.id, args);
              const b = invoke(fn.id, edited);
              if (outcomeKey(a) !== outcomeKey(b)) {
                throw new Error(`${fn.id}: "${canonical}" → ${outcomeKey(a)} but "${edited[i]}" → ${outcomeKey(b)}${b.error ? ` (${b.error.message})` : ""}`);
              }
              return true;
            }),
            fcOptions(80),
          );
        });

        it(`answers or refuses near-miss ${name} text by naming ${name}`, () => {
          fc.assert(
            fc.property(plausibleArgsFor(fn), nearMissLinkText, (args, text) => {
              const call = [...args];
              call[i] = text;
              const out = invoke(fn.id, call);
              // A refusal caused by the link text must name it; another argument may still be the one refused.
              return expectObeys(fn, call) && (out.error === undefined || out.error.message.length > 0);
            }),
            fcOptions(120),
          );
        });

        it(`answers or refuses token soup and random text in ${name} by name`, () => {
          fc.assert(
            fc.property(plausibleArgsFor(fn), fc.oneof(tokenSoup, fc.string({ maxLength: 24 })), (args, text) => {
              const call = [...args];
              call[i] = text;
              return expectObeys(fn, call);
            }),
            fcOptions(120),
          );
        });
      }
    });
  }

  it("refuses near-miss link text in RATE with a message that starts with link:", () => {
    // RATE has only the link argument, so every refusal is about the text itself.
    fc.assert(
      fc.property(nearMissLinkText, (text) => {
        const o = invoke("RATE", [text]);
        if (o.crash !== undefined) throw o.crash;
        return o.error === undefined ? typeof o.value === "number" : /^link: \S/.test(o.error.message) && o.error.code === "#VALUE!";
      }),
      fcOptions(300),
    );
  });
});
