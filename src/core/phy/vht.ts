/**
 * VHT PHY, IEEE 802.11-2020 Clause 21 (802.11ac): 5 GHz band only, 20, 40,
 * 80 and 160 MHz channels (80+80 MHz is not modelled), 1–8 spatial streams,
 * per-stream MCS 0–9, long (0.8 µs) or short (0.4 µs) guard interval, BCC or
 * LDPC, optional STBC. Single-user PPDUs.
 *
 * What VHT changes from HT (ht.ts), and only that, lives here: the subcarrier
 * counts of the wider channels, 256-QAM, the forbidden MCS/width/stream
 * combinations, the N_ES rule and its exceptions, the VHT preamble fields,
 * the VHT-LTF count and the LDPC symbol count with APEP_LENGTH.
 *
 * TXTIME (21.4.3):
 *   T_LEG_PREAMBLE + T_L-SIG + T_VHT-SIG-A + T_VHT-PREAMBLE + T_VHT-SIG-B + T_SYM × N_SYM            (long GI)
 *   T_LEG_PREAMBLE + T_L-SIG + T_VHT-SIG-A + T_VHT-PREAMBLE + T_VHT-SIG-B + T_SYM × ⌈T_SYMS × N_SYM ÷ T_SYM⌉ (short GI)
 *   T_VHT-PREAMBLE = T_VHT-STF + N_VHT-LTF × T_VHT-LTF
 * N_SYM with APEP_LENGTH (the psdu_bytes argument is taken as APEP_LENGTH,
 * the A-MPDU before the PHY's end-of-frame padding):
 *   BCC:  m_STBC × ⌈(8·APEP_LENGTH + 16 + 6·N_ES) ÷ (m_STBC · N_DBPS)⌉ (21.3.10.5.2)
 *   LDPC: the same with N_ES = 0, then one STBC symbol group more when the
 *         LDPC procedure of 19.3.11.7.5 would puncture too much (21.3.10.5.4).
 */
import type { Link } from "../link";
import type { Bytes, Dbm, MbPerSecond, MHz } from "../units";
import type { PhyFamily, TxTime, TxTimeTerm } from "./types";
import { invalid } from "../errors";
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
  txtimeFromTerms,
  type PreambleField,
} from "./_lib";
import {
  MIN_SENSITIVITY_20MHZ_DBM as HT_MIN_SENSITIVITY_20MHZ_DBM,
  T_GI_us,
  T_GIS_us,
  bccSymbols,
  dataFieldUs,
  ldpcCodewords,
  ldpcCodewordTerms,
  mStbc,
  sensitivityAtWidth,
  spaceTimeStreams,
  symbolUs,
  type LdpcCodewords,
  type SymbolParams,
} from "./ht";
import { N_SERVICE_bits } from "./ofdm";

/** VHT PHY characteristics (Table 21-29): aPSDUMaxLength = 4 692 480 octets. */
export const aPSDUMaxLength_VHT: Bytes = 4_692_480;

/** N_SD, data subcarriers per OFDM symbol (21.3.7; Tables 21-30…21-61). */
export const VHT_N_SD: Readonly<Record<number, number>> = { 20: 52, 40: 108, 80: 234, 160: 468 };
export const VHT_WIDTHS_MHZ: readonly MHz[] = [20, 40, 80, 160];
export const VHT_MAX_STREAMS = 8;
export const VHT_MCS_MAX = 9;
/** STBC (21.3.10.9.4): N_STS = 2·N_SS, so at most 4 spatial streams. */
export const VHT_STBC_MAX_STREAMS = 4;

/** Preamble fields (21.3.8; timing constants of 21.3.6), µs. */
export const VHT_SIG_A: PreambleField = ["VHT-SIG-A", 8]; // T_VHT-SIG-A: two 4 µs symbols
export const VHT_STF: PreambleField = ["VHT-STF", 4]; // T_VHT-STF
export const VHT_SIG_B: PreambleField = ["VHT-SIG-B", 4]; // T_VHT-SIG-B
/** T_VHT-LTF: each VHT-LTF symbol, µs. */
export const T_VHT_LTF_us = 4;

/**
 * N_VHT-LTF from N_STS,total (21.3.8.3.5, Table 21-13 — table number from
 * memory): 1→1, 2→2, 3→4, 4→4, 5→6, 6→6, 7→8, 8→8. HE reuses this count for
 * N_STS ≤ 8.
 */
export const N_VHT_LTF: Readonly<Record<number, number>> = { 1: 1, 2: 2, 3: 4, 4: 4, 5: 6, 6: 6, 7: 8, 8: 8 };

/** Table number of the VHT MCS table for a width and N_SS: 21-30…21-37 at 20 MHz, then 8 tables per width. */
export function vhtTableNumber(widthMHz: MHz, nSs: number): string {
  return `21-${30 + 8 * VHT_WIDTHS_MHZ.indexOf(widthMHz) + nSs - 1}`;
}

/** A (width, N_SS, MCS) cell of the VHT MCS tables. */
interface VhtCell {
  readonly widthMHz: MHz;
  readonly nSs: number;
  readonly mcs: number;
}

/**
 * Combinations the VHT MCS tables leave out (Tables 21-30…21-61): with them
 * N_DBPS, or N_DBPS or N_CBPS divided among the N_ES encoders, is not a whole
 * number of bits.
 */
export const VHT_UNDEFINED: readonly VhtCell[] = [
  { widthMHz: 20, nSs: 1, mcs: 9 }, // Table 21-30: N_DBPS = 52 × 8 × 5/6 = 346.67
  { widthMHz: 20, nSs: 2, mcs: 9 }, // Table 21-31: N_DBPS = 693.33
  { widthMHz: 20, nSs: 4, mcs: 9 }, // Table 21-33: N_DBPS = 1386.67
  { widthMHz: 20, nSs: 5, mcs: 9 }, // Table 21-34: N_DBPS = 1733.33
  { widthMHz: 20, nSs: 7, mcs: 9 }, // Table 21-36: N_DBPS = 2426.67
  { widthMHz: 20, nSs: 8, mcs: 9 }, // Table 21-37: N_DBPS = 2773.33
  { widthMHz: 80, nSs: 3, mcs: 6 }, // Table 21-48: N_DBPS 3159 is odd, N_ES = 2
  { widthMHz: 80, nSs: 7, mcs: 6 }, // Table 21-52: N_DBPS 7371 does not split over N_ES = 4
  { widthMHz: 80, nSs: 6, mcs: 9 }, // Table 21-51: N_CBPS 11232 does not split over N_ES = 5
  { widthMHz: 160, nSs: 3, mcs: 9 }, // Table 21-56: N_CBPS 11232 does not split over N_ES = 5
];

/**
 * N_ES rule of the VHT MCS tables: one BCC encoder per 2160 data bits per
 * symbol (600 Mb/s at the 3.6 µs short-GI symbol, 540 Mb/s at 4 µs) …
 */
export const VHT_N_DBPS_PER_BCC_ENCODER = 2160;

/**
 * … except where that count would not divide N_DBPS and N_CBPS evenly; the
 * tables then list a larger N_ES. One row each (Tables 21-30…21-61).
 */
export const VHT_N_ES_EXCEPTIONS: readonly (VhtCell & { readonly nEs: number })[] = [
  { widthMHz: 80, nSs: 7, mcs: 2, nEs: 3 }, // Table 21-52: N_DBPS 2457, rule gives 2
  { widthMHz: 80, nSs: 7, mcs: 7, nEs: 6 }, // Table 21-52: N_DBPS 8190, rule gives 4
  { widthMHz: 80, nSs: 7, mcs: 8, nEs: 6 }, // Table 21-52: N_DBPS 9828, rule gives 5
  { widthMHz: 80, nSs: 8, mcs: 7, nEs: 6 }, // Table 21-53: N_DBPS 9360, rule gives 5
  { widthMHz: 160, nSs: 4, mcs: 7, nEs: 6 }, // Table 21-57: N_DBPS 9360, rule gives 5
  { widthMHz: 160, nSs: 5, mcs: 8, nEs: 8 }, // Table 21-58: N_DBPS 14040, rule gives 7
  { widthMHz: 160, nSs: 6, mcs: 7, nEs: 8 }, // Table 21-59: N_DBPS 14040, rule gives 7
  { widthMHz: 160, nSs: 7, mcs: 4, nEs: 6 }, // Table 21-60: N_DBPS 9828, rule gives 5
  { widthMHz: 160, nSs: 7, mcs: 7, nEs: 9 }, // Table 21-60: N_DBPS 16380, rule gives 8
  { widthMHz: 160, nSs: 7, mcs: 8, nEs: 12 }, // Table 21-60: N_DBPS 19656, rule gives 10
  { widthMHz: 160, nSs: 7, mcs: 9, nEs: 12 }, // Table 21-60: N_DBPS 21840, rule gives 11
  { widthMHz: 160, nSs: 8, mcs: 5, nEs: 8 }, // Table 21-61: N_DBPS 14976, rule gives 7
  { widthMHz: 160, nSs: 8, mcs: 8, nEs: 12 }, // Table 21-61: N_DBPS 22464, rule gives 11
];

function sameCell(a: VhtCell, b: VhtCell): boolean {
  return a.widthMHz === b.widthMHz && a.nSs === b.nSs && a.mcs === b.mcs;
}

/** True when the VHT MCS tables define this MCS at this width and stream count. */
export function vhtCombinationDefined(widthMHz: MHz, nSs: number, mcs: number): boolean {
  return !VHT_UNDEFINED.some((c) => sameCell(c, { widthMHz, nSs, mcs }));
}

/** N_ES with BCC for a cell of the VHT MCS tables. */
export function vhtBccEncoders(widthMHz: MHz, nSs: number, mcs: number, nDbps: number): number {
  const exception = VHT_N_ES_EXCEPTIONS.find((c) => sameCell(c, { widthMHz, nSs, mcs }));
  return exception ? exception.nEs : Math.ceil(nDbps / VHT_N_DBPS_PER_BCC_ENCODER);
}

/** N_SD, N_CBPS, N_DBPS, R and N_ES of a VHT link. */
export function vhtSymbolParams(link: Link): SymbolParams {
  const { nBpscs, codeRate } = MCS_MODULATION[link.mcs!];
  const nSd = VHT_N_SD[link.widthMHz];
  const nCbps = nSd * nBpscs * link.streams;
  const nDbps = dataBitsPerSymbol(nSd, nBpscs, codeRate, link.streams);
  const nEs = link.coding === "LDPC" ? 1 : vhtBccEncoders(link.widthMHz, link.streams, link.mcs!, nDbps);
  return { nSd, nCbps, nDbps, codeRate, nEs };
}

/** VHT LDPC symbol count and the codeword terms behind it. */
export interface VhtLdpcSymbols {
  readonly nSym: number;
  readonly nSymInit: number;
  readonly codewords: LdpcCodewords;
}

/**
 * VHT LDPC (21.3.10.5.4): N_SYM,init = m_STBC × ⌈(8·APEP_LENGTH + 16) ÷
 * (m_STBC · N_DBPS)⌉, N_pld = N_SYM,init × N_DBPS, N_avbits = N_SYM,init ×
 * N_CBPS; the codeword steps of 19.3.11.7.5; N_SYM = N_SYM,init + m_STBC when
 * they ask for an extra symbol (the LDPC Extra OFDM Symbol bit of VHT-SIG-A2).
 */
export function vhtLdpcSymbols(apepBytes: Bytes, p: SymbolParams, m: number): VhtLdpcSymbols {
  const nSymInit = m * Math.ceil((8 * apepBytes + N_SERVICE_bits) / (m * p.nDbps));
  const codewords = ldpcCodewords(nSymInit * p.nDbps, nSymInit * p.nCbps, p.codeRate);
  return { nSym: nSymInit + (codewords.extraSymbol ? m : 0), nSymInit, codewords };
}

function vhtDataTerms(link: Link, apepBytes: Bytes, p: SymbolParams, m: number): { nSym: number; terms: TxTimeTerm[] } {
  const terms: TxTimeTerm[] = [factorTerm("N_DBPS (bits)", p.nDbps)];
  if (link.stbc) terms.push(factorTerm("m_STBC", m));
  if (link.coding === "LDPC") {
    const l = vhtLdpcSymbols(apepBytes, p, m);
    terms.push(
      factorTerm("N_CBPS (bits)", p.nCbps),
      factorTerm("N_SYM,init", l.nSymInit),
      ...ldpcCodewordTerms(l.codewords, m),
      factorTerm("N_SYM", l.nSym),
    );
    return { nSym: l.nSym, terms };
  }
  const nSym = bccSymbols(apepBytes, p.nDbps, p.nEs, m);
  terms.push(factorTerm("N_ES", p.nEs), factorTerm("N_SYM", nSym));
  return { nSym, terms };
}

/** Preamble fields of a VHT SU PPDU in order of transmission. */
export function vhtPreambleFields(link: Link): PreambleField[] {
  const nLtf = N_VHT_LTF[spaceTimeStreams(link)];
  const fields: PreambleField[] = [L_STF, L_LTF, L_SIG, VHT_SIG_A, VHT_STF];
  for (let i = 1; i <= nLtf; i++) fields.push([`VHT-LTF${i}`, T_VHT_LTF_us]);
  fields.push(VHT_SIG_B);
  return fields;
}

function vhtTxtime(link: Link, apepBytes: Bytes): TxTime {
  const terms: TxTimeTerm[] = preambleTerms(vhtPreambleFields(link));
  if (apepBytes === 0) {
    // An NDP carries no Data field (21.3.4; N_SYM = 0 in 21.4.3).
    terms.push(factorTerm("N_SYM (NDP: no Data field)", 0));
    return txtimeFromTerms(terms);
  }
  const p = vhtSymbolParams(link);
  const data = vhtDataTerms(link, apepBytes, p, mStbc(link.stbc));
  terms.push(...data.terms, factorTerm(link.giUs === T_GIS_us ? "T_SYMS (µs)" : "T_SYM (µs)", symbolUs(link.giUs!)));
  terms.push(durationTerm("Data", dataFieldUs(data.nSym, link.giUs!, true)));
  return txtimeFromTerms(terms);
}

/**
 * Minimum input sensitivity at 20 MHz for VHT MCS 0–9, dBm (Table 21-25):
 * MCS 0–7 as HT (Table 19-23), then 256-QAM R = 3/4 and 5/6.
 */
export const VHT_MIN_SENSITIVITY_20MHZ_DBM: readonly Dbm[] = [...HT_MIN_SENSITIVITY_20MHZ_DBM, -59, -57];

function streamsText(n: number): string {
  return n === 1 ? "1 spatial stream" : `${n} spatial streams`;
}

/** The stream counts at which `mcs` is defined at `widthMHz`, as text ("3 or 6"). */
function definedStreamsText(widthMHz: MHz, mcs: number): string {
  const ok: number[] = [];
  for (let n = 1; n <= VHT_MAX_STREAMS; n++) if (vhtCombinationDefined(widthMHz, n, mcs)) ok.push(n);
  return ok.length === 1 ? `${ok[0]}` : `${ok.slice(0, -1).join(", ")} or ${ok[ok.length - 1]}`;
}

function validateVht(link: Link): void {
  if (link.bandGHz !== 5) invalid(`link: VHT operates in the 5GHz band only, not ${link.bandGHz}GHz`);
  const mcs = link.mcs!;
  if (!Number.isInteger(mcs) || mcs < 0 || mcs > VHT_MCS_MAX) invalid(`link: VHT MCS must be 0–${VHT_MCS_MAX}, got MCS${mcs}`);
  if (!Number.isInteger(link.streams) || link.streams < 1 || link.streams > VHT_MAX_STREAMS) {
    invalid(`link: VHT carries 1–${VHT_MAX_STREAMS} spatial streams, got ${link.streams}SS`);
  }
  if (!VHT_WIDTHS_MHZ.includes(link.widthMHz)) {
    invalid(`link: VHT channels are 20MHz, 40MHz, 80MHz or 160MHz wide (80+80 is not modelled), got ${link.widthMHz}MHz`);
  }
  if (link.giUs !== T_GI_us && link.giUs !== T_GIS_us) invalid(`link: VHT guard interval is GI0.8 (long) or GI0.4 (short), got GI${link.giUs}`);
  if (link.stbc && link.streams > VHT_STBC_MAX_STREAMS) {
    invalid(`link: VHT STBC needs N_STS = 2 × N_SS ≤ 8, so at most ${VHT_STBC_MAX_STREAMS} spatial streams; got ${link.streams}SS`);
  }
  if (!vhtCombinationDefined(link.widthMHz, link.streams, mcs)) {
    invalid(
      `link: VHT MCS${mcs} is not defined at ${link.widthMHz} MHz with ${streamsText(link.streams)}; ` +
        `at ${link.widthMHz} MHz it needs ${definedStreamsText(link.widthMHz, mcs)} spatial streams, ` +
        `or use another MCS (IEEE 802.11-2020 Table ${vhtTableNumber(link.widthMHz, link.streams)})`,
    );
  }
}

const VHT_MCS_VALUES: readonly number[] = Array.from({ length: VHT_MCS_MAX + 1 }, (_, i) => i);

export const vht: PhyFamily = {
  family: "VHT",
  validate: validateVht,
  rateMbps: (link: Link): MbPerSecond => vhtSymbolParams(link).nDbps / symbolUs(link.giUs!),
  txtime: vhtTxtime,
  maxPsduBytes: () => aPSDUMaxLength_VHT,
  sensitivityDbm: (link: Link): Dbm => sensitivityAtWidth(VHT_MIN_SENSITIVITY_20MHZ_DBM[link.mcs!], link.widthMHz),
  nonHtReferenceRateMbps: (link: Link): MbPerSecond => {
    const { nBpscs, codeRate } = MCS_MODULATION[link.mcs!];
    return nonHtReferenceRateFor(nBpscs, codeRate);
  },
  mcsValues: VHT_MCS_VALUES,
};
