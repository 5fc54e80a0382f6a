/**
 * One sample call per catalog function, with the core call it must equal.
 * The bundle test fails when a registered function has no sample here, so
 * every function added to the catalog gets exercised through the built bundle.
 */
import * as core from "../../src/core/index";
import * as mac from "../../src/core/mac/index";
import * as contention from "../../src/core/contention/index";
import * as rf from "../../src/core/rf/index";
import * as budget from "../../src/core/budget/index";
import * as mu from "../../src/core/mu/index";

export interface Sample {
  readonly args: unknown[];
  /** The same computation through src/core. */
  readonly expected: () => unknown;
}

export const SAMPLES: Record<string, Sample[]> = {
  LINK: [
    { args: ["HE", 9, 2, 80, null, null, null], expected: () => core.parseLink("HE MCS9 2SS 80MHz").text },
    { args: ["ERP-OFDM", 54, null, null, null, null, null], expected: () => core.parseLink("ERP-OFDM 54Mbps").text },
    { args: ["HT", 15, null, 40, 0.4, 2.4, "GF"], expected: () => core.parseLink("HT MCS15 40MHz SGI GF 2.4GHz").text },
  ],
  RATE: [
    { args: ["OFDM 54Mbps 5GHz"], expected: () => core.rateMbps("OFDM 54Mbps 5GHz") },
    { args: ["VHT MCS9 2SS 80MHz GI0.4"], expected: () => core.rateMbps("VHT MCS9 2SS 80MHz GI0.4") },
  ],
  TXTIME: [
    { args: ["ERP-OFDM 54Mbps", 1500], expected: () => core.txtimeUs("ERP-OFDM 54Mbps", 1500) },
    { args: ["HE MCS11 2SS 80MHz", 65000], expected: () => core.txtimeUs("HE MCS11 2SS 80MHz", 65000) },
  ],
  PSDUFIT: [{ args: ["HT MCS7 20MHz", 5484], expected: () => core.psduFit("HT MCS7 20MHz", 5484) }],
  SENSITIVITY: [{ args: ["VHT MCS9 2SS 80MHz"], expected: () => core.sensitivityDbm("VHT MCS9 2SS 80MHz") }],
  TXTIMEPARTS: [{ args: ["HR-DSSS 11Mbps short", 1500], expected: () => core.txtimeTable("HR-DSSS 11Mbps short", 1500) }],
  MPDU: [
    { args: [1500, null], expected: () => mac.mpduBytes(1500) },
    { args: [1500, "AMSDU=2 GCMP-256"], expected: () => mac.mpduBytes(1500, "AMSDU=2 GCMP-256") },
  ],
  AMPDU: [{ args: [1550, 64], expected: () => mac.ampduBytes(1550, 64) }],
  AGGCOUNT: [
    { args: ["VHT MCS9 2SS 80MHz", 1500, null, null], expected: () => mac.aggCount("VHT MCS9 2SS 80MHz", 1500) },
    { args: ["HT MCS7 20MHz", 1500, "VO", "BA=32"], expected: () => mac.aggCount("HT MCS7 20MHz", 1500, "VO", "BA=32") },
  ],
  AIFS: [
    { args: ["BE", null, null], expected: () => mac.aifsUs("BE") },
    { args: ["VO", "ERP-OFDM 54Mbps", "AP"], expected: () => mac.aifsUs("VO", "ERP-OFDM 54Mbps", "AP") },
  ],
  ACCESS: [
    { args: ["ERP-OFDM 54Mbps", 1500, null, null, null, null], expected: () => mac.channelAccess("ERP-OFDM 54Mbps", 1500).totalUs },
    { args: ["HE MCS11 2SS 80MHz", 1500, "auto", "VI", "RTS", "AMSDU=2"], expected: () => mac.channelAccess("HE MCS11 2SS 80MHz", 1500, "auto", "VI", "RTS", "AMSDU=2").totalUs },
  ],
  GOODPUT: [
    { args: ["OFDM 54Mbps", 1500, null, null, null, null, null], expected: () => mac.goodputMbps("OFDM 54Mbps", 1500) },
    { args: ["VHT MCS9 2SS 80MHz", 1500, 32, "BE", "CTS", 0.1, "open"], expected: () => mac.goodputMbps("VHT MCS9 2SS 80MHz", 1500, 32, "BE", "CTS", 0.1, "open") },
    // Issue 15: a TCP download, OFDM 54 Mb/s: 2 × 8 × 1500 bits ÷ (2 × 406.5 µs data + 190.5 µs ACK access), hand-derived in test/core/mac/tcp.test.ts.
    { args: ["OFDM 54Mbps 5GHz", 1500, null, null, null, null, "TCP"], expected: () => expect.closeTo((2 * 8 * 1500) / (2 * 406.5 + 190.5), 10) },
  ],
  EFFICIENCY: [{ args: ["HT MCS7 20MHz", 1500, 1, null, null, null, null], expected: () => mac.efficiency("HT MCS7 20MHz", 1500, 1) }],
  RETX: [
    { args: [64, 0.1, null], expected: () => mac.expectedTransmissions(64, 0.1) },
    { args: [8, 0.1, "whole"], expected: () => mac.expectedTransmissions(8, 0.1, "whole") },
  ],
  COLLIDE: [
    { args: [10, null, null, null], expected: () => contention.collisionProbability(10) },
    { args: [50, 31, 1023, 4], expected: () => contention.collisionProbability(50, 31, 1023, 4) },
  ],
  SATURATE: [
    { args: ["OFDM 54Mbps", 10, 1500, null, null, null, null], expected: () => contention.saturationGoodputMbps("OFDM 54Mbps", 10, 1500) },
    { args: ["OFDM 54Mbps", 10, 1500, null, null, null, "TCP"], expected: () => budget.saturationGoodputTcpMbps("OFDM 54Mbps", 10, 1500, null, null, null, "TCP") },
  ],
  CONTENTION: [{ args: ["HE MCS7 20MHz", 20, 1500, "auto", "BE", "RTS", null], expected: () => contention.contentionShare("HE MCS7 20MHz", 20, 1500, "auto", "BE", "RTS") }],
  EDCAMIX: [
    {
      args: ["HE MCS7 1SS 20MHz", [["VO"], ["BE"]], [[2], [8]], 1500, null, null, null],
      expected: () => core.edcaMixTable("HE MCS7 1SS 20MHz", [["VO"], ["BE"]], [[2], [8]], 1500),
    },
  ],
  FSPL: [{ args: [10, 5500], expected: () => rf.fsplDb(10, 5500) }],
  INDOORLOSS: [
    { args: [20, 5500, null, null, null, null, null], expected: () => rf.indoorLossDb(20, 5500) },
    { args: [20, 2437, 28, 1, 15, null, null], expected: () => rf.indoorLossDb(20, 2437, 28, 1, 15) },
    // Issue 15 acceptance: walls add walls × wall_loss_db to the floor-only loss.
    { args: [20, 2437, 28, 1, 15, 3, 6], expected: () => rf.indoorLossDb(20, 2437, 28, 1, 15) + 3 * 6 },
  ],
  NOISEFLOOR: [{ args: [20, null], expected: () => rf.noiseFloorDbm(20) }],
  TOPLINK: [
    { args: ["VHT", -60, 2, 80, null, null], expected: () => rf.topLink("VHT", -60, 2, 80) },
    { args: ["OFDM", -75, null, null, 3, null], expected: () => rf.topLink("OFDM", -75, null, null, 3) },
  ],
  REACH: [
    { args: [20, -67, 5500, null, null, null, null, null, null], expected: () => rf.reachM(20, -67, 5500) },
    { args: [20, -67, 5500, 30, 0, null, 0, 2, 10], expected: () => rf.reachM(20, -67, 5500, 30, 0, null, 0, 2, 10) },
  ],
  COVERAGEAPS: [{ args: [5000, 25, null], expected: () => budget.coverageAps(5000, 25) }],
  BEACONSHARE: [
    { args: ["OFDM 6Mbps 5GHz", 4, 3, null, null], expected: () => budget.beaconShare("OFDM 6Mbps 5GHz", 4, 3) },
    { args: ["DSSS 1Mbps", 4, 3, 350, 100], expected: () => budget.beaconShare("DSSS 1Mbps", 4, 3, 350, 100) },
  ],
  CLIENTSHARE: [
    { args: ["HE MCS7 2SS 40MHz", 5, null, null, null, null, null], expected: () => budget.clientShare("HE MCS7 2SS 40MHz", 5) },
    { args: ["HE MCS7 2SS 40MHz", 5, 1500, 8, "VI", null, null], expected: () => budget.clientShare("HE MCS7 2SS 40MHz", 5, 1500, 8, "VI") },
    // Issue 15 acceptance: a voice client, one 200-octet packet per VO access = demand ÷ GOODPUT(link, 200, 1, "VO") exactly.
    { args: ["HE MCS7 2SS 40MHz", 0.1, 200, 1, "VO", null, 1], expected: () => 0.1 / mac.goodputMbps("HE MCS7 2SS 40MHz", 200, 1, "VO") },
  ],
  MIXSHARE: [
    {
      args: [[["HE MCS7 2SS 40MHz"], ["HT MCS4 20MHz"], [""]], [[20], [5], [null]], [[2], [1], [null]], null, null, null, null],
      expected: () => budget.mixShare([["HE MCS7 2SS 40MHz"], ["HT MCS4 20MHz"], [""]], [[20], [5], [null]], [[2], [1], [null]]),
    },
    {
      args: [[["HE MCS7 2SS 40MHz"], ["HE MCS7 2SS 40MHz"]], [[20], [10]], [[2], [0.1]], null, null, [["BE"], ["VO"]], [["auto"], [1]]],
      expected: () => 20 * budget.clientShare("HE MCS7 2SS 40MHz", 2) + 10 * (0.1 / mac.goodputMbps("HE MCS7 2SS 40MHz", 1500, 1, "VO")),
    },
  ],
  RADIOS: [{ args: [2.3, null, null], expected: () => budget.radios(2.3) }],
  BREAKDOWN: [{ args: ["ERP-OFDM 54Mbps", 1500, null, null, null, null], expected: () => core.breakdownTable("ERP-OFDM 54Mbps", 1500) }],
  MUACCESS: [
    { args: ["HE MCS7 1SS 20MHz RU26", 9, 100, null, null, null, null], expected: () => mu.muAccessUs("HE MCS7 1SS 20MHz RU26", 9, 100) },
    { args: ["HE MCS7 1SS 20MHz RU26 GI1.6", 9, 100, "up", 1, "VO", null], expected: () => mu.muAccessUs("HE MCS7 1SS 20MHz RU26 GI1.6", 9, 100, "up", 1, "VO") },
    { args: ["EHT MCS9 2SS 80MHz RU242", 4, 1500, "down", "auto", "BE", "MUBAR"], expected: () => mu.muAccessUs("EHT MCS9 2SS 80MHz RU242", 4, 1500, "down", "auto", "BE", "MUBAR") },
  ],
  MUGOODPUT: [{ args: ["HE MCS7 1SS 20MHz RU26", 9, 100, "down", 1, null, null], expected: () => mu.muGoodputMbps("HE MCS7 1SS 20MHz RU26", 9, 100, "down", 1) }],
  MUBREAKDOWN: [
    { args: ["HE MCS7 1SS 20MHz RU26 GI1.6", 9, 100, "up", 1, null, null], expected: () => mu.muBreakdownTable("HE MCS7 1SS 20MHz RU26 GI1.6", 9, 100, "up", 1) },
  ],
};
