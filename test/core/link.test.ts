import { parseLink } from "../../src/core/link";

describe("link text", () => {
  it("refuses an unknown family with the list of valid ones", () => {
    // DESIGN.md §4 gives this exact message as the model
    expect(() => parseLink("HX MCS1")).toThrow('link: unknown family "HX"; use DSSS, HR-DSSS, OFDM, ERP-OFDM, HT, VHT, HE or EHT');
  });
});

// --- non-HT families (DSSS, HR-DSSS, OFDM, ERP-OFDM): canonical text of DESIGN.md §3 ---
import { parseLink as parseNonHt, formatLink as formatNonHt, buildLink as buildNonHt } from "../../src/core/link";

describe("link text of the non-HT families (DESIGN.md §3: <family> <rate>Mbps [short|long] <band>GHz)", () => {
  it("prints ERP-OFDM 54 Mb/s with its default 2.4 GHz band", () => {
    expect(parseNonHt("erp-ofdm 54mbps").text).toBe("ERP-OFDM 54Mbps 2.4GHz");
  });
  it("prints the short preamble between the rate and the band, whatever the token order", () => {
    expect(parseNonHt("2.4GHz short 11Mbps HR-DSSS").text).toBe("HR-DSSS 11Mbps short 2.4GHz");
  });
  it("leaves the default long preamble out", () => {
    expect(parseNonHt("HR-DSSS 11Mbps long 2.4GHz").text).toBe("HR-DSSS 11Mbps 2.4GHz");
  });
  it("prints 5.5 Mb/s with its decimal", () => {
    expect(parseNonHt("HR-DSSS 5.5Mbps").text).toBe("HR-DSSS 5.5Mbps 2.4GHz");
  });
  it("gives OFDM the default 5 GHz band", () => {
    expect(parseNonHt("OFDM 6Mbps").text).toBe("OFDM 6Mbps 5GHz");
  });
  it("prints DSSS 1 Mb/s with the 2.4 GHz band", () => {
    expect(parseNonHt("dsss 1mbps").text).toBe("DSSS 1Mbps 2.4GHz");
  });
  it("formats a parsed non-HT link back to the same canonical text", () => {
    const link = parseNonHt("OFDM 24Mbps 6GHz");
    expect(formatNonHt(link)).toBe("OFDM 24Mbps 6GHz");
  });
  it("parses its own canonical text to the same link", () => {
    const text = parseNonHt("short HR-DSSS 2Mbps").text;
    expect(parseNonHt(text).text).toBe(text);
  });
  it("builds ERP-OFDM from LINK arguments, the rate given as mcs", () => {
    expect(buildNonHt("ERP-OFDM", 54, null, null, null, 2.4, null).text).toBe("ERP-OFDM 54Mbps 2.4GHz");
  });
  it("builds HR-DSSS with the short preamble from phy_options", () => {
    expect(buildNonHt("HR-DSSS", 11, null, null, null, null, "short").text).toBe("HR-DSSS 11Mbps short 2.4GHz");
  });
});
