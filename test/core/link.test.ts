import { parseLink } from "../../src/core/link";

describe("link text", () => {
  it("refuses an unknown family with the list of valid ones", () => {
    // DESIGN.md §4 gives this exact message as the model
    expect(() => parseLink("HX MCS1")).toThrow('link: unknown family "HX"; use DSSS, HR-DSSS, OFDM, ERP-OFDM, HT, VHT, HE or EHT');
  });
});
