/**
 * The coefficient tables of ITU-R P.1238-7 (02/2012) for the site-general
 * model of §3.1 (see pathLoss.ts): Table 2, power loss coefficients N, and
 * Table 3, floor penetration loss factors L_f(n) in dB, by frequency band and
 * environment. Offered as data so a sheet can use the recommendation's values
 * instead of the catalog defaults (N = 30, 15 dB per floor).
 *
 * All values below are from memory of that edition and must be checked
 * against the recommendation before they are relied on. Later editions
 * (P.1238-9 onwards) replaced this model with a different site-general form
 * (from memory); the tables belong to this edition only.
 */
import { finiteNumber, describe } from "../args";
import { invalid } from "../errors";
import type { Db } from "../units";
import { P1238_EDITION } from "./pathLoss";

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
