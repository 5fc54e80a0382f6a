/**
 * HE PHY (IEEE Std 802.11ax-2021, Clause 27): data rate, validity, TXTIME with
 * the pre-FEC padding / LDPC extra symbol / packet extension procedure,
 * minimum sensitivity. EHT (eht.ts) reuses the building blocks exported here
 * and adds only what 802.11be-2024 changes.
 *
 * PPDU formats modelled (27.3.4):
 * - HE SU PPDU: the whole channel (ruTones null).
 * - HE ER SU PPDU (`ER`): 20 MHz, the whole 242-tone RU or the upper 106-tone RU.
 * - One user's RU (`RU26`…`RU2x996`): an HE MU PPDU carrying that single user
 *   in OFDMA. Its HE-SIG-B has the common field (RU Allocation signalled, SIG-B
 *   compression off) and one user field, sent at HE-SIG-B MCS0 without DCM —
 *   the most robust (and longest) choice, which a sheet budgeting airtime
 *   should not under-count. Other users of the PPDU are not modelled: with
 *   more users the HE-SIG-B grows and the PPDU lasts as long as its longest user.
 *
 * Not modelled: midambles (N_MA = 0, Doppler off), HE TB PPDUs, MU-MIMO.
 * `psdu_bytes` is taken as APEP_LENGTH, the length the pre-FEC padding
 * equations start from (27.3.12); a PSDU of 0 octets is an empty Data field
 * carrying only the SERVICE bits (and the BCC tail), not an NDP.
 */
import type { Link } from "../link";
import type { PhyFamily, TxTime, TxTimeTerm } from "./types";
import type { Bytes, Dbm, MbPerSecond, Microseconds } from "../units";
import { invalid } from "../errors";
import {
  L_LTF,
  L_SIG,
  L_STF,
  MCS_MODULATION,
  aPPDUMaxTime_us,
  dataBitsPerSymbol,
  durationTerm,
  factorTerm,
  nonHtReferenceRateFor,
  preambleTerms,
  signalExtensionUs,
  txtimeFromTerms,
  type CodeRate,
  type McsModulation,
  type PreambleField,
} from "./_lib";

// ---------------------------------------------------------------------------
// Timing constants, 802.11ax-2021 27.3.8 (timing-related parameters table)
// ---------------------------------------------------------------------------

/** T_DFT,HE: the HE-LTF/Data DFT period, 12.8 µs (78.125 kHz subcarrier spacing). */
export const T_DFT_HE_us: Microseconds = 12.8;
/** T_RL-SIG: the repeated L-SIG, 4 µs. */
export const T_RL_SIG_us: Microseconds = 4;
/** T_HE-SIG-A: 8 µs (two symbols) in HE SU and HE MU PPDUs. */
export const T_HE_SIG_A_us: Microseconds = 8;
/** T_HE-SIG-A-R: 16 µs, HE-SIG-A repeated in the HE ER SU PPDU. */
export const T_HE_SIG_A_R_us: Microseconds = 2 * T_HE_SIG_A_us;
/** T_HE-SIG-B: one HE-SIG-B symbol, 4 µs (3.2 µs DFT + 0.8 µs GI). */
export const T_HE_SIG_B_us: Microseconds = 4;
/** T_HE-STF-NT: HE-STF of a non-trigger-based PPDU, 4 µs. */
export const T_HE_STF_NT_us: Microseconds = 4;

/** Guard intervals of the HE-LTF and Data fields, µs (27.3.8). */
export const HE_GI_US: readonly Microseconds[] = [0.8, 1.6, 3.2];

/** L-STF, L-LTF, L-SIG and RL-SIG: the pre-HE part of every HE PPDU (27.3.4). */
export const RL_SIG: PreambleField = ["RL-SIG", T_RL_SIG_us];
export const LEGACY_AND_RL_SIG: readonly PreambleField[] = [L_STF, L_LTF, L_SIG, RL_SIG];

/** T_SYM = T_DFT + T_GI, µs (27.3.8: 13.6, 14.4 or 16 µs). */
export function symbolDurationUs(giUs: Microseconds): Microseconds {
  return roundUs(T_DFT_HE_us + giUs);
}

/** Clears binary noise from sums and products of 0.8/1.6/3.2/12.8 µs (1e-9 µs resolution) so audit terms read as printed in the standard. */
export function roundUs(us: Microseconds): Microseconds {
  return Math.round(us * 1e9) / 1e9;
}

/**
 * One HE-LTF (and EHT-LTF) symbol, µs: the 1x/2x/4x LTF is T_DFT/4, T_DFT/2
 * or T_DFT long (3.2, 6.4, 12.8 µs), plus the Data field's GI (27.3.8:
 * T_HE-LTF-SYM = T_HE-LTF + T_GI,HE-LTF).
 */
export function ltfSymbolUs(ltf: 1 | 2 | 4, giUs: Microseconds): Microseconds {
  return roundUs((T_DFT_HE_us * ltf) / 4 + giUs);
}

/**
 * N_HE-LTF for a total of N_STS space-time streams (802.11ax-2021 27.3.11.10,
 * the table of N_HE-LTF per N_STS; 802.11be-2024 36.3.12.10 repeats it for
 * N_EHT-LTF): 1, 2, 4, 4, 6, 6, 8, 8.
 */
const LTF_COUNT_BY_STS: readonly number[] = [0, 1, 2, 4, 4, 6, 6, 8, 8];

export function ltfCount(nSts: number): number {
  return LTF_COUNT_BY_STS[nSts];
}

// ---------------------------------------------------------------------------
// Resource units: N_SD and N_SD,short
// ---------------------------------------------------------------------------

/**
 * A resource unit's data subcarriers. `nSd` from the RU subcarrier tables of
 * 27.3.2 (26→24, 52→48, 106→102, 242→234, 484→468, 996→980, 2×996→1960
 * data tones; 27.3.8's N_SD column); `nSdShort` is N_SD,short of the pre-FEC
 * padding process (27.3.12, table of N_SD,short per RU size), with DCM in
 * the `Dcm` columns (DCM halves N_SD: 27.3.12.9).
 */
export interface RuNumerology {
  readonly tones: number;
  readonly nSd: number;
  readonly nSdShort: number;
  readonly nSdDcm: number;
  readonly nSdShortDcm: number;
}

function ru(tones: number, nSd: number, nSdShort: number, nSdShortDcm: number): RuNumerology {
  return { tones, nSd, nSdShort, nSdDcm: nSd / 2, nSdShortDcm };
}

/** 802.11ax-2021 RU sizes, keyed by tones (1992 = 2×996). N_SD,short DCM values are from memory. */
export const HE_RUS: Readonly<Record<number, RuNumerology>> = {
  26: ru(26, 24, 6, 2),
  52: ru(52, 48, 12, 6),
  106: ru(106, 102, 24, 12),
  242: ru(242, 234, 60, 30),
  484: ru(484, 468, 120, 60),
  996: ru(996, 980, 240, 120),
  1992: ru(1992, 1960, 492, 246),
};

/** RU tones of a whole channel (SU PPDU): 20→242, 40→484, 80→996, 160→2×996 (27.3.2). */
export const HE_WHOLE_CHANNEL_RU: Readonly<Record<number, number>> = { 20: 242, 40: 484, 80: 996, 160: 1992 };

/** Display name of an RU size. */
export function ruName(tones: number): string {
  return tones === 1992 ? "RU2x996" : tones === 3984 ? "RU4x996" : `RU${tones}`;
}

/** Smallest channel width, MHz, that holds an RU of this many tones. */
export function smallestWidthFor(tones: number, wholeChannel: Readonly<Record<number, number>>): number {
  for (const w of Object.keys(wholeChannel).map(Number).sort((a, b) => a - b)) {
    if (wholeChannel[w] >= tones) return w;
  }
  return Infinity;
}

// ---------------------------------------------------------------------------
// Pre-FEC padding, LDPC extra symbol segment, packet extension (27.3.12, 27.3.13)
// ---------------------------------------------------------------------------

/** N_service: the SERVICE field, 16 bits (27.3.12). */
export const N_SERVICE_bits = 16;
/** N_tail per BCC encoder, 6 bits; HE uses one BCC encoder (N_ES = 1), BCC being limited to ≤ 242 tones (27.3.12). */
export const N_TAIL_BCC_bits = 6;

/** What the padding procedure needs about one user's encoding. */
export interface DataEncoding {
  readonly nDbps: number;
  readonly nCbps: number;
  readonly nDbpsShort: number;
  readonly nCbpsShort: number;
  readonly codeRate: CodeRate;
  /** m_STBC: 2 with STBC, else 1. */
  readonly mStbc: 1 | 2;
  readonly coding: "BCC" | "LDPC";
}

export interface PaddingResult {
  readonly nSymInit: number;
  readonly aInit: 1 | 2 | 3 | 4;
  readonly nExcess: number;
  /** LDPC extra symbol segment added (27.3.12, LDPC coding step). */
  readonly ldpcExtraSymbol: boolean;
  readonly nSym: number;
  /** Pre-FEC padding factor a after the LDPC step. */
  readonly a: 1 | 2 | 3 | 4;
  /** Bits before padding: 8·APEP_LENGTH + N_tail + N_service. */
  readonly payloadBits: number;
}

/**
 * LDPC codeword parameters (IEEE 802.11-2020 19.3.11.7.5, Table 19-16 "PPDU
 * encoding parameters") and the test for an extra symbol segment, in integer
 * arithmetic (R = num/den, L_LDPC a multiple of 648 so L_LDPC·R is whole).
 */
export function ldpcNeedsExtraSymbol(nPld: number, nAvbits: number, codeRate: CodeRate): boolean {
  const [num, den] = codeRate;
  const oneMinusR = (den - num) / den;
  let nCw: number;
  let lLdpc: number;
  if (nAvbits <= 648) {
    nCw = 1;
    lLdpc = nAvbits >= nPld + 912 * oneMinusR ? 1296 : 648;
  } else if (nAvbits <= 1296) {
    nCw = 1;
    lLdpc = nAvbits >= nPld + 1464 * oneMinusR ? 1944 : 1296;
  } else if (nAvbits <= 1944) {
    nCw = 1;
    lLdpc = 1944;
  } else if (nAvbits <= 2592) {
    nCw = 2;
    lLdpc = nAvbits >= nPld + 2916 * oneMinusR ? 1944 : 1296;
  } else {
    lLdpc = 1944;
    nCw = Math.ceil((nPld * den) / (lLdpc * num));
  }
  const infoBits = (nCw * lLdpc * num) / den; // N_CW × L_LDPC × R, whole
  const nShrt = Math.max(0, infoBits - nPld);
  const nPunc = Math.max(0, nCw * lLdpc - nAvbits - nShrt);
  const parityBits = (nCw * lLdpc * (den - num)) / den; // N_CW × L_LDPC × (1 − R), whole
  // 19.3.11.7.5 step d): (N_punc > 0.1·parity AND N_shrt < 1.2·N_punc·R/(1−R)) OR N_punc > 0.3·parity
  const heavy = 10 * nPunc > parityBits && 10 * nShrt * (den - num) < 12 * nPunc * num;
  return heavy || 10 * nPunc > 3 * parityBits;
}

/**
 * Number of data symbols and the pre-FEC padding factor a (802.11ax-2021
 * 27.3.12, pre-FEC padding process and LDPC coding; 802.11be-2024 36.3.13
 * uses the same procedure):
 *   N_excess  = mod(8·APEP_LENGTH + N_tail + N_service, m_STBC·N_DBPS)
 *   N_SYM,init = m_STBC·ceil((8·APEP_LENGTH + N_tail + N_service) / (m_STBC·N_DBPS))
 *   a_init    = 4 if N_excess = 0, else min(ceil(N_excess / (m_STBC·N_DBPS,short)), 4)
 * BCC: N_SYM = N_SYM,init, a = a_init. LDPC: with
 *   N_pld    = (N_SYM,init − m_STBC)·N_DBPS + m_STBC·N_DBPS,LAST,init
 *   N_avbits = (N_SYM,init − m_STBC)·N_CBPS + m_STBC·N_CBPS,LAST,init
 * (N_x,LAST,init = a_init·N_x,short, or N_x when a_init = 4) the LDPC
 * parameters decide on an extra symbol segment: then a = a_init + 1, or
 * a = 1 and N_SYM = N_SYM,init + m_STBC when a_init = 4.
 */
export function preFecPadding(apepBytes: Bytes, enc: DataEncoding): PaddingResult {
  const nTail = enc.coding === "BCC" ? N_TAIL_BCC_bits : 0;
  const payloadBits = 8 * apepBytes + nTail + N_SERVICE_bits;
  const m = enc.mStbc;
  const nExcess = payloadBits % (m * enc.nDbps);
  const nSymInit = m * Math.ceil(payloadBits / (m * enc.nDbps));
  const aInit = (nExcess === 0 ? 4 : Math.min(Math.ceil(nExcess / (m * enc.nDbpsShort)), 4)) as 1 | 2 | 3 | 4;
  if (enc.coding === "BCC") {
    return { nSymInit, aInit, nExcess, ldpcExtraSymbol: false, nSym: nSymInit, a: aInit, payloadBits };
  }
  const nDbpsLast = aInit < 4 ? aInit * enc.nDbpsShort : enc.nDbps;
  const nCbpsLast = aInit < 4 ? aInit * enc.nCbpsShort : enc.nCbps;
  const nPld = (nSymInit - m) * enc.nDbps + m * nDbpsLast;
  const nAvbits = (nSymInit - m) * enc.nCbps + m * nCbpsLast;
  if (!ldpcNeedsExtraSymbol(nPld, nAvbits, enc.codeRate)) {
    return { nSymInit, aInit, nExcess, ldpcExtraSymbol: false, nSym: nSymInit, a: aInit, payloadBits };
  }
  if (aInit === 4) {
    return { nSymInit, aInit, nExcess, ldpcExtraSymbol: true, nSym: nSymInit + m, a: 1, payloadBits };
  }
  return { nSymInit, aInit, nExcess, ldpcExtraSymbol: true, nSym: nSymInit, a: (aInit + 1) as 2 | 3 | 4, payloadBits };
}

/**
 * T_PE, µs, for the receiver's nominal packet padding and the pre-FEC padding
 * factor a (802.11ax-2021 27.3.13, table of PE field durations; from memory):
 * nominal 0 µs → 0; 8 µs → 0, 0, 4, 8; 16 µs → 4, 8, 12, 16 for a = 1…4.
 */
const T_PE_BY_NOMINAL_PADDING_us: Readonly<Record<0 | 8 | 16, readonly Microseconds[]>> = {
  0: [0, 0, 0, 0],
  8: [0, 0, 4, 8],
  16: [4, 8, 12, 16],
};

export function packetExtensionUs(nominalPaddingUs: 0 | 8 | 16, a: 1 | 2 | 3 | 4): Microseconds {
  return T_PE_BY_NOMINAL_PADDING_us[nominalPaddingUs][a - 1];
}

// ---------------------------------------------------------------------------
// Per-link numerology
// ---------------------------------------------------------------------------

/** Everything the rate and TXTIME of one HE/EHT link derive from. */
export interface Numerology {
  readonly ru: RuNumerology;
  readonly mod: McsModulation;
  readonly nSd: number;
  readonly nSdShort: number;
  readonly nSs: number;
  readonly nSts: number;
  readonly tSymUs: Microseconds;
  readonly enc: DataEncoding;
}

/** The link's RU: its own (ruTones) or the whole channel's. */
export function linkRu(link: Link, rus: Readonly<Record<number, RuNumerology>>, whole: Readonly<Record<number, number>>): RuNumerology {
  return rus[link.ruTones ?? whole[link.widthMHz]];
}

export function numerology(link: Link, rus: Readonly<Record<number, RuNumerology>>, whole: Readonly<Record<number, number>>): Numerology {
  const r = linkRu(link, rus, whole);
  const mod = MCS_MODULATION[link.mcs!];
  const nSd = link.dcm ? r.nSdDcm : r.nSd;
  const nSdShort = link.dcm ? r.nSdShortDcm : r.nSdShort;
  const nSs = link.streams;
  const mStbc: 1 | 2 = link.stbc ? 2 : 1;
  return {
    ru: r,
    mod,
    nSd,
    nSdShort,
    nSs,
    nSts: mStbc * nSs,
    tSymUs: symbolDurationUs(link.giUs!),
    enc: {
      // N_CBPS·R is not always whole (996- and 2×996-tone RUs at MCS 9 and 11,
      // e.g. 980 × 10 × 5/6 = 8166.7 bits; DCM at MCS0 on 242/106 tones): the
      // HE/EHT MCS tables list the integer N_DBPS = floor(N_CBPS·R) (802.11ax-2021
      // 27.5, e.g. 8166 for HE-MCS 11 on 996 tones, 1 SS; 802.11be-2024 36.5) and
      // their data rate column is that N_DBPS ÷ T_SYM (600.4 Mb/s, not 600.5), so
      // RATE (numerologyRateMbps) and TXTIME both use this one integer.
      nDbps: Math.floor(dataBitsPerSymbol(nSd, mod.nBpscs, mod.codeRate, nSs)),
      nCbps: nSd * mod.nBpscs * nSs,
      nDbpsShort: dataBitsPerSymbol(nSdShort, mod.nBpscs, mod.codeRate, nSs),
      nCbpsShort: nSdShort * mod.nBpscs * nSs,
      codeRate: mod.codeRate,
      mStbc,
      coding: link.coding!,
    },
  };
}

/**
 * The terms from the first LTF to the end: N_LTF × T_LTF-SYM, the Data field
 * N_SYM × T_SYM (with N_DBPS, a and the LDPC extra symbol as explanation),
 * T_PE and the 2.4 GHz signal extension. Shared by HE and EHT.
 */
export function trainingDataAndPeTerms(link: Link, n: Numerology, psduBytes: Bytes, ltfName: string): TxTimeTerm[] {
  const nLtf = ltfCount(n.nSts);
  const tLtfSym = ltfSymbolUs(link.ltf!, link.giUs!);
  const pad = preFecPadding(psduBytes, n.enc);
  const terms: TxTimeTerm[] = [
    factorTerm(`N_${ltfName}`, nLtf),
    factorTerm(`T_${ltfName}-SYM (µs)`, tLtfSym),
    durationTerm(`${ltfName} × N_${ltfName}`, roundUs(nLtf * tLtfSym)),
    factorTerm("N_DBPS (bits)", n.enc.nDbps),
    factorTerm("N_DBPS,short (bits)", n.enc.nDbpsShort),
    factorTerm("N_excess (bits)", pad.nExcess),
    factorTerm("N_SYM,init", pad.nSymInit),
    factorTerm("a_init", pad.aInit),
    factorTerm("LDPC extra symbol segment (1 = added)", pad.ldpcExtraSymbol ? 1 : 0),
    factorTerm("N_SYM", pad.nSym),
    factorTerm("a (pre-FEC padding factor)", pad.a),
    factorTerm("T_SYM (µs)", n.tSymUs),
    durationTerm("Data N_SYM × T_SYM", roundUs(pad.nSym * n.tSymUs)),
    durationTerm("PE (T_PE)", packetExtensionUs(link.nominalPaddingUs!, pad.a)),
    durationTerm("Signal extension", signalExtensionUs(link.bandGHz)),
  ];
  return terms;
}

/**
 * The MCS table's data rate: the integer N_DBPS ÷ T_SYM (802.11ax-2021 27.5;
 * 802.11be-2024 36.5), the same N_DBPS the TXTIME equations use, so RATE and
 * TXTIME agree on every RU, MCS, GI and stream count.
 */
export function numerologyRateMbps(n: Numerology): MbPerSecond {
  return n.enc.nDbps / n.tSymUs;
}

// ---------------------------------------------------------------------------
// Signal fields: HE-SIG-B for one user (27.3.11.8)
// ---------------------------------------------------------------------------

/**
 * N_DBPS of a 20 MHz signal-field symbol at MCS0 (BPSK, R = 1/2, 52 data
 * subcarriers): 26 bits. HE-SIG-B and EHT-SIG are sent per 20 MHz content channel.
 */
export const SIG_MCS0_N_DBPS_bits = dataBitsPerSymbol(52, MCS_MODULATION[0].nBpscs, MCS_MODULATION[0].codeRate, 1);

/** CRC and tail closing every HE-SIG-B / EHT-SIG encoding block, bits. */
export const SIG_CRC_bits = 4;
export const SIG_TAIL_bits = 6;

/** HE-SIG-B RU Allocation subfields per content channel (27.3.11.8.2): 1 at 20/40 MHz, 2 at 80, 4 at 160. */
export const HE_SIG_B_RU_ALLOCATIONS: Readonly<Record<number, number>> = { 20: 1, 40: 1, 80: 2, 160: 4 };
/** One RU Allocation subfield, 8 bits; the Center 26-tone RU bit at 80 and 160 MHz (27.3.11.8.2). */
export const HE_SIG_B_RU_ALLOCATION_bits = 8;
/** HE-SIG-B user field for a non-MU-MIMO allocation, 21 bits (27.3.11.8.3: STA-ID 11, NSTS 3, Beamformed 1, MCS 4, DCM 1, Coding 1). */
export const HE_SIG_B_USER_FIELD_bits = 21;

/**
 * HE-SIG-B symbols for one user in an OFDMA HE MU PPDU, at HE-SIG-B MCS0.
 * The content channel with the user carries the common field (RU Allocation
 * subfields, Center 26-tone RU bit at 80/160 MHz, CRC, tail) and one user
 * block holding a single user field (user field, CRC, tail); the other
 * content channel is padded to the same symbol count (27.3.11.8).
 */
export function heSigBSymbols(widthMHz: number): number {
  const center26 = widthMHz >= 80 ? 1 : 0;
  const common = HE_SIG_B_RU_ALLOCATIONS[widthMHz] * HE_SIG_B_RU_ALLOCATION_bits + center26 + SIG_CRC_bits + SIG_TAIL_bits;
  const userBlock = HE_SIG_B_USER_FIELD_bits + SIG_CRC_bits + SIG_TAIL_bits;
  return Math.ceil((common + userBlock) / SIG_MCS0_N_DBPS_bits);
}

// ---------------------------------------------------------------------------
// Validity rules as data
// ---------------------------------------------------------------------------

/** One forbidden combination: `refuses` returns the message (what is valid), or null. */
export type Rule = (link: Link) => string | null;

/** Run the rules in order; the first refusal raises #VALUE! naming the link. */
export function applyRules(rules: readonly Rule[], link: Link): void {
  for (const rule of rules) {
    const message = rule(link);
    if (message !== null) invalid(`link: ${message}`);
  }
}

/** The allowed (LTF size, GI) pairs of a PPDU format, e.g. "2x+0.8". */
export type GiLtfPair = `${1 | 2 | 4}x+${number}`;

export function giLtfPair(link: Link): GiLtfPair {
  return `${link.ltf!}x+${link.giUs!}` as GiLtfPair;
}

/**
 * HE SU and HE ER SU PPDUs: 1x HE-LTF + 0.8 µs, 2x + 0.8, 2x + 1.6, 4x + 0.8,
 * 4x + 3.2 (27.3.11.7 HE-SIG-A GI+LTF Size field; 4x + 0.8 µs is signalled
 * with the DCM and STBC bits both set, which then apply neither — so that
 * pair carries neither STBC nor DCM: see HE_SU_4X_GI08_RULE).
 */
export const HE_SU_GI_LTF: readonly GiLtfPair[] = ["1x+0.8", "2x+0.8", "2x+1.6", "4x+0.8", "4x+3.2"];
/**
 * HE SU / ER SU with 4x HE-LTF and GI 0.8 µs: HE-SIG-A's GI+LTF Size value 3
 * means 4x + 0.8 µs only when its DCM and STBC bits are both 1, and then
 * neither DCM nor STBC is applied (802.11ax-2021 27.3.11.7, HE-SIG-A fields of
 * the HE SU and HE ER SU PPDU: GI+LTF Size, DCM and STBC subfields). Such a
 * PPDU cannot signal STBC or DCM, so the link is refused. (The HE MU PPDU
 * signals 4x + 0.8 µs by its own GI+LTF value and has no such restriction.)
 */
export const HE_SU_4X_GI08_RULE: Rule = (l) =>
  l.ruTones !== null && !l.extendedRange
    ? null
    : l.ltf === 4 && l.giUs === 0.8 && (l.stbc || l.dcm)
      ? `HE ${l.extendedRange ? "ER SU" : "SU"} 4xLTF with GI0.8 cannot carry ${l.stbc ? "STBC" : "DCM"}: HE-SIG-A signals that pair by setting both its STBC and DCM bits, which then apply neither; use 4xLTF GI3.2 or 2xLTF with ${l.stbc ? "STBC" : "DCM"}`
      : null;

/** HE MU PPDU: 2x + 0.8, 2x + 1.6, 4x + 0.8, 4x + 3.2 µs (27.3.11.7, HE-SIG-A of the HE MU PPDU). */
export const HE_MU_GI_LTF: readonly GiLtfPair[] = ["2x+0.8", "2x+1.6", "4x+0.8", "4x+3.2"];

function pairsText(pairs: readonly GiLtfPair[]): string {
  return pairs.map((p) => p.replace("+", "LTF GI")).join(", ");
}

/** A rule that refuses GI/LTF pairs outside `pairs` for the PPDU format named `format`. */
export function giLtfRule(format: string, pairs: readonly GiLtfPair[]): (link: Link) => string | null {
  return (l) =>
    pairs.includes(giLtfPair(l))
      ? null
      : `${l.family} ${format} does not allow ${l.ltf}xLTF with GI${l.giUs}; allowed: ${pairsText(pairs)}`;
}

/** Rules shared by HE and EHT (family-neutral wording). */
export const commonRules = {
  mcs: (max: number, extra = ""): Rule => (l) =>
    Number.isInteger(l.mcs) && l.mcs! >= 0 && l.mcs! <= max ? null : `${l.family} MCS must be 0–${max}${extra}, got MCS${l.mcs}`,
  streams: (max: number): Rule => (l) =>
    l.streams >= 1 && l.streams <= max ? null : `${l.family} carries 1–${max} spatial streams, got ${l.streams}SS`,
  width: (widths: readonly number[]): Rule => (l) =>
    widths.includes(l.widthMHz) ? null : `${l.family} channel width must be ${widths.join(", ")} MHz, got ${l.widthMHz}MHz`,
  gi: (): Rule => (l) =>
    HE_GI_US.includes(l.giUs!) ? null : `${l.family} guard interval must be GI0.8, GI1.6 or GI3.2, got GI${l.giUs}`,
  /** 2.4 GHz: 20 and 40 MHz channels only (27.1.1; 36.1.1). */
  band24Width: (): Rule => (l) =>
    l.bandGHz === 2.4 && l.widthMHz > 40 ? `${l.family} at 2.4 GHz allows 20 or 40 MHz, got ${l.widthMHz}MHz` : null,
  /** A resource unit must fit in the channel. */
  ruFits: (rus: Readonly<Record<number, RuNumerology>>, whole: Readonly<Record<number, number>>): Rule => (l) => {
    if (l.ruTones === null) return null;
    if (!(l.ruTones in rus)) return `${l.family} has no ${ruName(l.ruTones)}`;
    const need = smallestWidthFor(l.ruTones, whole);
    return need <= l.widthMHz ? null : `${ruName(l.ruTones)} needs a channel of ${need} MHz or more, got ${l.widthMHz}MHz`;
  },
  /**
   * BCC only for RUs up to 242 tones, MCS 0–9 and up to 4 streams; LDPC
   * otherwise (802.11ax-2021 27.3.12.5; 802.11be-2024 36.3.13.3; DESIGN.md §3).
   */
  bcc: (rus: Readonly<Record<number, RuNumerology>>, whole: Readonly<Record<number, number>>): Rule => (l) => {
    if (l.coding !== "BCC") return null;
    const tones = linkRu(l, rus, whole).tones;
    if (tones > 242) return `${l.family} BCC is limited to RUs of 242 tones or fewer (20 MHz); use LDPC for ${l.ruTones ? ruName(tones) : `${l.widthMHz} MHz`}`;
    if (l.mcs! > 9) return `${l.family} BCC is limited to MCS 0–9; use LDPC for MCS${l.mcs}`;
    if (l.streams > 4) return `${l.family} BCC is limited to 1–4 spatial streams; use LDPC for ${l.streams}SS`;
    return null;
  },
};

/** HE MCS 0–11 (27.5), N_SS 1–8, widths 20–160 MHz (80+80 counts as 160). */
export const HE_MAX_MCS = 11;
export const HE_MAX_STREAMS = 8;
export const HE_WIDTHS_MHZ: readonly number[] = [20, 40, 80, 160];

/** DCM applies to HE-MCS 0, 1, 3 and 4 only (27.3.12.9). */
export const HE_DCM_MCS: readonly number[] = [0, 1, 3, 4];

/** HE ER SU PPDU: MCS 0–2 in the 242-tone RU, MCS 0 in the upper 106-tone RU (27.3.11.7, HE-SIG-A of the HE ER SU PPDU). */
const ER_MAX_MCS: Readonly<Record<number, number>> = { 242: 2, 106: 0 };
/** HE ER SU PPDU: at most 2 space-time streams (HE-SIG-A NSTS field of the ER SU PPDU; from memory). */
const ER_MAX_STS = 2;

const HE_RULES: readonly Rule[] = [
  commonRules.mcs(HE_MAX_MCS),
  commonRules.streams(HE_MAX_STREAMS),
  commonRules.width(HE_WIDTHS_MHZ),
  commonRules.gi(),
  commonRules.band24Width(),
  commonRules.ruFits(HE_RUS, HE_WHOLE_CHANNEL_RU),
  // ER SU is a 20 MHz PPDU: the whole 242-tone RU or the upper 106-tone RU (27.3.4).
  (l) => (l.extendedRange && l.widthMHz !== 20 ? `HE ER SU PPDUs are 20 MHz only, got ${l.widthMHz}MHz` : null),
  (l) =>
    l.extendedRange && l.ruTones !== null && l.ruTones !== 106
      ? `HE ER SU uses the whole 20 MHz (no RU token) or RU106, got ${ruName(l.ruTones)}`
      : null,
  // ER SU MCS: 0–2 on 242 tones, 0 on the 106-tone RU.
  (l) => {
    if (!l.extendedRange) return null;
    const tones = l.ruTones ?? 242;
    const max = ER_MAX_MCS[tones];
    return l.mcs! <= max ? null : `HE ER SU allows MCS 0–${max}${tones === 106 ? " (MCS0 only) on RU106" : " on the whole 20 MHz"}, got MCS${l.mcs}`;
  },
  // ER SU: at most 2 space-time streams (1SS, 1SS with STBC, or 2SS).
  (l) =>
    l.extendedRange && l.streams * (l.stbc ? 2 : 1) > ER_MAX_STS
      ? `HE ER SU carries at most 2 space-time streams (1SS, 1SS STBC or 2SS), got ${l.streams}SS${l.stbc ? " STBC" : ""}`
      : null,
  // DCM only on MCS 0, 1, 3, 4 (27.3.12.9).
  (l) => (l.dcm && !HE_DCM_MCS.includes(l.mcs!) ? `HE DCM applies to MCS 0, 1, 3 and 4 only, got MCS${l.mcs}` : null),
  // DCM with 1 or 2 spatial streams only (27.3.12.9).
  (l) => (l.dcm && l.streams > 2 ? `HE DCM allows 1 or 2 spatial streams, got ${l.streams}SS` : null),
  // DCM is not combined with STBC (27.3.11.7: DCM and STBC both set means neither applies).
  (l) => (l.dcm && l.stbc ? "HE DCM cannot be combined with STBC; drop one of them" : null),
  // STBC: one spatial stream on two space-time streams only (27.3.12.10: N_SS = 1, N_STS = 2).
  (l) => (l.stbc && l.streams !== 1 ? `HE STBC maps 1 spatial stream onto 2 space-time streams; use 1SS with STBC, got ${l.streams}SS` : null),
  commonRules.bcc(HE_RUS, HE_WHOLE_CHANNEL_RU),
  // GI/LTF pairs per PPDU format.
  (l) => (l.ruTones === null ? giLtfRule(l.extendedRange ? "ER SU PPDU" : "SU PPDU", HE_SU_GI_LTF)(l) : null),
  (l) => (l.ruTones !== null && !l.extendedRange ? giLtfRule("MU PPDU (RU)", HE_MU_GI_LTF)(l) : null),
  (l) => (l.ruTones !== null && l.extendedRange ? giLtfRule("ER SU PPDU", HE_SU_GI_LTF)(l) : null),
  HE_SU_4X_GI08_RULE,
];

// ---------------------------------------------------------------------------
// Sensitivity, maximum PSDU, non-HT reference rate
// ---------------------------------------------------------------------------

/**
 * Minimum input sensitivity at 20 MHz for MCS 0–11, dBm (802.11ax-2021
 * 27.3.19.4, receiver minimum input sensitivity table; from memory: MCS 0–9
 * as VHT's Table 21-25, MCS 10 −54, MCS 11 −52). Each doubling of the width
 * adds 3 dB.
 */
export const HE_SENSITIVITY_20MHZ_DBM: readonly Dbm[] = [-82, -79, -77, -74, -70, -66, -65, -64, -59, -57, -54, -52];

/**
 * Sensitivity for a link, dBm: the 20 MHz value + 3 dB per doubling of the
 * width the receiver decodes — the RU's width for an RU (242→20, 484→40,
 * 996→80, 2×996→160, 4×996→320), and the 20 MHz value for RUs smaller than
 * 242 tones (the standard's table is per channel width; these are our
 * choice). DCM and ER use the MCS's row unchanged (conservative).
 */
export function sensitivityFromTable(link: Link, table20: readonly Dbm[], whole: Readonly<Record<number, number>>): Dbm {
  const tones = link.ruTones ?? whole[link.widthMHz];
  const width = tones < 242 ? 20 : smallestWidthFor(tones, whole);
  return table20[link.mcs!] + 3 * Math.log2(width / 20);
}

/**
 * The largest PSDU the fastest PPDU of a family carries within aPPDUMaxTime,
 * octets: the shortest preamble, then as many data symbols as fit, all at
 * the largest N_DBPS, less the SERVICE field:
 *   N_SYM,max = floor((aPPDUMaxTime − T_preamble,min) ÷ T_SYM)
 *   PSDU_max  = floor((N_SYM,max × N_DBPS,max − N_service) ÷ 8)
 * (LDPC, so no tail bits; no packet extension.) HE: N_DBPS,max = 130 666
 * (2×996 tones, HE-MCS 11, 8 SS: floor(1960 × 10 × 5/6 × 8)), T_SYM 13.6 µs,
 * shortest preamble L-STF 8 + L-LTF 8 + L-SIG 4 + RL-SIG 4 + HE-SIG-A 8 +
 * HE-STF 4 + 8 HE-LTFs of 1x + 0.8 µs (4 µs each) = 68 µs:
 * N_SYM = floor(5416 ÷ 13.6) = 398, PSDU = floor((398 × 130 666 − 16) ÷ 8)
 * = 6 500 631 octets — exactly HE's aPSDUMaxLength (802.11ax-2021 27.4.4,
 * from memory), which is how we read the standard's derivation. EHT's value
 * is derived the same way (eht.ts).
 */
export function largestPsduInPpduMaxTime(nDbpsMax: number, shortestPreambleUs: Microseconds, tSymUs: Microseconds): Bytes {
  const nSym = Math.floor(roundUs((aPPDUMaxTime_us - shortestPreambleUs) / tSymUs));
  return Math.floor((nSym * nDbpsMax - N_SERVICE_bits) / 8);
}

/** aPSDUMaxLength for HE: 6 500 631 octets (27.4.4 HE PHY characteristics; from memory; largestPsduInPpduMaxTime reproduces it). */
export const HE_aPSDUMaxLength_bytes: Bytes = 6_500_631;

/**
 * Non-HT reference rate (IEEE 802.11-2020 10.6.6.5.2; 802.11ax-2021 keeps the
 * rule): the non-HT rate of the same modulation and code rate. With DCM the
 * constellation carries half the bits, so we take the next lower modulation
 * (16-QAM → QPSK, QPSK → BPSK, BPSK stays): our choice, the conservative one.
 */
export function nonHtReferenceRate(link: Link): MbPerSecond {
  const mod = MCS_MODULATION[link.mcs!];
  const nBpscs = link.dcm ? Math.max(1, mod.nBpscs / 2) : mod.nBpscs;
  return nonHtReferenceRateFor(nBpscs, mod.codeRate);
}

// ---------------------------------------------------------------------------
// TXTIME
// ---------------------------------------------------------------------------

/** The HE preamble fields before the HE-LTFs, by PPDU format (27.3.4; 27.4.3). */
function hePreFields(link: Link): PreambleField[] {
  if (link.extendedRange) return [...LEGACY_AND_RL_SIG, ["HE-SIG-A (ER, repeated)", T_HE_SIG_A_R_us], ["HE-STF", T_HE_STF_NT_us]];
  if (link.ruTones === null) return [...LEGACY_AND_RL_SIG, ["HE-SIG-A", T_HE_SIG_A_us], ["HE-STF", T_HE_STF_NT_us]];
  const nSigB = heSigBSymbols(link.widthMHz);
  return [
    ...LEGACY_AND_RL_SIG,
    ["HE-SIG-A", T_HE_SIG_A_us],
    [`HE-SIG-B (${nSigB} symbols at MCS0)`, nSigB * T_HE_SIG_B_us],
    ["HE-STF", T_HE_STF_NT_us],
  ];
}

/**
 * TXTIME of an HE SU, HE ER SU or (one-user) HE MU PPDU (802.11ax-2021 27.4.3):
 *   TXTIME = 20 + T_RL-SIG + T_HE-SIG-A(-R) [+ N_HE-SIG-B·T_HE-SIG-B] + T_HE-STF
 *          + N_HE-LTF·T_HE-LTF-SYM + N_SYM·T_SYM + N_MA·N_HE-LTF·T_HE-LTF-SYM
 *          + T_PE + SignalExtension,  with N_MA = 0 (no midamble).
 */
export function heTxtime(link: Link, psduBytes: Bytes): TxTime {
  const n = numerology(link, HE_RUS, HE_WHOLE_CHANNEL_RU);
  return txtimeFromTerms([...preambleTerms(hePreFields(link)), ...trainingDataAndPeTerms(link, n, psduBytes, "HE-LTF")]);
}

export const he: PhyFamily = {
  family: "HE",
  mcsValues: Array.from({ length: HE_MAX_MCS + 1 }, (_, i) => i),
  validate: (link) => applyRules(HE_RULES, link),
  rateMbps: (link) => numerologyRateMbps(numerology(link, HE_RUS, HE_WHOLE_CHANNEL_RU)),
  txtime: heTxtime,
  maxPsduBytes: () => HE_aPSDUMaxLength_bytes,
  sensitivityDbm: (link) => sensitivityFromTable(link, HE_SENSITIVITY_20MHZ_DBM, HE_WHOLE_CHANNEL_RU),
  nonHtReferenceRateMbps: nonHtReferenceRate,
};
