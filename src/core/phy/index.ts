/**
 * PHY entry points used by the spreadsheet functions and the MAC layer:
 * rate, TXTIME, largest PSDU in a duration, minimum sensitivity.
 */
import { parseLink, type Link } from "../link";
import { finiteNumber, integerInRange } from "../args";
import { AirtallyError, invalid } from "../errors";
import { familyModule } from "./registry";
import { BoundedMemo } from "../memo";
import type { PhyFamily, TxTime } from "./types";
import type { Bytes, Dbm, MbPerSecond, Microseconds } from "../units";

export type { TxTime, TxTimeTerm, PhyFamily } from "./types";
export { familyModule } from "./registry";

/** A Link from text or an already parsed Link. */
export function asLink(link: unknown): Link {
  if (typeof link === "object" && link !== null && "family" in link && "text" in link) return link as Link;
  return parseLink(link);
}

/**
 * What a sheet asks of one link again and again — its rate, its largest PSDU,
 * its sensitivity and the TXTIMEs already computed — kept per link so that a
 * workbook of thousands of rows pointing at a few link cells pays for each
 * equation once. Keyed by the text as given and by the canonical text (for
 * Link objects), bounded like the parse cache by entries and key characters
 * (memo.ts; STYLE.md: module state only as bounded caches). Values are the same numbers the family modules return.
 */
interface LinkFacts {
  readonly link: Link;
  readonly module: PhyFamily;
  readonly rateMbps: MbPerSecond;
  readonly maxPsduBytes: Bytes;
  /** NaN until looked up, and when the standard gives none (then `sensitivityRefusal` says why). */
  sensitivityDbm: Dbm;
  sensitivityRefusal: AirtallyError | null;
  /**
   * TXTIMEs already computed, direct-mapped by PSDU length (txtimeSlot), the
   * key beside the value, NaN for an empty slot (NaN equals no argument, so
   * an empty slot never answers). A link shares the empty tables until its
   * first TXTIME, then owns 4 KB: a fixed bound however many lengths a sheet
   * asks for.
   */
  txtimeKeys: Float64Array;
  txtimeValues: Float64Array;
}

const TXTIME_SLOT_BITS = 8;
const TXTIME_SLOTS = 1 << TXTIME_SLOT_BITS;

/**
 * Slot of a PSDU length: Fibonacci hashing (Knuth, TAOCP vol. 3, 6.4,
 * multiplicative hashing by 2^32/φ), the top bits of length × 0x9E3779B1.
 * The low bits alone would put lengths in arithmetic progression — a column
 * of sizes in steps of 256 octets — all in one slot.
 */
function txtimeSlot(psduBytes: number): number {
  return Math.imul(psduBytes, 0x9e3779b1) >>> (32 - TXTIME_SLOT_BITS);
}
const factsCache = new BoundedMemo<LinkFacts>("link facts", 2048, 2048 * 128, 1024);
/** The tables of a link with no TXTIME yet (never written). Every field keeps one type from creation on, so the JIT sees one object shape. */
const NO_TXTIME_KEYS = new Float64Array(TXTIME_SLOTS).fill(NaN);
const NO_TXTIME_VALUES = new Float64Array(TXTIME_SLOTS);

/*
 * The hit paths below are a lookup and a field load; everything else (parsing,
 * the family's equations, argument refusals) sits in separate functions so the
 * hit paths stay small enough for the JIT to inline into the caller.
 */

function factsOf(link: unknown): LinkFacts {
  if (typeof link === "string") {
    const hit = factsCache.get(link);
    if (hit !== undefined) return hit;
  }
  return factsOnMiss(link);
}

function factsOnMiss(link: unknown): LinkFacts {
  const key = typeof link === "string" ? link : typeof link === "object" && link !== null && "text" in link ? (link as Link).text : undefined;
  if (key !== undefined) {
    const hit = factsCache.get(key);
    if (hit !== undefined) return hit;
  }
  const l = asLink(link);
  const module = familyModule(l.family);
  const facts: LinkFacts = {
    link: l,
    module,
    rateMbps: module.rateMbps(l),
    maxPsduBytes: module.maxPsduBytes(l),
    sensitivityDbm: NaN,
    sensitivityRefusal: null,
    txtimeKeys: NO_TXTIME_KEYS,
    txtimeValues: NO_TXTIME_VALUES,
  };
  factsCache.set(key ?? l.text, facts);
  return facts;
}

/** PHY data rate, Mb/s. */
export function rateMbps(link: unknown): MbPerSecond {
  return factsOf(link).rateMbps;
}

/** Largest PSDU of this link, octets. */
export function maxPsduBytes(link: unknown): Bytes {
  return factsOf(link).maxPsduBytes;
}

function checkedPsdu(f: LinkFacts, psduBytes: unknown): Bytes {
  const max = f.maxPsduBytes;
  if (typeof psduBytes === "number" && psduBytes > max && Number.isFinite(psduBytes)) {
    invalid(`psdu_bytes: ${psduBytes} exceeds the largest ${f.link.family} PSDU (${max} octets) for ${f.link.text}`);
  }
  return integerInRange("psdu_bytes", psduBytes, 0, max, "octets");
}

/** TXTIME with its terms; psdu_bytes must be a whole number from 0 to the family's maximum PSDU length. */
export function txtime(link: unknown, psduBytes: unknown): TxTime {
  const f = factsOf(link);
  return f.module.txtime(f.link, checkedPsdu(f, psduBytes));
}

/** TXTIME, µs (remembered per link and PSDU length). */
export function txtimeUs(link: unknown, psduBytes: unknown): Microseconds {
  const f = factsOf(link);
  if (typeof psduBytes === "number") {
    const slot = txtimeSlot(psduBytes);
    if (f.txtimeKeys[slot] === psduBytes) return f.txtimeValues[slot];
  }
  return txtimeOnMiss(f, psduBytes);
}

function txtimeOnMiss(f: LinkFacts, psduBytes: unknown): Microseconds {
  const n = checkedPsdu(f, psduBytes);
  const total = f.module.txtime(f.link, n).totalUs;
  if (f.txtimeKeys === NO_TXTIME_KEYS) {
    f.txtimeKeys = new Float64Array(TXTIME_SLOTS).fill(NaN);
    f.txtimeValues = new Float64Array(TXTIME_SLOTS);
  }
  const slot = txtimeSlot(n);
  f.txtimeKeys[slot] = n;
  f.txtimeValues[slot] = total;
  return total;
}

/**
 * Largest PSDU whose TXTIME ≤ duration_us, octets; 0 when not even an empty
 * PSDU fits. TXTIME never falls as the PSDU grows, so a binary search over
 * 0..maxPsdu is exact.
 */
export function psduFit(link: unknown, durationUs: unknown): Bytes {
  const { link: l, module, maxPsduBytes: max } = factsOf(link);
  const d = finiteNumber("duration_us", durationUs);
  if (d < 0) invalid(`duration_us: must be 0 or more µs, got ${d}`);
  let hi = max;
  if (module.txtime(l, 0).totalUs > d) return 0;
  if (module.txtime(l, hi).totalUs <= d) return hi;
  let lo = 0; // invariant: txtime(lo) ≤ d < txtime(hi)
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (module.txtime(l, mid).totalUs <= d) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Minimum input sensitivity, dBm (#N/A where the standard gives none, e.g. HT MCS 33–76). */
export function sensitivityDbm(link: unknown): Dbm {
  const f = factsOf(link);
  const known = f.sensitivityDbm;
  if (!Number.isNaN(known)) return known;
  return sensitivityOnMiss(f);
}

/** The family's table, looked up once per link; a refusal is remembered and thrown again. */
function sensitivityOnMiss(f: LinkFacts): Dbm {
  if (f.sensitivityRefusal === null) {
    try {
      f.sensitivityDbm = f.module.sensitivityDbm(f.link);
      return f.sensitivityDbm;
    } catch (e) {
      if (!(e instanceof AirtallyError)) throw e;
      f.sensitivityRefusal = e;
    }
  }
  throw f.sensitivityRefusal;
}

/** Non-HT reference rate used to choose the control response rate, Mb/s. */
export function nonHtReferenceRateMbps(link: unknown): MbPerSecond {
  const l = asLink(link);
  return familyModule(l.family).nonHtReferenceRateMbps(l);
}

/** TXTIMEPARTS rows: [label, value] for each term, then ["TXTIME (µs)", total]. */
export function txtimeTable(link: unknown, psduBytes: unknown): (string | number)[][] {
  const t = txtime(link, psduBytes);
  const rows: (string | number)[][] = t.terms.map((term) => [term.label, term.value]);
  rows.push(["TXTIME (µs)", t.totalUs]);
  return rows;
}
