/**
 * Airtally's spreadsheet functions (namespace AIRTALLY). Each wrapper only
 * coerces its arguments, calls `src/core` and maps errors (DESIGN.md §1);
 * no arithmetic lives here. The JSDoc tags generate `functions.json` at build
 * time and the registration calls are appended by the metadata plugin.
 *
 * Function ids are stored in users' workbooks: never rename one; new
 * arguments go at the end.
 */
import * as core from "../core/index";
import { arrayCell, numberCell, textCell } from "./errors";

/**
 * IEEE 802.11 PHY families by their clause names.
 * @customenum {string}
 */
enum PhyFamily {
  /** Clause 15 direct sequence spread spectrum, 1–2 Mb/s */
  DSSS = "DSSS",
  /** Clause 16 high rate DSSS (CCK), 1–11 Mb/s */
  HR_DSSS = "HR-DSSS",
  /** Clause 17 OFDM, 5 and 6 GHz, 6–54 Mb/s */
  OFDM = "OFDM",
  /** Clause 18 ERP-OFDM, 2.4 GHz, 6–54 Mb/s */
  ERP_OFDM = "ERP-OFDM",
  /** Clause 19 HT (802.11n) */
  HT = "HT",
  /** Clause 21 VHT (802.11ac) */
  VHT = "VHT",
  /** HE (802.11ax) */
  HE = "HE",
  /** EHT (802.11be) */
  EHT = "EHT",
}

/**
 * Canonical link text for a PHY configuration, to keep in one cell and point other formulas at.
 * @customfunction LINK
 * @param family PHY family: DSSS, HR-DSSS, OFDM, ERP-OFDM, HT, VHT, HE or EHT
 * @param mcs MCS index (HT: 0–76; VHT 0–9; HE 0–11; EHT 0–13), or the data rate in Mb/s for DSSS, HR-DSSS, OFDM and ERP-OFDM
 * @param [streams] Spatial streams (count), default 1; implied by the MCS index for HT
 * @param [width_mhz] Channel width (MHz): 20, 40, 80, 160 or 320, default 20
 * @param [gi_us] Guard interval (µs): 0.4, 0.8, 1.6 or 3.2, default 0.8
 * @param [band_ghz] Band (GHz): 2.4, 5 or 6, default 5 (2.4 for DSSS, HR-DSSS and ERP-OFDM)
 * @param [phy_options] Options text: LDPC, BCC, STBC, GF, 1xLTF/2xLTF/4xLTF, PE0/PE8/PE16, ER, RU26…RU2x996, DCM, short/long
 * @returns Link text in canonical form (text)
 * @helpurl https://localhost:3000/help/link.html
 */
export function link(
  family: PhyFamily,
  mcs: number,
  streams?: number,
  width_mhz?: number,
  gi_us?: number,
  band_ghz?: number,
  phy_options?: string,
): string {
  return textCell(() => core.buildLink(family, mcs, streams, width_mhz, gi_us, band_ghz, phy_options).text);
}

/**
 * PHY data rate of a link.
 * @customfunction RATE
 * @param link Link text, e.g. "HE MCS9 2SS 80MHz 5GHz" (text)
 * @returns PHY data rate (Mb/s)
 * @example =AIRTALLY.RATE("OFDM 54Mbps 5GHz")
 * @example =AIRTALLY.RATE("HE MCS11 1SS 80MHz GI0.8 5GHz")
 * @remarks N_SD × N_BPSCS × R × N_SS ÷ T_SYM for OFDM-based PHYs (IEEE Std 802.11-2020 Clauses 17–21; IEEE Std 802.11ax-2021; IEEE Std 802.11be-2024 MCS tables).
 * @helpurl https://localhost:3000/help/rate.html
 */
export function rate(link: string): number {
  return numberCell(() => core.rateMbps(link));
}

/**
 * PPDU duration for a PSDU, per the standard's TXTIME equation for the link's PHY.
 * @customfunction TXTIME
 * @param link Link text, e.g. "VHT MCS7 2SS 80MHz 5GHz" (text)
 * @param psdu_bytes PSDU length (bytes), 0 to the family's maximum PSDU length
 * @returns PPDU duration including preamble, padding, packet extension and 2.4 GHz signal extension (µs)
 * @helpurl https://localhost:3000/help/txtime.html
 */
export function txtime(link: string, psdu_bytes: number): number {
  return numberCell(() => core.txtimeUs(link, psdu_bytes));
}

/**
 * Largest PSDU whose TXTIME fits in a duration.
 * @customfunction PSDUFIT
 * @param link Link text (text)
 * @param duration_us Available time (µs)
 * @returns Largest PSDU length that fits (bytes); 0 if none fits
 * @helpurl https://localhost:3000/help/psdufit.html
 */
export function psdufit(link: string, duration_us: number): number {
  return numberCell(() => core.psduFit(link, duration_us));
}

/**
 * The standard's minimum input sensitivity for the link's MCS and width.
 * @customfunction SENSITIVITY
 * @param link Link text (text)
 * @returns Minimum input sensitivity (dBm)
 * @helpurl https://localhost:3000/help/sensitivity.html
 */
export function sensitivity(link: string): number {
  return numberCell(() => core.sensitivityDbm(link));
}

/**
 * The terms that make up a TXTIME, for auditing; spills two columns, total last.
 * @customfunction TXTIMEPARTS
 * @param link Link text (text)
 * @param psdu_bytes PSDU length (bytes)
 * @returns Two columns: term (with its unit) and value; the last row is TXTIME (µs)
 * @helpurl https://localhost:3000/help/txtimeparts.html
 */
export function txtimeparts(link: string, psdu_bytes: number): any[][] {
  return arrayCell(() => core.txtimeTable(link, psdu_bytes));
}
