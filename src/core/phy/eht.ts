/**
 * EHT PHY (IEEE Std 802.11be-2024, Clause 36). Everything not listed here is
 * HE's (he.ts): symbol timing, GI, LTF symbol durations, N_LTF per N_STS,
 * the pre-FEC padding / LDPC extra symbol / packet extension procedure
 * (36.3.13 repeats 27.3.12), the shared rate formula.
 *
 * What EHT changes:
 * - MCS 0–13 (12 and 13: 4096-QAM), 320 MHz (4×996-tone RU, 6 GHz only).
 * - No STBC, no ER PPDU; DCM exists only as EHT-MCS 15 (and EHT-MCS 14 is
 *   EHT DUP mode): neither is modelled, so both are refused with a message.
 * - The PPDU is the EHT MU PPDU: after L-SIG/RL-SIG come U-SIG (2 symbols)
 *   and EHT-SIG, then EHT-STF, EHT-LTFs, Data and PE (36.3.4).
 *   With the whole channel (no RU token) it is a non-OFDMA transmission to
 *   one user ("EHT SU"); with an RU token it is an OFDMA transmission in
 *   which only that user's RU carries a user field. EHT-SIG is at EHT-SIG
 *   MCS0 (BPSK 1/2), its most robust and longest encoding.
 * - Nominal packet padding of 20 µs (EHT adds it for 4096-QAM) is not in the
 *   link grammar; PE0/PE8/PE16 use the HE table.
 */
import type { Link } from "../link";
import type { PhyFamily, TxTime } from "./types";
import type { Bytes, Dbm, Microseconds } from "../units";
import { MCS_MODULATION, dataBitsPerSymbol, preambleTerms, txtimeFromTerms, type PreambleField } from "./_lib";
import {
  HE_RUS,
  HE_MU_GI_LTF,
  HE_SENSITIVITY_20MHZ_DBM,
  HE_MAX_STREAMS,
  LEGACY_AND_RL_SIG,
  SIG_CRC_bits,
  SIG_MCS0_N_DBPS_bits,
  SIG_TAIL_bits,
  T_HE_STF_NT_us,
  applyRules,
  commonRules,
  giLtfRule,
  largestPsduInPpduMaxTime,
  ltfSymbolUs,
  symbolDurationUs,
  nonHtReferenceRate,
  numerology,
  numerologyRateMbps,
  sensitivityFromTable,
  trainingDataAndPeTerms,
  type RuNumerology,
  type Rule,
} from "./he";

/** EHT RUs: HE's plus the 4×996-tone RU of a 320 MHz channel (N_SD 3920, N_SD,short 984; 36.3.13 — N_SD,short from memory). */
export const EHT_RUS: Readonly<Record<number, RuNumerology>> = {
  ...HE_RUS,
  3984: { tones: 3984, nSd: 3920, nSdShort: 984, nSdDcm: 1960, nSdShortDcm: 492 },
};

/** Whole-channel RU per width (36.3.2): HE's plus 320 MHz → 4×996. */
export const EHT_WHOLE_CHANNEL_RU: Readonly<Record<number, number>> = { 20: 242, 40: 484, 80: 996, 160: 1992, 320: 3984 };

export const EHT_MAX_MCS = 13;
export const EHT_WIDTHS_MHZ: readonly number[] = [20, 40, 80, 160, 320];

/** T_U-SIG: two 4 µs symbols (36.3.12, timing-related parameters). */
export const T_U_SIG_us: Microseconds = 8;
/** T_EHT-SIG: one EHT-SIG symbol, 4 µs. */
export const T_EHT_SIG_us: Microseconds = 4;
/** T_EHT-STF of a non-trigger-based PPDU, 4 µs: the same field length as HE's. */
export const T_EHT_STF_NT_us: Microseconds = T_HE_STF_NT_us;

/**
 * EHT-SIG bit counts (802.11be-2024 36.3.12.8; from memory):
 * - U-SIG overflow in the common field: Spatial Reuse 4, GI+LTF Size 2,
 *   Number of EHT-LTF Symbols 3, LDPC Extra Symbol Segment 1, Pre-FEC
 *   Padding Factor 2, PE Disambiguity 1, Disregard 4 = 17 bits;
 * - non-OFDMA: plus Number of Non-OFDMA Users 3 bits, encoded together with
 *   the first user field;
 * - OFDMA: plus 9-bit RU Allocation subfields per content channel — 1 at
 *   20/40 MHz, 2 at 80 MHz in the first encoding block; at 160 and 320 MHz a
 *   second block with 2 and 6 more, each block closed by CRC and tail;
 * - user field (non-MU-MIMO): STA-ID 11, MCS 4, reserved 1, NSS 4,
 *   Beamformed 1, Coding 1 = 22 bits.
 */
export const EHT_SIG_USIG_OVERFLOW_bits = 17;
const EHT_SIG_NON_OFDMA_USERS_bits = 3;
export const EHT_SIG_RU_ALLOCATION_bits = 9;
export const EHT_SIG_USER_FIELD_bits = 22;
/** RU Allocation subfields per content channel in the first and second encoding blocks. */
export const EHT_SIG_RU_ALLOCATIONS: Readonly<Record<number, readonly [number, number]>> = {
  20: [1, 0],
  40: [1, 0],
  80: [2, 0],
  160: [2, 2],
  320: [2, 6],
};

export const BLOCK_END_bits = SIG_CRC_bits + SIG_TAIL_bits;

/**
 * EHT-SIG symbols for one user at EHT-SIG MCS0 (26 bits per symbol per
 * content channel). Non-OFDMA: common field and the user field in one
 * encoding block, 17 + 3 + 22 + 4 + 6 = 52 bits → 2 symbols at any width.
 * OFDMA: the common field's encoding block(s), then one user field with CRC
 * and tail.
 */
export function ehtSigSymbols(widthMHz: number, ofdma: boolean): number {
  let bits: number;
  if (!ofdma) {
    bits = EHT_SIG_USIG_OVERFLOW_bits + EHT_SIG_NON_OFDMA_USERS_bits + EHT_SIG_USER_FIELD_bits + BLOCK_END_bits;
  } else {
    const [first, second] = EHT_SIG_RU_ALLOCATIONS[widthMHz];
    bits = EHT_SIG_USIG_OVERFLOW_bits + first * EHT_SIG_RU_ALLOCATION_bits + BLOCK_END_bits;
    if (second > 0) bits += second * EHT_SIG_RU_ALLOCATION_bits + BLOCK_END_bits;
    bits += EHT_SIG_USER_FIELD_bits + BLOCK_END_bits;
  }
  return Math.ceil(bits / SIG_MCS0_N_DBPS_bits);
}

/**
 * Minimum input sensitivity at 20 MHz, dBm (802.11be-2024 36.3.21.4
 * receiver minimum input sensitivity table): HE's MCS 0–11 plus MCS 12 −49
 * and MCS 13 −46 (from memory); +3 dB per doubling up to 320 MHz.
 */
export const EHT_SENSITIVITY_20MHZ_DBM: readonly Dbm[] = [...HE_SENSITIVITY_20MHZ_DBM, -49, -46];

/**
 * aPSDUMaxLength for EHT, derived as HE's 6 500 631 octets is
 * (largestPsduInPpduMaxTime in he.ts): N_DBPS,max = 313 600 (4×996 tones,
 * EHT-MCS 13, 8 SS: 3920 × 12 × 5/6 × 8), T_SYM 13.6 µs, shortest EHT MU
 * preamble L-STF 8 + L-LTF 8 + L-SIG 4 + RL-SIG 4 + U-SIG 8 + one EHT-SIG
 * symbol 4 (a non-OFDMA user at a higher EHT-SIG MCS) + EHT-STF 4 + 8
 * EHT-LTFs of 2x + 0.8 µs (7.2 µs each; the EHT MU PPDU has no 1x EHT-LTF)
 * = 97.6 µs: N_SYM = floor(5386.4 ÷ 13.6) = 396, PSDU =
 * floor((396 × 313 600 − 16) ÷ 8) = 15 523 198 octets. Our memory of
 * 802.11be-2024 36.4.4 says 15 523 200 (= 396 × 313 600 ÷ 8, the SERVICE
 * field not subtracted; HE's value without that subtraction would be
 * 6 500 633, not 6 500 631): we keep the derived, smaller value, which never
 * overstates what one PPDU carries.
 */
export const EHT_SHORTEST_PREAMBLE_us: Microseconds = 8 + 8 + 4 + 4 + T_U_SIG_us + T_EHT_SIG_us + T_EHT_STF_NT_us + 8 * ltfSymbolUs(2, 0.8);
export const EHT_aPSDUMaxLength_bytes: Bytes = largestPsduInPpduMaxTime(
  dataBitsPerSymbol(EHT_RUS[3984].nSd, MCS_MODULATION[13].nBpscs, MCS_MODULATION[13].codeRate, HE_MAX_STREAMS),
  EHT_SHORTEST_PREAMBLE_us,
  symbolDurationUs(0.8),
);

const EHT_RULES: readonly Rule[] = [
  commonRules.mcs(EHT_MAX_MCS, " (EHT-MCS 14, EHT DUP, and 15, BPSK-DCM, are not modelled)"),
  commonRules.streams(HE_MAX_STREAMS),
  commonRules.width(EHT_WIDTHS_MHZ),
  commonRules.gi(),
  // 320 MHz channels exist only in the 6 GHz band (36.1.1).
  (l) => (l.widthMHz === 320 && l.bandGHz !== 6 ? `EHT 320 MHz is allowed only at 6 GHz, got ${l.bandGHz}GHz` : null),
  commonRules.band24Width(),
  commonRules.ruFits(EHT_RUS, EHT_WHOLE_CHANNEL_RU),
  // EHT has no extended range PPDU (36.3.4 lists EHT MU and EHT TB only).
  (l) => (l.extendedRange ? "EHT has no extended range (ER) PPDU; ER is for HE" : null),
  // EHT has no STBC (the EHT-SIG user field has no STBC bit; 36.3.13).
  (l) => (l.stbc ? "EHT does not use STBC; drop the STBC option" : null),
  // EHT signals DCM as EHT-MCS 15 (BPSK-DCM), which is not modelled.
  (l) => (l.dcm ? "EHT expresses DCM as EHT-MCS 15 (BPSK-DCM), which is not modelled; drop DCM" : null),
  commonRules.bcc(EHT_RUS, EHT_WHOLE_CHANNEL_RU),
  // EHT MU PPDU: 2x + 0.8, 2x + 1.6, 4x + 0.8, 4x + 3.2 µs (36.3.12.7, U-SIG/EHT-SIG GI+LTF Size field) — HE MU's set.
  giLtfRule("MU PPDU", HE_MU_GI_LTF),
];

/** EHT MU PPDU fields before the EHT-LTFs (36.3.4). */
function ehtPreFields(link: Link): PreambleField[] {
  const ofdma = link.ruTones !== null;
  const nSig = ehtSigSymbols(link.widthMHz, ofdma);
  return [
    ...LEGACY_AND_RL_SIG,
    ["U-SIG", T_U_SIG_us],
    [`EHT-SIG (${nSig} symbols at MCS0, ${ofdma ? "OFDMA" : "non-OFDMA"})`, nSig * T_EHT_SIG_us],
    ["EHT-STF", T_EHT_STF_NT_us],
  ];
}

/**
 * TXTIME of an EHT MU PPDU (802.11be-2024 36.4.3):
 *   TXTIME = 20 + T_RL-SIG + T_U-SIG + N_EHT-SIG·T_EHT-SIG + T_EHT-STF
 *          + N_EHT-LTF·T_EHT-LTF-SYM + N_SYM·T_SYM + T_PE + SignalExtension.
 */
export function ehtTxtime(link: Link, psduBytes: Bytes): TxTime {
  const n = numerology(link, EHT_RUS, EHT_WHOLE_CHANNEL_RU);
  return txtimeFromTerms([...preambleTerms(ehtPreFields(link)), ...trainingDataAndPeTerms(link, n, psduBytes, "EHT-LTF")]);
}

export const eht: PhyFamily = {
  family: "EHT",
  mcsValues: Array.from({ length: EHT_MAX_MCS + 1 }, (_, i) => i),
  validate: (link) => applyRules(EHT_RULES, link),
  rateMbps: (link) => numerologyRateMbps(numerology(link, EHT_RUS, EHT_WHOLE_CHANNEL_RU)),
  txtime: ehtTxtime,
  maxPsduBytes: () => EHT_aPSDUMaxLength_bytes,
  sensitivityDbm: (link) => sensitivityFromTable(link, EHT_SENSITIVITY_20MHZ_DBM, EHT_WHOLE_CHANNEL_RU),
  nonHtReferenceRateMbps: nonHtReferenceRate,
};
