/**
 * Trigger, MU-BAR and Multi-STA BlockAck sizes and airtimes, hand-derived
 * from the frame formats (IEEE Std 802.11ax-2021 9.3.1.22 Trigger frame,
 * 9.3.1.8.7 Multi-STA BlockAck; field sizes from memory) and the OFDM TXTIME
 * of IEEE Std 802.11-2020 17.4.3, eq. (17-29):
 *   TXTIME = 20 + 4 × ceil((16 + 8 × LENGTH + 6) ÷ N_DBPS), N_DBPS = 24 at 6 Mb/s, 96 at 24 Mb/s.
 */
import { multiStaBlockAckBytes, multiStaBitmapOctets, triggerFrameBytes, triggerPaddingOctets, muBreakdownTable } from "../../../src/core/mu";
import { txtimeUs } from "../../../src/core/phy";

// Basic Trigger: FC 2 + Duration 2 + RA 6 + TA 6 + Common Info 8 + users × (User Info 5 + Trigger Dependent 1) + Padding + FCS 4
// Padding for 16 µs of MinTrigProcTime (our choice, the largest): 16 µs × 6 Mb/s = 96 bits = 12 octets; × 24 Mb/s = 48 octets.
const basic = (users: number, padding: number) => 2 + 2 + 6 + 6 + 8 + users * (5 + 1) + padding + 4;

describe("Trigger frame sizes (802.11ax-2021 9.3.1.22, from memory)", () => {
  it("pads for 16 µs at the trigger's rate: 12 octets at 6 Mb/s, 48 at 24 Mb/s", () => {
    expect([triggerPaddingOctets(6), triggerPaddingOctets(24)]).toEqual([(16 * 6) / 8, (16 * 24) / 8]);
  });
  it.each([1, 4, 9])("a Basic Trigger for %i users is 28 + 6 × users + padding octets", (users) => {
    expect(triggerFrameBytes("basic", users, "HE", 12)).toBe(basic(users, 12));
  });
  it("a MU-BAR adds BAR Control 2 + Starting Sequence Control 2 to each User Info: 9 users → 16 + 8 + 9 × 9 + 48 + 4 = 157 octets", () => {
    expect(triggerFrameBytes("mubar", 9, "HE", 48)).toBe(16 + 8 + 9 * 9 + 48 + 4);
  });
  it("an EHT trigger carries the 5-octet Special User Info field (802.11be-2024, from memory)", () => {
    expect(triggerFrameBytes("basic", 4, "EHT", 0) - triggerFrameBytes("basic", 4, "HE", 0)).toBe(5);
  });
});

describe("Trigger frame airtime at 6 and 24 Mb/s (hand-derived, eq. (17-29))", () => {
  // [users, µs at 6 Mb/s, µs at 24 Mb/s]
  const cases: [number, number, number][] = [
    // 1 user: 46 octets at 6 Mb/s → ceil((16 + 368 + 6) / 24) = 17 symbols → 88 µs; 82 octets at 24 Mb/s → ceil(678 / 96) = 8 → 52 µs
    [1, 20 + 4 * 17, 20 + 4 * 8],
    // 4 users: 64 octets → ceil(534 / 24) = 23 → 112 µs; 100 octets → ceil(822 / 96) = 9 → 56 µs
    [4, 20 + 4 * 23, 20 + 4 * 9],
    // 9 users: 94 octets → ceil(774 / 24) = 33 → 152 µs; 130 octets → ceil(1062 / 96) = 12 → 68 µs
    [9, 20 + 4 * 33, 20 + 4 * 12],
  ];
  it.each(cases)("%i users: a Basic Trigger lasts as derived at 6 Mb/s and at 24 Mb/s", (users, at6, at24) => {
    expect(txtimeUs("OFDM 6Mbps 5GHz", triggerFrameBytes("basic", users, "HE", triggerPaddingOctets(6)))).toBe(at6);
    expect(txtimeUs("OFDM 24Mbps 5GHz", triggerFrameBytes("basic", users, "HE", triggerPaddingOctets(24)))).toBe(at24);
  });
  it("MUBREAKDOWN's trigger row for direction up is that airtime: 9 users at 6 Mb/s (HE-MCS0 → control rate 6) and at 24 Mb/s (HE-MCS7 → 24)", () => {
    // HE-MCS0 is BPSK 1/2 (non-HT reference 6 Mb/s), HE-MCS7 64-QAM 5/6 (54 Mb/s → highest basic rate 24), IEEE 802.11-2020 10.6.6.5
    const row = (link: string) => muBreakdownTable(link, 9, 100, "up", 1)[2];
    expect(row("HE MCS0 1SS 20MHz RU26 GI1.6 5GHz")).toEqual(["Basic Trigger (9 User Info, 94 octets, 6 Mb/s) (µs)", 152]);
    expect(row("HE MCS7 1SS 20MHz RU26 GI1.6 5GHz")).toEqual(["Basic Trigger (9 User Info, 130 octets, 24 Mb/s) (µs)", 68]);
  });
});

describe("Multi-STA BlockAck (802.11ax-2021 9.3.1.8.7, from memory)", () => {
  it("one Ack per user is a 2-octet AID TID Info: 9 users → 16 + 2 + 9 × 2 + 4 = 40 octets", () => {
    expect(multiStaBlockAckBytes(9, false, 256)).toBe(16 + 2 + 9 * 2 + 4);
  });
  it("a block ack per user adds Starting Sequence Control 2 and the bitmap: 4 users, window 256 (32-octet bitmap) → 18 + 4 × 36 + 4", () => {
    expect(multiStaBlockAckBytes(4, true, 256)).toBe(18 + 4 * (2 + 2 + 32) + 4);
  });
  it("sends the smallest bitmap that holds the window (32 … 1024 bits)", () => {
    expect([1, 32, 33, 64, 65, 256, 257, 1024].map(multiStaBitmapOctets)).toEqual([4, 4, 8, 8, 16, 32, 64, 128]);
  });
});
