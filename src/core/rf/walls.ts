/**
 * Walls between an access point and a client, for INDOORLOSS and REACH:
 * walls × a loss per wall, added to ITU-R P.1238's site-general loss
 * (which has a floor term but no wall term: its N already averages the walls
 * of a typical building of its class, so counting walls on top is the
 * planner's choice of a more pessimistic, wall-by-wall estimate).
 *
 * The default loss per wall is common practice, not a standard's value:
 * an interior plasterboard (drywall) partition on studs, 3 dB up to 3 GHz and
 * 4 dB from 3 to 7.125 GHz (the top of the 6 GHz band). Other materials,
 * common practice, at 2.4 / 5 GHz per wall:
 *   clear glass 2 / 3 dB, wooden door 3 / 4 dB, plasterboard 3 / 4 dB,
 *   brick 6 / 10 dB, concrete block 10 / 15 dB, poured concrete 15 / 20 dB
 *   or more, metal (lift shafts, fire doors, coated glass) 20 dB or more.
 * Real walls differ widely with their build: a site survey decides.
 */
import { finiteNumber, isMissing } from "../args";
import { invalid } from "../errors";
import type { Db, MHz } from "../units";
import { atMost, nonNegative, optionalNumber, wholeNonNegative } from "./_lib";

/** Default loss per wall, dB (common practice: interior plasterboard partition), by the highest frequency it serves. */
export const COMMON_WALL_LOSS_dB: readonly { readonly upToMHz: MHz; readonly lossDb: Db }[] = [
  { upToMHz: 3000, lossDb: 3 },
  { upToMHz: 7125, lossDb: 4 },
];

/** Guards, not model limits: no path crosses more walls; no wall takes more loss. */
const MAX_WALLS = 200;
const MAX_WALL_LOSS_dB: Db = 100;

function noDefaultWallLoss(freqMHz: MHz): never {
  const top = COMMON_WALL_LOSS_dB[COMMON_WALL_LOSS_dB.length - 1].upToMHz;
  invalid(`wall_loss_db: no common-practice wall loss above ${top} MHz (got ${freqMHz} MHz); give the loss per wall in dB`);
}

/** The common-practice loss of one plasterboard wall at this frequency, dB (#VALUE! above 7.125 GHz). */
export function commonWallLossDb(freqMHz: MHz): Db {
  const row = COMMON_WALL_LOSS_dB.find((r) => freqMHz <= r.upToMHz);
  if (!row) noDefaultWallLoss(freqMHz);
  return row.lossDb;
}

/**
 * The wall term, dB: walls × wall_loss_db, with wall_loss_db omitted the
 * common-practice plasterboard value for the frequency. walls omitted → 0
 * (and then no default loss is needed at any frequency).
 *
 *   wallsLossDb(5200, 3) → 3 × 4 = 12 dB;   wallsLossDb(2437, 2, 6) → 12 dB
 */
export function wallsLossDb(freqMHz: MHz, walls: unknown, wallLossDb: unknown): Db {
  // The common case — no walls given — stays a comparison, so INDOORLOSS without walls costs what it did.
  if (isMissing(walls) && isMissing(wallLossDb)) return 0;
  return checkedWallsLossDb(freqMHz, walls, wallLossDb);
}

function checkedWallsLossDb(freqMHz: MHz, walls: unknown, wallLossDb: unknown): Db {
  const n = atMost("walls", wholeNonNegative("walls", optionalNumber("walls", walls, 0)), MAX_WALLS, "walls");
  const perWall = isMissing(wallLossDb)
    ? n === 0
      ? 0
      : commonWallLossDb(freqMHz)
    : atMost("wall_loss_db", nonNegative("wall_loss_db", finiteNumber("wall_loss_db", wallLossDb), "dB"), MAX_WALL_LOSS_dB, "dB");
  return n * perWall;
}
