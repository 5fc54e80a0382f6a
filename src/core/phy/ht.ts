/**
 * HT PHY, IEEE 802.11-2020 Clause 19 (802.11n): 20 and 40 MHz channels in the
 * 2.4 GHz and 5 GHz bands, 1–4 spatial streams, HT MCS 0–76, long (0.8 µs) or
 * short (0.4 µs) guard interval, BCC or LDPC, optional STBC, HT-mixed (MF) or
 * HT-greenfield (GF) format.
 *
 * TXTIME (19.4.3):
 *   HT-mixed:      T_LEG_PREAMBLE + T_L-SIG + T_HT-SIG + T_HT-PREAMBLE + T_SYM × N_SYM            (long GI)
 *                  T_LEG_PREAMBLE + T_L-SIG + T_HT-SIG + T_HT-PREAMBLE + T_SYM × ⌈T_SYMS × N_SYM ÷ T_SYM⌉ (short GI)
 *   HT-greenfield: T_GF-HT-PREAMBLE + T_HT-SIG + T_SYM × N_SYM   (long GI)
 *                  T_GF-HT-PREAMBLE + T_HT-SIG + T_SYMS × N_SYM  (short GI, no rounding)
 *   each + SignalExtension (6 µs) in the 2.4 GHz band.
 * N_SYM (19.3.11.5 BCC, 19.3.11.7.5 LDPC):
 *   BCC:  N_SYM = m_STBC × ⌈(8·LENGTH + 16 + 6·N_ES) ÷ (m_STBC · N_DBPS)⌉
 *   LDPC: N_SYM = N_avbits ÷ N_CBPS after the codeword/shortening/puncturing procedure.
 * The equations are cited by clause; their printed equation numbers were not
 * checked against the 2020 edition here.
 *
 * The VHT module (vht.ts) reuses the symbol timing, the LDPC procedure and
 * the sensitivity rows from here and adds only what Clause 21 changes.
 */
import type { Link } from "../link";
import type { Bytes, Dbm, MbPerSecond, MHz, Microseconds } from "../units";
import type { PhyFamily, TxTime, TxTimeTerm } from "./types";
import { invalid, noAnswer } from "../errors";
import {
  L_LTF,
  L_SIG,
  L_STF,
  MCS_MODULATION,
  dataBitsPerSymbol,
  durationTerm,
  factorTerm,
  nonHtReferenceRateFor,
  preambleTerms,
  signalExtensionUs,
  txtimeFromTerms,
  type CodeRate,
  type PreambleField,
} from "./_lib";
import { N_SERVICE_bits, N_TAIL_bits } from "./ofdm";

// ---------------------------------------------------------------------------
// Timing-related constants (19.3.6, the HT timing-related constants table)
// ---------------------------------------------------------------------------

/** T_SYM, µs: symbol interval with the long (0.8 µs) guard interval (19.3.6). */
export const T_SYM_us: Microseconds = 4;
/** T_SYMS, µs: symbol interval with the short (0.4 µs) guard interval (19.3.6). */
export const T_SYMS_us: Microseconds = 3.6;
/** T_GI and T_GIS, µs: the two guard intervals HT and VHT data symbols may use (19.3.6, 21.3.6). */
export const T_GI_us: Microseconds = 0.8;
export const T_GIS_us: Microseconds = 0.4;

/** Preamble fields as data (19.3.6, 19.3.9): durations in µs. */
export const HT_SIG: PreambleField = ["HT-SIG", 8]; // T_HT-SIG: two 4 µs symbols
export const HT_STF: PreambleField = ["HT-STF", 4]; // T_HT-STF (HT-mixed)
export const HT_GF_STF: PreambleField = ["HT-GF-STF", 8]; // T_HT-GF-STF (greenfield)
/** T_HT-LTF1 in greenfield: 8 µs (double guard interval plus two long training symbols). */
export const T_HT_LTF1_GF_us: Microseconds = 8;
/** T_HT-LTFs: every other HT-LTF, and the first one in HT-mixed format, 4 µs. */
export const T_HT_LTFs_us: Microseconds = 4;

/** Symbol interval for a guard interval, µs. */
export function symbolUs(giUs: Microseconds): Microseconds {
  return giUs === T_GIS_us ? T_SYMS_us : T_SYM_us;
}

/**
 * Data field duration, µs, for N_SYM symbols. With the short GI the HT-mixed
 * and VHT equations round up to the 4 µs symbol boundary of the legacy
 * receivers that read L-SIG (T_SYM × ⌈T_SYMS × N_SYM ÷ T_SYM⌉); greenfield
 * does not round. Integer nanoseconds keep 3.6 × N exact.
 */
export function dataFieldUs(nSym: number, giUs: Microseconds, roundToLongSymbol: boolean): Microseconds {
  const tSymNs = T_SYM_us * 1000;
  const tSymsNs = T_SYMS_us * 1000;
  if (giUs !== T_GIS_us) return (nSym * tSymNs) / 1000;
  if (!roundToLongSymbol) return (nSym * tSymsNs) / 1000;
  return (tSymNs * Math.ceil((tSymsNs * nSym) / tSymNs)) / 1000;
}

// ---------------------------------------------------------------------------
// MCS tables (Tables 19-27…19-41)
// ---------------------------------------------------------------------------

/** PHY characteristics (19.5, the HT PHY characteristics table): aPSDUMaxLength = 65 535 octets (16-bit HT-SIG LENGTH). */
export const aPSDUMaxLength_HT: Bytes = 2 ** 16 - 1;

/** N_SD, data subcarriers per OFDM symbol: 52 at 20 MHz, 108 at 40 MHz (19.3.7, Tables 19-27…19-41). */
export const HT_N_SD: Readonly<Record<number, number>> = { 20: 52, 40: 108 };
/** MCS 32 is a 40 MHz duplicate of one 20 MHz BPSK stream with 48 data subcarriers (the MCS 32 table, 19.5). */
export const N_SD_MCS32 = 48;

type HtModulation = "BPSK" | "QPSK" | "16-QAM" | "64-QAM";
const N_BPSCS: Readonly<Record<HtModulation, number>> = { BPSK: 1, QPSK: 2, "16-QAM": 4, "64-QAM": 6 };
const R1_2: CodeRate = [1, 2];
const R3_4: CodeRate = [3, 4];

/** One HT MCS: the modulation of each spatial stream (in stream order) and the code rate shared by all. */
export interface HtMcs {
  readonly index: number;
  readonly streamModulations: readonly HtModulation[];
  readonly codeRate: CodeRate;
}

/**
 * Unequal modulation MCS 33–76 (Tables 19-36…19-41 give them at 20 and
 * 40 MHz; the per-stream modulations are the same in both): one row each.
 */
const UNEQUAL_MCS: readonly HtMcs[] = [
  // 2 spatial streams (Tables 19-36 at 20 MHz, 19-39 at 40 MHz)
  { index: 33, streamModulations: ["16-QAM", "QPSK"], codeRate: R1_2 },
  { index: 34, streamModulations: ["64-QAM", "QPSK"], codeRate: R1_2 },
  { index: 35, streamModulations: ["64-QAM", "16-QAM"], codeRate: R1_2 },
  { index: 36, streamModulations: ["16-QAM", "QPSK"], codeRate: R3_4 },
  { index: 37, streamModulations: ["64-QAM", "QPSK"], codeRate: R3_4 },
  { index: 38, streamModulations: ["64-QAM", "16-QAM"], codeRate: R3_4 },
  // 3 spatial streams (Tables 19-37 at 20 MHz, 19-40 at 40 MHz)
  { index: 39, streamModulations: ["16-QAM", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 40, streamModulations: ["16-QAM", "16-QAM", "QPSK"], codeRate: R1_2 },
  { index: 41, streamModulations: ["64-QAM", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 42, streamModulations: ["64-QAM", "16-QAM", "QPSK"], codeRate: R1_2 },
  { index: 43, streamModulations: ["64-QAM", "16-QAM", "16-QAM"], codeRate: R1_2 },
  { index: 44, streamModulations: ["64-QAM", "64-QAM", "QPSK"], codeRate: R1_2 },
  { index: 45, streamModulations: ["64-QAM", "64-QAM", "16-QAM"], codeRate: R1_2 },
  { index: 46, streamModulations: ["16-QAM", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 47, streamModulations: ["16-QAM", "16-QAM", "QPSK"], codeRate: R3_4 },
  { index: 48, streamModulations: ["64-QAM", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 49, streamModulations: ["64-QAM", "16-QAM", "QPSK"], codeRate: R3_4 },
  { index: 50, streamModulations: ["64-QAM", "16-QAM", "16-QAM"], codeRate: R3_4 },
  { index: 51, streamModulations: ["64-QAM", "64-QAM", "QPSK"], codeRate: R3_4 },
  { index: 52, streamModulations: ["64-QAM", "64-QAM", "16-QAM"], codeRate: R3_4 },
  // 4 spatial streams (Tables 19-38 at 20 MHz, 19-41 at 40 MHz)
  { index: 53, streamModulations: ["16-QAM", "QPSK", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 54, streamModulations: ["16-QAM", "16-QAM", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 55, streamModulations: ["16-QAM", "16-QAM", "16-QAM", "QPSK"], codeRate: R1_2 },
  { index: 56, streamModulations: ["64-QAM", "QPSK", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 57, streamModulations: ["64-QAM", "16-QAM", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 58, streamModulations: ["64-QAM", "16-QAM", "16-QAM", "QPSK"], codeRate: R1_2 },
  { index: 59, streamModulations: ["64-QAM", "16-QAM", "16-QAM", "16-QAM"], codeRate: R1_2 },
  { index: 60, streamModulations: ["64-QAM", "64-QAM", "QPSK", "QPSK"], codeRate: R1_2 },
  { index: 61, streamModulations: ["64-QAM", "64-QAM", "16-QAM", "QPSK"], codeRate: R1_2 },
  { index: 62, streamModulations: ["64-QAM", "64-QAM", "16-QAM", "16-QAM"], codeRate: R1_2 },
  { index: 63, streamModulations: ["64-QAM", "64-QAM", "64-QAM", "QPSK"], codeRate: R1_2 },
  { index: 64, streamModulations: ["64-QAM", "64-QAM", "64-QAM", "16-QAM"], codeRate: R1_2 },
  { index: 65, streamModulations: ["16-QAM", "QPSK", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 66, streamModulations: ["16-QAM", "16-QAM", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 67, streamModulations: ["16-QAM", "16-QAM", "16-QAM", "QPSK"], codeRate: R3_4 },
  { index: 68, streamModulations: ["64-QAM", "QPSK", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 69, streamModulations: ["64-QAM", "16-QAM", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 70, streamModulations: ["64-QAM", "16-QAM", "16-QAM", "QPSK"], codeRate: R3_4 },
  { index: 71, streamModulations: ["64-QAM", "16-QAM", "16-QAM", "16-QAM"], codeRate: R3_4 },
  { index: 72, streamModulations: ["64-QAM", "64-QAM", "QPSK", "QPSK"], codeRate: R3_4 },
  { index: 73, streamModulations: ["64-QAM", "64-QAM", "16-QAM", "QPSK"], codeRate: R3_4 },
  { index: 74, streamModulations: ["64-QAM", "64-QAM", "16-QAM", "16-QAM"], codeRate: R3_4 },
  { index: 75, streamModulations: ["64-QAM", "64-QAM", "64-QAM", "QPSK"], codeRate: R3_4 },
  { index: 76, streamModulations: ["64-QAM", "64-QAM", "64-QAM", "16-QAM"], codeRate: R3_4 },
];

export const HT_MCS_MAX = 76;
/** MCS 32: the 40 MHz duplicate format (one stream, BPSK R = 1/2). */
export const HT_MCS_DUPLICATE = 32;

/**
 * The HT MCS `index`: MCS 0–31 are the per-stream MCS (index mod 8, the rows
 * of MCS_MODULATION 0–7) on ⌊index ÷ 8⌋ + 1 equally modulated streams
 * (Tables 19-27…19-34); 32 is the duplicate format; 33–76 unequal modulation.
 */
export function htMcs(index: number): HtMcs {
  if (!Number.isInteger(index) || index < 0 || index > HT_MCS_MAX) {
    invalid(`link: HT MCS index must be 0–${HT_MCS_MAX} (MCS0–31 equal modulation, MCS32 40 MHz duplicate, MCS33–76 unequal modulation), got MCS${index}`);
  }
  if (index <= 31) {
    const m = MCS_MODULATION[index % 8];
    const nSs = Math.floor(index / 8) + 1;
    return { index, streamModulations: Array<HtModulation>(nSs).fill(m.modulation as HtModulation), codeRate: m.codeRate };
  }
  if (index === HT_MCS_DUPLICATE) return { index, streamModulations: ["BPSK"], codeRate: R1_2 };
  return UNEQUAL_MCS[index - 33];
}

/** Spatial streams N_SS an HT MCS index implies (19.3.5; Tables 19-27…19-41). Called by the link parser. */
export function htImpliedStreams(index: number): number {
  return htMcs(index).streamModulations.length;
}

/** Σ N_BPSCS(i) over the spatial streams: N_SS × N_BPSCS for equal modulation. */
function bitsPerSubcarrierAllStreams(mcs: HtMcs): number {
  return mcs.streamModulations.reduce((sum, m) => sum + N_BPSCS[m], 0);
}

/** Symbol parameters of one link: what the TXTIME and rate equations need. */
export interface SymbolParams {
  /** N_SD, data subcarriers. */
  readonly nSd: number;
  /** N_CBPS, coded bits per OFDM symbol (all streams). */
  readonly nCbps: number;
  /** N_DBPS, data bits per OFDM symbol (all streams). */
  readonly nDbps: number;
  readonly codeRate: CodeRate;
  /** N_ES, BCC encoders (1 for LDPC). */
  readonly nEs: number;
}

/**
 * N_ES for BCC: the N_ES column of Tables 19-27…19-41 rises by one for each
 * 1200 data bits per symbol (one encoder per 300 Mb/s at the 4 µs symbol):
 * 2 for MCS 21–23 and 28–31 at 40 MHz, 1 for every 20 MHz MCS. The rows for
 * unequal modulation MCS 33–76 follow the same rule (not checked row by row
 * against the tables).
 */
export const HT_N_DBPS_PER_BCC_ENCODER = 1200;

/** N_SD, N_CBPS, N_DBPS and N_ES of an HT link. */
export function htSymbolParams(link: Link): SymbolParams {
  const mcs = htMcs(link.mcs!);
  const nSd = mcs.index === HT_MCS_DUPLICATE ? N_SD_MCS32 : HT_N_SD[link.widthMHz];
  const bits = bitsPerSubcarrierAllStreams(mcs);
  const nCbps = nSd * bits;
  // The shared formula N_SD × N_BPSCS × R × N_SS with Σ N_BPSCS over streams in place of N_BPSCS × N_SS.
  const nDbps = dataBitsPerSymbol(nSd, bits, mcs.codeRate, 1);
  const nEs = link.coding === "LDPC" ? 1 : Math.ceil(nDbps / HT_N_DBPS_PER_BCC_ENCODER);
  return { nSd, nCbps, nDbps, codeRate: mcs.codeRate, nEs };
}

// ---------------------------------------------------------------------------
// Space-time streams and training fields
// ---------------------------------------------------------------------------

/** m_STBC: 2 with STBC (symbols go in Alamouti pairs), else 1 (19.3.11.5). */
export function mStbc(stbc: boolean): 1 | 2 {
  return stbc ? 2 : 1;
}

/** N_STS: space-time streams; STBC doubles the spatial streams (N_STS = 2·N_SS, Table 19-18 rows used here). */
export function spaceTimeStreams(link: Link): number {
  return link.stbc ? 2 * link.streams : link.streams;
}

/**
 * N_LTF (data HT-LTFs) from N_STS, 19.3.9.4.6 (Table 19-12, table number from
 * memory): 1→1, 2→2, 3→4, 4→4. Extension HT-LTFs (sounding extra dimensions)
 * are not modelled.
 */
export const HT_N_LTF: Readonly<Record<number, number>> = { 1: 1, 2: 2, 3: 4, 4: 4 };

/** Preamble fields of an HT PPDU in order of transmission. */
export function htPreambleFields(link: Link): PreambleField[] {
  const nLtf = HT_N_LTF[spaceTimeStreams(link)];
  const fields: PreambleField[] = [];
  if (link.greenfield) {
    // T_GF-HT-PREAMBLE = T_HT-GF-STF + T_HT-LTF1 + (N_LTF − 1) × T_HT-LTFs, with HT-SIG after HT-LTF1 (19.3.9.2).
    fields.push(HT_GF_STF, ["HT-LTF1", T_HT_LTF1_GF_us], HT_SIG);
  } else {
    // T_LEG_PREAMBLE + T_L-SIG + T_HT-SIG + T_HT-PREAMBLE, T_HT-PREAMBLE = T_HT-STF + N_LTF × T_HT-LTF.
    fields.push(L_STF, L_LTF, L_SIG, HT_SIG, HT_STF, ["HT-LTF1", T_HT_LTFs_us]);
  }
  for (let i = 2; i <= nLtf; i++) fields.push([`HT-LTF${i}`, T_HT_LTFs_us]);
  return fields;
}

// ---------------------------------------------------------------------------
// LDPC PPDU encoding (19.3.11.7.5), shared with VHT (21.3.10.5.4)
// ---------------------------------------------------------------------------

/** Codeword count, length and the shortening/puncturing that fit N_pld payload bits into N_avbits. */
export interface LdpcCodewords {
  /** N_CW, LDPC codewords. */
  readonly nCw: number;
  /** L_LDPC, codeword length, bits (648, 1296 or 1944). */
  readonly lLdpc: number;
  /** N_shrt, shortening bits. */
  readonly nShrt: number;
  /** N_punc, punctured bits before any extra symbol. */
  readonly nPunc: number;
  /** True when puncturing would be excessive, so the standard adds symbols (N_avbits += N_CBPS × m_STBC). */
  readonly extraSymbol: boolean;
}

/**
 * Steps (c)–(e) of 19.3.11.7.5: choose N_CW and L_LDPC from N_avbits (the
 * PPDU encoding parameters table of that subclause), compute N_shrt and
 * N_punc, and decide whether N_avbits must grow by one STBC symbol group.
 * Exact integer arithmetic: every product with R is a whole number here.
 */
export function ldpcCodewords(nPld: number, nAvbits: number, codeRate: CodeRate): LdpcCodewords {
  const [num, den] = codeRate;
  const parity = den - num; // (1 − R) × den
  // N_avbits ≥ N_pld + K × (1 − R)  ⇔  (N_avbits − N_pld) × den ≥ K × (den − num)
  const roomFor = (k: number) => (nAvbits - nPld) * den >= k * parity;
  let nCw: number;
  let lLdpc: number;
  if (nAvbits <= 648) {
    nCw = 1;
    lLdpc = roomFor(912) ? 1296 : 648;
  } else if (nAvbits <= 1296) {
    nCw = 1;
    lLdpc = roomFor(1464) ? 1944 : 1296;
  } else if (nAvbits <= 1944) {
    nCw = 1;
    lLdpc = 1944;
  } else if (nAvbits <= 2592) {
    nCw = 2;
    lLdpc = roomFor(2916) ? 1944 : 1296;
  } else {
    nCw = Math.ceil((nPld * den) / (1944 * num)); // ⌈N_pld ÷ (1944 × R)⌉
    lLdpc = 1944;
  }
  const infoBits = (nCw * lLdpc * num) / den; // N_CW × L_LDPC × R
  const nShrt = Math.max(0, infoBits - nPld);
  const nPunc = Math.max(0, nCw * lLdpc - nAvbits - nShrt);
  // (N_punc > 0.1 × N_CW × L_LDPC × (1 − R) AND N_shrt < 1.2 × N_punc × R ÷ (1 − R)) OR N_punc > 0.3 × N_CW × L_LDPC × (1 − R)
  const parityBits = nCw * lLdpc * parity; // × 1/den
  const extraSymbol =
    (10 * nPunc * den > parityBits && 10 * nShrt * parity < 12 * nPunc * num) || 10 * nPunc * den > 3 * parityBits;
  return { nCw, lLdpc, nShrt, nPunc, extraSymbol };
}

/** The LDPC symbol count of an HT PPDU and the terms that explain it. */
export interface LdpcSymbols {
  readonly nSym: number;
  readonly codewords: LdpcCodewords;
  readonly nAvbits: number;
}

/**
 * HT LDPC (19.3.11.7.5): N_pld = 8·LENGTH + 16; N_avbits = N_CBPS × m_STBC ×
 * ⌈N_pld ÷ (N_CBPS × R × m_STBC)⌉, plus N_CBPS × m_STBC when puncturing is
 * excessive; N_SYM = N_avbits ÷ N_CBPS.
 */
export function htLdpcSymbols(psduBytes: Bytes, p: SymbolParams, m: number): LdpcSymbols {
  const nPld = 8 * psduBytes + N_SERVICE_bits;
  let nAvbits = p.nCbps * m * Math.ceil(nPld / (p.nDbps * m)); // N_CBPS × R = N_DBPS
  const codewords = ldpcCodewords(nPld, nAvbits, p.codeRate);
  if (codewords.extraSymbol) nAvbits += p.nCbps * m;
  return { nSym: nAvbits / p.nCbps, codewords, nAvbits };
}

/** BCC: N_SYM = m_STBC × ⌈(8·LENGTH + 16 + 6·N_ES) ÷ (m_STBC · N_DBPS)⌉ (19.3.11.5; 21.3.10.5.2 with APEP_LENGTH). */
export function bccSymbols(psduBytes: Bytes, nDbps: number, nEs: number, m: number): number {
  return m * Math.ceil((8 * psduBytes + N_SERVICE_bits + N_TAIL_bits * nEs) / (m * nDbps));
}

/** Audit terms of the LDPC encoding process (19.3.11.7.5): codewords, shortening, puncturing, extra symbol. */
export function ldpcCodewordTerms(codewords: LdpcCodewords, m: number): TxTimeTerm[] {
  return [
    factorTerm("N_CW (LDPC codewords)", codewords.nCw),
    factorTerm("L_LDPC (bits)", codewords.lLdpc),
    factorTerm("N_shrt (bits)", codewords.nShrt),
    factorTerm("N_punc (bits)", codewords.nPunc),
    factorTerm("LDPC extra symbol", codewords.extraSymbol ? m : 0),
  ];
}

/** Explanatory terms for the data field's symbol count (BCC or LDPC). */
export function dataSymbolTerms(link: Link, psduBytes: Bytes, p: SymbolParams, m: number): { nSym: number; terms: TxTimeTerm[] } {
  const terms: TxTimeTerm[] = [factorTerm("N_DBPS (bits)", p.nDbps)];
  if (link.stbc) terms.push(factorTerm("m_STBC", m));
  if (link.coding === "LDPC") {
    const l = htLdpcSymbols(psduBytes, p, m);
    terms.push(factorTerm("N_CBPS (bits)", p.nCbps), ...ldpcCodewordTerms(l.codewords, m), factorTerm("N_SYM", l.nSym));
    return { nSym: l.nSym, terms };
  }
  const nSym = bccSymbols(psduBytes, p.nDbps, p.nEs, m);
  const padding = nSym * p.nDbps - (8 * psduBytes + N_SERVICE_bits + N_TAIL_bits * p.nEs);
  terms.push(factorTerm("N_ES", p.nEs), factorTerm("N_SYM", nSym), factorTerm("padding bits", padding));
  return { nSym, terms };
}

// ---------------------------------------------------------------------------
// Sensitivity and non-HT reference rate
// ---------------------------------------------------------------------------

/**
 * Receiver minimum input sensitivity at 20 MHz, dBm, per modulation and code
 * rate in the order of per-stream MCS 0–7 (Table 19-23). The 40 MHz column of
 * the table is 3 dB higher, as is each doubling of width in VHT (Table 21-25).
 */
export const MIN_SENSITIVITY_20MHZ_DBM: readonly Dbm[] = [-82, -79, -77, -74, -70, -66, -65, -64];

/** A 20 MHz sensitivity moved to a wider channel: +3 dB per doubling (Tables 19-23, 21-25). */
export function sensitivityAtWidth(dbm20: Dbm, widthMHz: MHz): Dbm {
  return dbm20 + 3 * Math.log2(widthMHz / 20);
}

function isUnequal(mcs: HtMcs): boolean {
  return mcs.index > HT_MCS_DUPLICATE;
}

/** The per-stream MCS 0–7 row (MCS_MODULATION) of an equally modulated HT MCS. */
function perStreamRow(mcs: HtMcs): number {
  return mcs.index === HT_MCS_DUPLICATE ? 0 : mcs.index % 8;
}

// ---------------------------------------------------------------------------
// Validation
// ---------------------------------------------------------------------------

export const HT_WIDTHS_MHZ: readonly MHz[] = [20, 40];
/** STBC (19.3.11.9.2): N_STS = 2·N_SS is modelled for N_SS ≤ 2 (N_STS ≤ 4). */
export const HT_STBC_MAX_STREAMS = 2;

function validateHt(link: Link): void {
  if (link.bandGHz !== 2.4 && link.bandGHz !== 5) {
    invalid(`link: HT operates in the 2.4GHz and 5GHz bands, not ${link.bandGHz}GHz`);
  }
  const mcs = htMcs(link.mcs!);
  if (link.streams !== mcs.streamModulations.length) {
    invalid(`link: HT MCS${mcs.index} carries ${mcs.streamModulations.length} spatial stream(s), not ${link.streams}SS`);
  }
  if (!HT_WIDTHS_MHZ.includes(link.widthMHz)) invalid(`link: HT channels are 20MHz or 40MHz wide, got ${link.widthMHz}MHz`);
  if (link.giUs !== T_GI_us && link.giUs !== T_GIS_us) invalid(`link: HT guard interval is GI0.8 (long) or GI0.4 (short), got GI${link.giUs}`);
  if (mcs.index === HT_MCS_DUPLICATE && link.widthMHz !== 40) {
    invalid(`link: HT MCS32 is the 40 MHz duplicate format and exists only at 40MHz; at 20MHz use MCS0`);
  }
  if (link.stbc && link.streams > HT_STBC_MAX_STREAMS) {
    invalid(`link: HT STBC is modelled for 1 or 2 spatial streams (N_STS = 2 × N_SS ≤ 4); MCS${mcs.index} has ${link.streams}`);
  }
}

// ---------------------------------------------------------------------------
// The family module
// ---------------------------------------------------------------------------

function htTxtime(link: Link, psduBytes: Bytes): TxTime {
  const p = htSymbolParams(link);
  const m = mStbc(link.stbc);
  const terms: TxTimeTerm[] = preambleTerms(htPreambleFields(link));
  const tSym = symbolUs(link.giUs!);
  if (psduBytes === 0) {
    // An HT-SIG LENGTH of 0 is an NDP: no Data field (19.3.13).
    terms.push(factorTerm("N_SYM (NDP: no Data field)", 0));
  } else {
    const data = dataSymbolTerms(link, psduBytes, p, m);
    terms.push(...data.terms, factorTerm(link.giUs === T_GIS_us ? "T_SYMS (µs)" : "T_SYM (µs)", tSym));
    const roundUp = !link.greenfield; // HT-mixed ends on a 4 µs boundary for legacy receivers
    terms.push(durationTerm("Data", dataFieldUs(data.nSym, link.giUs!, roundUp)));
  }
  const ext = signalExtensionUs(link.bandGHz);
  if (ext > 0) terms.push(durationTerm("Signal extension", ext));
  return txtimeFromTerms(terms);
}

function htSensitivity(link: Link): Dbm {
  const mcs = htMcs(link.mcs!);
  if (isUnequal(mcs)) {
    noAnswer(`link: IEEE 802.11-2020 Table 19-23 gives minimum sensitivity for MCS0–32 only, not for the unequal modulation MCS${mcs.index}`);
  }
  return sensitivityAtWidth(MIN_SENSITIVITY_20MHZ_DBM[perStreamRow(mcs)], link.widthMHz);
}

/**
 * Non-HT reference rate (10.6.6.5.2) of the MCS's modulation and code rate.
 * Unequal modulation MCS take the densest constellation among their streams
 * (common practice; not checked against the standard's table).
 */
function htNonHtReferenceRate(link: Link): MbPerSecond {
  const mcs = htMcs(link.mcs!);
  const densest = Math.max(...mcs.streamModulations.map((m) => N_BPSCS[m]));
  return nonHtReferenceRateFor(densest, mcs.codeRate);
}

function htRate(link: Link): MbPerSecond {
  return htSymbolParams(link).nDbps / symbolUs(link.giUs!);
}

/** MCS offered to a best-MCS search: 0–32 (33–76 have no minimum sensitivity in Table 19-23). */
const HT_SEARCH_MCS: readonly number[] = Array.from({ length: HT_MCS_DUPLICATE + 1 }, (_, i) => i);

export const ht: PhyFamily = {
  family: "HT",
  validate: validateHt,
  rateMbps: htRate,
  txtime: htTxtime,
  maxPsduBytes: () => aPSDUMaxLength_HT,
  sensitivityDbm: htSensitivity,
  nonHtReferenceRateMbps: htNonHtReferenceRate,
  mcsValues: HT_SEARCH_MCS,
  impliedStreams: htImpliedStreams,
};
