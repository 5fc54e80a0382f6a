/**
 * The coefficient tables of ITU-R P.1238-7 (02/2012) for the site-general
 * model of §3.1 (see pathLoss.ts): Table 2, power loss coefficients N, and
 * Table 3, floor penetration loss factors L_f(n) in dB, by frequency band and
 * environment. Offered as data so a sheet can use the recommendation's values
 * for another environment; INDOORLOSS and REACH take Table 3's office L_f(n)
 * for the band when floor_loss_db is omitted (officeFloorLossDb below).
 *
 * All values below are from memory of that edition and must be checked
 * against the recommendation before they are relied on. Later editions
 * (P.1238-9 onwards) replaced this model with a different site-general form
 * (from memory); the tables belong to this edition only.
 */
import { finiteNumber, describe } from "../args";
import { invalid } from "../errors";
import type { Db } from "../units";

/** The edition whose eq. (1) and Tables 2 and 3 are used. */
export const P1238_EDITION = "ITU-R P.1238-7 (02/2012)";

export type P1238Environment = "residential" | "apartment" | "house" | "office" | "commercial";
export const P1238_ENVIRONMENTS: readonly P1238Environment[] = ["residential", "apartment", "house", "office", "commercial"];

/** L_f(n) as the recommendation writes it: a + b·(n − 1) for any n ≥ 1, or one value per floor count n = 1, 2, 3… */
export type FloorLossRule =
  | { readonly kind: "linear"; readonly firstDb: Db; readonly perExtraFloorDb: Db }
  | { readonly kind: "perFloors"; readonly byFloorsDb: readonly Db[] };

interface BandRow {
  /** The band as the recommendation's tables label it. */
  readonly band: string;
  readonly n: Partial<Record<P1238Environment, number>>;
  readonly floorLoss: Partial<Record<P1238Environment, FloorLossRule>>;
}

const linear = (firstDb: Db, perExtraFloorDb: Db): FloorLossRule => ({ kind: "linear", firstDb, perExtraFloorDb });
const perFloors = (...byFloorsDb: Db[]): FloorLossRule => ({ kind: "perFloors", byFloorsDb });

/**
 * P.1238-7 Tables 2 and 3 (from memory, one row per band). Where the
 * recommendation splits residential into apartment and house, the row has
 * those two instead of "residential". 60 and 70 GHz rows (Table 2 only,
 * same-floor) are left out: no 802.11 band here needs them.
 */
export const P1238_TABLES: readonly BandRow[] = [
  { band: "900MHz", n: { office: 33, commercial: 20 }, floorLoss: { office: perFloors(9, 19, 24) } },
  { band: "1.2-1.3GHz", n: { office: 32, commercial: 22 }, floorLoss: {} },
  {
    band: "1.8-2GHz",
    n: { residential: 28, office: 30, commercial: 22 },
    // 4n, 15 + 4(n − 1), 6 + 3(n − 1)
    floorLoss: { residential: linear(4, 4), office: linear(15, 4), commercial: linear(6, 3) },
  },
  {
    band: "2.4GHz",
    n: { apartment: 28, house: 28, office: 30 },
    floorLoss: { apartment: perFloors(10), house: perFloors(5), office: perFloors(14) },
  },
  { band: "3.5GHz", n: { office: 27 }, floorLoss: { office: perFloors(18, 26) } },
  { band: "4GHz", n: { office: 28, commercial: 22 }, floorLoss: {} },
  {
    band: "5.2GHz",
    n: { apartment: 30, house: 28, office: 31 },
    floorLoss: { apartment: perFloors(13), house: perFloors(7), office: perFloors(16) },
  },
  { band: "5.8GHz", n: { office: 24 }, floorLoss: { office: perFloors(22, 28) } },
];

export const P1238_BANDS: readonly string[] = P1238_TABLES.map((r) => r.band);

/** The recommendation's values for one environment and band. */
export interface P1238Coefficients {
  readonly edition: string;
  readonly band: string;
  readonly environment: P1238Environment;
  /** Power loss coefficient N (Table 2). */
  readonly distancePower: number;
  /** Floor penetration loss factor L_f(n), dB (Table 3); 0 for n = 0. */
  readonly floorLossDb: number;
}

function floorLossFor(rule: FloorLossRule, floors: number, where: string): Db {
  if (floors === 0) return 0;
  if (rule.kind === "linear") return rule.firstDb + rule.perExtraFloorDb * (floors - 1);
  const v = rule.byFloorsDb[floors - 1];
  if (v === undefined) {
    invalid(`floors: P.1238-7 Table 3 gives L_f for ${where} only up to ${rule.byFloorsDb.length} floor(s), got ${floors}`);
  }
  return v;
}

/**
 * N and L_f(n) from P.1238-7 Tables 2 and 3 for an environment, a band label
 * (one of P1238_BANDS, e.g. "5.2GHz") and a floor count (default 0).
 * #VALUE! when the table has no entry there, saying which entries exist.
 *
 * Example: p1238Coefficients("office", "1.8-2GHz", 2) → N 30, L_f 15 + 4 = 19 dB.
 */
export function p1238Coefficients(environment: unknown, band: unknown, floors: unknown = 0): P1238Coefficients {
  const env = P1238_ENVIRONMENTS.find((e) => typeof environment === "string" && e === environment.trim().toLowerCase());
  if (!env) invalid(`environment: expected ${P1238_ENVIRONMENTS.join(", ")}, got ${describe(environment)}`);
  const key = typeof band === "string" ? band.replace(/\s+/g, "").replace(/ghz$/i, "GHz").replace(/mhz$/i, "MHz") : band;
  const row = P1238_TABLES.find((r) => r.band === key);
  if (!row) invalid(`band: expected one of ${P1238_BANDS.join(", ")}, got ${describe(band)}`);
  const n = floors === null || floors === undefined || floors === "" ? 0 : finiteNumber("floors", floors);
  if (!Number.isInteger(n) || n < 0) invalid(`floors: must be a whole number 0 or more, got ${n}`);
  const distancePower = row.n[env];
  if (distancePower === undefined) {
    invalid(`environment: P.1238-7 Table 2 has no N for ${env} at ${row.band}; it has ${Object.keys(row.n).join(", ")}`);
  }
  const rule = row.floorLoss[env];
  if (rule === undefined && n > 0) {
    const has = Object.keys(row.floorLoss);
    invalid(`environment: P.1238-7 Table 3 has no L_f for ${env} at ${row.band}${has.length ? `; it has ${has.join(", ")}` : ""}`);
  }
  return {
    edition: P1238_EDITION,
    band: row.band,
    environment: env,
    distancePower,
    floorLossDb: rule === undefined ? 0 : floorLossFor(rule, n, `${env} at ${row.band}`),
  };
}

/**
 * Which Table 3 row serves a frequency, MHz, for the office default of
 * INDOORLOSS and REACH. The recommendation labels rows by band; the spans
 * around each label are our choice, wide enough for the 802.11 channels of
 * that band: 2.4 GHz 2300–2600 (channels 1–14), 5.2 GHz 4900–5350 (U-NII-1
 * and -2A), 5.8 GHz 5350–5925 (U-NII-2C and -3: 5.47–5.725 GHz lies between
 * the two rows, and we take the 5.8 GHz row, the larger loss — a shorter
 * reach, more access points). The 6 GHz band (5925–7125 MHz) has no Table 3
 * row in this edition: there floor_loss_db must be given.
 */
export const P1238_OFFICE_FLOOR_SPANS_MHz: readonly { readonly band: string; readonly fromMHz: number; readonly toMHz: number }[] = [
  { band: "900MHz", fromMHz: 900, toMHz: 1000 },
  { band: "1.8-2GHz", fromMHz: 1700, toMHz: 2100 },
  { band: "2.4GHz", fromMHz: 2300, toMHz: 2600 },
  { band: "3.5GHz", fromMHz: 3300, toMHz: 3800 },
  { band: "5.2GHz", fromMHz: 4900, toMHz: 5350 },
  { band: "5.8GHz", fromMHz: 5350, toMHz: 5925 },
];

function noOfficeRow(freqMHz: number): never {
  const spans = P1238_OFFICE_FLOOR_SPANS_MHz.map((r) => `${r.fromMHz}–${r.toMHz}`).join(", ");
  invalid(
    `floor_loss_db: ${P1238_EDITION} Table 3 has no office floor penetration factor at ${freqMHz} MHz (its office rows serve ${spans} MHz); ` +
      `give floor_loss_db, the loss per floor in dB`,
  );
}

function beyondOfficeRow(band: string, tabulated: number, floors: number): never {
  invalid(
    `floors: ${P1238_EDITION} Table 3 gives the office L_f at ${band} for up to ${tabulated} floor${tabulated === 1 ? "" : "s"}, got ${floors}; ` +
      `give floor_loss_db, the loss per floor in dB, for more floors`,
  );
}

/**
 * L_f(n), dB, of Table 3 for an office at this frequency (from memory, as the
 * whole table): 1.8–2 GHz 15 + 4(n − 1); 900 MHz 9, 19, 24 for 1–3 floors;
 * 2.4 GHz 14 (1 floor); 3.5 GHz 18, 26; 5.2 GHz 16 (1 floor); 5.8 GHz 22, 28.
 * Where the table stops (its per-floor rows), more floors are refused rather
 * than extrapolated: the recommendation gives no rule there. 0 for n = 0 at
 * any frequency.
 *
 * Example: officeFloorLossDb(1900, 3) → 15 + 4 × 2 = 23 dB.
 */
export function officeFloorLossDb(freqMHz: number, floors: number): Db {
  if (floors === 0) return 0;
  const span = P1238_OFFICE_FLOOR_SPANS_MHz.find((r) => freqMHz >= r.fromMHz && freqMHz <= r.toMHz);
  if (span === undefined) noOfficeRow(freqMHz);
  const rule = P1238_TABLES.find((r) => r.band === span.band)!.floorLoss.office!;
  if (rule.kind === "perFloors" && floors > rule.byFloorsDb.length) beyondOfficeRow(span.band, rule.byFloorsDb.length, floors);
  return floorLossFor(rule, floors, `office at ${span.band}`);
}
