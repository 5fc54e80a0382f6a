/**
 * The PPDUs of a multi-user exchange (IEEE Std 802.11ax-2021 27.3.4, 27.4.3;
 * IEEE Std 802.11be-2024 36.3.4, 36.4.3), built from the HE/EHT PHY pieces
 * (phy/he.ts, phy/eht.ts) so the padding, LTF and packet extension rules live
 * in one place.
 *
 * - MU PPDU carrying `users` equal users on equal RUs: the one-user PPDU of
 *   he.ts/eht.ts with HE-SIG-B (EHT-SIG) holding one user field per user.
 *   Every user's Data field is padded to the longest user's N_SYM (27.3.12);
 *   with equal users that is the link's own N_SYM.
 * - TB PPDU: no HE-SIG-B/EHT-SIG, an 8 µs HE-STF/EHT-STF (T_HE-STF-T, 27.3.8),
 *   the Data field and packet extension of the user's RU, and a duration
 *   fixed by the trigger's UL Length (the L-SIG LENGTH of 27.3.11.5): every
 *   station's TB PPDU ends at the same 4 µs boundary.
 */
import type { Link } from "../link";
import type { Bytes, MbPerSecond, Microseconds } from "../units";
import type { TxTimeTerm } from "../phy/types";
import { invalid } from "../errors";
import { durationTerm, factorTerm, preambleTerms, signalExtensionUs, txtimeFromTerms, type PreambleField } from "../phy/_lib";
import {
  HE_RUS,
  HE_SIG_B_RU_ALLOCATIONS,
  HE_SIG_B_RU_ALLOCATION_bits,
  HE_SIG_B_USER_FIELD_bits,
  HE_WHOLE_CHANNEL_RU,
  LEGACY_AND_RL_SIG,
  SIG_CRC_bits,
  SIG_MCS0_N_DBPS_bits,
  SIG_TAIL_bits,
  T_HE_SIG_A_us,
  T_HE_SIG_B_us,
  T_HE_STF_NT_us,
  giLtfPair,
  numerology,
  ruName,
  trainingDataAndPeTerms,
  type GiLtfPair,
} from "../phy/he";
import {
  BLOCK_END_bits,
  EHT_RUS,
  EHT_SIG_RU_ALLOCATIONS,
  EHT_SIG_RU_ALLOCATION_bits,
  EHT_SIG_USER_FIELD_bits,
  EHT_SIG_USIG_OVERFLOW_bits,
  EHT_WHOLE_CHANNEL_RU,
  T_EHT_SIG_us,
  T_U_SIG_us,
} from "../phy/eht";
import { txtime } from "../phy/index";

/** T_HE-STF-T: the HE-STF of an HE TB PPDU, 8 µs (five 1.6 µs periods; 802.11ax-2021 27.3.8). EHT-STF of an EHT TB PPDU: the same (36.3.12; from memory). */
export const T_HE_STF_T_us: Microseconds = 8;

/**
 * GI and LTF pairs a TB PPDU may use: 1x LTF + 1.6 µs, 2x LTF + 1.6 µs,
 * 4x LTF + 3.2 µs (the Trigger frame's GI And HE-LTF Type subfield,
 * 802.11ax-2021 9.3.1.22.1; from memory; EHT keeps them).
 */
export const TB_GI_LTF: readonly GiLtfPair[] = ["1x+1.6", "2x+1.6", "4x+3.2"];

/**
 * L-SIG LENGTH arithmetic (802.11ax-2021 27.3.11.5, from memory):
 *   LENGTH = ceil((TXTIME − SignalExtension − 20) ÷ 4) × 3 − 3 − m,
 * m = 2 for an HE TB PPDU. EHT sets LENGTH to a multiple of 3, m = 0
 * (802.11be-2024 36.3.12.5; from memory). The duration the LENGTH signals,
 * (LENGTH + 3 + m) ÷ 3 × 4 + 20 + SignalExtension, does not depend on m.
 */
const L_SIG_M: Readonly<Record<"HE" | "EHT", number>> = { HE: 2, EHT: 0 };
/** Preamble before L-SIG's LENGTH starts counting: L-STF + L-LTF + L-SIG = 20 µs. */
const T_LEGACY_us: Microseconds = 20;
const L_SIG_SYMBOL_us: Microseconds = 4;

type MuFamily = "HE" | "EHT";

function muFamily(link: Link): MuFamily {
  return link.family === "EHT" ? "EHT" : "HE";
}

function tables(link: Link) {
  return muFamily(link) === "EHT" ? ([EHT_RUS, EHT_WHOLE_CHANNEL_RU] as const) : ([HE_RUS, HE_WHOLE_CHANNEL_RU] as const);
}

/** HE-SIG-B and EHT-SIG have one content channel at 20 MHz and two from 40 MHz on (27.3.11.8; 36.3.12.8). */
export function contentChannels(widthMHz: number): number {
  return widthMHz === 20 ? 1 : 2;
}

/**
 * User-specific bits of one content channel: user fields in blocks of two,
 * each block closed by CRC 4 + tail 6; an odd last user is a block of one
 * (27.3.11.8.3; 36.3.12.8).
 */
function userBlockBits(users: number, userFieldBits: number): number {
  return Math.floor(users / 2) * (2 * userFieldBits + BLOCK_END_bits) + (users % 2) * (userFieldBits + BLOCK_END_bits);
}

/** Users in the busiest content channel: the users spread evenly over the content channels (from memory). */
function usersPerContentChannel(widthMHz: number, users: number): number {
  return Math.ceil(users / contentChannels(widthMHz));
}

/**
 * HE-SIG-B symbols at HE-SIG-B MCS0 for `users` OFDMA users: the common field
 * (RU Allocation subfields, the Center 26-tone RU bit at 80/160 MHz, CRC,
 * tail) and the user blocks of the busiest content channel, in 26-bit
 * symbols (27.3.11.8). One user gives he.ts's heSigBSymbols.
 */
export function heSigBSymbolsFor(widthMHz: number, users: number): number {
  const center26 = widthMHz >= 80 ? 1 : 0;
  const common = HE_SIG_B_RU_ALLOCATIONS[widthMHz] * HE_SIG_B_RU_ALLOCATION_bits + center26 + SIG_CRC_bits + SIG_TAIL_bits;
  return Math.ceil((common + userBlockBits(usersPerContentChannel(widthMHz, users), HE_SIG_B_USER_FIELD_bits)) / SIG_MCS0_N_DBPS_bits);
}

/** EHT-SIG symbols at EHT-SIG MCS0 for `users` OFDMA users (eht.ts's common field; one user gives ehtSigSymbols(width, true)). */
export function ehtSigSymbolsFor(widthMHz: number, users: number): number {
  const [first, second] = EHT_SIG_RU_ALLOCATIONS[widthMHz];
  let common = EHT_SIG_USIG_OVERFLOW_bits + first * EHT_SIG_RU_ALLOCATION_bits + BLOCK_END_bits;
  if (second > 0) common += second * EHT_SIG_RU_ALLOCATION_bits + BLOCK_END_bits;
  return Math.ceil((common + userBlockBits(usersPerContentChannel(widthMHz, users), EHT_SIG_USER_FIELD_bits)) / SIG_MCS0_N_DBPS_bits);
}

export interface Ppdu {
  /** Duration on the air, µs: the sum of the `adds` terms. */
  readonly totalUs: Microseconds;
  readonly terms: readonly TxTimeTerm[];
}

function muPreFields(link: Link, users: number): PreambleField[] {
  if (muFamily(link) === "EHT") {
    const n = ehtSigSymbolsFor(link.widthMHz, users);
    return [...LEGACY_AND_RL_SIG, ["U-SIG", T_U_SIG_us], [`EHT-SIG (${n} symbols at MCS0, ${users} user fields)`, n * T_EHT_SIG_us], ["EHT-STF", T_HE_STF_NT_us]];
  }
  const n = heSigBSymbolsFor(link.widthMHz, users);
  return [...LEGACY_AND_RL_SIG, ["HE-SIG-A", T_HE_SIG_A_us], [`HE-SIG-B (${n} symbols at MCS0, ${users} user fields)`, n * T_HE_SIG_B_us], ["HE-STF", T_HE_STF_NT_us]];
}

function ltfName(link: Link): string {
  return muFamily(link) === "EHT" ? "EHT-LTF" : "HE-LTF";
}

/**
 * TXTIME of a MU PPDU carrying `users` users, each a PSDU of `psduBytes` on
 * the link's RU (27.4.3 with N_HE-SIG-B for all users; 36.4.3). A link
 * without an RU is one user on the whole channel: the link's own PPDU
 * (HE SU, or EHT MU non-OFDMA), as TXTIME gives it.
 */
export function muPpdu(link: Link, users: number, psduBytes: Bytes): Ppdu {
  if (link.ruTones === null) return txtime(link, psduBytes);
  const [rus, whole] = tables(link);
  const n = numerology(link, rus, whole);
  return txtimeFromTerms([...preambleTerms(muPreFields(link, users)), ...trainingDataAndPeTerms(link, n, psduBytes, ltfName(link))]);
}

export interface TbPpdu extends Ppdu {
  /** TXTIME by the TB PPDU equation (27.4.3), before the UL Length's 4 µs boundary. */
  readonly equationUs: Microseconds;
  /** The trigger's UL Length (the TB PPDU's L-SIG LENGTH), octets. */
  readonly ulLength: number;
}

/** The link's RU as a name (the whole channel's when it has none). */
export function ruOf(link: Link): string {
  const [, whole] = tables(link);
  return ruName(link.ruTones ?? whole[link.widthMHz]);
}

/**
 * HE/EHT TB PPDU of one station on the link's RU (27.4.3):
 *   TXTIME = 20 + T_RL-SIG + T_HE-SIG-A + T_HE-STF-T + N_HE-LTF·T_HE-LTF-SYM + N_SYM·T_SYM + T_PE + SignalExtension
 * (EHT: U-SIG in place of HE-SIG-A, 36.4.3), then the UL Length the AP puts
 * in the trigger, LENGTH = ceil((TXTIME − SE − 20) ÷ 4) × 3 − 3 − m, and the
 * duration it signals. The PE field fills the PPDU to that boundary (from memory).
 */
export function tbPpdu(link: Link, psduBytes: Bytes): TbPpdu {
  const fam = muFamily(link);
  const sig: PreambleField = fam === "EHT" ? ["U-SIG", T_U_SIG_us] : ["HE-SIG-A", T_HE_SIG_A_us];
  const stf: PreambleField = [`${fam}-STF (TB PPDU, T_${fam}-STF-T)`, T_HE_STF_T_us];
  const [rus, whole] = tables(link);
  const n = numerology(link, rus, whole);
  const eq = txtimeFromTerms([...preambleTerms([...LEGACY_AND_RL_SIG, sig, stf]), ...trainingDataAndPeTerms(link, n, psduBytes, ltfName(link))]);
  const se = signalExtensionUs(link.bandGHz);
  const symbols = Math.ceil(roundNoise((eq.totalUs - se - T_LEGACY_us) / L_SIG_SYMBOL_us));
  const m = L_SIG_M[fam];
  const ulLength = symbols * 3 - 3 - m;
  const signalledUs = ((ulLength + 3 + m) / 3) * L_SIG_SYMBOL_us + T_LEGACY_us + se;
  const terms: TxTimeTerm[] = [
    ...eq.terms,
    factorTerm("TXTIME by the TB PPDU equation (µs)", eq.totalUs),
    factorTerm(`UL Length (L-SIG LENGTH, m = ${m})`, ulLength),
    durationTerm("PE fill to the UL Length's 4 µs boundary", roundNoise(signalledUs - eq.totalUs)),
  ];
  return { totalUs: roundNoise(signalledUs), terms, equationUs: eq.totalUs, ulLength };
}

function roundNoise(x: number): number {
  return Math.round(x * 1e9) / 1e9;
}

/** `link` for a TB PPDU that carries its data (direction up): its GI and LTF must be a TB pair. */
export function checkTbGiLtf(link: Link): void {
  if (!TB_GI_LTF.includes(giLtfPair(link))) {
    invalid(
      `link: an ${link.family} TB PPDU (direction up) takes 2xLTF GI1.6 or 4xLTF GI3.2 (the Trigger frame's GI and LTF types; ` +
        `its 1xLTF GI1.6 is no pair an MU or SU link allows), got ${link.ltf}xLTF GI${link.giUs}; use GI1.6 or GI3.2 in the link`,
    );
  }
}

/**
 * HE-MCS of the same modulation and code rate as a non-HT control rate
 * (IEEE 802.11-2020 Table 17-4 against 802.11ax-2021 27.5): 6 → MCS0,
 * 12 → 1, 18 → 2, 24 → 3, 36 → 4, 48 → 5, 54 → 6; 9 Mb/s (BPSK 3/4) has no
 * HE-MCS, so MCS0.
 */
const MCS_FOR_CONTROL_RATE: Readonly<Record<number, number>> = { 6: 0, 9: 0, 12: 1, 18: 2, 24: 3, 36: 4, 48: 5, 54: 6 };

/**
 * The TB PPDU that carries a station's acknowledgement (direction down):
 * the station's RU, one spatial stream, the HE-MCS matching the control
 * response rate (the rule of IEEE 802.11-2020 10.6.6.5 carried over to the
 * trigger's UL HE-MCS: our choice), no STBC or DCM, the link's GI and LTF
 * when a TB PPDU allows them, else 2x LTF + 1.6 µs.
 */
export function ackTbLink(link: Link, controlRateMbps: MbPerSecond): Link {
  const tbPair = TB_GI_LTF.includes(giLtfPair(link));
  return {
    ...link,
    mcs: MCS_FOR_CONTROL_RATE[controlRateMbps] ?? 0,
    streams: 1,
    stbc: false,
    dcm: false,
    ltf: tbPair ? link.ltf : 2,
    giUs: tbPair ? link.giUs : 1.6,
    text: `${link.family} TB PPDU acknowledgement`,
  };
}
