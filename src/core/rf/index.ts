/**
 * RF: path loss (free space, ITU-R P.1238 indoor), its inverse, the thermal
 * noise floor and the best link at a signal level. Results are planning
 * estimates, not a replacement for a site survey; local regulations, codes
 * and licensed practice decide.
 */
export { fsplDb, indoorLossDb, reachM, SPEED_OF_LIGHT_m_per_s, P1238_EDITION, P1238_CONSTANT_dB, DEFAULT_DISTANCE_POWER, DISTANCE_POWER_MIN, DISTANCE_POWER_MAX, FSPL_MIN_WAVELENGTHS } from "./pathLoss";
export { wallsLossDb, commonWallLossDb, COMMON_WALL_LOSS_dB } from "./walls";
export { officeFloorLossDb, P1238_OFFICE_FLOOR_SPANS_MHz } from "./p1238";
export { p1238Coefficients, P1238_TABLES, P1238_BANDS, P1238_ENVIRONMENTS } from "./p1238";
export type { P1238Coefficients, P1238Environment, FloorLossRule } from "./p1238";
export { noiseFloorDbm, THERMAL_NOISE_dBm_per_Hz, DEFAULT_NOISE_FIGURE_dB } from "./noise";
export { topLink } from "./topLink";
