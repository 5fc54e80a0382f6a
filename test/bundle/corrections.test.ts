/**
 * Issue 12's corrections as a host sees them: the built bundle, called by the
 * catalog's names, argument order and defaults. Each check value names its
 * source; values recalled from memory are marked so.
 */
import { call, loadBundle, readMetadata, SpreadsheetError } from "./loadBundle";

const bundle = loadBundle();
const metadata = readMetadata();
const errorOf = (v: unknown) => (v instanceof SpreadsheetError ? v.code : `no error: ${JSON.stringify(v)}`);

describe("corrected values through the bundle", () => {
  it("RATE of HE MCS11 1SS 80 MHz GI0.8 is 8166 ÷ 13.6 = 600.441 Mb/s (802.11ax-2021 27.5 N_DBPS, from memory), not 600.490", () => {
    expect(call(bundle, "RATE", "HE MCS11 1SS 80MHz GI0.8 5GHz")).toBeCloseTo(8166 / 13.6, 9);
  });

  it("INDOORLOSS with floor_loss_db omitted: 3 floors at 1900 MHz cost P.1238-7 Table 3's 15 + 4 × 2 = 23 dB (office, from memory)", () => {
    const sameFloor = call(bundle, "INDOORLOSS", 20, 1900, null, 0, null) as number;
    expect((call(bundle, "INDOORLOSS", 20, 1900, null, 3, null) as number) - sameFloor).toBeCloseTo(23, 9);
    // given, floor_loss_db stays per floor
    expect((call(bundle, "INDOORLOSS", 20, 1900, null, 3, 15) as number) - sameFloor).toBeCloseTo(45, 9);
  });

  it("REACH uses the same floor rule: one floor at 5200 MHz is Table 3's 16 dB (office, from memory)", () => {
    // d = 10^((EIRP − target − 20·log10 f + 28 − L_f) ÷ N) = 10^((20 + 67 − 74.3201 + 28 − 16) ÷ 30)
    expect(call(bundle, "REACH", 20, -67, 5200, null, 1, null, null)).toBeCloseTo(Math.pow(10, (20 + 67 - 20 * Math.log10(5200) + 28 - 16) / 30), 9);
  });

  it("AGGCOUNT answers #N/A when one MPDU cannot fit in aPPDUMaxTime (5484 µs)", () => {
    // 5 MSDUs of 1508 octets in one A-MSDU ≈ 7.6 kB at 6.5 Mb/s ≈ 9.4 ms
    expect(errorOf(call(bundle, "AGGCOUNT", "HT MCS0 20MHz 5GHz", 1500, null, "AMSDU=5"))).toBe("#N/A");
  });

  it("TXTIME refuses an EHT PSDU above 15 523 198 octets = floor((396 × 313 600 − 16) ÷ 8), derived as HE's 6 500 631", () => {
    expect(typeof call(bundle, "TXTIME", "EHT MCS13 8SS 320MHz 6GHz", 15_523_198)).toBe("number");
    expect(errorOf(call(bundle, "TXTIME", "EHT MCS13 8SS 320MHz 6GHz", 15_523_199))).toBe("#VALUE!");
  });

  it("a 128-MPDU block ack window is answered by a 40-octet BlockAck (128-bit bitmap, 802.11ax-2021 9.3.1.8.2, from memory)", () => {
    const rows = call(bundle, "BREAKDOWN", "HE MCS7 1SS 20MHz", 1500, null, null, null, "BA=128") as [string, number][];
    const ba = rows.find((r) => /^BlockAck \(/.test(r[0]))!;
    const rate = Number(ba[0].match(/\(([\d.]+) Mb\/s\)/)![1]);
    // OFDM TXTIME (IEEE 802.11-2020 17.4.3): 20 + 4 × ceil((16 + 8 × 40 + 6) ÷ N_DBPS), N_DBPS = 4 × rate (Table 17-4)
    expect(ba[1]).toBe(20 + 4 * Math.ceil((16 + 8 * 40 + 6) / (4 * rate)));
  });

  it("refuses HE SU 4xLTF GI0.8 with STBC, saying why (802.11ax-2021 27.3.11.7 HE-SIG-A)", () => {
    const e = call(bundle, "RATE", "HE MCS0 4xLTF GI0.8 STBC") as SpreadsheetError;
    expect([e.code, /cannot carry STBC/.test(e.message)]).toEqual(["#VALUE!", true]);
  });

  it("names no internal field in a repeated-token message", () => {
    const e = call(bundle, "RATE", "HE MCS9 PE8 PE0") as SpreadsheetError;
    expect(e.message).toBe('link: "PE0" repeats the packet extension (PE0/PE8/PE16); give each setting once');
  });
});

describe("the beacon function", () => {
  it("BEACONLOAD is gone", () => {
    expect(bundle.functions.has("BEACONLOAD")).toBe(false);
    expect(metadata.functions.some((f) => f.id === "BEACONLOAD")).toBe(false);
  });

  it("BEACONSHARE is registered with the catalog's arguments, link first", () => {
    const fn = metadata.functions.find((f) => f.id === "BEACONSHARE")!;
    expect(fn.parameters.map((p) => [p.name, !!p.optional])).toEqual([
      ["beacon_link", false],
      ["ssids", false],
      ["aps_heard", true],
      ["beacon_bytes", true],
      ["interval_tu", true],
    ]);
  });

  it("BEACONSHARE with the defaults: one SSID, OFDM 6 Mb/s, the 377-octet 5 GHz beacon, 100 TU", () => {
    // AIFS 16 + 9 + mean backoff 1.5 × 9 + TXTIME 20 + 4 × ceil((16 + 8 × 377 + 6) ÷ 24) = 566.5 µs per 102 400 µs
    expect(call(bundle, "BEACONSHARE", "OFDM 6Mbps 5GHz", 1, null, null, null)).toBeCloseTo((25 + 13.5 + 20 + 4 * 127) / 102400, 12);
  });
});
