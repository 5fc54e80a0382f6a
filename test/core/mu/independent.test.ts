/**
 * MUACCESS against an independent reckoning of the same exchange, written
 * here from the standard's rules without any of src/core's helpers (all
 * durations in tenths of a microsecond, integer arithmetic), over a seeded
 * sample of HE links with BCC coding (RUs up to 242 tones, MCS 0–9, where
 * the padding needs no LDPC step):
 *
 * - HE PPDUs (IEEE Std 802.11ax-2021 27.4.3): L-STF 8 + L-LTF 8 + L-SIG 4 +
 *   RL-SIG 4 + HE-SIG-A 8 µs, then HE-SIG-B (MU PPDU, 4 µs symbols) and
 *   HE-STF 4 µs (MU) or 8 µs (TB), N_HE-LTF × (12.8 × size ÷ 4 + GI), and
 *   N_SYM × (12.8 + GI) with BCC pre-FEC padding (27.3.12):
 *   N_SYM = ceil((8·L + 16 + 6) ÷ N_DBPS), a from N_excess and N_DBPS,short,
 *   and T_PE from the nominal packet padding and a (27.3.13, from memory).
 *   A TB PPDU lasts until the 4 µs boundary its UL Length signals (27.3.11.5).
 * - HE-SIG-B at MCS0, 26 bits per symbol: RU Allocation 8 bits × (1, 1, 2)
 *   at 20/40/80 MHz, a Center 26-tone RU bit at 80 MHz, CRC 4 + tail 6; user
 *   fields of 21 bits in pairs + 10; the users split over 1 (20 MHz) or 2
 *   content channels.
 * - Non-HT control frames (IEEE 802.11-2020 eq. 17-29): 20 + 4 × ceil((22 + 8·L) ÷ (4 × rate)),
 *   at the highest of 6, 12, 24 Mb/s not above the MCS's non-HT reference rate (10.6.6.5).
 * - Frame sizes (9.3.1.22, 9.3.1.8.7, from memory): Basic Trigger 28 + 6 per user + padding,
 *   MU-BAR 28 + 9 per user + padding, padding 2 × rate octets (16 µs);
 *   Multi-STA BlockAck 22 + 2 per user (Ack) or + 36 per user (window 256);
 *   compressed BlockAck 56, Ack 14; MPDU = packet + 54 (CCMP-128).
 * - AP's EDCA for BE (Table 9-155): AIFS 16 + 3 × 9, mean backoff 7.5 × 9.
 */
import fc from "fast-check";
import { muAccessUs } from "../../../src/core/mu";

/** HE RU N_SD and N_SD,short (27.3.2, 27.3.12 tables). */
const RU: Record<number, [number, number]> = { 26: [24, 6], 52: [48, 12], 106: [102, 24], 242: [234, 60] };
/** HE-MCS 0–9: N_BPSCS and R as [num, den] (27.5). */
const MCS: [number, number, number][] = [[1, 1, 2], [2, 1, 2], [2, 3, 4], [4, 1, 2], [4, 3, 4], [6, 2, 3], [6, 3, 4], [6, 5, 6], [8, 3, 4], [8, 5, 6]];
/** Non-HT reference rate of HE-MCS 0–9 (Mb/s). */
const REFERENCE = [6, 12, 18, 24, 36, 48, 54, 54, 54, 54];
/** RUs of each size per channel width (27.3.2.2). */
const FIT: Record<number, Record<number, number>> = { 20: { 26: 9, 52: 4, 106: 2, 242: 1 }, 40: { 26: 18, 52: 8, 106: 4, 242: 2 }, 80: { 26: 37, 52: 16, 106: 8, 242: 4 } };
const PE_TENTHS: Record<number, number[]> = { 0: [0, 0, 0, 0], 8: [0, 0, 40, 80], 16: [40, 80, 120, 160] };

interface Case {
  readonly ru: number;
  readonly width: number;
  readonly mcs: number;
  readonly ss: number;
  readonly gi: 0.8 | 1.6 | 3.2;
  readonly ltf: 2 | 4;
  readonly pe: 0 | 8 | 16;
  readonly users: number;
  readonly packet: number;
  readonly mpdus: number;
  readonly mode: "up" | "down" | "mubar";
}

const tenths = (us: number) => Math.round(us * 10);

/** HE Data field + PE + LTFs, tenths of µs, BCC. */
function dataTenths(ru: number, mcs: number, ss: number, gi: number, ltf: number, pe: number, psdu: number): number {
  const [nsd, nsdShort] = RU[ru];
  const [nbpscs, num, den] = MCS[mcs];
  const nDbps = (nsd * nbpscs * num * ss) / den;
  const nDbpsShort = (nsdShort * nbpscs * num * ss) / den;
  const bits = 8 * psdu + 16 + 6;
  const nSym = Math.ceil(bits / nDbps);
  const excess = bits % nDbps;
  const a = excess === 0 ? 4 : Math.min(Math.ceil(excess / nDbpsShort), 4);
  const nLtf = ss === 1 ? 1 : 2;
  return nLtf * ((128 * ltf) / 4 + tenths(gi)) + nSym * (128 + tenths(gi)) + PE_TENTHS[pe][a - 1];
}

function sigBSymbols(width: number, users: number): number {
  const channels = width === 20 ? 1 : 2;
  const perChannel = Math.ceil(users / channels);
  const common = { 20: 8, 40: 8, 80: 16 }[width as 20 | 40 | 80]! + (width === 80 ? 1 : 0) + 10;
  const userBits = Math.floor(perChannel / 2) * 52 + (perChannel % 2) * 31;
  return Math.ceil((common + userBits) / 26);
}

function muPpduTenths(c: Case, psdu: number): number {
  return 320 + 40 * sigBSymbols(c.width, c.users) + 40 + dataTenths(c.ru, c.mcs, c.ss, c.gi, c.ltf, c.pe, psdu);
}

function tbPpduTenths(ru: number, mcs: number, ss: number, gi: number, ltf: number, pe: number, psdu: number): number {
  const txtime = 320 + 80 + dataTenths(ru, mcs, ss, gi, ltf, pe, psdu);
  return 200 + 40 * Math.ceil((txtime - 200) / 40);
}

function controlTenths(octets: number, rate: number): number {
  return 10 * (20 + 4 * Math.ceil((22 + 8 * octets) / (4 * rate)));
}

const ceil4 = (x: number) => Math.ceil(x / 4) * 4;

/** The exchange by the rules above, µs; null when its data PPDU overruns aPPDUMaxTime (5484 µs). */
function expectedUs(c: Case): number | null {
  const rate = REFERENCE[c.mcs] >= 24 ? 24 : REFERENCE[c.mcs] >= 12 ? 12 : 6;
  const mpdu = c.packet + 54;
  const ampdu = c.mpdus === 1 ? mpdu + 4 : (c.mpdus - 1) * ceil4(4 + mpdu) + 4 + mpdu;
  const backoff = 430 + 675;
  const sifs = 160;
  const padding = 2 * rate;
  if (c.mode === "up") {
    const data = tbPpduTenths(c.ru, c.mcs, c.ss, c.gi, c.ltf, c.pe, ampdu);
    if (data > 54840) return null;
    const trigger = 28 + 6 * c.users + padding;
    const mba = 22 + c.users * (c.mpdus === 1 ? 2 : 36);
    return (backoff + controlTenths(trigger, rate) + sifs + data + sifs + controlTenths(mba, rate)) / 10;
  }
  const psdu = c.mode === "mubar" ? ampdu : ceil4(c.mpdus === 1 ? 4 + mpdu : ampdu) + 4 + 34;
  const data = muPpduTenths(c, psdu);
  if (data > 54840) return null;
  const ackMcs = rate === 24 ? 3 : rate === 12 ? 1 : 0;
  const tbPair = (c.ltf !== 4 && c.gi === 1.6) || (c.ltf === 4 && c.gi === 3.2);
  const ack = tbPpduTenths(c.ru, ackMcs, 1, tbPair ? c.gi : 1.6, tbPair ? c.ltf : 2, c.pe, (c.mpdus === 1 ? 14 : 56) + 4);
  const bar = c.mode === "mubar" ? controlTenths(28 + 9 * c.users + padding, rate) + sifs : 0;
  return (backoff + data + sifs + bar + ack) / 10;
}

function linkText(c: Case): string {
  return `HE MCS${c.mcs} ${c.ss}SS ${c.width}MHz GI${c.gi} ${c.ltf}xLTF PE${c.pe} RU${c.ru} BCC 5GHz`;
}

const cases: fc.Arbitrary<Case> = fc
  .record({
    width: fc.constantFrom(20, 40, 80),
    ru: fc.constantFrom(26, 52, 106, 242),
    mcs: fc.integer({ min: 0, max: 9 }),
    ss: fc.constantFrom(1, 2),
    giLtf: fc.constantFrom<[0.8 | 1.6 | 3.2, 2 | 4]>([0.8, 2], [1.6, 2], [3.2, 4], [0.8, 4]),
    pe: fc.constantFrom<0 | 8 | 16>(0, 8, 16),
    userShare: fc.double({ min: 0, max: 1, noNaN: true }),
    packet: fc.constantFrom(40, 100, 200, 700, 1500),
    mpdus: fc.integer({ min: 1, max: 3 }),
    mode: fc.constantFrom<"up" | "down" | "mubar">("up", "down", "mubar"),
  })
  .map(({ giLtf, userShare, ...r }) => ({ ...r, gi: giLtf[0], ltf: giLtf[1], users: 1 + Math.floor(userShare * (FIT[r.width][r.ru] - 1)) }))
  // An RU link is checked as an MU PPDU (2x or 4x LTF, 27.3.11.7); a TB PPDU (up) takes 2x with GI 1.6 or 4x with GI 3.2.
  .filter((c) => c.mode !== "up" || (c.gi === 1.6 && c.ltf === 2) || (c.gi === 3.2 && c.ltf === 4));

describe("MUACCESS equals an independent reckoning from the standard's rules (BCC HE links)", () => {
  it("agrees to 1e-9 µs on a seeded sample of 1500 exchanges, and refuses exactly those past aPPDUMaxTime", () => {
    let compared = 0;
    fc.assert(
      fc.property(cases, (c) => {
        const want = expectedUs(c);
        const args = [linkText(c), c.users, c.packet, c.mode === "up" ? "up" : "down", c.mpdus, "BE", c.mode === "mubar" ? "MUBAR" : null] as const;
        if (want === null) {
          expect(() => muAccessUs(...args)).toThrow(/^(mpdus|packet_bytes): /);
          return;
        }
        compared++;
        expect([linkText(c), c.users, c.mode, c.packet, c.mpdus, muAccessUs(...args)]).toEqual([linkText(c), c.users, c.mode, c.packet, c.mpdus, expect.closeTo(want, 9)]);
      }),
      { seed: 0x13, numRuns: 1500 },
    );
    expect(compared).toBeGreaterThan(1000);
  });
});
