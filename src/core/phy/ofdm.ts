/**
 * OFDM PHYs with one 20 MHz channel:
 * - OFDM, IEEE 802.11-2020 Clause 17, in the 5 GHz and 6 GHz bands, 20 MHz
 *   channel spacing only (the half- and quarter-clocked 10 MHz and 5 MHz
 *   channel spacings of Clause 17 are not modelled).
 * - ERP-OFDM, IEEE 802.11-2020 Clause 18: the same modulation in the 2.4 GHz
 *   band, followed by aSignalExtension (6 µs) of no transmission.
 *
 * TXTIME (17.4.3, eq. (17-29); ERP: 18.5.x, from memory):
 *   TXTIME = T_PREAMBLE + T_SIGNAL + T_SYM × Ceiling((16 + 8 × LENGTH + 6) ÷ N_DBPS) [+ aSignalExtension]
 * 16 is the SERVICE field and 6 the BCC tail, in bits; LENGTH in octets.
 */
import type { Link } from "../link";
import type { Bytes, Dbm, MbPerSecond, Microseconds } from "../units";
import type { PhyFamily, TxTime } from "./types";
import { invalid } from "../errors";
import {
  L_LTF,
  L_SIG,
  L_STF,
  dataBitsPerSymbol,
  dataRateMbps,
  durationTerm,
  factorTerm,
  preambleDurationUs,
  preambleTerms,
  signalExtensionUs,
  txtimeFromTerms,
  type CodeRate,
} from "./_lib";

/** T_FFT, µs: IFFT/FFT period (Table 17-5, 20 MHz spacing). */
export const T_FFT_us: Microseconds = 3.2;
/** T_GI, µs: guard interval of a data symbol (Table 17-5). */
export const T_GI_us: Microseconds = 0.8;
/** T_SYM = T_GI + T_FFT = 4 µs (Table 17-5). */
export const T_SYM_us: Microseconds = T_GI_us + T_FFT_us;
/** N_SD: data subcarriers (Table 17-5). */
export const N_SD = 48;
/** T_PREAMBLE = L-STF + L-LTF = 16 µs (Table 17-5). */
export const T_PREAMBLE_us: Microseconds = preambleDurationUs([L_STF, L_LTF]);
/** T_SIGNAL: the SIGNAL (L-SIG) symbol, 4 µs (Table 17-5). */
export const T_SIGNAL_us: Microseconds = preambleDurationUs([L_SIG]);
/** SERVICE field, bits (17.3.5.2). */
export const N_SERVICE_bits = 16;
/** BCC tail bits, N_tail (17.3.5.3). */
export const N_TAIL_bits = 6;
/** LENGTH is a 12-bit field, so aPSDUMaxLength = 2^12 − 1 = 4095 octets (17.3.4.3, Table 17-21 OFDM PHY characteristics). */
export const aPSDUMaxLength_OFDM: Bytes = 2 ** 12 - 1;

/** One row of Table 17-4 (rate-dependent parameters) with its Table 17-18 minimum sensitivity. */
export interface OfdmRate {
  /** Data rate at 20 MHz channel spacing, Mb/s (the link's rate token). */
  readonly rateMbps: MbPerSecond;
  readonly modulation: "BPSK" | "QPSK" | "16-QAM" | "64-QAM";
  /** N_BPSC, coded bits per subcarrier. */
  readonly nBpsc: number;
  readonly codeRate: CodeRate;
  /** Minimum input sensitivity at 20 MHz, dBm (Table 17-18). */
  readonly sensitivityDbm: Dbm;
}

/** IEEE 802.11-2020 Table 17-4 (N_BPSC, R) and Table 17-18 (minimum sensitivity, 20 MHz spacing). */
export const OFDM_RATES: readonly OfdmRate[] = [
  { rateMbps: 6, modulation: "BPSK", nBpsc: 1, codeRate: [1, 2], sensitivityDbm: -82 },
  { rateMbps: 9, modulation: "BPSK", nBpsc: 1, codeRate: [3, 4], sensitivityDbm: -81 },
  { rateMbps: 12, modulation: "QPSK", nBpsc: 2, codeRate: [1, 2], sensitivityDbm: -79 },
  { rateMbps: 18, modulation: "QPSK", nBpsc: 2, codeRate: [3, 4], sensitivityDbm: -77 },
  { rateMbps: 24, modulation: "16-QAM", nBpsc: 4, codeRate: [1, 2], sensitivityDbm: -74 },
  { rateMbps: 36, modulation: "16-QAM", nBpsc: 4, codeRate: [3, 4], sensitivityDbm: -70 },
  { rateMbps: 48, modulation: "64-QAM", nBpsc: 6, codeRate: [2, 3], sensitivityDbm: -66 },
  { rateMbps: 54, modulation: "64-QAM", nBpsc: 6, codeRate: [3, 4], sensitivityDbm: -65 },
];

const RATE_LIST = OFDM_RATES.map((r) => r.rateMbps);

/** N_CBPS = N_SD × N_BPSC, coded bits per OFDM symbol (Table 17-4). */
export function codedBitsPerSymbol(row: OfdmRate): number {
  return N_SD * row.nBpsc;
}

/** N_DBPS = N_CBPS × R, data bits per OFDM symbol (Table 17-4). */
export function ofdmDataBitsPerSymbol(row: OfdmRate): number {
  return dataBitsPerSymbol(N_SD, row.nBpsc, row.codeRate, 1);
}

/** N_SYM = Ceiling((16 + 8 × LENGTH + 6) ÷ N_DBPS) (17.3.5.4, eq. (17-11), number from memory). */
export function nonHtDataSymbols(psduBytes: Bytes, nDbps: number): number {
  return Math.ceil((N_SERVICE_bits + 8 * psduBytes + N_TAIL_bits) / nDbps);
}

/** The Table 17-4 row of a validated link. */
function rowOf(link: Link): OfdmRate {
  const row = OFDM_RATES.find((r) => r.rateMbps === link.rateMbps);
  if (!row) invalid(`link: ${link.family} has no ${link.rateMbps} Mb/s rate; use ${listOr(RATE_LIST)}`);
  return row;
}

/** "6, 9, … 48 or 54" */
function listOr(values: readonly number[]): string {
  return `${values.slice(0, -1).join(", ")} or ${values[values.length - 1]}`;
}

/** Checks common to Clause 17 and 18: a Table 17-4 rate, one 20 MHz channel, one stream. */
function validateRateAndWidth(link: Link): void {
  const f = link.family;
  if (link.rateMbps === null || !RATE_LIST.includes(link.rateMbps)) {
    const hint =
      link.rateMbps !== null && [1, 2, 5.5, 11].includes(link.rateMbps) ? `; ${link.rateMbps} Mb/s is DSSS/HR-DSSS at 2.4 GHz` : "";
    invalid(`link: ${f} has no ${link.rateMbps} Mb/s rate; use ${listOr(RATE_LIST)}${hint}`);
  }
  if (link.widthMHz === 10 || link.widthMHz === 5) {
    invalid(`link: ${f} at ${link.widthMHz} MHz channel spacing (Clause 17 half/quarter clocking) is not modelled; use 20MHz`);
  }
  if (link.widthMHz !== 20) invalid(`link: ${f} uses 20 MHz channels, got ${link.widthMHz}MHz`);
  if (link.streams !== 1) invalid(`link: ${f} has one spatial stream, got ${link.streams}SS`);
  if (link.preamble !== null) invalid(`link: ${f} has no short/long preamble option; that is DSSS and HR-DSSS`);
}

function validateOfdm(link: Link): void {
  validateRateAndWidth(link);
  if (link.bandGHz === 2.4) invalid(`link: OFDM at 2.4 GHz — that is ERP-OFDM (Clause 18); write "ERP-OFDM ${link.rateMbps}Mbps 2.4GHz"`);
}

function validateErpOfdm(link: Link): void {
  validateRateAndWidth(link);
  if (link.bandGHz !== 2.4) {
    invalid(`link: ERP-OFDM is the 2.4 GHz PHY (Clause 18); at ${link.bandGHz} GHz use OFDM ("OFDM ${link.rateMbps}Mbps ${link.bandGHz}GHz")`);
  }
}

/** TXTIME with its audit terms; the signal extension appears only where the band adds it. */
function txtimeOfdm(link: Link, psduBytes: Bytes): TxTime {
  const row = rowOf(link);
  const nDbps = ofdmDataBitsPerSymbol(row);
  const nSym = nonHtDataSymbols(psduBytes, nDbps);
  const padBits = nSym * nDbps - (N_SERVICE_bits + 8 * psduBytes + N_TAIL_bits); // 17.3.5.4 N_PAD
  const terms = [
    ...preambleTerms([L_STF, L_LTF, L_SIG]),
    factorTerm("N_DBPS (bits)", nDbps),
    factorTerm("pad bits", padBits),
    factorTerm("N_SYM", nSym),
    factorTerm("T_SYM (µs)", T_SYM_us),
    durationTerm("data field", nSym * T_SYM_us),
  ];
  const extension = signalExtensionUs(link.bandGHz);
  if (extension > 0) terms.push(durationTerm("signal extension", extension));
  return txtimeFromTerms(terms);
}

function makeFamily(family: "OFDM" | "ERP-OFDM", validate: (link: Link) => void): PhyFamily {
  return {
    family,
    mcsValues: RATE_LIST,
    validate,
    rateMbps: (link) => {
      const row = rowOf(link);
      return dataRateMbps(N_SD, row.nBpsc, row.codeRate, 1, T_SYM_us);
    },
    txtime: txtimeOfdm,
    maxPsduBytes: () => aPSDUMaxLength_OFDM,
    // Clause 18 (ERP-OFDM receiver) refers to the Clause 17 table, so both use Table 17-18.
    sensitivityDbm: (link) => rowOf(link).sensitivityDbm,
    // Non-HT PHY: the control response rate is chosen against the data rate itself (10.6.6.5).
    nonHtReferenceRateMbps: (link) => rowOf(link).rateMbps,
  };
}

/** OFDM, Clause 17: 6–54 Mb/s at 5 and 6 GHz, 20 MHz channel spacing. */
export const ofdm: PhyFamily = makeFamily("OFDM", validateOfdm);
/** ERP-OFDM, Clause 18: 6–54 Mb/s at 2.4 GHz with the 6 µs signal extension. */
export const erpOfdm: PhyFamily = makeFamily("ERP-OFDM", validateErpOfdm);
