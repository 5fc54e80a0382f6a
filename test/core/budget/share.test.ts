import { clientShare, mixShare } from "../../../src/core/budget/index";
import { goodputMbps } from "../../../src/core/mac/index";
import { saturationGoodputMbps } from "../../../src/core/contention/index";
import { expectValueErrorNaming as expectValueError } from "../../_lib/expectError";

/**
 * One station alone, OFDM 54 Mb/s at 5 GHz, 1500-octet packets, BE, CCMP-128, by hand:
 *   MPDU = 26 (QoS data header) + 8 (LLC/SNAP) + 1500 + 8 (CCMP header) + 8 (MIC) + 4 (FCS) = 1554 octets
 *   PPDU = 20 + 4 × ceil((16 + 8 × 1554 + 6) ÷ 216) = 20 + 4 × 58 = 252 µs   (IEEE 802.11-2020 eq. (17-29), N_DBPS 216)
 *   Ack at 24 Mb/s = 20 + 4 × ceil((16 + 8 × 14 + 6) ÷ 96) = 28 µs           (control response rate, 10.6.6.5)
 *   ACCESS = AIFS[BE] 16 + 3 × 9 + mean backoff 15 ÷ 2 × 9 + 252 + SIFS 16 + 28 = 43 + 67.5 + 252 + 16 + 28 = 406.5 µs
 *   goodput = 8 × 1500 ÷ 406.5 = 29.52 Mb/s
 */
const OFDM54_GOODPUT_Mbps = (8 * 1500) / (43 + 67.5 + 252 + 16 + 28);

describe("CLIENTSHARE", () => {
  it("is demand ÷ the hand-derived goodput for one station: 10 Mb/s at OFDM 54 Mb/s", () => {
    expect(clientShare("OFDM 54Mbps 5GHz", 10)).toBeCloseTo(10 / OFDM54_GOODPUT_Mbps, 12);
  });

  it("is demand ÷ GOODPUT for one station with every argument given", () => {
    const link = "VHT MCS7 2SS 80MHz 5GHz";
    expect(clientShare(link, 50, 1000, 1, "VI", "GCMP-256")).toBe(50 / goodputMbps(link, 1000, null, "VI", null, null, "GCMP-256"));
  });

  it("is demand ÷ SATURATE with 10 contending stations (the channel's capacity at that link)", () => {
    const link = "HE MCS9 2SS 80MHz 5GHz";
    expect(clientShare(link, 20, 1500, 10)).toBe(20 / saturationGoodputMbps(link, 10, 1500, null, "BE", null, null));
  });

  it("keeps a share above 1 when the demand exceeds the link (never clamped)", () => {
    expect(clientShare("OFDM 54Mbps 5GHz", 40)).toBeCloseTo(40 / OFDM54_GOODPUT_Mbps, 12);
  });

  it("is 0 for no demand", () => {
    expect(clientShare("OFDM 54Mbps 5GHz", 0)).toBe(0);
  });

  it("refuses a negative demand", () => {
    expectValueError(() => clientShare("OFDM 54Mbps 5GHz", -1), "demand_mbps");
  });

  it("refuses zero stations", () => {
    expectValueError(() => clientShare("OFDM 54Mbps 5GHz", 1, 1500, 0), "stations");
  });

  it("refuses bad link text", () => {
    expectValueError(() => clientShare("OFDM 55Mbps 5GHz", 1), "link");
  });
});

/**
 * Voice: one 200-octet packet per AC_VO access, OFDM 54 Mb/s at 5 GHz, CCMP-128, by hand:
 *   MPDU = 26 + 8 + 200 + 8 + 8 + 4 = 254 octets
 *   PPDU = 20 + 4 × ceil((16 + 8 × 254 + 6) ÷ 216) = 20 + 4 × 10 = 60 µs   (IEEE 802.11-2020 eq. (17-29))
 *   AIFS[VO] = SIFS 16 + AIFSN 2 × 9 = 34 µs; mean backoff CWmin 3 ÷ 2 × 9 = 13.5 µs   (Table 9-155, non-AP STA)
 *   ACCESS = 34 + 13.5 + 60 + SIFS 16 + Ack 28 = 151.5 µs
 *   goodput = 8 × 200 ÷ 151.5 = 10.56 Mb/s; 0.1 Mb/s needs 0.1 ÷ 10.56 = 0.00947 of the airtime
 */
const OFDM54_VOICE_GOODPUT_Mbps = (8 * 200) / (34 + 13.5 + 60 + 16 + 28);

describe("CLIENTSHARE with mpdus (one packet per access)", () => {
  it("is demand ÷ GOODPUT(link, 200, 1, VO) exactly for a voice client (issue 15 acceptance)", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    expect(clientShare(link, 0.1, 200, 1, "VO", null, 1)).toBe(0.1 / goodputMbps(link, 200, 1, "VO"));
  });

  it("matches the hand-derived voice access at OFDM 54 Mb/s", () => {
    expect(clientShare("OFDM 54Mbps 5GHz", 0.1, 200, 1, "VO", null, 1)).toBeCloseTo(0.1 / OFDM54_VOICE_GOODPUT_Mbps, 12);
  });

  it("charges a one-packet-per-access class far more than the same demand in full A-MPDUs", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    // At 200 octets "auto" packs hundreds of MPDUs per access; one per access pays AIFS, backoff, preamble and Ack per packet.
    expect(clientShare(link, 0.1, 200, 1, "VO", null, 1)).toBeGreaterThan(5 * clientShare(link, 0.1, 200, 1, "VO", null, "auto"));
  });

  it("treats an omitted or blank mpdus as auto", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    expect(clientShare(link, 2, 1500, 1, "BE", null, null)).toBe(clientShare(link, 2, 1500, 1, "BE", null, "auto"));
  });

  it("passes mpdus to SATURATE with several stations", () => {
    const link = "HE MCS7 2SS 40MHz 5GHz";
    expect(clientShare(link, 0.1, 200, 4, "VO", null, 1)).toBe(0.1 / saturationGoodputMbps(link, 4, 200, 1, "VO", null, null));
  });

  it("refuses more MPDUs than fit, naming mpdus", () => {
    expectValueError(() => clientShare("OFDM 54Mbps 5GHz", 1, 1500, 1, "BE", null, 2), "mpdus");
  });
});

describe("MIXSHARE", () => {
  const A = "OFDM 54Mbps 5GHz";
  const B = "VHT MCS9 2SS 80MHz 5GHz";

  it("sums count × CLIENTSHARE over the rows", () => {
    // 10 clients × 2 Mb/s on A + 2 clients × 20 Mb/s on B
    expect(mixShare([[A], [B]], [[10], [2]], [[2], [20]])).toBeCloseTo(10 * clientShare(A, 2) + 2 * clientShare(B, 20), 12);
  });

  it("matches the hand-derived goodput for one row", () => {
    // 4 clients × 3 Mb/s ÷ 29.52 Mb/s
    expect(mixShare([[A]], [[4]], [[3]])).toBeCloseTo((4 * 3) / OFDM54_GOODPUT_Mbps, 12);
  });

  it("reads ranges of different shapes cell by cell when the cell counts agree", () => {
    // links as a row, counts and demands as columns
    expect(mixShare([[A, B]], [[10], [2]], [[2], [20]])).toBeCloseTo(10 * clientShare(A, 2) + 2 * clientShare(B, 20), 12);
  });

  it("ignores blank rows", () => {
    expect(mixShare([[A], [""], [null]], [[10], [""], [null]], [[2], [""], [0]])).toBeCloseTo(10 * clientShare(A, 2), 12);
  });

  it("passes packet_bytes and stations to each row", () => {
    expect(mixShare([[B]], [[5]], [[10]], 1000, 8)).toBeCloseTo(5 * clientShare(B, 10, 1000, 8), 12);
  });

  it("is 0 for an empty mix", () => {
    expect(mixShare([[""]], [[""]], [[""]])).toBe(0);
  });

  it("refuses ranges of different sizes", () => {
    expectValueError(() => mixShare([[A], [B]], [[10]], [[2], [20]]), "counts");
  });

  it("refuses a demands range of a different size", () => {
    expectValueError(() => mixShare([[A], [B]], [[10], [2]], [[2]]), "demands_mbps");
  });

  it("refuses a row with clients but no link", () => {
    expectValueError(() => mixShare([[A], [""]], [[10], [3]], [[2], [5]]), "links");
  });

  it("names the item of a bad link", () => {
    expect(() => mixShare([[A], ["OFDM 55Mbps"]], [[10], [3]], [[2], [5]])).toThrow(/^links: item 2: link:/);
  });

  it("charges each class with its own access category and MPDUs per access", () => {
    // 10 data clients (BE, auto) + 4 voice handsets (VO, one packet per access)
    const expected = 10 * clientShare(B, 2, 1500, 1, "BE", null, "auto") + 4 * clientShare(B, 0.1, 1500, 1, "VO", null, 1);
    expect(mixShare([[B], [B]], [[10], [4]], [[2], [0.1]], null, null, [["BE"], ["VO"]], [["auto"], [1]])).toBeCloseTo(expected, 12);
  });

  it("matches the hand-derived voice access for a voice-only mix", () => {
    // 5 handsets × 0.1 Mb/s ÷ 10.56 Mb/s (200-octet packets, one per VO access)
    expect(mixShare([[A]], [[5]], [[0.1]], 200, 1, [["VO"]], [[1]])).toBeCloseTo((5 * 0.1) / OFDM54_VOICE_GOODPUT_Mbps, 12);
  });

  it("takes BE and auto for blank accesses and mpdus cells", () => {
    expect(mixShare([[A], [B]], [[10], [2]], [[2], [20]], null, null, [[""], [null]], [[null], [""]])).toBe(mixShare([[A], [B]], [[10], [2]], [[2], [20]]));
  });

  it("refuses an accesses range of a different size", () => {
    expectValueError(() => mixShare([[A], [B]], [[10], [2]], [[2], [20]], null, null, [["VO"]]), "accesses");
  });

  it("refuses an mpdus range of a different size", () => {
    expectValueError(() => mixShare([[A], [B]], [[10], [2]], [[2], [20]], null, null, null, [[1], [1], [1]]), "mpdus");
  });

  it("names the item of a bad access category, even in a row with no clients", () => {
    expect(() => mixShare([[A], [B]], [[10], [0]], [[2], [0]], null, null, [["BE"], ["V0"]])).toThrow(/^accesses: item 2: access:/);
  });

  it("names the item of a bad MPDU count", () => {
    expect(() => mixShare([[A], [B]], [[10], [2]], [[2], [20]], null, null, null, [[2], [1]])).toThrow(/^mpdus: item 1: mpdus:/);
  });

  it("refuses a negative count", () => {
    expectValueError(() => mixShare([[A]], [[-1]], [[2]]), "counts");
  });

  it("does not change its input ranges", () => {
    const links = [[A], [B]];
    const counts = [[10], [2]];
    const demands = [[2], [20]];
    mixShare(links, counts, demands);
    expect([links, counts, demands]).toEqual([[[A], [B]], [[10], [2]], [[2], [20]]]);
  });
});
