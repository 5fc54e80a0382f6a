/**
 * Helpers shared by the PHY family modules: the one data-rate formula, the
 * preamble-fields-as-data summation, and the TXTIME audit builder.
 */
import type { TxTime, TxTimeTerm } from "./types";
import type { MbPerSecond, Microseconds } from "../units";

/** A code rate R as a fraction, e.g. [5, 6] for R = 5/6. */
export type CodeRate = readonly [number, number];

/**
 * The shared data-rate formula of every OFDM-based PHY:
 * rate = N_SD × N_BPSCS × R × N_SS ÷ T_SYM (bits per µs = Mb/s), equivalently
 * N_DBPS ÷ T_SYM. (IEEE 802.11-2020 Tables 17-4, 19-27…19-41, 21-30…21-61; 802.11ax-2021 Tables 27-55…)
 */
export function dataRateMbps(nSd: number, nBpscs: number, codeRate: CodeRate, nSs: number, tSymUs: Microseconds): MbPerSecond {
  return (nSd * nBpscs * codeRate[0] * nSs) / codeRate[1] / tSymUs;
}

/** N_DBPS = N_SD × N_BPSCS × R × N_SS, data bits per OFDM symbol (an integer for every defined MCS). */
export function dataBitsPerSymbol(nSd: number, nBpscs: number, codeRate: CodeRate, nSs: number): number {
  return (nSd * nBpscs * codeRate[0] * nSs) / codeRate[1];
}

/** A preamble field by the standard's name and its duration, µs (e.g. ["L-STF", 8]). */
export type PreambleField = readonly [name: string, durationUs: Microseconds];

/** Sum of preamble field durations. */
export function preambleDurationUs(fields: readonly PreambleField[]): Microseconds {
  let sum = 0;
  for (const [, us] of fields) sum += us;
  return sum;
}

/** Terms for a list of preamble fields (each a duration that adds to TXTIME). */
export function preambleTerms(fields: readonly PreambleField[]): TxTimeTerm[] {
  return fields.map(([name, us]) => ({ label: `${name} (µs)`, value: us, adds: true }));
}

/** A duration term (adds to TXTIME). */
export function durationTerm(label: string, valueUs: Microseconds): TxTimeTerm {
  return { label: `${label} (µs)`, value: valueUs, adds: true };
}

/** An explanatory term (does not add). The unit, if any, belongs in the label. */
export function factorTerm(label: string, value: number): TxTimeTerm {
  return { label, value, adds: false };
}

/**
 * Build a TxTime from its terms: the total is the sum of the `adds` terms,
 * so the audit and the result cannot drift apart. Rounds away binary noise at
 * 1e-9 µs (sums of 0.4/0.8/3.2 µs terms) so that equal TXTIMEs compare equal.
 */
export function txtimeFromTerms(terms: TxTimeTerm[]): TxTime {
  let total = 0;
  for (const t of terms) if (t.adds) total += t.value;
  return { totalUs: Math.round(total * 1e9) / 1e9, terms };
}

/** Modulation and coding of one per-stream MCS index (VHT, HE and EHT share indices 0–13). */
export interface McsModulation {
  readonly modulation: "BPSK" | "QPSK" | "16-QAM" | "64-QAM" | "256-QAM" | "1024-QAM" | "4096-QAM";
  /** N_BPSCS, coded bits per subcarrier per stream. */
  readonly nBpscs: number;
  readonly codeRate: CodeRate;
}

/**
 * Per-stream MCS 0–13: IEEE 802.11-2020 Table 21-29…21-61 (VHT, 0–9),
 * 802.11ax-2021 27.5 (HE adds 10–11: 1024-QAM), 802.11be-2024 36.5 (EHT adds
 * 12–13: 4096-QAM). HT MCS 0–7 use the first eight rows for each stream.
 */
export const MCS_MODULATION: readonly McsModulation[] = [
  { modulation: "BPSK", nBpscs: 1, codeRate: [1, 2] }, // MCS0
  { modulation: "QPSK", nBpscs: 2, codeRate: [1, 2] }, // MCS1
  { modulation: "QPSK", nBpscs: 2, codeRate: [3, 4] }, // MCS2
  { modulation: "16-QAM", nBpscs: 4, codeRate: [1, 2] }, // MCS3
  { modulation: "16-QAM", nBpscs: 4, codeRate: [3, 4] }, // MCS4
  { modulation: "64-QAM", nBpscs: 6, codeRate: [2, 3] }, // MCS5
  { modulation: "64-QAM", nBpscs: 6, codeRate: [3, 4] }, // MCS6
  { modulation: "64-QAM", nBpscs: 6, codeRate: [5, 6] }, // MCS7
  { modulation: "256-QAM", nBpscs: 8, codeRate: [3, 4] }, // MCS8
  { modulation: "256-QAM", nBpscs: 8, codeRate: [5, 6] }, // MCS9
  { modulation: "1024-QAM", nBpscs: 10, codeRate: [3, 4] }, // MCS10
  { modulation: "1024-QAM", nBpscs: 10, codeRate: [5, 6] }, // MCS11
  { modulation: "4096-QAM", nBpscs: 12, codeRate: [3, 4] }, // MCS12
  { modulation: "4096-QAM", nBpscs: 12, codeRate: [5, 6] }, // MCS13
];

/**
 * Non-HT reference rate of a modulation and coding rate, Mb/s: the rate the
 * control response rules compare against the basic rate set
 * (IEEE 802.11-2020 10.6.6.5.2 and its table of non-HT reference rates).
 * Modulations above 64-QAM map to 54 Mb/s.
 */
export function nonHtReferenceRateFor(nBpscs: number, codeRate: CodeRate): MbPerSecond {
  const r = codeRate[0] / codeRate[1];
  if (nBpscs === 1) return r <= 0.5 ? 6 : 9;
  if (nBpscs === 2) return r <= 0.5 ? 12 : 18;
  if (nBpscs === 4) return r <= 0.5 ? 24 : 36;
  if (nBpscs === 6) return r <= 2 / 3 ? 48 : 54;
  return 54;
}

/**
 * The non-HT (legacy) preamble and signal field that open every OFDM-based
 * PPDU from Clause 17 on: L-STF 8 µs, L-LTF 8 µs, L-SIG 4 µs
 * (IEEE 802.11-2020 17.4.3 T_PREAMBLE = 16 µs, T_SIGNAL = 4 µs; 19.4.3
 * T_LEG_PREAMBLE = 16 µs, T_L-SIG = 4 µs; 20 MHz channel spacing).
 */
export const L_STF: PreambleField = ["L-STF", 8];
export const L_LTF: PreambleField = ["L-LTF", 8];
export const L_SIG: PreambleField = ["L-SIG", 4];

/**
 * aSignalExtension: 6 µs of no transmission after every OFDM-based PPDU in
 * the 2.4 GHz band (IEEE 802.11-2020 Table 18-5 ERP characteristics; 19.4.3
 * "SignalExtension" term for HT at 2.4 GHz; 802.11ax-2021 27.4.3 for HE).
 */
export const aSignalExtension_us: Microseconds = 6;

/** Signal extension of an OFDM-based PPDU in this band, µs. */
export function signalExtensionUs(bandGHz: number): Microseconds {
  return bandGHz === 2.4 ? aSignalExtension_us : 0;
}

/**
 * aPPDUMaxTime, µs: 5.484 ms for VHT (IEEE 802.11-2020 Table 21-28) and HE
 * (802.11ax-2021 27.4.4; EHT keeps it, 802.11be-2024 36.4.4 — from memory);
 * HT mixed-format PPDUs are held to the same by the L-SIG LENGTH field
 * (the HT table's 10 ms applies to greenfield; from memory). DESIGN.md §2
 * applies 5484 µs to every family with A-MPDU.
 */
export const aPPDUMaxTime_us: Microseconds = 5484;
