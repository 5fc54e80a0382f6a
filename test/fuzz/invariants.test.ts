/**
 * Invariants that hold for any valid input (issue 7), checked through the
 * built bundle with fast-check. Each is a relation the standard or the
 * catalog states, not a value copied from our code:
 *
 *   - TXTIME never falls as the PSDU grows (every TXTIME equation of
 *     IEEE Std 802.11-2020 Clauses 15–21 and 802.11ax/be is a preamble plus a
 *     non-decreasing function of the PSDU length).
 *   - PSDUFIT(d) fits in d and one byte more does not (DESIGN.md §2).
 *   - RATE rises with the MCS within a family at fixed width, streams and GI
 *     (each family's MCS table orders modulation × coding rate); a non-HT
 *     rate is the rate the text names (IEEE 802.11-2020 15.1 and 16.1 rate
 *     sets, Table 17-4).
 *   - GOODPUT ≤ RATE, EFFICIENCY = GOODPUT ÷ RATE in [0, 1], SATURATE ≤ RATE.
 *   - a result the catalog calls a "share 0..1" is in [0, 1].
 *   - spills are rectangular and their total rows equal the function they audit
 *     (BREAKDOWN = ACCESS, MUBREAKDOWN = MUACCESS).
 *   - MUGOODPUT ≤ users × RATE (no RU carries more than its data rate).
 *
 * A property whose functions are not registered yet is skipped with a test
 * name that says so.
 */
import fc from "fast-check";
import * as fs from "fs";
import * as path from "path";
import { fcOptions, invoke, itIfRegistered, meta, metadata, plausibleArgsFor, validLink, VALID_LINKS, type FunctionMeta } from "./fuzzLib";

/** The number a call answered, undefined for a refusal; a crash or a non-number fails the property. */
function num(id: string, args: unknown[]): number | undefined {
  const o = invoke(id, args);
  if (o.crash !== undefined) throw o.crash;
  if (o.error) return undefined;
  if (typeof o.value !== "number" || !Number.isFinite(o.value)) throw new Error(`${id} returned ${String(o.value)}`);
  return o.value;
}
function matrix(id: string, args: unknown[]): unknown[][] | undefined {
  const o = invoke(id, args);
  if (o.crash !== undefined) throw o.crash;
  return o.error ? undefined : (o.value as unknown[][]);
}
function refusedBy(id: string, args: unknown[], name: string): boolean {
  const o = invoke(id, args);
  return o.error !== undefined && o.error.message.startsWith(`${name}:`);
}
const REL = 1e-9;
function close(a: number, b: number): boolean {
  return Math.abs(a - b) <= REL * Math.max(1, Math.abs(a), Math.abs(b));
}

/** Arguments by name, for functions whose order the catalog fixes (DESIGN.md §2). */
function argsByName(fn: FunctionMeta, values: Record<string, unknown>): unknown[] {
  return fn.parameters.map((p) => (p.name in values ? values[p.name] : null));
}
function named(fn: FunctionMeta, args: unknown[]): Record<string, unknown> {
  return Object.fromEntries(fn.parameters.map((p, i) => [p.name, args[i]]));
}

/** A predicate's answer when the drawn input had nothing to compare (a refusal, an undefined MCS+1). */
const VACUOUS = "vacuous" as const;
type Verdict = boolean | typeof VACUOUS;

/**
 * fc.assert over a predicate that may be vacuous for some inputs, and a check
 * that at least a tenth of the runs compared something: a property that
 * passes only because every draw was refused proves nothing.
 */
function holds<T>(arb: fc.Arbitrary<T>, predicate: (x: T) => Verdict, numRuns: number): void {
  let compared = 0;
  fc.assert(
    fc.property(arb, (x) => {
      const v = predicate(x);
      if (v === VACUOUS) return true;
      compared++;
      return v;
    }),
    fcOptions(numRuns),
  );
  expect(compared).toBeGreaterThanOrEqual(Math.ceil(numRuns / 10));
}

const psdu = fc.oneof(fc.integer({ min: 0, max: 5000 }), fc.integer({ min: 0, max: 6_500_631 }));

describe("PHY invariants", () => {
  itIfRegistered(["TXTIME"], "TXTIME never falls as the PSDU grows", () => {
    fc.assert(
      fc.property(fc.constantFrom(...VALID_LINKS), psdu, psdu, (l, x, y) => {
        const [a, b] = x <= y ? [x, y] : [y, x];
        const ta = num("TXTIME", [l.text, a]);
        const tb = num("TXTIME", [l.text, b]);
        if (tb === undefined) return refusedBy("TXTIME", [l.text, b], "psdu_bytes"); // beyond the family's maximum PSDU
        return ta !== undefined && ta <= tb && ta > 0;
      }),
      fcOptions(400),
    );
  });

  itIfRegistered(["TXTIME"], "TXTIME is longer for 4000 bytes than for 0 (it depends on the PSDU at all)", () => {
    fc.assert(
      fc.property(fc.constantFrom(...VALID_LINKS), (l) => {
        const t0 = num("TXTIME", [l.text, 0]);
        const t1 = num("TXTIME", [l.text, 4000]);
        return t0 !== undefined && t1 !== undefined && t1 > t0;
      }),
      fcOptions(100),
    );
  });

  itIfRegistered(["PSDUFIT", "TXTIME"], "PSDUFIT(d) fits in d and PSDUFIT(d)+1 does not", () => {
    fc.assert(
      fc.property(fc.constantFrom(...VALID_LINKS), fc.oneof(fc.double({ min: 0, max: 6000, noNaN: true }), fc.integer({ min: 0, max: 40000 })), (l, d) => {
        const fit = num("PSDUFIT", [l.text, d]);
        if (fit === undefined || !Number.isInteger(fit) || fit < 0) return false;
        const tFit = num("TXTIME", [l.text, fit]);
        if (tFit === undefined) return false;
        if (fit > 0 && tFit > d) return false; // the answer must fit
        const tNext = num("TXTIME", [l.text, fit + 1]);
        if (tNext === undefined) return refusedBy("TXTIME", [l.text, fit + 1], "psdu_bytes"); // the family's maximum PSDU
        return tNext > d;
      }),
      fcOptions(300),
    );
  });

  itIfRegistered(["PSDUFIT"], "PSDUFIT never falls as the duration grows", () => {
    fc.assert(
      fc.property(fc.constantFrom(...VALID_LINKS), fc.double({ min: 0, max: 6000, noNaN: true }), fc.double({ min: 0, max: 6000, noNaN: true }), (l, x, y) => {
        const [a, b] = x <= y ? [x, y] : [y, x];
        const fa = num("PSDUFIT", [l.text, a]);
        const fb = num("PSDUFIT", [l.text, b]);
        return fa !== undefined && fb !== undefined && fa <= fb;
      }),
      fcOptions(200),
    );
  });

  itIfRegistered(["RATE", "LINK"], "RATE rises with the MCS within a family at fixed width, streams, GI and options", () => {
    const mcsLinks = VALID_LINKS.filter((l) => l.gi !== null && !(l.family === "HT" && (l.mcs % 8 === 7 || l.mcs >= 32)));
    holds(
      fc.constantFrom(...mcsLinks),
      (l) => {
        const streams = l.family === "HT" ? null : l.streams;
        const next = invoke("LINK", [l.family, l.mcs + 1, streams, l.width, l.gi, l.band, l.options]);
        if (next.error || typeof next.value !== "string") return VACUOUS; // MCS+1 not defined there: nothing to compare
        const r0 = num("RATE", [l.text]);
        const r1 = num("RATE", [next.value]);
        if (r0 === undefined || r1 === undefined) return false;
        if (!(r1 > r0)) throw new Error(`RATE("${next.value}") = ${r1} is not above RATE("${l.text}") = ${r0}`);
        return true;
      },
      400,
    );
  });

  itIfRegistered(["RATE"], "a non-HT link's RATE is the rate its text names (the rate sets of Clauses 15–18)", () => {
    const nonHt = VALID_LINKS.filter((l) => l.gi === null);
    fc.assert(fc.property(fc.constantFrom(...nonHt), (l) => num("RATE", [l.text]) === l.mcs), fcOptions(60));
  });

  itIfRegistered(["RATE", "SENSITIVITY"], "SENSITIVITY never falls (gets easier) as the MCS rises within a family at fixed width and streams", () => {
    // Minimum input sensitivity tables (e.g. IEEE 802.11-2020 Table 19-23, 21-25) are ordered by MCS.
    const mcsLinks = VALID_LINKS.filter((l) => l.gi !== null && l.options === null && !(l.family === "HT" && (l.mcs % 8 === 7 || l.mcs >= 32)));
    holds(
      fc.constantFrom(...mcsLinks),
      (l) => {
        const next = invoke("LINK", [l.family, l.mcs + 1, l.family === "HT" ? null : l.streams, l.width, l.gi, l.band, null]);
        if (next.error || typeof next.value !== "string") return VACUOUS;
        const s0 = num("SENSITIVITY", [l.text]);
        const s1 = num("SENSITIVITY", [next.value]);
        return s0 !== undefined && s1 !== undefined && s1 >= s0;
      },
      200,
    );
  });
});

describe("MAC and contention invariants", () => {
  itIfRegistered(["GOODPUT", "RATE"], "GOODPUT ≤ RATE", () => {
    const fn = meta("GOODPUT")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const g = num("GOODPUT", args);
        if (g === undefined) return VACUOUS;
        const r = num("RATE", [named(fn, args).link]);
        if (r === undefined || !(g >= 0 && g <= r)) throw new Error(`GOODPUT = ${g}, RATE = ${r} for ${JSON.stringify(args)}`);
        return true;
      },
      200,
    );
  });

  itIfRegistered(["MUGOODPUT", "RATE"], "MUGOODPUT ≤ users × RATE (each user's RU carries at most its own data rate)", () => {
    const fn = meta("MUGOODPUT")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const g = num("MUGOODPUT", args);
        if (g === undefined) return VACUOUS;
        const a = named(fn, args);
        const r = num("RATE", [a.link]);
        if (r === undefined || !(g > 0 && g <= (a.users as number) * r)) throw new Error(`MUGOODPUT = ${g}, RATE = ${r} for ${JSON.stringify(args)}`);
        return true;
      },
      200,
    );
  });

  itIfRegistered(["EFFICIENCY", "GOODPUT", "RATE"], "EFFICIENCY is GOODPUT ÷ RATE for the same arguments", () => {
    const fn = meta("EFFICIENCY")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const e = num("EFFICIENCY", args);
        const g = num("GOODPUT", args);
        if (e === undefined || g === undefined) return (e === undefined) === (g === undefined) ? VACUOUS : false;
        const r = num("RATE", [named(fn, args).link])!;
        return close(e, g / r);
      },
      150,
    );
  });

  itIfRegistered(["SATURATE", "RATE"], "SATURATE ≤ RATE", () => {
    const fn = meta("SATURATE")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const s = num("SATURATE", args);
        if (s === undefined) return VACUOUS;
        const r = num("RATE", [named(fn, args).link])!;
        return s >= 0 && s <= r;
      },
      150,
    );
  });

  itIfRegistered(["SATURATE", "GOODPUT"], "SATURATE for one station equals GOODPUT without loss (Bianchi with n = 1: no collisions, mean backoff CWmin ÷ 2)", () => {
    const sat = meta("SATURATE")!;
    const good = meta("GOODPUT")!;
    holds(
      plausibleArgsFor(sat),
      (args) => {
        const a = { ...named(sat, args), stations: 1, mpdu_loss: 0 };
        const s = num("SATURATE", argsByName(sat, a));
        const g = num("GOODPUT", argsByName(good, a));
        if (s === undefined || g === undefined) return (s === undefined) === (g === undefined) ? VACUOUS : false;
        if (!close(s, g)) throw new Error(`SATURATE(1 station) = ${s} but GOODPUT = ${g} for ${JSON.stringify(a)}`);
        return true;
      },
      100,
    );
  });

  itIfRegistered(["COLLIDE"], "COLLIDE is 0 for one station and never falls as stations are added (Bianchi 2000, p = 1 − (1 − τ)^(n−1))", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 999 }), fc.constantFrom(null, 7, 15, 31), fc.constantFrom(null, 255, 1023), fc.constantFrom(null, 4, 7), (n, lo, hi, r) => {
        const p1 = num("COLLIDE", [1, lo, hi, r]);
        const pn = num("COLLIDE", [n, lo, hi, r]);
        const pn1 = num("COLLIDE", [n + 1, lo, hi, r]);
        return p1 === 0 && pn !== undefined && pn1 !== undefined && pn <= pn1 + REL;
      }),
      fcOptions(100),
    );
  });

  itIfRegistered(["RETX"], "RETX is at least 1 and exactly 1 without loss", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 256 }), fc.double({ min: 0, max: 0.95, noNaN: true }), fc.constantFrom(null, "selective", "whole"), (m, loss, mode) => {
        const none = num("RETX", [m, 0, mode]);
        const x = num("RETX", [m, loss, mode]);
        return none === 1 && x !== undefined && x >= 1;
      }),
      fcOptions(100),
    );
  });

  itIfRegistered(["AGGCOUNT"], "AGGCOUNT is a whole number of MPDUs, at least 1", () => {
    const fn = meta("AGGCOUNT")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const n = num("AGGCOUNT", args);
        return n === undefined ? VACUOUS : Number.isInteger(n) && n >= 1;
      },
      100,
    );
  });
});

/** The @returns text of each function, read from the wrappers' JSDoc (the catalog text the user sees). */
function returnsText(): Record<string, string> {
  const src = fs.readFileSync(path.resolve(__dirname, "../../src/functions/functions.ts"), "utf8");
  const out: Record<string, string> = {};
  for (const block of src.split("/**").slice(1)) {
    const id = block.match(/@customfunction\s+(\S+)/)?.[1];
    const returns = block.match(/@returns\s+([^\n]*)/)?.[1];
    if (id && returns) out[id] = returns;
  }
  return out;
}

/**
 * Functions whose @returns says "share 0..1" but whose model documents a
 * value above 1 as meaningful — listed so an exception is explicit and
 * reviewed, not silently skipped. Empty: BEACONSHARE, CLIENTSHARE, MIXSHARE
 * say "above 1 means…" in their @returns and are checked ≥ 0 elsewhere.
 */
const SHARE_MAY_EXCEED_ONE: Record<string, string> = {};

describe("shares", () => {
  const returns = returnsText();
  const shareFns = metadata.functions.filter((f) => /share 0\s*\.\.\s*1/.test(returns[f.id] ?? "") && (f as { result?: { dimensionality?: string } }).result?.dimensionality !== "matrix");

  it("finds the functions whose @returns says share 0..1", () => {
    expect(shareFns.length).toBeGreaterThan(0);
  });

  for (const fn of shareFns) {
    const bounded = !(fn.id in SHARE_MAY_EXCEED_ONE);
    it(bounded ? `${fn.id} is a share in [0, 1]` : `${fn.id} is a share ≥ 0 (above 1 allowed: ${SHARE_MAY_EXCEED_ONE[fn.id]})`, () => {
      holds(
        plausibleArgsFor(fn),
        (args) => {
          const s = num(fn.id, args);
          if (s === undefined) return VACUOUS;
          if (!(s >= 0 && (!bounded || s <= 1))) throw new Error(`${fn.id}(${JSON.stringify(args)}) = ${s}`);
          return true;
        },
        150,
      );
    });
  }

  itIfRegistered(["CLIENTSHARE"], "CLIENTSHARE is ≥ 0 (above 1 means more than one channel, by design: DESIGN.md §2) and 0 for no demand", () => {
    const fn = meta("CLIENTSHARE")!;
    fc.assert(
      fc.property(plausibleArgsFor(fn), (args) => {
        const s = num("CLIENTSHARE", args);
        const zero = num("CLIENTSHARE", argsByName(fn, { ...named(fn, args), demand_mbps: 0 }));
        return (s === undefined || s >= 0) && (zero === undefined || zero === 0);
      }),
      fcOptions(100),
    );
  });

  itIfRegistered(["BEACONSHARE"], "BEACONSHARE is ≥ 0 (above 1 means beacons alone exceed the channel) and 0 for no SSIDs", () => {
    const fn = meta("BEACONSHARE")!;
    fc.assert(
      fc.property(plausibleArgsFor(fn), (args) => {
        const s = num("BEACONSHARE", args);
        const zero = num("BEACONSHARE", argsByName(fn, { ...named(fn, args), ssids: 0 }));
        return (s === undefined || s >= 0) && (zero === undefined || zero === 0);
      }),
      fcOptions(100),
    );
  });

  itIfRegistered(["EDCAMIX"], "EDCAMIX spills one row per class, shares in [0, 1] adding up to at most 1, per-station goodput = goodput ÷ stations", () => {
    const fn = meta("EDCAMIX")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const rows = matrix("EDCAMIX", args);
        if (rows === undefined) return VACUOUS;
        let total = 0;
        for (const row of rows) {
          const [, stations, goodput, perStation, share] = row as [string, number, number, number, number];
          if (!(share >= 0 && share <= 1 && goodput >= 0)) throw new Error(`EDCAMIX row ${JSON.stringify(row)}`);
          if (stations > 0 && !close(perStation, goodput / stations)) throw new Error(`EDCAMIX row ${JSON.stringify(row)}: per station ≠ goodput ÷ stations`);
          total += share;
        }
        if (total > 1 + REL) throw new Error(`EDCAMIX shares add up to ${total} for ${JSON.stringify(args)}`);
        return true;
      },
      80,
    );
  });
});

describe("spills", () => {
  const spilling = metadata.functions.filter((f) => (f as { result?: { dimensionality?: string } }).result?.dimensionality === "matrix");

  for (const fn of spilling) {
    it(`${fn.id} spills a rectangular, non-empty range of finite numbers and text`, () => {
      let answered = 0;
      holds(
        plausibleArgsFor(fn),
        (args) => {
          const rows = matrix(fn.id, args);
          if (rows === undefined) return VACUOUS;
          answered++;
          const width = rows[0]?.length ?? 0;
          return (
            width > 0 &&
            rows.every((r) => Array.isArray(r) && r.length === width && r.every((c) => typeof c === "string" || (typeof c === "number" && Number.isFinite(c))))
          );
        },
        100,
      );
      expect(answered).toBeGreaterThan(0);
    });
  }

  itIfRegistered(["TXTIMEPARTS", "TXTIME"], "TXTIMEPARTS's last row is TXTIME for the same link and PSDU", () => {
    holds(
      fc.tuple(validLink, fc.integer({ min: 0, max: 20000 })),
      ([l, n]) => {
        const rows = matrix("TXTIMEPARTS", [l.text, n]);
        const t = num("TXTIME", [l.text, n]);
        if (rows === undefined || t === undefined) return (rows === undefined) === (t === undefined) ? VACUOUS : false;
        return rows[rows.length - 1][1] === t;
      },
      150,
    );
  });

  itIfRegistered(["MUBREAKDOWN", "MUACCESS", "MUGOODPUT"], "MUBREAKDOWN's terms add up to its last row, which is MUACCESS; MUGOODPUT is the users' packet bits over it", () => {
    const fn = meta("MUBREAKDOWN")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const rows = matrix("MUBREAKDOWN", args);
        const a = num("MUACCESS", args);
        const g = num("MUGOODPUT", args);
        if (rows === undefined || a === undefined || g === undefined) return rows === undefined && a === undefined && g === undefined ? VACUOUS : false;
        const total = rows[rows.length - 1][1] as number;
        const sum = rows.slice(0, -1).reduce((s, r) => s + (r[1] as number), 0);
        if (!close(total, a) || !close(sum, total)) throw new Error(`MUBREAKDOWN total ${total}, sum of parts ${sum}, MUACCESS ${a} for ${JSON.stringify(args)}`);
        return g > 0 && g * a >= 8 * (named(fn, args).users as number) * (named(fn, args).packet_bytes as number) * (1 - REL);
      },
      150,
    );
  });

  itIfRegistered(["BREAKDOWN", "ACCESS"], "BREAKDOWN's components add up to its last row, which is ACCESS for the same arguments", () => {
    const fn = meta("BREAKDOWN")!;
    const access = meta("ACCESS")!;
    holds(
      plausibleArgsFor(fn),
      (args) => {
        const rows = matrix("BREAKDOWN", args);
        const a = num("ACCESS", argsByName(access, named(fn, args)));
        if (rows === undefined || a === undefined) return (rows === undefined) === (a === undefined) ? VACUOUS : false;
        const total = rows[rows.length - 1][1] as number;
        const sum = rows.slice(0, -1).reduce((s, r) => s + (r[1] as number), 0);
        if (!close(total, a) || !close(sum, total)) throw new Error(`BREAKDOWN total ${total}, sum of parts ${sum}, ACCESS ${a} for ${JSON.stringify(args)}`);
        return true;
      },
      150,
    );
  });
});
