/**
 * EDCA parameter sets per access category (IEEE 802.11-2020 10.23.2, and
 * Table 9-155 "Default EDCA Parameter Set element parameter values"), the
 * AP's own defaults (`AP`), AP-advertised overrides (`AIFSN=`, `CWMIN=`,
 * `CWMAX=`, `TXOP=`) and legacy DCF access (`DCF`: DIFS, the PHY's
 * aCWmin/aCWmax, no TXOP).
 *
 *   edcaParameters("VO", "OFDM 54Mbps 5GHz")
 *     → { aifsn: 2, cwMin: 3, cwMax: 7, txopLimitUs: 2080, aifsUs: 16 + 2 × 9 = 34, … }
 */
import { invalid } from "../errors";
import { describe, isMissing } from "../args";
import type { Link } from "../link";
import type { Microseconds } from "../units";
import { asLink } from "../phy";
import { parseMacOptions, type MacOptions } from "./options";
import { aCWmax, aCWmin, ackTimeoutUs, aifsFor, difsUs, eifsUs, sifsUs, slotUs } from "./timing";

export type AccessCategory = "BK" | "BE" | "VI" | "VO" | "DCF";
export type Protection = "none" | "RTS" | "CTS";

const ACCESS_CATEGORIES: readonly AccessCategory[] = ["BK", "BE", "VI", "VO", "DCF"];

/** access: BK, BE, VI, VO or DCF (also AC_BE etc.), case-insensitive; empty → BE. */
export function parseAccess(value: unknown): AccessCategory {
  if (isMissing(value)) return "BE";
  if (typeof value === "string") {
    const t = value.trim().toUpperCase().replace(/^AC_/, "");
    const ac = ACCESS_CATEGORIES.find((a) => a === t);
    if (ac) return ac;
  }
  return invalid(`access: expected BK, BE, VI, VO or DCF, got ${describe(value)}`);
}

/** protection: none, RTS or CTS (CTS-to-self), case-insensitive; empty → none. */
export function parseProtection(value: unknown): Protection {
  if (isMissing(value)) return "none";
  if (typeof value === "string") {
    const t = value.trim().toUpperCase();
    if (t === "NONE") return "none";
    if (t === "RTS" || t === "RTS/CTS") return "RTS";
    if (t === "CTS" || t === "CTS-TO-SELF") return "CTS";
  }
  return invalid(`protection: expected none, RTS (RTS/CTS) or CTS (CTS-to-self), got ${describe(value)}`);
}

export interface EdcaParameters {
  readonly access: AccessCategory;
  readonly aifsn: number;
  readonly cwMin: number;
  readonly cwMax: number;
  /** 0 = one MSDU/A-MPDU exchange per TXOP. */
  readonly txopLimitUs: Microseconds;
  readonly slotUs: Microseconds;
  readonly sifsUs: Microseconds;
  /** AIFS[AC] (DIFS under DCF). */
  readonly aifsUs: Microseconds;
  readonly difsUs: Microseconds;
  readonly eifsUs: Microseconds;
  readonly ackTimeoutUs: Microseconds;
  /** Transmission attempts before an MPDU is dropped (RETRY=, default dot11ShortRetryLimit 7). */
  readonly retryLimit: number;
}

type EdcaAc = Exclude<AccessCategory, "DCF">;

/** Non-AP station AIFSN (Table 9-155). */
const STA_AIFSN: Readonly<Record<EdcaAc, number>> = { BK: 7, BE: 3, VI: 2, VO: 2 };
/** AP AIFSN (dot11QAPEDCATable defaults, Annex C; from memory). */
const AP_AIFSN: Readonly<Record<EdcaAc, number>> = { BK: 7, BE: 3, VI: 1, VO: 1 };

/** CWmin per AC from the PHY's aCWmin (Table 9-155): BK/BE aCWmin, VI (aCWmin+1)/2 − 1, VO (aCWmin+1)/4 − 1. */
function defaultCwMin(ac: EdcaAc, cwMinPhy: number): number {
  if (ac === "VI") return (cwMinPhy + 1) / 2 - 1;
  if (ac === "VO") return (cwMinPhy + 1) / 4 - 1;
  return cwMinPhy;
}

/**
 * CWmax per AC (Table 9-155): BK/BE aCWmax, VI aCWmin, VO (aCWmin+1)/2 − 1.
 * The AP's BE CWmax is 4 × (aCWmin + 1) − 1 (dot11QAPEDCATable, from memory);
 * its other CWmax values equal the station's.
 */
function defaultCwMax(ac: EdcaAc, cwMinPhy: number, cwMaxPhy: number, ap: boolean): number {
  if (ac === "VI") return cwMinPhy;
  if (ac === "VO") return (cwMinPhy + 1) / 2 - 1;
  if (ac === "BE" && ap) return 4 * (cwMinPhy + 1) - 1;
  return cwMaxPhy;
}

/**
 * TXOP limit per AC, µs (Table 9-155): BK and BE 0; VI 6.016 ms and VO
 * 3.264 ms for the Clause 15/16 PHYs (DSSS, HR/DSSS); VI 4.096 ms and VO
 * 2.080 ms for the OFDM-based PHYs (Clauses 17, 18, 19, 21, 27, 36). The AP's
 * defaults are the same.
 */
function defaultTxopUs(ac: EdcaAc, link: Link): Microseconds {
  const dsss = link.family === "DSSS" || link.family === "HR-DSSS";
  if (ac === "VI") return dsss ? 6016 : 4096;
  if (ac === "VO") return dsss ? 3264 : 2080;
  return 0;
}

/** dot11ShortRetryLimit default 7 (Annex C MIB; from memory). */
export const DEFAULT_RETRY_LIMIT = 7;

/** EDCA (or DCF) parameters for an already parsed link and options. */
export function edcaFor(access: AccessCategory, link: Link, options: MacOptions): EdcaParameters {
  const cwMinPhy = aCWmin(link);
  const cwMaxPhy = aCWmax(link);
  const sifs = sifsUs(link);
  const slot = slotUs(link, options);
  const difs = difsUs(link, options);
  let aifsn: number;
  let cwMin: number;
  let cwMax: number;
  let txop: Microseconds;
  if (access === "DCF") {
    if (options.aifsn !== null) invalid(`mac_options: AIFSN= is an EDCA setting; DCF waits DIFS. Drop AIFSN= or choose BK, BE, VI or VO`);
    if (options.txopLimitUs !== null) invalid(`mac_options: TXOP= is an EDCA setting; DCF has no TXOP. Drop TXOP= or choose BK, BE, VI or VO`);
    // DIFS = aSIFSTime + 2 × aSlotTime, i.e. an AIFSN of 2.
    aifsn = 2;
    cwMin = options.cwMin ?? cwMinPhy;
    cwMax = options.cwMax ?? cwMaxPhy;
    txop = 0;
  } else {
    aifsn = options.aifsn ?? (options.ap ? AP_AIFSN : STA_AIFSN)[access];
    cwMin = options.cwMin ?? defaultCwMin(access, cwMinPhy);
    cwMax = options.cwMax ?? defaultCwMax(access, cwMinPhy, cwMaxPhy, options.ap);
    txop = options.txopLimitUs ?? defaultTxopUs(access, link);
  }
  if (cwMin > cwMax) {
    invalid(`mac_options: CWmin ${cwMin} would be above CWmax ${cwMax} for ${access}; set both CWMIN= and CWMAX=`);
  }
  return Object.freeze({
    access,
    aifsn,
    cwMin,
    cwMax,
    txopLimitUs: txop,
    slotUs: slot,
    sifsUs: sifs,
    aifsUs: access === "DCF" ? difs : aifsFor(link, options, aifsn),
    difsUs: difs,
    eifsUs: eifsUs(link, options),
    ackTimeoutUs: ackTimeoutUs(link, options),
    retryLimit: options.retryLimit ?? DEFAULT_RETRY_LIMIT,
  });
}

/** EDCA parameters of an access category on a link (used by the contention model). */
export function edcaParameters(access: unknown, link: unknown, macOptions?: unknown): EdcaParameters {
  return edcaFor(parseAccess(access), asLink(link), parseMacOptions(macOptions));
}

/** The link AIFS uses when none is given: OFDM at 5 GHz (SIFS 16 µs, slot 9 µs). Any 5 GHz OFDM rate gives the same AIFS. */
export const AIFS_DEFAULT_LINK = "OFDM 6Mbps 5GHz";

/**
 * AIFS (catalog), µs: aSIFSTime + AIFSN × aSlotTime for the access category
 * on the link's PHY and band (DIFS for DCF).
 *
 *   aifsUs("BE") → 16 + 3 × 9 = 43;   aifsUs("BE", "ERP-OFDM 54Mbps 2.4GHz", "SLOT=20") → 10 + 3 × 20 = 70
 */
export function aifsUs(access: unknown, link?: unknown, macOptions?: unknown): Microseconds {
  return edcaParameters(access, isMissing(link) ? AIFS_DEFAULT_LINK : link, macOptions).aifsUs;
}
