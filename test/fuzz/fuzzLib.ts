/**
 * Shared pieces of the hostile-input suite (issue 7): the built bundle loaded
 * as a host sees it, the catalog read from dist/functions.json, argument
 * generators keyed by parameter name and type, and the one outcome rule that
 * every call must obey (DESIGN.md §4):
 *
 *   - a finite number, a non-empty string, or a rectangular matrix of
 *     finite numbers and strings; never NaN, ±Infinity, undefined or null;
 *   - or a refusal: #VALUE! or #N/A, with a message that starts with one of
 *     the function's parameter names followed by a colon ("psdu_bytes: …"),
 *     at most MESSAGE_MAX_CHARS (400) characters long;
 *   - never any other exception (a TypeError escaping the wrapper would be a
 *     host-specific crash in Excel).
 *
 * Everything is generic over functions.json, so a function the lead registers
 * is fuzzed as soon as it is built. Seeded: FUZZ_SEED and FUZZ_RUNS (a
 * multiplier) in the environment override the defaults for a longer soak.
 */
import fc from "fast-check";
import { loadBundle, readMetadata, SpreadsheetError, ERROR_CODES, type LoadedBundle } from "../bundle/loadBundle";
import { MESSAGE_MAX_CHARS } from "../../src/functions/errors";

export const bundle: LoadedBundle = loadBundle();
export const metadata = readMetadata();
export type FunctionMeta = (typeof metadata.functions)[number];
export type ParamMeta = FunctionMeta["parameters"][number] & { dimensionality?: string };

/** Fixed seed so a failure reproduces; override with FUZZ_SEED for a soak. */
export const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : 0x7a11e7;
const RUNS_SCALE = process.env.FUZZ_RUNS ? Number(process.env.FUZZ_RUNS) : 1;
export function runs(n: number): number {
  return Math.max(1, Math.round(n * RUNS_SCALE));
}
export function fcOptions(n: number): fc.Parameters<unknown> {
  return { seed: SEED, numRuns: runs(n), endOnFailure: true };
}

export function registered(id: string): boolean {
  return bundle.functions.has(id);
}
export function meta(id: string): FunctionMeta | undefined {
  return metadata.functions.find((f) => f.id === id);
}

/** `it` when the function is registered in the built bundle, else a clearly named skip. */
export function itIfRegistered(ids: string[], name: string, body: () => void, timeoutMs?: number): void {
  const missing = ids.filter((id) => !registered(id));
  if (missing.length === 0) it(name, body, timeoutMs);
  else it.skip(`${name} — skipped: ${missing.join(", ")} not registered in dist/functions.js yet`, body);
}

/**
 * Guard against unbounded work (solver loops, huge counts), NOT a benchmark:
 * the bound is two orders of magnitude above any closed-form call so that a
 * loaded CI machine never trips it, yet an input that makes a function loop
 * for seconds does. A call over the bound is re-timed twice and the fastest
 * of the three counts, so a GC pause or a descheduled process is not blamed
 * on the function.
 */
export const CALL_BOUND_MS = 50;

export interface Outcome {
  readonly value?: unknown;
  readonly error?: SpreadsheetError;
  /** Anything other than the stub's spreadsheet error (a crash). */
  readonly crash?: unknown;
  readonly ms: number;
}

function once(fn: (...a: unknown[]) => unknown, args: unknown[]): Outcome {
  const t0 = performance.now();
  try {
    const value = fn(...args);
    return { value, ms: performance.now() - t0 };
  } catch (e) {
    const ms = performance.now() - t0;
    if (e instanceof SpreadsheetError) return { error: e, ms };
    return { crash: e, ms };
  }
}

/** Call a registered function through the bundle, timing it. */
export function invoke(id: string, args: unknown[]): Outcome {
  const fn = bundle.functions.get(id);
  if (!fn) throw new Error(`${id} is not registered`);
  let out = once(fn, args);
  for (let retry = 0; retry < 2 && out.ms > CALL_BOUND_MS; retry++) {
    const again = once(fn, args);
    if (again.ms < out.ms) out = { ...out, ms: again.ms };
  }
  return out;
}

export function show(args: unknown[]): string {
  return args
    .map((a) => {
      if (typeof a === "number") return Object.is(a, -0) ? "-0" : String(a);
      if (a === undefined) return "undefined";
      try {
        return JSON.stringify(a);
      } catch {
        return String(a);
      }
    })
    .join(", ");
}

/**
 * Names a refusal may start with: the function's own parameter names
 * (DESIGN.md §4). LINK too names the argument a refusal comes from
 * ("gi_us: a guard interval does not apply to OFDM…").
 */
export function allowedPrefixes(fn: FunctionMeta): string[] {
  return fn.parameters.map((p) => p.name);
}

/** Every problem with one outcome, as text; empty when it obeys DESIGN.md §4. */
export function violations(fn: FunctionMeta, args: unknown[], out: Outcome): string[] {
  const where = `${fn.id}(${show(args)})`;
  const problems: string[] = [];
  if (out.ms > CALL_BOUND_MS) problems.push(`${where} took ${out.ms.toFixed(1)} ms (> ${CALL_BOUND_MS} ms guard)`);
  if (out.crash !== undefined) {
    const c = out.crash as Error;
    problems.push(`${where} threw a non-spreadsheet error: ${c?.name}: ${c?.message}`);
    return problems;
  }
  if (out.error) {
    const { code, message } = out.error;
    if (code !== ERROR_CODES.invalidValue && code !== ERROR_CODES.notAvailable) problems.push(`${where} refused with code ${code}`);
    if (typeof message !== "string" || message.trim() === "") problems.push(`${where} refused with an empty message`);
    else {
      const prefixes = allowedPrefixes(fn);
      if (!prefixes.some((p) => message.startsWith(`${p}:`))) {
        problems.push(`${where} → ${code} "${message}" does not start with a parameter name (${prefixes.join(", ")})`);
      }
      if (message.length > MESSAGE_MAX_CHARS) problems.push(`${where} → a message of ${message.length} characters (> ${MESSAGE_MAX_CHARS})`);
    }
    return problems;
  }
  problems.push(...valueProblems(where, fn, out.value));
  return problems;
}

function cellProblem(v: unknown): string | null {
  if (typeof v === "number") return Number.isFinite(v) ? null : `non-finite number ${v}`;
  if (typeof v === "string") return null;
  if (typeof v === "boolean") return null;
  return `cell of type ${v === null ? "null" : typeof v}`;
}

/** Shape and content of a returned value against the declared result. */
export function valueProblems(where: string, fn: FunctionMeta, value: unknown): string[] {
  const result = (fn as { result?: { type?: string; dimensionality?: string } }).result ?? {};
  if (result.dimensionality === "matrix") {
    if (!Array.isArray(value) || value.length === 0) return [`${where} returned ${show([value])}, expected a non-empty matrix`];
    const width = Array.isArray(value[0]) ? value[0].length : -1;
    const problems: string[] = [];
    value.forEach((row, i) => {
      if (!Array.isArray(row)) problems.push(`${where} row ${i} is not an array`);
      else {
        if (row.length !== width || width === 0) problems.push(`${where} spill is not rectangular: row ${i} has ${row.length} cells, row 0 has ${width}`);
        row.forEach((cell, j) => {
          const p = cellProblem(cell);
          if (p) problems.push(`${where} cell [${i}][${j}]: ${p}`);
        });
      }
    });
    return problems;
  }
  if (result.type === "number") {
    return typeof value === "number" && Number.isFinite(value) ? [] : [`${where} returned ${show([value])}, expected a finite number`];
  }
  if (result.type === "string") {
    return typeof value === "string" && value.length > 0 ? [] : [`${where} returned ${show([value])}, expected non-empty text`];
  }
  const p = cellProblem(value);
  return p ? [`${where} returned ${p}`] : [];
}

// ---------------------------------------------------------------------------
// Argument generators
// ---------------------------------------------------------------------------

/** Numbers a spreadsheet can hand over, and several it should never produce but a caller might. */
export const hostileNumber: fc.Arbitrary<number> = fc.oneof(
  fc.constantFrom(0, -0, -1, 1, 0.5, -0.5, NaN, Infinity, -Infinity, 1e308, -1e308, Number.MAX_SAFE_INTEGER, Number.MIN_VALUE, 2 ** 31, 1e-12, 65535.5),
  fc.double({ noNaN: false }),
  fc.integer({ min: -1000, max: 100000 }),
  fc.double({ min: -10, max: 10, noNaN: true }),
);

/** Text that is not what any argument expects. */
export const hostileText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom("", " ", "\t", "0", "-1", "NaN", "Infinity", "1e308", "TRUE", "#VALUE!", "null", "auto", "AUTO", "µ", "μs", "\u0000", "x".repeat(5000)),
  fc.string({ maxLength: 30 }),
  fc.string({ unit: "grapheme", maxLength: 12 }),
);

/** A 2-D range of cells, what a host passes for a range (or a scalar given one). */
export function range<T>(cell: fc.Arbitrary<T>, maxRows = 4, maxCols = 3): fc.Arbitrary<T[][]> {
  return fc
    .record({ rows: fc.integer({ min: 0, max: maxRows }), cols: fc.integer({ min: 0, max: maxCols }) })
    .chain(({ rows, cols }) => fc.array(fc.array(cell, { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }));
}

/** Any cell value a host can deliver, plus the non-values a host must never deliver but a caller might. */
export const hostileScalar: fc.Arbitrary<unknown> = fc.oneof(
  hostileNumber,
  hostileText,
  fc.boolean(),
  fc.constantFrom(null, undefined),
);

/** Anything at all: scalars, ranges (also ragged), objects, arrays of the wrong depth. */
export const hostileAny: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: hostileScalar },
  { weight: 2, arbitrary: range(hostileScalar) },
  { weight: 1, arbitrary: fc.array(hostileScalar, { maxLength: 4 }) },
  { weight: 1, arbitrary: fc.array(fc.array(hostileScalar, { maxLength: 3 }), { maxLength: 3 }) },
  { weight: 1, arbitrary: fc.constantFrom({}, { family: "HE" }, [[]], [[[1]]], () => 1, Symbol.for("x") as unknown, BigInt(10) as unknown) },
);

// ---------------------------------------------------------------------------
// Valid links: enumerated through the bundle's own LINK, so the pool follows
// whatever the family modules accept, and a refusal there is simply skipped.
// ---------------------------------------------------------------------------

const NON_HT_RATES: Record<string, number[]> = {
  DSSS: [1, 2],
  "HR-DSSS": [1, 2, 5.5, 11],
  OFDM: [6, 9, 12, 18, 24, 36, 48, 54],
  "ERP-OFDM": [6, 9, 12, 18, 24, 36, 48, 54],
};
const MCS_MAX: Record<string, number> = { HT: 31, VHT: 9, HE: 11, EHT: 13 };
const WIDTHS = [20, 40, 80, 160, 320];
const GIS: Record<string, number[]> = { HT: [0.4, 0.8], VHT: [0.4, 0.8], HE: [0.8, 1.6, 3.2], EHT: [0.8, 1.6, 3.2] };
const BANDS = [2.4, 5, 6];
const STREAMS = [1, 2, 3, 4, 8];
const OPTIONS: Record<string, (string | null)[]> = {
  DSSS: [null, "short"],
  "HR-DSSS": [null, "short"],
  OFDM: [null],
  "ERP-OFDM": [null],
  HT: [null, "GF", "LDPC", "STBC"],
  VHT: [null, "LDPC", "STBC"],
  HE: [null, "1xLTF", "4xLTF", "PE0", "PE8", "RU26", "RU106", "RU484", "DCM", "ER", "BCC"],
  EHT: [null, "1xLTF", "PE0", "RU242", "RU996"],
};

export interface ValidLink {
  readonly text: string;
  readonly family: string;
  readonly mcs: number;
  readonly streams: number;
  readonly width: number;
  readonly gi: number | null;
  readonly band: number;
  readonly options: string | null;
}

function enumerateLinks(): ValidLink[] {
  const link = bundle.functions.get("LINK");
  if (!link) return [];
  const out: ValidLink[] = [];
  const attempt = (family: string, mcs: number, streams: number | null, width: number | null, gi: number | null, band: number, options: string | null) => {
    try {
      const text = link(family, mcs, streams, width, gi, band, options);
      if (typeof text === "string") out.push({ text, family, mcs, streams: streams ?? 1, width: width ?? 20, gi, band, options });
    } catch {
      /* not a valid combination: the pool holds only what LINK accepts */
    }
  };
  for (const [family, rates] of Object.entries(NON_HT_RATES)) {
    for (const r of rates) for (const band of BANDS) for (const o of OPTIONS[family]) attempt(family, r, null, null, null, band, o);
  }
  for (const family of ["HT", "VHT", "HE", "EHT"]) {
    for (let mcs = 0; mcs <= MCS_MAX[family]; mcs++) {
      for (const ss of family === "HT" ? [null] : STREAMS) {
        for (const w of WIDTHS) for (const gi of GIS[family]) for (const band of BANDS) attempt(family, mcs, ss, w, gi, band, null);
      }
      // Options on a smaller base so the pool stays a few thousand links.
      for (const o of OPTIONS[family]) if (o) for (const w of [20, 80]) for (const gi of GIS[family]) attempt(family, mcs, family === "HT" ? null : 2, w, gi, 5, o);
    }
  }
  return out;
}

/** Every link the bundle's LINK accepts among a broad grid of combinations. */
export const VALID_LINKS: readonly ValidLink[] = enumerateLinks();
export const validLink: fc.Arbitrary<ValidLink> = VALID_LINKS.length > 0 ? fc.constantFrom(...VALID_LINKS) : fc.constant(undefined as unknown as ValidLink);
export const validLinkText: fc.Arbitrary<string> = validLink.map((l) => l.text);
/** The HE and EHT links of the pool: the ones a multi-user exchange accepts. */
const MU_LINKS: readonly ValidLink[] = VALID_LINKS.filter((l) => l.family === "HE" || l.family === "EHT");

// ---------------------------------------------------------------------------
// Near-miss link text, built from valid canonical links
// ---------------------------------------------------------------------------

function tokensOf(text: string): string[] {
  return text.split(" ");
}

/** Edits that keep the meaning (DESIGN.md §3: any order, any case, any spacing; µ and u alike). */
export const meaningPreservingEdit: fc.Arbitrary<(text: string) => string> = fc.oneof(
  fc.constant((t: string) => t.toLowerCase()),
  fc.constant((t: string) => t.toUpperCase()),
  fc.array(fc.boolean(), { minLength: 40, maxLength: 40 }).map((flips) => (t: string) =>
    [...t].map((c, i) => (flips[i % flips.length] ? c.toUpperCase() : c.toLowerCase())).join(""),
  ),
  fc.constantFrom("  ", "\t", " \t ", ", ").map((sep) => (t: string) => tokensOf(t).join(sep)),
  fc.constant((t: string) => `  ${t}  `),
  fc.array(fc.nat(), { minLength: 8, maxLength: 8 }).map((keys) => (t: string) => {
    const toks = tokensOf(t);
    return toks
      .map((tok, i) => ({ tok, k: keys[i % keys.length] + i / 100 }))
      .sort((a, b) => a.k - b.k)
      .map((x) => x.tok)
      .join(" ");
  }),
  fc.constantFrom("us", "µs", "μs", "uS", "µS").map((unit) => (t: string) => t.replace(/\bGI(\d+(?:\.\d+)?)\b/i, `GI$1${unit}`)),
);

/** Edits that may or may not keep the text valid: anything goes, only the error discipline is checked. */
export const nearMissEdit: fc.Arbitrary<(text: string) => string> = fc.oneof(
  meaningPreservingEdit,
  fc.nat().map((k) => (t: string) => {
    const toks = tokensOf(t);
    toks.splice(k % toks.length, 1);
    return toks.join(" ");
  }),
  fc.nat().map((k) => (t: string) => {
    const toks = tokensOf(t);
    const i = k % toks.length;
    toks.splice(i, 0, toks[i]);
    return toks.join(" ");
  }),
  fc.record({ k: fc.nat(), n: fc.constantFrom("0", "1", "3", "7", "12", "14", "99", "999", "-1", "1.5", "", "00", "0x10", "1e3") }).map(
    ({ k, n }) => (t: string) => {
      const toks = tokensOf(t);
      const i = k % toks.length;
      toks[i] = toks[i].replace(/\d+(?:\.\d+)?/, n);
      return toks.join(" ");
    },
  ),
  fc.constantFrom(
    (t: string) => t.replace(/(\d)(MHz|GHz|SS|Mbps)/, "$1 $2"),
    (t: string) => t.replace("MHz", "Mhz"),
    (t: string) => t.replace("MHz", "MH z"),
    (t: string) => t.replace("GHz", "G"),
    (t: string) => t.replace("GI", "GI "),
    (t: string) => t.replace("MCS", "MCS "),
    (t: string) => t.replace("MCS", "mcs-"),
    (t: string) => t.replace("-", ""),
    (t: string) => t.replace("-", "_"),
    (t: string) => t.replace(/^(\S+)/, "$1$1"),
    (t: string) => t.replace("GI0.8", "GI800ns"),
    (t: string) => t.replace("GI0.8", "GI0,8"),
    (t: string) => t.replace("2.4GHz", "2,4GHz"),
    (t: string) => t.replace(" ", "\u00a0"),
    (t: string) => t.replace(" ", "\u200b"),
    (t: string) => t.replace(/(\d+)SS/, "$1ss $1SS"),
    (t: string) => `${t} ${t}`,
    (t: string) => `${t} SGI LGI`,
    (t: string) => `${t} LDPC BCC`,
    (t: string) => `${t} RU26 RU52`,
    (t: string) => `${t} short long`,
    (t: string) => `${t} GF MF`,
    (t: string) => `${t} 4xLTF`,
    (t: string) => `${t} DCM`,
    (t: string) => `${t} ER`,
    (t: string) => `${t} STBC`,
    (t: string) => `${t} 320MHz`,
    (t: string) => `${t} 1e400MHz`,
    (t: string) => t.replace(/^\S+/, "HX"),
    (t: string) => t.replace(/^\S+/, ""),
    (t: string) => t.replace(/MCS\d+/, "MCS"),
    (t: string) => t.replace(/MCS\d+/, "54Mbps"),
    (t: string) => t.replace(/\d+Mbps/, "MCS7"),
    (t: string) => t + "\u0000",
  ),
  fc.string({ maxLength: 6 }).map((junk) => (t: string) => `${t} ${junk}`),
);

/** Valid canonical links run through 1–3 near-miss edits. */
export const nearMissLinkText: fc.Arbitrary<string> = fc
  .tuple(validLinkText, fc.array(nearMissEdit, { minLength: 1, maxLength: 3 }))
  .map(([t, edits]) => edits.reduce((acc, e) => e(acc), t));

// ---------------------------------------------------------------------------
// Plausible values by parameter name (so the fuzz reaches the model, not only
// the argument checks); unknown names fall back to the declared type.
// ---------------------------------------------------------------------------

const access = fc.constantFrom("BK", "BE", "VI", "VO", "DCF", "be", " vo ");
const protection = fc.constantFrom("none", "RTS", "CTS", "rts", "None");
const macOption = fc.constantFrom("CCMP-128", "GCMP-256", "CCMP-256", "open", "AMSDU=2", "AMSDU=4", "BA=64", "BA=256", "AMPDU=3", "TXOP=2528", "TXOP=0", "AP", "AIFSN=2", "CWMIN=7", "CWMAX=63", "SLOT=20", "SLOT=9", "BASIC=6,12,24", "HTC", "RETRY=4", "MUBAR", "TCP", "TCP TCPACK=3");
const macOptions = fc.array(macOption, { maxLength: 4 }).map((xs) => [...new Set(xs)].join(" "));
const share = fc.double({ min: 0, max: 1, noNaN: true });

const PLAUSIBLE: Record<string, fc.Arbitrary<unknown>> = {
  link: validLinkText,
  beacon_link: validLinkText,
  family: fc.constantFrom("DSSS", "HR-DSSS", "OFDM", "ERP-OFDM", "HT", "VHT", "HE", "EHT"),
  mcs: fc.integer({ min: 0, max: 15 }),
  streams: fc.integer({ min: 1, max: 8 }),
  width_mhz: fc.constantFrom(20, 40, 80, 160, 320),
  gi_us: fc.constantFrom(0.4, 0.8, 1.6, 3.2),
  band_ghz: fc.constantFrom(2.4, 5, 6),
  phy_options: fc.constantFrom("LDPC", "STBC", "GF", "1xLTF", "4xLTF", "RU26", "DCM", "short", "ER"),
  psdu_bytes: fc.oneof(fc.integer({ min: 0, max: 4000 }), fc.integer({ min: 0, max: 6_500_631 })),
  packet_bytes: fc.integer({ min: 1, max: 2304 }),
  mpdu_bytes: fc.integer({ min: 1, max: 11454 }),
  count: fc.integer({ min: 1, max: 1024 }),
  duration_us: fc.double({ min: 0, max: 10000, noNaN: true }),
  mpdus: fc.oneof(fc.constant("auto"), fc.integer({ min: 1, max: 256 })),
  access,
  protection,
  mac_options: macOptions,
  mpdu_loss: share,
  mode: fc.constantFrom("selective", "whole"),
  stations: fc.integer({ min: 1, max: 1000 }),
  cwmin: fc.constantFrom(0, 1, 3, 7, 15, 31),
  cwmax: fc.constantFrom(15, 63, 1023, 32767),
  retry_limit: fc.integer({ min: 1, max: 16 }),
  access_list: fc.constantFrom([["VO"], ["BE"]], [["BK"], ["BE"], ["VI"], ["VO"]], "VO, BE", [["DCF"]]),
  counts: fc.constantFrom([[2], [8]], [[1], [1], [1], [1]], "2, 8", [[10]]),
  // FSPL takes two wavelengths and more (0.249 m at 2412 MHz, the lowest frequency below); INDOORLOSS 1 m and more.
  distance_m: fc.double({ min: 0.25, max: 10000, noNaN: true }),
  freq_mhz: fc.constantFrom(2412, 2437, 5180, 5500, 5955, 6415),
  // Inside the accepted 17–40 (src/core/rf/pathLoss.ts DISTANCE_POWER_MIN/MAX), both ends included.
  distance_power: fc.constantFrom(17, 20, 28, 30, 31, 40),
  floors: fc.integer({ min: 0, max: 10 }),
  floor_loss_db: fc.double({ min: 0, max: 30, noNaN: true }),
  noise_figure_db: fc.double({ min: 0, max: 15, noNaN: true }),
  rssi_dbm: fc.double({ min: -100, max: -20, noNaN: true }),
  margin_db: fc.double({ min: 0, max: 20, noNaN: true }),
  ssids: fc.integer({ min: 1, max: 16 }),
  aps_heard: fc.integer({ min: 1, max: 20 }),
  beacon_bytes: fc.integer({ min: 50, max: 1500 }),
  interval_tu: fc.constantFrom(100, 102, 200, 1000),
  demand_mbps: fc.double({ min: 0, max: 100, noNaN: true }),
  links: validLinkText.map((t) => [[t]]),
  demands_mbps: fc.double({ min: 0, max: 50, noNaN: true }).map((d) => [[d]]),
  accesses: access.map((a) => [[a]]),
  walls: fc.integer({ min: 0, max: 20 }),
  wall_loss_db: fc.double({ min: 0, max: 20, noNaN: true }),
  total_share: fc.double({ min: 0, max: 20, noNaN: true }),
  max_utilization: fc.double({ min: 0.1, max: 1, noNaN: true }),
  overhead_share: fc.double({ min: 0, max: 0.09, noNaN: true }),
  eirp_dbm: fc.double({ min: 0, max: 36, noNaN: true }),
  target_dbm: fc.double({ min: -90, max: -40, noNaN: true }),
  rx_gain_dbi: fc.double({ min: 0, max: 10, noNaN: true }),
  area_m2: fc.double({ min: 1, max: 100000, noNaN: true }),
  reach_m: fc.double({ min: 1, max: 100, noNaN: true }),
  overlap_share: fc.double({ min: 0, max: 0.5, noNaN: true }),
  // Multi-user exchanges: mostly counts that fit some RU plan (9 × RU26 in 20 MHz … 148 in 320 MHz), some past every plan.
  users: fc.oneof({ weight: 3, arbitrary: fc.constant(1) }, { weight: 4, arbitrary: fc.integer({ min: 1, max: 9 }) }, { weight: 1, arbitrary: fc.integer({ min: 1, max: 160 }) }),
  direction: fc.constantFrom("down", "up", "DL", "UL", " Up "),
};

/** A plausible value for a parameter: by name if known, else by declared type and dimensionality. */
export function plausible(p: ParamMeta): fc.Arbitrary<unknown> {
  const byName = PLAUSIBLE[p.name];
  if (byName) return byName;
  const scalar = p.type === "string" ? fc.string({ maxLength: 10 }) : p.type === "number" ? fc.double({ min: 0, max: 100, noNaN: true }) : hostileScalar;
  return p.dimensionality === "matrix" ? range(scalar, 3, 1) : scalar;
}

/** A hostile value for a parameter, biased to its declared shape. */
export function hostile(p: ParamMeta): fc.Arbitrary<unknown> {
  if (p.dimensionality === "matrix") return fc.oneof({ weight: 3, arbitrary: range(hostileScalar) }, { weight: 1, arbitrary: hostileAny });
  return hostileAny;
}

/**
 * Arguments for a function: each position independently plausible, hostile
 * or omitted (null / missing at the end), so most calls carry one or two bad
 * arguments among good ones — the case an argument check is most likely to
 * get wrong.
 */
export function argsFor(fn: FunctionMeta): fc.Arbitrary<unknown[]> {
  const params = fn.parameters as ParamMeta[];
  const each = params.map((p) =>
    fc.oneof({ weight: 5, arbitrary: plausible(p) }, { weight: 2, arbitrary: hostile(p) }, { weight: 1, arbitrary: fc.constantFrom(null, "") }),
  );
  const optionalTail = params.length - params.findIndex((p, i) => params.slice(i).every((q) => q.optional));
  const tail = optionalTail > params.length ? 0 : optionalTail;
  return fc.tuple(fc.tuple(...each), fc.nat({ max: 3 }), fc.nat()).map(([args, mode, k]) =>
    // One call in four drops some trailing optional arguments, the way a caller omits them (undefined, not null).
    mode === 0 && tail > 0 ? args.slice(0, params.length - 1 - (k % tail)) : args,
  );
}

/**
 * Arguments that only make sense together, keyed by parameter names (so a new
 * function with the same names gets them too): LINK's parts from a link the
 * grid accepts, equal-shaped ranges for access_list/counts and
 * links/counts/demands_mbps.
 */
function joint(fn: FunctionMeta): fc.Arbitrary<(args: unknown[]) => unknown[]> | null {
  const names = fn.parameters.map((p) => p.name);
  const at = (n: string) => names.indexOf(n);
  const has = (...ns: string[]) => ns.every((n) => at(n) >= 0);
  if (has("family", "mcs", "streams", "width_mhz", "gi_us", "band_ghz", "phy_options") && VALID_LINKS.length > 0) {
    return validLink.map((l) => (args: unknown[]) => {
      const out = [...args];
      const isNonHt = l.gi === null;
      out[at("family")] = l.family;
      out[at("mcs")] = l.mcs;
      out[at("streams")] = isNonHt || l.family === "HT" ? null : l.streams;
      out[at("width_mhz")] = isNonHt ? null : l.width;
      out[at("gi_us")] = l.gi;
      out[at("band_ghz")] = l.band;
      out[at("phy_options")] = l.options;
      return out;
    });
  }
  if (has("access_list", "counts")) {
    return fc
      .array(fc.tuple(fc.constantFrom("BK", "BE", "VI", "VO", "DCF"), fc.integer({ min: 0, max: 20 })), { minLength: 1, maxLength: 5 })
      .map((rows) => (args: unknown[]) => {
        const out = [...args];
        out[at("access_list")] = rows.map(([a]) => [a]);
        out[at("counts")] = rows.map(([, n]) => [n]);
        return out;
      });
  }
  if (has("links", "counts", "demands_mbps")) {
    // accesses and mpdus (MIXSHARE), when declared, are ranges parallel to links.
    const classAccess = fc.constantFrom("BK", "BE", "VI", "VO", "DCF", null);
    const classMpdus = fc.constantFrom("auto", 1, null);
    return fc
      .array(fc.tuple(validLinkText, fc.integer({ min: 0, max: 50 }), fc.double({ min: 0, max: 20, noNaN: true }), classAccess, classMpdus), {
        minLength: 1,
        maxLength: 4,
      })
      .map((rows) => (args: unknown[]) => {
        const out = [...args];
        out[at("links")] = rows.map(([l]) => [l]);
        out[at("counts")] = rows.map(([, n]) => [n]);
        out[at("demands_mbps")] = rows.map(([, , d]) => [d]);
        if (at("accesses") >= 0) out[at("accesses")] = rows.map(([, , , a]) => [a]);
        if (at("mpdus") >= 0) out[at("mpdus")] = rows.map(([, , , , m]) => [m]);
        return out;
      });
  }
  if (has("link", "users") && MU_LINKS.length > 0) {
    // Multi-user exchanges: an HE or EHT link; one user on the whole channel, on an RU a count that most RU plans hold
    // (the 9 × RU26 of 20 MHz at most), and a few MPDUs per user so the exchange fits its limits.
    const users = fc.oneof(fc.constant(1), fc.integer({ min: 1, max: 2 }), fc.integer({ min: 1, max: 9 }));
    return fc
      .tuple(fc.constantFrom(...MU_LINKS), users, fc.oneof(fc.constant("auto"), fc.integer({ min: 1, max: 16 })), fc.constantFrom("down", "up"))
      .map(([l, u, m, d]) => (args: unknown[]) => {
        const out = [...args];
        out[at("link")] = l.text;
        out[at("users")] = l.options !== null && /^RU/.test(l.options) ? u : 1;
        if (at("mpdus") >= 0) out[at("mpdus")] = m;
        if (at("direction") >= 0) out[at("direction")] = d;
        return out;
      });
  }
  if (has("mpdus") && !names.some((n) => /(^|_)link$/.test(n))) {
    // Without a link there is no "auto" aggregation to size (RETX): a count of MPDUs.
    return fc.integer({ min: 1, max: 256 }).map((m) => (args: unknown[]) => {
      const out = [...args];
      out[at("mpdus")] = m;
      return out;
    });
  }
  return null;
}

/** Only plausible arguments (for invariants that need answers). */
export function plausibleArgsFor(fn: FunctionMeta): fc.Arbitrary<unknown[]> {
  const base = fc.tuple(...(fn.parameters as ParamMeta[]).map(plausible));
  const fix = joint(fn);
  if (!fix) return base;
  return fc.tuple(base, fix, fc.nat({ max: 4 })).map(([args, f, k]) => (k === 0 ? args : f(args)));
}
