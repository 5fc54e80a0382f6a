import { parseLink } from "../../../src/core/link";
import {
  rateMbps,
  txtime,
  txtimeUs,
  psduFit,
  sensitivityDbm,
  maxPsduBytes,
  nonHtReferenceRateMbps,
} from "../../../src/core/phy/index";
import {
  dsss,
  hrDsss,
  hrDsssLengthField,
  hrDsssOctetsFromLength,
  LONG_PREAMBLE_us,
  LONG_HEADER_us,
  SHORT_PREAMBLE_us,
  SHORT_HEADER_us,
} from "../../../src/core/phy/dsss";
import { expectValueError } from "../../_lib/expectError";
import { durationSum } from "../../_lib/txtime";

describe("DSSS / HR-DSSS rates (IEEE 802.11-2020 15.1, 16.1)", () => {
  it("has 1 and 2 Mb/s for DSSS (Clause 15)", () => {
    expect(dsss.mcsValues).toEqual([1, 2]);
  });
  it("has 1, 2, 5.5 and 11 Mb/s for HR-DSSS (Clause 16)", () => {
    expect(hrDsss.mcsValues).toEqual([1, 2, 5.5, 11]);
  });
  it("gives RATE as the link's data rate", () => {
    expect(rateMbps("HR-DSSS 5.5Mbps 2.4GHz")).toBe(5.5);
  });
  it("uses the data rate as the non-HT reference rate", () => {
    expect(nonHtReferenceRateMbps("HR-DSSS 11Mbps 2.4GHz")).toBe(11);
  });
});

describe("PLCP preamble and header durations (IEEE 802.11-2020 16.2.2.2, 16.2.2.3)", () => {
  it("has a 144 µs long preamble", () => {
    expect(LONG_PREAMBLE_us).toBe(128 + 16); // SYNC 128 bits + SFD 16 bits at 1 Mb/s
  });
  it("has a 48 µs long header", () => {
    expect(LONG_HEADER_us).toBe(48); // SIGNAL 8 + SERVICE 8 + LENGTH 16 + CRC 16 bits at 1 Mb/s
  });
  it("has a 72 µs short preamble", () => {
    expect(SHORT_PREAMBLE_us).toBe(56 + 16); // SYNC 56 bits + SFD 16 bits at 1 Mb/s
  });
  it("has a 24 µs short header", () => {
    expect(SHORT_HEADER_us).toBe(48 / 2); // 48 header bits at 2 Mb/s
  });
});

describe("DSSS / HR-DSSS TXTIME (Clause 15/16 TXTIME equation)", () => {
  it("takes 304 µs for a 14-octet ACK at 1 Mb/s, long preamble", () => {
    // PreambleLength + PLCPHeaderTime + ceil(14·8 / 1) = 144 + 48 + 112
    expect(txtimeUs("DSSS 1Mbps 2.4GHz", 14)).toBe(144 + 48 + 112);
  });
  it("takes 6192 µs for 1500 octets at 2 Mb/s", () => {
    // 144 + 48 + ceil(12000 / 2)
    expect(txtimeUs("DSSS 2Mbps 2.4GHz", 1500)).toBe(144 + 48 + 6000);
  });
  it("rounds the PSDU time up at 11 Mb/s with the short preamble", () => {
    // 72 + 24 + ceil(12000 / 11) = 96 + ceil(1090.9) = 96 + 1091
    expect(txtimeUs("HR-DSSS 11Mbps short 2.4GHz", 1500)).toBe(72 + 24 + 1091);
  });
  it("takes 1283 µs for 1500 octets at 11 Mb/s, long preamble", () => {
    // 144 + 48 + ceil(12000 / 11) = 192 + 1091
    expect(txtimeUs("HR-DSSS 11Mbps 2.4GHz", 1500)).toBe(144 + 48 + 1091);
  });
  it("rounds the PSDU time up at 5.5 Mb/s", () => {
    // 72 + 24 + ceil(800 / 5.5) = 96 + ceil(145.45) = 96 + 146
    expect(txtimeUs("HR-DSSS 5.5Mbps short 2.4GHz", 100)).toBe(72 + 24 + 146);
  });
  it("takes 152 µs for a 14-octet ACK at 2 Mb/s, short preamble", () => {
    // 72 + 24 + 112 / 2
    expect(txtimeUs("HR-DSSS 2Mbps short 2.4GHz", 14)).toBe(72 + 24 + 56);
  });
  it("is the preamble and header alone for an empty PSDU", () => {
    expect(txtimeUs("HR-DSSS 11Mbps 2.4GHz", 0)).toBe(144 + 48);
  });
  it("lists PLCP preamble, PLCP header and PSDU as the duration terms", () => {
    const adds = txtime("HR-DSSS 11Mbps short 2.4GHz", 1500).terms.filter((t) => t.adds);
    expect(adds.map((t) => [t.label, t.value])).toEqual([
      ["PLCP preamble (µs)", 72],
      ["PLCP header (µs)", 24],
      ["PSDU (µs)", 1091],
    ]);
  });
  it("lists the data rate and PSDU bits as factor terms", () => {
    const factors = txtime("HR-DSSS 11Mbps short 2.4GHz", 1500).terms.filter((t) => !t.adds);
    expect(factors.map((t) => [t.label, t.value])).toEqual([
      ["data rate (Mb/s)", 11],
      ["PSDU bits", 12000],
    ]);
  });
  it("has duration terms that sum to the total for every rate, preamble and sample size", () => {
    const links = ["DSSS 1Mbps", "DSSS 2Mbps", "HR-DSSS 1Mbps", "HR-DSSS 2Mbps", "HR-DSSS 5.5Mbps", "HR-DSSS 11Mbps",
      "HR-DSSS 2Mbps short", "HR-DSSS 5.5Mbps short", "HR-DSSS 11Mbps short"];
    for (const link of links) {
      for (const n of [0, 1, 14, 1023, 1026, 1500, 4095]) {
        const t = txtime(link, n);
        const sum = durationSum(t);
        expect(sum).toBe(t.totalUs);
      }
    }
  });
});

describe("HR/DSSS LENGTH field and length extension bit (IEEE 802.11-2020 16.2.3.5 example table, from memory)", () => {
  // Example for 11 Mb/s CCK: octets, octets × 8 / 11, LENGTH, length extension bit
  it("sets LENGTH 744 and extension 0 for 1023 octets", () => {
    // 1023·8/11 = 744.00 → LENGTH 744; 744 − 744.00 < 8/11
    expect(hrDsssLengthField(1023, 11)).toEqual({ lengthUs: 744, lengthExtension: 0 });
  });
  it("sets LENGTH 745 and extension 0 for 1024 octets", () => {
    // 1024·8/11 = 744.73 → 745; 745 − 744.73 = 0.27 < 0.73
    expect(hrDsssLengthField(1024, 11)).toEqual({ lengthUs: 745, lengthExtension: 0 });
  });
  it("sets LENGTH 746 and extension 0 for 1025 octets", () => {
    // 1025·8/11 = 745.45 → 746; 746 − 745.45 = 0.55 < 0.73
    expect(hrDsssLengthField(1025, 11)).toEqual({ lengthUs: 746, lengthExtension: 0 });
  });
  it("sets LENGTH 747 and extension 1 for 1026 octets", () => {
    // 1026·8/11 = 746.18 → 747; 747 − 746.18 = 0.82 ≥ 0.73
    expect(hrDsssLengthField(1026, 11)).toEqual({ lengthUs: 747, lengthExtension: 1 });
  });
  it("never sets the extension at 5.5 Mb/s", () => {
    // 1026·8/5.5 = 1492.36 → 1493; one µs carries less than one octet only at 11 Mb/s
    expect(hrDsssLengthField(1026, 5.5)).toEqual({ lengthUs: 1493, lengthExtension: 0 });
  });
  it("recovers 1026 octets from LENGTH 747 with the extension bit at the receiver", () => {
    // floor(747 · 11 / 8) − 1 = floor(1027.125) − 1
    expect(hrDsssOctetsFromLength(747, 1, 11)).toBe(1026);
  });
  it("round-trips every PSDU length at every rate through the receiver's formula", () => {
    for (const rate of [1, 2, 5.5, 11]) {
      for (let n = 0; n <= 4095; n++) {
        const { lengthUs, lengthExtension } = hrDsssLengthField(n, rate);
        if (hrDsssOctetsFromLength(lengthUs, lengthExtension, rate) !== n) {
          throw new Error(`round trip failed at ${rate} Mb/s, ${n} octets`);
        }
      }
    }
  });
  it("matches the PSDU term of TXTIME", () => {
    // Both are ceil(8 × 1500 ÷ 11) = 1091 µs (16.2.3.5 LENGTH; Clause 16 TXTIME)
    const psduTerm = txtime("HR-DSSS 11Mbps 2.4GHz", 1500).terms.find((t) => t.label === "PSDU (µs)")!;
    expect(hrDsssLengthField(1500, 11).lengthUs).toBe(psduTerm.value);
  });
  it("refuses a rate HR/DSSS does not have", () => {
    expectValueError(() => hrDsssLengthField(100, 54), /^rate_mbps: .*1, 2, 5\.5 or 11/);
  });
  it("refuses a fractional octet count", () => {
    expectValueError(() => hrDsssLengthField(10.5, 11), /^psdu_bytes: /);
  });
  it("refuses an extension bit other than 0 or 1 at the receiver", () => {
    expectValueError(() => hrDsssOctetsFromLength(747, 2, 11), /^length_extension: /);
  });
});

describe("DSSS / HR-DSSS PSDUFIT", () => {
  it("fits 14 octets into 304 µs at 1 Mb/s", () => {
    // 304 − 192 = 112 µs = 112 bits = 14 octets
    expect(psduFit("DSSS 1Mbps 2.4GHz", 304)).toBe(14);
  });
  it("fits 1500 octets into 1187 µs at 11 Mb/s short", () => {
    // ceil(8L / 11) ≤ 1187 − 96 = 1091 → 8L ≤ 12001 → L ≤ 1500
    expect(psduFit("HR-DSSS 11Mbps short 2.4GHz", 72 + 24 + 1091)).toBe(1500);
  });
  it("fits nothing into less than the preamble and header", () => {
    expect(psduFit("HR-DSSS 11Mbps 2.4GHz", 191)).toBe(0); // 144 + 48 = 192 µs minimum
  });
  it("round-trips: the fitted PSDU fits and one more octet does not", () => {
    for (const link of ["DSSS 1Mbps", "DSSS 2Mbps", "HR-DSSS 5.5Mbps", "HR-DSSS 11Mbps short", "HR-DSSS 5.5Mbps short"]) {
      for (const d of [200, 305, 1000, 2999]) {
        const n = psduFit(link, d);
        expect(txtimeUs(link, n)).toBeLessThanOrEqual(d);
        if (n < 4095) expect(txtimeUs(link, n + 1)).toBeGreaterThan(d); // at the maximum PSDU there is no +1
      }
    }
  });
});

describe("DSSS / HR-DSSS sensitivity", () => {
  it("is −80 dBm for DSSS 2 Mb/s (Clause 15)", () => {
    expect(sensitivityDbm("DSSS 2Mbps 2.4GHz")).toBe(-80);
  });
  it("is −80 dBm for DSSS 1 Mb/s (the 2 Mb/s figure, conservative)", () => {
    expect(sensitivityDbm("DSSS 1Mbps 2.4GHz")).toBe(-80);
  });
  it("is −76 dBm for HR-DSSS 11 Mb/s (Clause 16)", () => {
    expect(sensitivityDbm("HR-DSSS 11Mbps 2.4GHz")).toBe(-76);
  });
  it("is −76 dBm for HR-DSSS 5.5 Mb/s (the 11 Mb/s figure, conservative)", () => {
    expect(sensitivityDbm("HR-DSSS 5.5Mbps short 2.4GHz")).toBe(-76);
  });
  it("is −80 dBm for HR-DSSS 2 Mb/s (Clause 15 modulation and figure)", () => {
    expect(sensitivityDbm("HR-DSSS 2Mbps 2.4GHz")).toBe(-80);
  });
});

describe("DSSS / HR-DSSS maximum PSDU", () => {
  it("is 4095 octets (aPSDUMaxLength, from memory)", () => {
    expect(maxPsduBytes("HR-DSSS 11Mbps 2.4GHz")).toBe(4095);
  });
});

describe("DSSS / HR-DSSS refusals", () => {
  it("refuses DSSS with a short preamble", () => {
    expectValueError(() => parseLink("DSSS 2Mbps short 2.4GHz"), /DSSS \(Clause 15\) has only the long preamble/);
  });
  it("refuses HR-DSSS short preamble at 1 Mb/s", () => {
    expectValueError(() => parseLink("HR-DSSS 1Mbps short 2.4GHz"), /short preamble is not defined at 1 Mb\/s; use long, or 2, 5\.5 or 11/);
  });
  it("refuses a CCK rate for DSSS and lists 1 or 2", () => {
    expectValueError(() => parseLink("DSSS 11Mbps 2.4GHz"), /^link: DSSS has no 11 Mb\/s rate; use 1 or 2$/);
  });
  it("refuses an unknown HR-DSSS rate and lists the valid ones", () => {
    expectValueError(() => parseLink("HR-DSSS 22Mbps 2.4GHz"), /^link: HR-DSSS has no 22 Mb\/s rate; use 1, 2, 5\.5 or 11$/);
  });
  it("refuses an OFDM rate for HR-DSSS and says where it belongs", () => {
    expectValueError(() => parseLink("HR-DSSS 54Mbps 2.4GHz"), /ERP-OFDM/);
  });
  it("refuses HR-DSSS at 5 GHz", () => {
    expectValueError(() => parseLink("HR-DSSS 11Mbps 5GHz"), /only in the 2\.4 GHz band.*use 2\.4GHz/);
  });
  it("refuses DSSS at 6 GHz", () => {
    expectValueError(() => parseLink("DSSS 1Mbps 6GHz"), /only in the 2\.4 GHz band/);
  });
  it("refuses a 40 MHz width", () => {
    expectValueError(() => parseLink("HR-DSSS 11Mbps 40MHz"), /20 MHz/);
  });
  it("refuses an MCS token", () => {
    expectValueError(() => parseLink("HR-DSSS MCS3"), /Mbps/);
  });
});

describe("DSSS / HR-DSSS TXTIME bad psdu_bytes", () => {
  const bad: Array<[string, unknown]> = [
    ["negative", -1],
    ["fractional", 14.5],
    ["above 4095", 4096],
    ["NaN", NaN],
    ["text", "14"],
  ];
  it.each(bad)("refuses %s psdu_bytes with a #VALUE! naming psdu_bytes", (_name, value) => {
    expectValueError(() => txtime("DSSS 1Mbps 2.4GHz", value), /^psdu_bytes: /);
  });
});
