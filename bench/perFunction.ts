/**
 * Section 1 of `npm run bench`: every catalog function, calls/s in the core
 * and through the built bundle, against an inline-arithmetic baseline of the
 * same equation measured in the same run (issue 7).
 *
 * Three kinds of row:
 *   closed  closed form of numeric arguments. Baseline: the equation written
 *           inline on the same numbers. Target ≥ 0.5×.
 *   text    closed form of a link's parameters, where the argument is link
 *           text. Two baselines: the equation on parameters already decoded
 *           (printed for information: no function of text can reach it, as
 *           the row's "text floor" — one Map lookup of the same text — shows),
 *           and the same equation fed from the same link text by the cheapest
 *           inline means, a Map from the text to its decoded parameters. The
 *           target ≥ 0.5× applies to the second: both sides start from the
 *           same argument. Link text parsing itself is section 2.
 *   info    searches, solvers, series and composite functions: calls/s only
 *           (with a baseline where one is meaningful), no target.
 *
 * Before timing, every baseline is checked against the function on all of
 * the row's inputs (relative 1e-9): a baseline that computes something else
 * would make the ratio meaningless, so a disagreement fails the row.
 */
import type { Core } from "./coreLibrary";
import { fmtRate, interleaved, lpad, median, medianRatio, pad } from "./harness";

/** Interleaved rounds per row with a target; the best of each counts (BENCH_ROUNDS, default 5). This machine class shows ±30 % between identical runs. */
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);

export type Fn = (...args: unknown[]) => unknown;
type Step = (i: number) => unknown;

export interface Case {
  id: string;
  kind: "closed" | "text" | "info";
  /** The equation and its source, printed under the table. */
  equation: string;
  core: Step;
  bundle: (f: Fn) => Step;
  /** Inline arithmetic on numbers (for text rows: on parameters already decoded). */
  baseline?: (i: number) => number;
  /** Text rows: the same arithmetic fed from the same link text through one Map lookup. */
  sameText?: (i: number) => number;
  /** Text rows: the link texts, for the floor measurement. */
  texts?: readonly string[];
  /** Inputs the agreement check walks (i = 0 … inputs − 1). */
  inputs: number;
}

export interface Row {
  id: string;
  kind: Case["kind"];
  /** Median calls/s over the rounds. */
  core: number;
  bundle: number;
  baseline?: number;
  sameText?: number;
  /** Median over rounds of calls/s ÷ the baseline's calls/s in the same round: the figure the target applies to. */
  ratios?: { coreToBaseline: number; bundleToBaseline: number; coreToSameText?: number; bundleToSameText?: number; floorToBaseline?: number };
  /** Largest relative difference between the function and its baseline(s); undefined when no baseline. */
  disagreement?: number;
}

// ---------------------------------------------------------------------------
// Inputs (powers of two long, so `i & mask` cycles them cheaply)
// ---------------------------------------------------------------------------

/** IEEE 802.11-2020 Table 17-4: OFDM rates, Mb/s; N_DBPS = rate × 4 µs. */
const OFDM_RATES = [6, 9, 12, 18, 24, 36, 48, 54];
const OFDM_LINKS = OFDM_RATES.map((r) => `OFDM ${r}Mbps 5GHz`);
/** Table 17-18: minimum input sensitivity for 20 MHz, dBm, in OFDM_RATES order. */
const OFDM_SENSITIVITY = [-82, -81, -79, -77, -74, -70, -66, -65];
/** The data rate inputs: N_SD, N_BPSCS, R, N_SS, T_SYM (µs) of each link. */
const RATE_CASES: { link: string; nsd: number; nbpscs: number; r: number; nss: number; tsym: number }[] = [
  { link: "OFDM 54Mbps 5GHz", nsd: 48, nbpscs: 6, r: 3 / 4, nss: 1, tsym: 4 }, // IEEE 802.11-2020 Table 17-4
  { link: "OFDM 6Mbps 5GHz", nsd: 48, nbpscs: 1, r: 1 / 2, nss: 1, tsym: 4 }, // Table 17-4
  { link: "VHT MCS9 2SS 80MHz GI0.4 5GHz", nsd: 234, nbpscs: 8, r: 5 / 6, nss: 2, tsym: 3.6 }, // Table 21-5 (from memory: N_SD 234 at 80 MHz)
  { link: "VHT MCS7 1SS 40MHz GI0.8 5GHz", nsd: 108, nbpscs: 6, r: 5 / 6, nss: 1, tsym: 4 }, // Table 21-5
  { link: "HE MCS11 2SS 80MHz GI0.8 5GHz", nsd: 980, nbpscs: 10, r: 5 / 6, nss: 2, tsym: 13.6 }, // 802.11ax-2021: 980 data tones at 80 MHz (from memory)
  { link: "HE MCS7 1SS 20MHz GI0.8 5GHz", nsd: 234, nbpscs: 6, r: 5 / 6, nss: 1, tsym: 13.6 }, // 802.11ax-2021 (from memory: 234 data tones at 20 MHz)
  { link: "HT MCS7 1SS 20MHz GI0.8 5GHz", nsd: 52, nbpscs: 6, r: 5 / 6, nss: 1, tsym: 4 }, // Table 19-27 (from memory)
  { link: "HT MCS15 2SS 40MHz GI0.4 5GHz", nsd: 108, nbpscs: 6, r: 5 / 6, nss: 2, tsym: 3.6 }, // Table 19-28 (from memory)
];
const PSDUS = Array.from({ length: 256 }, (_, i) => 40 + ((i * 97) % 2264));
const DISTANCES_M = Array.from({ length: 256 }, (_, i) => 1 + i * 0.37);
const FREQS_MHZ = [2412, 2437, 2462, 5180, 5500, 5745, 5955, 6415];
const WIDTHS_MHZ = [20, 40, 80, 160, 320, 20, 40, 80];
const TARGETS_DBM = Array.from({ length: 256 }, (_, i) => -45 - (i % 50) * 0.9);
const RSSI_DBM = Array.from({ length: 256 }, (_, i) => -40 - (i % 30)); // all above HE MCS0 80 MHz sensitivity
const AREAS_M2 = Array.from({ length: 256 }, (_, i) => 150 + i * 137.3);
const REACHES_M = [8.3, 11.7, 14.1, 17.9, 21.3, 26.6, 33.3, 41.9];
const SHARES = Array.from({ length: 256 }, (_, i) => 0.013 + i * 0.0391);
const PACKETS = Array.from({ length: 256 }, (_, i) => 64 + ((i * 53) % 1437));
const MPDU_SIZES = Array.from({ length: 256 }, (_, i) => 80 + ((i * 61) % 3000));
const COUNTS = Array.from({ length: 64 }, (_, i) => 1 + i);
const LOSSES = [0.01, 0.02, 0.05, 0.08, 0.1, 0.15, 0.2, 0.3];
const ACCESS = ["BE", "BK", "VI", "VO"];
const HE_LINK = "HE MCS7 1SS 80MHz GI0.8 5GHz";
const MU_LINK = "HE MCS7 1SS 80MHz GI0.8 RU106 5GHz";
const MU_UP_LINK = "HE MCS7 1SS 80MHz GI1.6 RU106 5GHz";

/** Equation constants, each with its source. */
const SPEED_OF_LIGHT = 299_792_458; // m/s, SI definition
const P1238_CONSTANT = -28; // ITU-R P.1238-7 eq. (1): L = 20·log10 f + N·log10 d + L_f(n) − 28
const N_OFFICE_5GHZ = 31; // passed explicitly, so the baseline needs no table
const QOS_MPDU_OVERHEAD = 26 + 8 + 8 + 8 + 4; // QoS Data header 26 (802.11-2020 9.3.2.1) + CCMP header 8 + LLC/SNAP 8 + MIC 8 (12.5.3) + FCS 4
const AMPDU_DELIMITER = 4; // IEEE 802.11-2020 9.7.1: 4-octet delimiter, subframes padded to 4 octets
const HEX = (3 * Math.sqrt(3)) / 2; // regular hexagon area = (3√3/2)·r²
/** The budget functions' ceil: binary noise below 1e-9 rounded away first (their documented equation), e.g. 1.2 ÷ 0.6 = 2.0000000000000004 → 2. */
const ceilClean = (x: number) => Math.ceil(Math.round(x * 1e9) / 1e9);

const TEXT_FLOOR_NOTE = "one Map lookup of the same link text";

/** A row without a target: calls/s, and the ratio to an inline baseline where one is meaningful (checked like the others). */
function info(id: string, equation: string, core: Step, bundle: (f: Fn) => Step, baseline?: (i: number) => number): Case {
  return { id, kind: "info", equation, core, bundle, baseline, inputs: baseline ? 2048 : 0 };
}

/** OFDM PPDU, µs: IEEE 802.11-2020 eq. (17-29) at 20 MHz, N_DBPS = rate × 4 µs (Table 17-4). */
function ofdmPpduUs(octets: number, rateMbps: number): number {
  return 20 + 4 * Math.ceil((16 + 8 * octets + 6) / (4 * rateMbps));
}
/** Control response rate: the highest basic rate ≤ the data rate (IEEE 802.11-2020 10.6.6.5.2), basic set 6, 12, 24 Mb/s (Table 17-4's mandatory rates). */
function ackRateMbps(rateMbps: number): number {
  return rateMbps >= 24 ? 24 : rateMbps >= 12 ? 12 : 6;
}
/**
 * One OFDM exchange for BE, µs (DESIGN.md §2): AIFS[BE] = SIFS 16 + 3 × slot 9, mean backoff CWmin/2 × slot = 7.5 × 9
 * (IEEE 802.11-2020 Table 9-155, Table 17-21), the data PPDU (MPDU = packet + 54 octets with CCMP-128), SIFS, a 14-octet Ack.
 */
function ofdmExchangeUs(packetBytes: number, rateMbps: number): number {
  return 16 + 3 * 9 + 7.5 * 9 + ofdmPpduUs(packetBytes + QOS_MPDU_OVERHEAD, rateMbps) + 16 + ofdmPpduUs(14, ackRateMbps(rateMbps));
}

export function cases(core: Core): Case[] {
  // Bound once, as a caller of the library would: the bench times the functions, not the library's export getters.
  const { rateMbps, txtimeUs, sensitivityDbm, psduFit, txtimeTable, buildLink, edcaMixTable, breakdownTable } = core;
  const { fsplDb, indoorLossDb, noiseFloorDbm, reachM, topLink } = core.rf;
  const { mpduBytes, ampduBytes, expectedTransmissions, aggCount, aifsUs, channelAccess, goodputMbps, efficiency } = core.mac;
  const { coverageAps, radios, beaconShare, clientShare, mixShare } = core.budget;
  const { collisionProbability, saturationGoodputMbps, contentionShare } = core.contention;
  const { muAccessUs, muGoodputMbps, muBreakdownTable } = core.mu;
  const rateByText = new Map(RATE_CASES.map((c) => [c.link, c] as const));
  const ndbpsByText = new Map(OFDM_LINKS.map((l, k) => [l, OFDM_RATES[k] * 4] as const));
  const sensitivityByText = new Map(OFDM_LINKS.map((l, k) => [l, OFDM_SENSITIVITY[k]] as const));
  const mixLinks = [["HE MCS7 2SS 40MHz GI0.8 5GHz"], ["HT MCS4 1SS 20MHz GI0.8 5GHz"]];
  const mixCounts = [[20], [5]];
  const mixDemands = [[2], [1]];
  const edcaAccess = [["VI"], ["BE"]];
  const edcaCounts = [[2], [5]];

  return [
    // ----------------------------------------------------------- text (closed form of a link)
    {
      id: "RATE",
      kind: "text",
      equation: "floor(N_SD × N_BPSCS × R × N_SS) ÷ T_SYM, the tables' integer N_DBPS (IEEE 802.11-2020 Clauses 17, 19, 21; 802.11ax-2021 27.5)",
      core: (i) => rateMbps(RATE_CASES[i & 7].link),
      bundle: (f) => (i) => f(RATE_CASES[i & 7].link),
      baseline: (i) => {
        const c = RATE_CASES[i & 7];
        return Math.floor(c.nsd * c.nbpscs * c.r * c.nss + 1e-6) / c.tsym; // + 1e-6: 5/6 in binary must not floor 1170 to 1169
      },
      sameText: (i) => {
        const c = rateByText.get(RATE_CASES[i & 7].link)!;
        return Math.floor(c.nsd * c.nbpscs * c.r * c.nss + 1e-6) / c.tsym;
      },
      texts: RATE_CASES.map((c) => c.link),
      inputs: 8,
    },
    {
      id: "TXTIME",
      kind: "text",
      equation: "OFDM: 20 µs + 4 µs × ceil((16 + 8·L + 6) ÷ N_DBPS) (IEEE 802.11-2020 eq. (17-29))",
      core: (i) => txtimeUs(OFDM_LINKS[i & 7], PSDUS[i & 255]),
      bundle: (f) => (i) => f(OFDM_LINKS[i & 7], PSDUS[i & 255]),
      baseline: (i) => 20 + 4 * Math.ceil((16 + 8 * PSDUS[i & 255] + 6) / (OFDM_RATES[i & 7] * 4)),
      sameText: (i) => 20 + 4 * Math.ceil((16 + 8 * PSDUS[i & 255] + 6) / ndbpsByText.get(OFDM_LINKS[i & 7])!),
      texts: OFDM_LINKS,
      inputs: 2048,
    },
    {
      id: "SENSITIVITY",
      kind: "text",
      equation: "table lookup (IEEE 802.11-2020 Table 17-18, 20 MHz)",
      core: (i) => sensitivityDbm(OFDM_LINKS[i & 7]),
      bundle: (f) => (i) => f(OFDM_LINKS[i & 7]),
      baseline: (i) => OFDM_SENSITIVITY[i & 7],
      sameText: (i) => sensitivityByText.get(OFDM_LINKS[i & 7])!,
      texts: OFDM_LINKS,
      inputs: 8,
    },
    // ----------------------------------------------------------- closed form of numbers
    {
      id: "FSPL",
      kind: "closed",
      equation: "20·log10(4π·d·f ÷ c) (Friis free-space loss)",
      core: (i) => fsplDb(DISTANCES_M[i & 255], FREQS_MHZ[i & 7]),
      bundle: (f) => (i) => f(DISTANCES_M[i & 255], FREQS_MHZ[i & 7]),
      baseline: (i) => 20 * Math.log10((4 * Math.PI * DISTANCES_M[i & 255] * FREQS_MHZ[i & 7] * 1e6) / SPEED_OF_LIGHT),
      inputs: 2048,
    },
    {
      id: "INDOORLOSS",
      kind: "closed",
      equation: "20·log10 f + N·log10 d − 28 (ITU-R P.1238-7 eq. (1), no floors)",
      core: (i) => indoorLossDb(DISTANCES_M[i & 255], FREQS_MHZ[i & 7], N_OFFICE_5GHZ),
      bundle: (f) => (i) => f(DISTANCES_M[i & 255], FREQS_MHZ[i & 7], N_OFFICE_5GHZ),
      baseline: (i) => 20 * Math.log10(FREQS_MHZ[i & 7]) + N_OFFICE_5GHZ * Math.log10(DISTANCES_M[i & 255]) + P1238_CONSTANT,
      inputs: 2048,
    },
    {
      id: "NOISEFLOOR",
      kind: "closed",
      equation: "−174 dBm/Hz + 10·log10(B) + NF (kT₀ at 290 K)",
      core: (i) => noiseFloorDbm(WIDTHS_MHZ[i & 7], 7),
      bundle: (f) => (i) => f(WIDTHS_MHZ[i & 7], 7),
      baseline: (i) => -174 + 10 * Math.log10(WIDTHS_MHZ[i & 7] * 1e6) + 7,
      inputs: 8,
    },
    {
      id: "REACH",
      kind: "closed",
      equation: "10^((EIRP − target − 20·log10 f + 28) ÷ N) (P.1238-7 eq. (1) solved for d)",
      core: (i) => reachM(20, TARGETS_DBM[i & 255], FREQS_MHZ[i & 7], N_OFFICE_5GHZ),
      bundle: (f) => (i) => f(20, TARGETS_DBM[i & 255], FREQS_MHZ[i & 7], N_OFFICE_5GHZ),
      baseline: (i) => Math.pow(10, (20 - TARGETS_DBM[i & 255] - 20 * Math.log10(FREQS_MHZ[i & 7]) - P1238_CONSTANT) / N_OFFICE_5GHZ),
      inputs: 2048,
    },
    {
      id: "COVERAGEAPS",
      kind: "closed",
      equation: "max(1, ceil(area ÷ ((3√3/2)·(reach·(1 − overlap))²))) (hexagonal cells; ceil after rounding at 1e-9)",
      core: (i) => coverageAps(AREAS_M2[i & 255], REACHES_M[i & 7], 0.15),
      bundle: (f) => (i) => f(AREAS_M2[i & 255], REACHES_M[i & 7], 0.15),
      baseline: (i) => {
        const r = REACHES_M[i & 7] * 0.85;
        return Math.max(1, ceilClean(AREAS_M2[i & 255] / (HEX * r * r)));
      },
      inputs: 2048,
    },
    {
      id: "RADIOS",
      kind: "closed",
      equation: "ceil(total_share ÷ (max_utilization − overhead_share)) (ceil after rounding at 1e-9)",
      core: (i) => radios(SHARES[i & 255], 0.7, 0.1),
      bundle: (f) => (i) => f(SHARES[i & 255], 0.7, 0.1),
      baseline: (i) => ceilClean(SHARES[i & 255] / (0.7 - 0.1)),
      inputs: 256,
    },
    {
      id: "MPDU",
      kind: "closed",
      equation: "header 26 + CCMP 8 + LLC/SNAP 8 + packet + MIC 8 + FCS 4 (IEEE 802.11-2020 9.3.2.1, 12.5.3)",
      core: (i) => mpduBytes(PACKETS[i & 255]),
      bundle: (f) => (i) => f(PACKETS[i & 255]),
      baseline: (i) => PACKETS[i & 255] + QOS_MPDU_OVERHEAD,
      inputs: 256,
    },
    {
      id: "AMPDU",
      kind: "closed",
      equation: "(n − 1)·pad4(4 + MPDU) + 4 + MPDU (IEEE 802.11-2020 9.7.1)",
      core: (i) => ampduBytes(MPDU_SIZES[i & 255], COUNTS[i & 63]),
      bundle: (f) => (i) => f(MPDU_SIZES[i & 255], COUNTS[i & 63]),
      baseline: (i) => {
        const sub = AMPDU_DELIMITER + MPDU_SIZES[i & 255];
        return (COUNTS[i & 63] - 1) * (((sub + 3) >> 2) << 2) + sub;
      },
      inputs: 2048,
    },
    {
      id: "RETX",
      kind: "closed",
      equation: "whole-burst retransmission: 1 ÷ (1 − p)^N",
      core: (i) => expectedTransmissions(COUNTS[i & 63], LOSSES[i & 7], "whole"),
      bundle: (f) => (i) => f(COUNTS[i & 63], LOSSES[i & 7], "whole"),
      baseline: (i) => 1 / Math.pow(1 - LOSSES[i & 7], COUNTS[i & 63]),
      inputs: 512,
    },
    // ----------------------------------------------------------- info
    info("RETX sel.", "selective: Σ_k (1 − (1 − p^k)^N), a series", (i) => expectedTransmissions(COUNTS[i & 63], LOSSES[i & 7]), (f) => (i) => f(COUNTS[i & 63], LOSSES[i & 7]), (i) => {
      const n = COUNTS[i & 63];
      const p = LOSSES[i & 7];
      let sum = 0;
      for (let k = 0, pk = 1; ; k++, pk *= p) {
        const term = 1 - Math.pow(1 - pk, n);
        sum += term;
        if (term < 1e-15) return sum;
      }
    }),
    info("LINK", "builds and validates link text", (i) => buildLink("HE", i % 12, 1 + (i & 1), 20 << (i & 3), 0.8, 5, undefined).text, (f) => (i) => f("HE", i % 12, 1 + (i & 1), 20 << (i & 3), 0.8, 5)),
    info("PSDUFIT", "binary search over TXTIME (any PHY); baseline: OFDM's closed-form inverse of eq. (17-29)", (i) => psduFit(OFDM_LINKS[i & 7], 30 + PSDUS[i & 255] / 2), (f) => (i) => f(OFDM_LINKS[i & 7], 30 + PSDUS[i & 255] / 2), (i) => {
      const symbols = Math.floor((30 + PSDUS[i & 255] / 2 - 20) / 4);
      return Math.min(4095, Math.floor((symbols * OFDM_RATES[i & 7] * 4 - 22) / 8)); // 4095: aPSDUMaxLength (Table 17-21, from memory)
    }),
    info("TXTIMEPARTS", "TXTIME terms as a spill", (i) => txtimeTable(OFDM_LINKS[i & 7], PSDUS[i & 255]), (f) => (i) => f(OFDM_LINKS[i & 7], PSDUS[i & 255])),
    info("AGGCOUNT", "MPDUs under four aggregation limits", (i) => aggCount(HE_LINK, PACKETS[i & 255], ACCESS[i & 3]), (f) => (i) => f(HE_LINK, PACKETS[i & 255], ACCESS[i & 3])),
    info("AIFS", "SIFS + AIFSN × slot (Table 9-155)", (i) => aifsUs(ACCESS[i & 3]), (f) => (i) => f(ACCESS[i & 3])),
    info("ACCESS", "one channel access, all terms", (i) => channelAccess(HE_LINK, 1500, COUNTS[i & 63]).totalUs, (f) => (i) => f(HE_LINK, 1500, COUNTS[i & 63])),
    info("GOODPUT", "MAC options, access terms, retransmission; baseline: 8·packet ÷ one OFDM exchange", (i) => goodputMbps(OFDM_LINKS[i & 7], PACKETS[i & 255]), (f) => (i) => f(OFDM_LINKS[i & 7], PACKETS[i & 255]), (i) => (8 * PACKETS[i & 255]) / ofdmExchangeUs(PACKETS[i & 255], OFDM_RATES[i & 7])),
    info("EFFICIENCY", "GOODPUT ÷ RATE", (i) => efficiency(OFDM_LINKS[i & 7], PACKETS[i & 255]), (f) => (i) => f(OFDM_LINKS[i & 7], PACKETS[i & 255]), (i) => (8 * PACKETS[i & 255]) / ofdmExchangeUs(PACKETS[i & 255], OFDM_RATES[i & 7]) / OFDM_RATES[i & 7]),
    info("COLLIDE", "Bianchi fixed point (memoised)", (i) => collisionProbability(COUNTS[i & 63]), (f) => (i) => f(COUNTS[i & 63])),
    info("SATURATE", "saturation goodput (memoised; cold calls in section 4)", (i) => saturationGoodputMbps(HE_LINK, COUNTS[i & 63], 1500), (f) => (i) => f(HE_LINK, COUNTS[i & 63], 1500)),
    info("CONTENTION", "contention share of airtime (memoised)", (i) => contentionShare(HE_LINK, COUNTS[i & 63], 1500), (f) => (i) => f(HE_LINK, COUNTS[i & 63], 1500)),
    info("EDCAMIX", "multi-class EDCA fixed point, spilled", () => edcaMixTable(HE_LINK, edcaAccess, edcaCounts, 1500), (f) => () => f(HE_LINK, edcaAccess, edcaCounts, 1500)),
    info("TOPLINK", "best MCS at a signal level", (i) => topLink("HE", RSSI_DBM[i & 255], 2, 80), (f) => (i) => f("HE", RSSI_DBM[i & 255], 2, 80)),
    info("BEACONSHARE", "SSIDs × APs × (access + beacon TXTIME) ÷ interval", (i) => beaconShare("OFDM 6Mbps 5GHz", 1 + (i & 7), 3), (f) => (i) => f("OFDM 6Mbps 5GHz", 1 + (i & 7), 3)),
    info("CLIENTSHARE", "demand ÷ goodput; baseline: demand × one OFDM exchange ÷ 8·1500", (i) => clientShare(OFDM_LINKS[i & 7], SHARES[i & 255]), (f) => (i) => f(OFDM_LINKS[i & 7], SHARES[i & 255]), (i) => (SHARES[i & 255] * ofdmExchangeUs(1500, OFDM_RATES[i & 7])) / (8 * 1500)),
    info("MIXSHARE", "Σ count × CLIENTSHARE over ranges", () => mixShare(mixLinks, mixCounts, mixDemands), (f) => () => f(mixLinks, mixCounts, mixDemands)),
    info("BREAKDOWN", "channel access terms as a spill", (i) => breakdownTable(HE_LINK, 1500, COUNTS[i & 63]), (f) => (i) => f(HE_LINK, 1500, COUNTS[i & 63])),
    info("MUACCESS", "one multi-user exchange, down (MU PPDU + TB PPDU acks), 1–8 × RU106 in 80 MHz", (i) => muAccessUs(MU_LINK, 1 + (i & 7), PACKETS[i & 255], "down", 1 + (i & 7)), (f) => (i) => f(MU_LINK, 1 + (i & 7), PACKETS[i & 255], "down", 1 + (i & 7))),
    info("MUACCESS up", "one multi-user exchange, up (Trigger + TB PPDU + Multi-STA BlockAck), 1–8 × RU106 in 80 MHz", (i) => muAccessUs(MU_UP_LINK, 1 + (i & 7), PACKETS[i & 255], "up", 1 + (i & 7)), (f) => (i) => f(MU_UP_LINK, 1 + (i & 7), PACKETS[i & 255], "up", 1 + (i & 7))),
    info("MUGOODPUT", "users' packet bits ÷ MUACCESS, mpdus auto", (i) => muGoodputMbps(MU_LINK, 1 + (i & 7), PACKETS[i & 255]), (f) => (i) => f(MU_LINK, 1 + (i & 7), PACKETS[i & 255])),
    info("MUBREAKDOWN", "multi-user exchange terms as a spill", (i) => muBreakdownTable(MU_UP_LINK, 1 + (i & 7), PACKETS[i & 255], "up", 1), (f) => (i) => f(MU_UP_LINK, 1 + (i & 7), PACKETS[i & 255], "up", 1)),
  ];
}

/** Largest relative difference between the function and a baseline over the row's inputs. */
function disagreement(c: Case, other: (i: number) => number): number {
  let worst = 0;
  for (let i = 0; i < c.inputs; i++) {
    const got = c.core(i);
    const want = other(i);
    if (typeof got !== "number") return Infinity;
    worst = Math.max(worst, Math.abs(got - want) / Math.max(1e-300, Math.abs(want)));
  }
  return worst;
}

/** Calls/s of a bare Map.get over the texts: the least any function of link text can cost. */
function textFloorStep(texts: readonly string[]): Step {
  const table = new Map(texts.map((t, i) => [t, i] as const));
  const mask = texts.length - 1;
  return (i) => table.get(texts[i & mask]);
}

export function measure(c: Case, registered: Map<string, Fn>): Row {
  const id = c.id.split(" ")[0];
  const f = registered.get(id);
  if (!f) throw new Error(`${id} is not registered by dist/functions.js`);
  const bundleStep = c.bundle(f);
  let disagree: number | undefined;
  if (c.baseline) disagree = disagreement(c, c.baseline);
  if (c.sameText) disagree = Math.max(disagree ?? 0, disagreement(c, c.sameText));
  const steps: Step[] = [c.core, bundleStep];
  const at = { baseline: -1, sameText: -1, floor: -1 };
  if (c.baseline) at.baseline = steps.push(c.baseline) - 1;
  if (c.sameText) at.sameText = steps.push(c.sameText) - 1;
  if (c.texts) at.floor = steps.push(textFloorStep(c.texts)) - 1;
  const rounds = interleaved(steps, c.kind === "info" ? 1 : ROUNDS);
  const col = (k: number) => median(rounds.map((r) => r[k]));
  const row: Row = { id: c.id, kind: c.kind, core: col(0), bundle: col(1), disagreement: disagree };
  if (at.baseline >= 0) {
    row.baseline = col(at.baseline);
    row.ratios = { coreToBaseline: medianRatio(rounds, 0, at.baseline), bundleToBaseline: medianRatio(rounds, 1, at.baseline) };
    if (at.sameText >= 0) {
      row.sameText = col(at.sameText);
      row.ratios.coreToSameText = medianRatio(rounds, 0, at.sameText);
      row.ratios.bundleToSameText = medianRatio(rounds, 1, at.sameText);
    }
    if (at.floor >= 0) row.ratios.floorToBaseline = medianRatio(rounds, at.floor, at.baseline);
  }
  return row;
}

export const TARGET = 0.5;

/** The ratios the target applies to: against the same-text baseline for text rows, the inline baseline otherwise. */
function targetRatios(r: Row): [number, number] {
  const x = r.ratios!;
  return r.kind === "text" ? [x.coreToSameText!, x.bundleToSameText!] : [x.coreToBaseline, x.bundleToBaseline];
}

/** True when the row meets its target (info rows always do). */
export function passes(r: Row): boolean {
  if (r.disagreement !== undefined && !(r.disagreement <= 1e-9)) return false;
  if (r.kind === "info") return true;
  return targetRatios(r).every((x) => x >= TARGET);
}

export function print(rows: Row[], all: Case[]): boolean {
  console.log("\n1. Per function — median calls/s in the core and through the bundle; × = median over rounds of calls/s ÷ the row's baseline in the same round");
  console.log(`   ${pad("function", 13)}${lpad("baseline", 12)}${lpad("core", 12)}${lpad("×", 6)}${lpad("bundle", 12)}${lpad("×", 6)}  verdict (target ≥ ${TARGET}× for closed forms; ${ROUNDS} rounds)`);
  let ok = true;
  const line = (name: string, base: number | undefined, r: Row, x: [number, number] | undefined, verdict: string) => {
    const f = (v: number | undefined) => (v === undefined ? "" : v.toFixed(2));
    console.log(`   ${pad(name, 13)}${lpad(base === undefined ? "—" : fmtRate(base), 12)}${lpad(fmtRate(r.core), 12)}${lpad(f(x?.[0]), 6)}${lpad(fmtRate(r.bundle), 12)}${lpad(f(x?.[1]), 6)}  ${verdict}`);
  };
  for (const r of rows) {
    const pass = passes(r);
    ok &&= pass;
    const agree = r.disagreement === undefined || r.disagreement <= 1e-9 ? "" : ` — DISAGREES with its baseline by ${r.disagreement.toExponential(1)}`;
    if (r.kind === "text") {
      line(r.id, r.sameText, r, targetRatios(r), `${pass ? "PASS" : "FAIL"} (baseline fed from the same link text)${agree}`);
      line("", r.baseline, r, [r.ratios!.coreToBaseline, r.ratios!.bundleToBaseline], `info (baseline on decoded parameters; ${TEXT_FLOOR_NOTE} alone: ${r.ratios!.floorToBaseline!.toFixed(2)}×)`);
    } else if (r.kind === "closed") {
      line(r.id, r.baseline, r, targetRatios(r), `${pass ? "PASS" : "FAIL"}${agree}`);
    } else {
      const equation = all.find((c) => c.id === r.id)!.equation;
      const x: [number, number] | undefined = r.ratios ? [r.ratios.coreToBaseline, r.ratios.bundleToBaseline] : undefined;
      line(r.id, r.baseline, r, x, `info: ${equation}${agree}`);
    }
  }
  console.log("   Equations of the baselines:");
  for (const c of all) if (c.kind !== "info") console.log(`     ${pad(c.id, 12)} ${c.equation}`);
  console.log("   Every baseline was checked against the function on the row's inputs before timing (relative 1e-9).");
  return ok;
}
