import { goodputMbps, efficiency, parseMacOptions, tcpAckAccessUs, exchangeContext, channelAccess } from "../../../src/core/mac/index";
import { rateMbps } from "../../../src/core/phy/index";
import { clientShare, mixShare, saturationGoodputTcpMbps, dataOnlyMacOptions } from "../../../src/core/budget/index";
import { saturationGoodputMbps } from "../../../src/core/contention/index";
import { expectValueErrorNaming as expectValueError } from "../../_lib/expectError";

/**
 * Hand derivation: a TCP download, OFDM 54 Mb/s at 5 GHz, BE, CCMP-128, 1500-octet segments
 * (OFDM sends one MPDU per access), delayed ACKs: one ACK per 2 segments (RFC 1122 4.2.3.2, RFC 5681 4.2).
 *
 * Data access (as in share.test.ts):
 *   MPDU = 26 (QoS data header) + 8 (LLC/SNAP) + 1500 + 8 (CCMP header) + 8 (MIC) + 4 (FCS) = 1554 octets
 *   PPDU = 20 + 4 × ceil((16 + 8 × 1554 + 6) ÷ 216) = 252 µs           (IEEE 802.11-2020 eq. (17-29), N_DBPS 216)
 *   ACCESS = AIFS[BE] (16 + 3 × 9 = 43) + backoff 15 ÷ 2 × 9 (67.5) + 252 + SIFS 16 + Ack 28 = 406.5 µs
 * TCP ACK access on the reverse link (a 40-octet IP packet: IPv4 20 + TCP 20):
 *   MPDU = 26 + 8 + 40 + 8 + 8 + 4 = 94 octets
 *   PPDU = 20 + 4 × ceil((16 + 8 × 94 + 6) ÷ 216) = 20 + 4 × ceil(774 ÷ 216) = 20 + 4 × 4 = 36 µs
 *   ACCESS = 43 + 67.5 + 36 + 16 + 28 = 190.5 µs
 * Two segments cost 2 × 406.5 + 190.5 = 1003.5 µs and carry 2 × 8 × 1500 = 24 000 bits:
 *   TCP goodput = 24 000 ÷ 1003.5 = 23.916 Mb/s   (UDP: 12 000 ÷ 406.5 = 29.520 Mb/s)
 */
const LINK = "OFDM 54Mbps 5GHz";
const DATA_ACCESS_us = 43 + 67.5 + 252 + 16 + 28;
const ACK_ACCESS_us = 43 + 67.5 + 36 + 16 + 28;
const TCP_GOODPUT_Mbps = (2 * 8 * 1500) / (2 * DATA_ACCESS_us + ACK_ACCESS_us);
const UDP_GOODPUT_Mbps = (8 * 1500) / DATA_ACCESS_us;

describe("TCP in mac_options (GOODPUT)", () => {
  it("matches the hand derivation: a data access per segment and an ACK access per two segments", () => {
    expect(goodputMbps(LINK, 1500, null, null, null, null, "TCP")).toBeCloseTo(TCP_GOODPUT_Mbps, 10);
  });

  it("costs the ACK the hand-derived 190.5 µs access", () => {
    expect(tcpAckAccessUs(exchangeContext(LINK, 1500, null, null, "TCP"))).toBeCloseTo(ACK_ACCESS_us, 9);
    expect(channelAccess(LINK, 40).totalUs).toBeCloseTo(ACK_ACCESS_us, 9); // the same access through ACCESS
  });

  it("is below UDP goodput on the same link (issue 15 acceptance)", () => {
    expect(goodputMbps(LINK, 1500)).toBeCloseTo(UDP_GOODPUT_Mbps, 10);
    expect(goodputMbps(LINK, 1500, null, null, null, null, "TCP")).toBeLessThan(goodputMbps(LINK, 1500));
    const he = "HE MCS9 2SS 80MHz 5GHz";
    expect(goodputMbps(he, 1500, null, null, null, null, "TCP")).toBeLessThan(goodputMbps(he, 1500));
  });

  it("TCPACK=1 (an ACK per segment) costs one ACK access per data access", () => {
    // 12 000 bits ÷ (406.5 + 190.5) µs
    expect(goodputMbps(LINK, 1500, null, null, null, null, "TCP TCPACK=1")).toBeCloseTo((8 * 1500) / (DATA_ACCESS_us + ACK_ACCESS_us), 10);
  });

  it("with an A-MPDU of 64 segments and TCPACK=2 adds 32 ACK accesses per data access", () => {
    const he = "HE MCS9 2SS 80MHz 5GHz";
    const data = channelAccess(he, 1500, 64).totalUs;
    const ack = channelAccess(he, 40, 1).totalUs; // one 40-octet packet, BE, no protection
    expect(goodputMbps(he, 1500, 64, null, null, null, "TCP")).toBeCloseTo((64 * 8 * 1500) / (data + 32 * ack), 9);
  });

  it("keeps the selective-retransmission loss model for the data: 1 ÷ (1 ÷ G + T_ACK ÷ (8 × bytes × n))", () => {
    const he = "HE MCS9 2SS 80MHz 5GHz";
    const g = goodputMbps(he, 1500, 64, null, null, 0.1);
    const ack = channelAccess(he, 40, 1).totalUs;
    expect(goodputMbps(he, 1500, 64, null, null, 0.1, "TCP")).toBeCloseTo(1 / (1 / g + ack / (8 * 1500 * 2)), 9);
  });

  it("sends the ACKs in the data's access category", () => {
    const vi = goodputMbps(LINK, 1500, null, "VI", null, null, "TCP");
    const g = goodputMbps(LINK, 1500, null, "VI");
    const ack = channelAccess(LINK, 40, 1, "VI").totalUs;
    expect(vi).toBeCloseTo(1 / (1 / g + ack / (8 * 1500 * 2)), 10);
  });

  it("carries through EFFICIENCY = GOODPUT ÷ RATE", () => {
    expect(efficiency(LINK, 1500, null, null, null, null, "TCP")).toBeCloseTo(TCP_GOODPUT_Mbps / rateMbps(LINK), 10);
  });

  it("parses TCP and TCPACK=n, and refuses TCPACK without TCP or out of range", () => {
    expect(parseMacOptions("TCP").tcp).toBe(true);
    expect(parseMacOptions("tcp TCPACK=4").tcpAckSegments).toBe(4);
    expectValueError(() => parseMacOptions("TCPACK=2"), "mac_options");
    expectValueError(() => parseMacOptions("TCP TCPACK=0"), "mac_options");
    expectValueError(() => parseMacOptions("TCP TCPACK=1.5"), "mac_options");
    expectValueError(() => parseMacOptions("TCP TCP"), "mac_options");
  });
});

describe("TCP in SATURATE, CLIENTSHARE and MIXSHARE", () => {
  const he = "HE MCS7 2SS 40MHz 5GHz";

  it("SATURATE adds the ACK accesses after the saturated data: 1 ÷ (1 ÷ S + T_ACK ÷ (8 × bytes × 2))", () => {
    const s = saturationGoodputMbps(he, 10, 1500, null, "BE", null, null);
    const ack = channelAccess(he, 40, 1).totalUs;
    expect(saturationGoodputTcpMbps(he, 10, 1500, null, "BE", null, "TCP")).toBeCloseTo(1 / (1 / s + ack / (8 * 1500 * 2)), 9);
    expect(saturationGoodputTcpMbps(he, 10, 1500, null, "BE", null, "TCP")).toBeLessThan(s);
  });

  it("SATURATE without TCP is the contention model's result unchanged", () => {
    expect(saturationGoodputTcpMbps(he, 10, 1500, null, "BE", null, "GCMP-256")).toBe(saturationGoodputMbps(he, 10, 1500, null, "BE", null, "GCMP-256"));
  });

  it("CLIENTSHARE of a TCP flow is demand ÷ the TCP goodput, one station or several", () => {
    expect(clientShare(LINK, 10, 1500, 1, "BE", "TCP")).toBeCloseTo(10 / TCP_GOODPUT_Mbps, 10);
    expect(clientShare(he, 10, 1500, 10, "BE", "TCP")).toBe(10 / saturationGoodputTcpMbps(he, 10, 1500, null, "BE", null, "TCP"));
  });

  it("MIXSHARE takes a class's MAC settings after its access category (\"BE TCP\")", () => {
    const mix = mixShare([[LINK], [LINK]], [[3], [2]], [[4], [1]], null, null, [["BE TCP"], ["VO"]], [[null], [1]]);
    expect(mix).toBeCloseTo(3 * (4 / TCP_GOODPUT_Mbps) + 2 * clientShare(LINK, 1, 1500, 1, "VO", null, 1), 10);
  });

  it("MIXSHARE names the item of a bad class setting", () => {
    expect(() => mixShare([[LINK]], [[3]], [[4]], null, null, [["BE TCPACK=2"]])).toThrow(/^accesses: item 1: mac_options:/);
  });

  it("CONTENTION and EDCAMIX refuse TCP rather than ignore it", () => {
    expectValueError(() => dataOnlyMacOptions("CONTENTION", "TCP"), "mac_options");
    expect(dataOnlyMacOptions("EDCAMIX", "GCMP-256")).toBe("GCMP-256");
  });
});
