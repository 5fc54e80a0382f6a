import { parseMacOptions, DEFAULT_MAC_OPTIONS } from "../../../src/core/mac";
import { expectValueError } from "../../_lib/expectError";

describe("mac_options parsing (DESIGN.md §2)", () => {
  it("gives the defaults for an empty value", () => {
    expect(parseMacOptions(null)).toEqual(DEFAULT_MAC_OPTIONS);
    expect(parseMacOptions("")).toEqual(DEFAULT_MAC_OPTIONS);
    expect(DEFAULT_MAC_OPTIONS.cipher).toBe("CCMP-128");
  });
  it("reads settings separated by spaces, commas and semicolons, in any case", () => {
    const o = parseMacOptions("gcmp-256, amsdu=2; TXOP=2080 ap htc");
    expect([o.cipher, o.amsdu, o.txopLimitUs, o.ap, o.htc]).toEqual(["GCMP-256", 2, 2080, true, true]);
  });
  it("reads a comma-separated basic rate set", () => {
    expect(parseMacOptions("BASIC=24,6,12 SLOT=20").basicRatesMbps).toEqual([6, 12, 24]);
  });
  it("reads the remaining numeric settings", () => {
    const o = parseMacOptions("BA=32 AMPDU=2 AIFSN=4 CWMIN=7 CWMAX=255 RETRY=4");
    expect([o.baWindow, o.ampduExponent, o.aifsn, o.cwMin, o.cwMax, o.retryLimit]).toEqual([32, 2, 4, 7, 255, 4]);
  });
  it("reads MUBAR (multi-user acknowledgements asked by a MU-BAR trigger, DESIGN.md §2), once only", () => {
    expect([DEFAULT_MAC_OPTIONS.muBar, parseMacOptions("mubar GCMP-256").muBar]).toEqual([false, true]);
    expectValueError(() => parseMacOptions("MUBAR MUBAR"), /^mac_options: "MUBAR" repeats/);
  });

  it("reads BAR (BlockAckReq recovery after a missed BlockAck), off by default", () => {
    expect([DEFAULT_MAC_OPTIONS.blockAckReq, parseMacOptions("bar").blockAckReq]).toEqual([false, true]);
  });
  it("refuses an unknown setting and lists the valid ones", () => {
    expectValueError(() => parseMacOptions("WEP"), /^mac_options: unknown setting "WEP"; use CCMP-128/);
  });
  it("refuses a repeated setting", () => {
    expectValueError(() => parseMacOptions("CCMP-128 GCMP-256"), /^mac_options: "GCMP-256" repeats/);
  });
  it("refuses a TXOP over 255 × 32 µs (9.4.2.28)", () => {
    expectValueError(() => parseMacOptions("TXOP=9000"), /^mac_options: TXOP= .*0 to 8160/);
  });
  it("refuses a contention window that is not 2^n − 1 (9.4.2.28)", () => {
    expectValueError(() => parseMacOptions("CWMIN=10"), /^mac_options: CWMIN= must be one less than a power of two/);
  });
  it("refuses CWMIN above CWMAX", () => {
    expectValueError(() => parseMacOptions("CWMIN=63 CWMAX=15"), /^mac_options: CWMIN=63 is above CWMAX=15/);
  });
  it("refuses AIFSN=1 for a non-AP station", () => {
    expectValueError(() => parseMacOptions("AIFSN=1"), /^mac_options: AIFSN=1 is for an AP/);
  });
  it("refuses a slot other than 9 or 20", () => {
    expectValueError(() => parseMacOptions("SLOT=10"), /^mac_options: SLOT= must be 9 or 20/);
  });
  it("refuses a basic rate no PHY has", () => {
    expectValueError(() => parseMacOptions("BASIC=6,7"), /^mac_options: BASIC= takes rates/);
  });
  it("refuses a number where text is expected", () => {
    expectValueError(() => parseMacOptions(5), /^mac_options: expected text/);
  });
  it("returns a frozen object that parsing again does not change", () => {
    const o = parseMacOptions("AMSDU=2");
    expect(Object.isFrozen(o)).toBe(true);
    expect(parseMacOptions(o)).toBe(o);
  });
});
