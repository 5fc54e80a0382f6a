/**
 * Thermal noise floor of a receiver.
 */
import { finiteNumber } from "../args";
import type { Db, Dbm, MHz } from "../units";
import { atLeast, atMost, nonNegative, optionalNumber } from "./_lib";

/**
 * Thermal noise density kT₀ at the standard reference temperature T₀ = 290 K:
 * 1.380649e-23 J/K × 290 K = 4.0e-21 W/Hz = −173.98 dBm/Hz, used as the
 * customary rounded figure −174 dBm/Hz.
 */
export const THERMAL_NOISE_dBm_per_Hz: Dbm = -174;

/** Catalog default receiver noise figure, dB (DESIGN.md §2; common practice for a Wi-Fi client). */
export const DEFAULT_NOISE_FIGURE_dB: Db = 7;

/**
 * NOISEFLOOR: −174 dBm/Hz + 10·log10(width_mhz × 1e6 Hz) + noise figure, dBm.
 *
 * Example: noiseFloorDbm(20) → −174 + 73.01 + 7 = −93.99 dBm.
 */
export function noiseFloorDbm(widthMHz: unknown, noiseFigureDb?: unknown): Dbm {
  // Bounds far outside Wi-Fi (1 Hz to 1 THz, NF up to 100 dB) only keep the result finite.
  const w: MHz = atMost("width_mhz", atLeast("width_mhz", finiteNumber("width_mhz", widthMHz), 1e-6, "MHz"), 1e6, "MHz");
  const nf = atMost("noise_figure_db", nonNegative("noise_figure_db", optionalNumber("noise_figure_db", noiseFigureDb, DEFAULT_NOISE_FIGURE_dB), "dB"), 100, "dB");
  return THERMAL_NOISE_dBm_per_Hz + 10 * Math.log10(w * 1e6) + nf;
}
