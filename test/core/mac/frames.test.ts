import { mpduBytes, ampduBytes, blockAckBytes, ACK_octets, RTS_octets, CTS_octets, BLOCK_ACK_REQ_octets } from "../../../src/core/mac";
import { expectValueError } from "../../_lib/expectError";

describe("MPDU: QoS Data MPDU length (IEEE 802.11-2020 9.3.2.1, 12.5)", () => {
  it("wraps a 1500-octet packet with CCMP-128 by default", () => {
    // QoS Data header 26 (9.3.2.1) + CCMP header 8 + LLC/SNAP 8 + packet + CCMP MIC 8 (12.5.3.2) + FCS 4
    expect(mpduBytes(1500)).toBe(26 + 8 + (8 + 1500) + 8 + 4);
  });
  it("adds no security overhead when open", () => {
    expect(mpduBytes(1500, "open")).toBe(26 + (8 + 1500) + 4);
  });
  it("uses a 16-octet MIC for CCMP-256", () => {
    expect(mpduBytes(1500, "CCMP-256")).toBe(26 + 8 + 1508 + 16 + 4); // 12.5.3.2: CCMP-256 MIC 16 octets
  });
  it("uses an 8-octet header and 16-octet MIC for GCMP-128", () => {
    expect(mpduBytes(1500, "gcmp-128")).toBe(26 + 8 + 1508 + 16 + 4); // 12.5.5.2
  });
  it("uses an 8-octet header and 16-octet MIC for GCMP-256", () => {
    expect(mpduBytes(1500, "GCMP-256")).toBe(26 + 8 + 1508 + 16 + 4); // 12.5.5.2
  });
  it("adds the 4-octet HT Control field with HTC", () => {
    expect(mpduBytes(1500, "HTC")).toBe(26 + 4 + 8 + 1508 + 8 + 4); // 9.2.4.6 HT Control 4 octets
  });
  it("packs an A-MSDU of two with 14-octet subframe headers, the first padded to 4 octets", () => {
    // 9.3.2.2.2: subframe = DA 6 + SA 6 + Length 2 + MSDU; 14 + 1508 = 1522 → padded to 1524; last unpadded
    expect(mpduBytes(1500, "AMSDU=2")).toBe(26 + 8 + (1524 + 1522) + 8 + 4);
  });
  it("applies security once per MPDU, not per A-MSDU subframe", () => {
    expect(mpduBytes(100, "AMSDU=3 open")).toBe(26 + (124 + 124 + 122) + 4); // 14 + 108 = 122 → 124 padded
  });
  it("carries the largest packet an MSDU allows (2304 − 8 LLC/SNAP)", () => {
    expect(mpduBytes(2296, "open")).toBe(26 + 2304 + 4);
  });
  it("refuses a packet over the 2304-octet MSDU limit", () => {
    expectValueError(() => mpduBytes(2297), /^packet_bytes: .*2296/);
  });
  it("refuses a zero, fractional or non-numeric packet", () => {
    expectValueError(() => mpduBytes(0), /^packet_bytes:/);
    expectValueError(() => mpduBytes(100.5), /^packet_bytes:/);
    expectValueError(() => mpduBytes(NaN), /^packet_bytes:/);
    expectValueError(() => mpduBytes("1500"), /^packet_bytes:/);
  });
  it("refuses an A-MSDU over the largest MPDU of any PHY (11 454 octets)", () => {
    expectValueError(() => mpduBytes(2000, "AMSDU=6"), /^mac_options: AMSDU=6 .*11454/);
  });
  it("refuses an unknown cipher", () => {
    expectValueError(() => mpduBytes(1500, "CCMP-512"), /^mac_options: unknown setting "CCMP-512"/);
  });
});

describe("AMPDU: A-MPDU length (IEEE 802.11-2020 9.7.1)", () => {
  it("is the MPDU plus its 4-octet delimiter for one MPDU", () => {
    expect(ampduBytes(1554, 1)).toBe(4 + 1554);
  });
  it("pads every subframe but the last to a multiple of 4 octets", () => {
    expect(ampduBytes(1554, 2)).toBe(4 + 1554 + 2 + (4 + 1554)); // 1558 → 1560
  });
  it("adds no padding when subframes are already aligned", () => {
    expect(ampduBytes(1556, 3)).toBe(3 * (4 + 1556));
  });
  it("refuses a count of 0 or a fractional MPDU length", () => {
    expectValueError(() => ampduBytes(1554, 0), /^count:/);
    expectValueError(() => ampduBytes(1554.5, 2), /^mpdu_bytes:/);
  });
});

describe("control frames (IEEE 802.11-2020 9.3.1)", () => {
  it("Ack is 14 octets: Frame Control, Duration, RA, FCS", () => {
    expect(ACK_octets).toBe(2 + 2 + 6 + 4);
  });
  it("CTS is 14 octets", () => {
    expect(CTS_octets).toBe(2 + 2 + 6 + 4);
  });
  it("RTS is 20 octets: Frame Control, Duration, RA, TA, FCS", () => {
    expect(RTS_octets).toBe(2 + 2 + 6 + 6 + 4);
  });
  it("compressed BlockAckReq is 24 octets", () => {
    expect(BLOCK_ACK_REQ_octets).toBe(2 + 2 + 6 + 6 + 2 + 2 + 4); // + BAR Control + Starting Sequence Control
  });
  it("compressed BlockAck with a 64-bit bitmap is 32 octets", () => {
    expect(blockAckBytes(64)).toBe(2 + 2 + 6 + 6 + 2 + 2 + 8 + 4);
  });
  it("compressed BlockAck with a 256-bit bitmap is 56 octets (802.11ax-2021)", () => {
    expect(blockAckBytes(256)).toBe(2 + 2 + 6 + 6 + 2 + 2 + 32 + 4);
  });
  // 802.11ax-2021 9.3.1.8.2 adds 16- and 32-octet bitmaps, 802.11be-2024 64 and 128 octets (from memory):
  // the smallest that holds the window is sent.
  it("compressed BlockAck for a 128-MPDU window has a 128-bit bitmap: 40 octets", () => {
    expect(blockAckBytes(128)).toBe(2 + 2 + 6 + 6 + 2 + 2 + 16 + 4);
  });
  it("compressed BlockAck for a 512-MPDU window has a 512-bit bitmap: 88 octets", () => {
    expect(blockAckBytes(512)).toBe(2 + 2 + 6 + 6 + 2 + 2 + 64 + 4);
  });
  // Independent of our memory of the size list: for every window the bitmap covers the window, and halving it
  // (the next power-of-two size down) would not, except for windows of 64 or less, where 64 bits is the floor.
  it("sends, for every window 1–1024, a bitmap that covers it and is at most twice the window (64 bits at least)", () => {
    for (let w = 1; w <= 1024; w++) {
      const bitmapBits = (blockAckBytes(w) - 24) * 8;
      expect(bitmapBits).toBeGreaterThanOrEqual(w);
      expect(bitmapBits).toBeLessThanOrEqual(Math.max(64, 2 * w - 1));
    }
  });
  it("a window between two sizes takes the larger bitmap (BA=100 → 128 bits, BA=300 → 512 bits)", () => {
    expect(blockAckBytes(100)).toBe(blockAckBytes(128));
    expect(blockAckBytes(300)).toBe(blockAckBytes(512));
  });
  it("compressed BlockAck with a 1024-bit bitmap is 152 octets (802.11be-2024)", () => {
    expect(blockAckBytes(1024)).toBe(2 + 2 + 6 + 6 + 2 + 2 + 128 + 4);
  });
});
