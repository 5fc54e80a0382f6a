/**
 * Path loss: free space (Friis) and the ITU-R P.1238 site-general indoor
 * model, plus its inverse (REACH).
 *
 * Results are planning estimates, not a replacement for a site survey:
 * walls, furniture, people and antenna patterns move real levels by many dB.
 * Transmit power, EIRP and channels are regulated and vary by country, and
 * RF exposure limits protect people; local regulations, codes and licensed
 * practice decide. These functions never choose a power: the EIRP is the
 * user's own input.
 */
import { finiteNumber, isMissing, numberInRange } from "../args";
import { invalid } from "../errors";
import type { Db, Dbm, MHz, Meters } from "../units";
import { atLeast, atMost, nonNegative, optionalNumber, positive, wholeNonNegative } from "./_lib";
import { P1238_EDITION, officeFloorLossDb } from "./p1238";
import { wallsLossDb } from "./walls";

/** Speed of light in vacuum, m/s (exact by the SI definition of the metre). */
export const SPEED_OF_LIGHT_m_per_s = 299_792_458;

/**
 * Free-space path loss, dB (Friis transmission equation with isotropic
 * antennas): FSPL = 20·log10(4π·d·f ÷ c), d in m, f in Hz.
 * With d in m and f in MHz this is 20·log10(d) + 20·log10(f) − 27.55 dB
 * (20·log10(4π·1e6 ÷ c) = −27.55).
 *
 * Planning estimate only (see the module note): local regulations, codes and
 * licensed practice decide.
 *
 * Far field only. The Friis equation holds in the far field of the
 * antennas: r > 2D²/λ, r ≫ D and r ≫ λ for an antenna of largest dimension
 * D (C. A. Balanis, Antenna Theory: Analysis and Design, 3rd ed., Wiley
 * 2005, §2.2.4; T. S. Rappaport, Wireless Communications: Principles and
 * Practice, 2nd ed., Prentice Hall 2002, §4.3 — section numbers from memory).
 * FSPL knows no antenna size, so it takes the wavelength condition: distance
 * at least FSPL_MIN_WAVELENGTHS (2) wavelengths λ = c ÷ f — our reading of
 * "r ≫ λ", which for a half-wave dipole (D = λ/2, 2D²/λ = λ/2) also clears
 * the Fraunhofer distance. Closer than that the equation's loss shrinks
 * towards 0 dB and below (at d = λ/4π it is 0 dB: FSPL(0.001, 5180) would be
 * −13.3 dB, a gain), which no path has: #VALUE! naming distance_m.
 *
 * Example: fsplDb(10, 2437) → 60.18 dB.
 */
/** FSPL's accepted range: 1 kHz to 10 THz, up to 10⁹ m — far outside Wi-Fi, only to keep the result finite. */
const FSPL_MIN_FREQ_MHz: MHz = 0.001;
const FSPL_MAX_FREQ_MHz: MHz = 1e7;
const FSPL_MAX_DISTANCE_m: Meters = 1e9;
/** Shortest distance FSPL accepts, in wavelengths (the far-field condition above). */
export const FSPL_MIN_WAVELENGTHS = 2;
/** The bound as d·f, m·MHz: d ≥ 2λ = 2c ÷ f  ⇔  d·f ≥ 2c ÷ 10⁶ (one multiply and compare on the hot path). */
const FSPL_MIN_DISTANCE_TIMES_FREQ_m_MHz = (FSPL_MIN_WAVELENGTHS * SPEED_OF_LIGHT_m_per_s) / 1e6;

function inNearField(d: number, f: number): never {
  const minimum = FSPL_MIN_DISTANCE_TIMES_FREQ_m_MHz / f;
  invalid(
    `distance_m: the Friis free-space equation holds in the far field only; at ${f} MHz use at least ` +
      `${FSPL_MIN_WAVELENGTHS} wavelengths (${+minimum.toPrecision(3)} m), got ${d}`,
  );
}

export function fsplDb(distanceM: unknown, freqMHz: unknown): Db {
  const d = atMost("distance_m", positive("distance_m", finiteNumber("distance_m", distanceM), "m"), FSPL_MAX_DISTANCE_m, "m");
  const f = atLeast("freq_mhz", atMost("freq_mhz", finiteNumber("freq_mhz", freqMHz), FSPL_MAX_FREQ_MHz, "MHz"), FSPL_MIN_FREQ_MHz, "MHz");
  if (!(d * f >= FSPL_MIN_DISTANCE_TIMES_FREQ_m_MHz)) inNearField(d, f);
  return 20 * Math.log10((4 * Math.PI * d * f * 1e6) / SPEED_OF_LIGHT_m_per_s);
}

/**
 * ITU-R P.1238-7 (02/2012) §3.1, site-general model, eq. (1):
 *   L_total = 20·log10(f) + N·log10(d) + L_f(n) − 28   dB
 * f in MHz, d in m with d > 1 m (at d = 1 m the distance term is 0, so we
 * accept d ≥ 1 m), N the distance power loss coefficient, L_f(n) the floor
 * penetration loss factor for n floors between the stations (L_f = 0 for
 * n = 0). That edition covers 900 MHz to 100 GHz.
 */
export { P1238_EDITION };
/** The constant of eq. (1), dB. */
export const P1238_CONSTANT_dB: Db = -28;
/** Frequency range of the edition, MHz (its title: 900 MHz to 100 GHz). */
export const P1238_MIN_FREQ_MHz: MHz = 900;
export const P1238_MAX_FREQ_MHz: MHz = 100_000;
/** The model holds from 1 m (eq. (1): d > 1 m). */
export const P1238_MIN_DISTANCE_m: Meters = 1;

/** Catalog default N = 30, P.1238-7 Table 2's office value at 1.8–2 GHz (DESIGN.md §2). */
export const DEFAULT_DISTANCE_POWER = 30;
/**
 * Range of the distance power loss coefficient N that the model is used
 * with. P.1238-7 Table 2 gives N from 17 (60 GHz, commercial) to 33
 * (900 MHz, office), 28–31 at 2.4–5.2 GHz (from memory of the table); the
 * upper bound 40 is N = 10·4, the inverse-fourth-power decay of the two-ray
 * ground reflection model (Rappaport, Wireless Communications, 2nd ed.,
 * §4.6, from memory), the steepest distance power of the common models, for
 * dense buildings where a planner chooses more than the table. A value
 * under 10 is most likely the path loss exponent n (N = 10·n), so the
 * message says so: REACH with 3 instead of 30 would answer 372 507 426 m.
 */
export const DISTANCE_POWER_MIN = 17;
export const DISTANCE_POWER_MAX = 40;

/** The model's arguments after checks. */
interface IndoorModel {
  readonly freqMHz: MHz;
  readonly distancePower: number;
  readonly floors: number;
  /** L_f(n), dB: Table 3's office value, or floors × floor_loss_db when that is given. */
  readonly floorPenetrationDb: Db;
  /** walls × wall_loss_db (walls.ts), dB; 0 with no walls. */
  readonly wallsDb: Db;
}

/** Guards, not model limits: no building has more floors; no floor takes more loss. */
const INDOOR_MAX_FLOORS = 200;
const INDOOR_MAX_FLOOR_LOSS_dB: Db = 200;
const INDOOR_MAX_DISTANCE_m: Meters = 1e6;
/** eirp_dbm, target_dbm and rx_gain_dbi are levels a planner can meet: ±300 dB keeps REACH finite. */
const LEVEL_LIMIT_dB = 300;

// Refusals out of line, so the checks stay small enough to inline (src/core/args.ts).
function outsideBands(f: number): never {
  invalid(`freq_mhz: ${P1238_EDITION} covers ${P1238_MIN_FREQ_MHz} to ${P1238_MAX_FREQ_MHz} MHz, got ${f}`);
}
function badDistancePower(n: number): never {
  const exponentHint = n > 0 && n < 10 ? `; ${n} looks like the path loss exponent n, and N = 10·n (${10 * n})` : "";
  invalid(
    `distance_power: the coefficient N must be from ${DISTANCE_POWER_MIN} to ${DISTANCE_POWER_MAX} ` +
      `(ITU-R P.1238-7 Table 2 gives 17–33; 40 is a fourth-power decay), got ${n}${exponentHint}`,
  );
}
function belowModel(d: number): never {
  invalid(`distance_m: the P.1238 model holds from ${P1238_MIN_DISTANCE_m} m, got ${d}`);
}

function readModel(freqMHz: unknown, distancePower: unknown, floors: unknown, floorLossDb: unknown, walls: unknown, wallLossDb: unknown): IndoorModel {
  const f = finiteNumber("freq_mhz", freqMHz);
  if (f < P1238_MIN_FREQ_MHz || f > P1238_MAX_FREQ_MHz) outsideBands(f);
  const n = optionalNumber("distance_power", distancePower, DEFAULT_DISTANCE_POWER);
  if (!(n >= DISTANCE_POWER_MIN && n <= DISTANCE_POWER_MAX)) badDistancePower(n);
  const nFloors = atMost("floors", wholeNonNegative("floors", optionalNumber("floors", floors, 0)), INDOOR_MAX_FLOORS, "");
  return {
    freqMHz: f,
    distancePower: n,
    floors: nFloors,
    floorPenetrationDb: floorPenetrationDb(f, nFloors, floorLossDb),
    wallsDb: wallsLossDb(f, walls, wallLossDb),
  };
}

/**
 * L_f(n), dB. With floor_loss_db omitted: ITU-R P.1238-7 Table 3's floor
 * penetration loss factor for an office at this frequency (officeFloorLossDb,
 * from memory), which grows by less than its first-floor value per extra
 * floor (1.8–2 GHz: 15 + 4(n − 1), so 3 floors cost 23 dB, not 45); #VALUE!
 * where the table has no value. With floor_loss_db given: floors ×
 * floor_loss_db, a constant loss per floor that the user chose.
 */
function floorPenetrationDb(freqMHz: number, floors: number, floorLossDb: unknown): Db {
  if (isMissing(floorLossDb)) return officeFloorLossDb(freqMHz, floors);
  const perFloor = atMost("floor_loss_db", nonNegative("floor_loss_db", finiteNumber("floor_loss_db", floorLossDb), "dB"), INDOOR_MAX_FLOOR_LOSS_dB, "dB");
  return floors * perFloor;
}

/** 20·log10(f) − 28 + L_f(n) + walls × wall loss: every term except the distance term, dB. */
function lossAtOneMetreDb(model: IndoorModel): Db {
  return 20 * Math.log10(model.freqMHz) + P1238_CONSTANT_dB + model.floorPenetrationDb + model.wallsDb;
}

/**
 * INDOORLOSS: ITU-R P.1238-7 site-general indoor path loss, dB (eq. (1)
 * above) with L_f(n) from Table 3 (office) or floors × floor_loss_db, plus
 * walls × wall_loss_db (walls.ts; the default per-wall loss is common
 * practice for a plasterboard partition).
 *
 * Planning estimate only (see the module note): not a replacement for a site
 * survey; local regulations, codes and licensed practice decide.
 *
 * Example: indoorLossDb(20, 5200) → 20·log10(5200) − 28 + 30·log10(20) = 85.35 dB.
 */
export function indoorLossDb(
  distanceM: unknown,
  freqMHz: unknown,
  distancePower?: unknown,
  floors?: unknown,
  floorLossDb?: unknown,
  walls?: unknown,
  wallLossDb?: unknown,
): Db {
  const d = atMost("distance_m", finiteNumber("distance_m", distanceM), INDOOR_MAX_DISTANCE_m, "m");
  if (d < P1238_MIN_DISTANCE_m) belowModel(d);
  const model = readModel(freqMHz, distancePower, floors, floorLossDb, walls, wallLossDb);
  return lossAtOneMetreDb(model) + model.distancePower * Math.log10(d);
}

/**
 * REACH: the distance, m, at which the received level falls to `target_dbm`
 * under INDOORLOSS — eq. (1) solved for d:
 *   target = eirp + rx_gain − L_total(d)
 *   d = 10^((eirp + rx_gain − target − 20·log10(f) + 28 − L_f(n) − walls × wall_loss) ÷ N)
 * When the target is above the level received at 1 m (where the model
 * starts), there is no distance: #VALUE! ("target_dbm above the signal at 1 m").
 *
 * The EIRP is the user's figure; this function does not check it against any
 * regulatory limit and never proposes a power. Planning estimate only: not a
 * replacement for a site survey; local regulations, codes and licensed
 * practice decide.
 *
 * Example: reachM(20, -67, 5200) → 10^((20 + 67 − 74.32 + 28) ÷ 30) = 22.7 m.
 */
export function reachM(
  eirpDbm: unknown,
  targetDbm: unknown,
  freqMHz: unknown,
  distancePower?: unknown,
  floors?: unknown,
  floorLossDb?: unknown,
  rxGainDbi?: unknown,
  walls?: unknown,
  wallLossDb?: unknown,
): Meters {
  const eirp: Dbm = numberInRange("eirp_dbm", eirpDbm, -LEVEL_LIMIT_dB, LEVEL_LIMIT_dB, "dBm");
  const target: Dbm = numberInRange("target_dbm", targetDbm, -LEVEL_LIMIT_dB, LEVEL_LIMIT_dB, "dBm");
  const model = readModel(freqMHz, distancePower, floors, floorLossDb, walls, wallLossDb);
  const rxGain: Db = isMissing(rxGainDbi) ? 0 : numberInRange("rx_gain_dbi", rxGainDbi, -LEVEL_LIMIT_dB, LEVEL_LIMIT_dB, "dBi");
  const atOneMetre: Dbm = eirp + rxGain - lossAtOneMetreDb(model);
  if (target > atOneMetre) {
    invalid(
      `target_dbm: ${target} dBm is above the signal at 1 m (${round2(atOneMetre)} dBm from eirp_dbm ${eirp}, ` +
        `rx_gain_dbi ${rxGain} and the loss at 1 m); the model starts at 1 m, so use a lower target or a higher EIRP within your local limits`,
    );
  }
  const d = Math.pow(10, (atOneMetre - target) / model.distancePower);
  if (!Number.isFinite(d)) invalid(`target_dbm: the distance overflows (${eirp} − ${target} dB over N = ${model.distancePower}); check the arguments`);
  return d;
}

function round2(x: number): number {
  return Math.round(x * 100) / 100;
}
