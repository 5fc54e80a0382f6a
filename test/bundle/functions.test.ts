/**
 * The built add-in as a host sees it: dist/functions.js loaded in a bare vm
 * context with only a stub CustomFunctions, called by the catalog's names,
 * argument order and defaults (DESIGN.md §2), compared with src/core.
 */
import { call, loadBundle, readMetadata, SpreadsheetError } from "./loadBundle";
import { SAMPLES } from "./samples";

const bundle = loadBundle();
const metadata = readMetadata();

describe("functions bundle in a bare context", () => {
  it("loads with only CustomFunctions defined and leaks no globals", () => {
    expect(bundle.globalsAfterLoad).toEqual([]);
  });

  it("registers exactly the functions that functions.json declares", () => {
    const declared = metadata.functions.map((f) => f.id).sort();
    expect([...bundle.functions.keys()].sort()).toEqual(declared);
  });

  it("has a sample call for every registered function", () => {
    const missing = [...bundle.functions.keys()].filter((id) => !SAMPLES[id]);
    expect(missing).toEqual([]);
  });

  for (const [id, samples] of Object.entries(SAMPLES)) {
    for (const sample of samples) {
      it(`${id}(${sample.args.map((a) => JSON.stringify(a)).join(", ")}) equals the core`, () => {
        expect(call(bundle, id, ...sample.args)).toEqual(sample.expected());
      });
    }
  }

  it("names every parameter with its unit suffix or a catalog name", () => {
    // DESIGN.md §1: parameter names end with their unit; the few unitless ones are catalog names.
    const unitless = new Set(["link", "family", "mcs", "streams", "phy_options", "mac_options", "access", "protection", "mpdus", "count", "mpdu_loss", "mode", "stations", "cwmin", "cwmax", "retry_limit", "access_list", "counts", "ssids", "aps_heard", "links", "floors", "walls", "accesses", "distance_power", "total_share", "max_utilization", "overhead_share", "overlap_share", "beacon_link", "users", "direction"]);
    for (const fn of metadata.functions) {
      for (const p of fn.parameters) {
        const ok = unitless.has(p.name) || /_(bytes|us|mhz|ghz|dbm|db|dbi|m|m2|mbps|tu)$/.test(p.name);
        expect(ok ? p.name : `${fn.id}.${p.name} has no unit suffix`).toBe(p.name);
      }
    }
  });

  it("gives every function a help URL and a description", () => {
    for (const fn of metadata.functions) {
      expect(fn.helpUrl).toMatch(/^https:\/\/localhost:3000\/help\/[a-z]+\.html$/);
      expect((fn.description ?? "").length).toBeGreaterThan(10);
    }
  });
});

describe("bad input through the bundle", () => {
  const refusals: [string, unknown[], string, RegExp][] = [
    ["RATE", ["HX MCS1"], "#VALUE!", /unknown family "HX"/],
    ["RATE", [null], "#VALUE!", /^link:/],
    ["RATE", [42], "#VALUE!", /^link:/],
    ["TXTIME", ["OFDM 54Mbps", -1], "#VALUE!", /^psdu_bytes:/],
    ["TXTIME", ["OFDM 54Mbps", 12.5], "#VALUE!", /^psdu_bytes:/],
    ["TXTIME", ["OFDM 54Mbps", 1e12], "#VALUE!", /^psdu_bytes:/],
    ["TXTIME", ["OFDM 54Mbps", NaN], "#VALUE!", /^psdu_bytes:/],
    ["TXTIME", ["OFDM 54Mbps", null], "#VALUE!", /^psdu_bytes:/],
    ["TXTIME", ["OFDM 54Mbps", "1500"], "#VALUE!", /^psdu_bytes:/],
    ["PSDUFIT", ["OFDM 54Mbps", -5], "#VALUE!", /^duration_us:/],
    ["LINK", ["HX", 1], "#VALUE!", /^family:/],
    ["LINK", ["VHT", 9, 1, 20], "#VALUE!", /^mcs: VHT MCS9 is not defined at 20 MHz with 1 spatial stream/],
    ["LINK", ["OFDM", 54, null, null, 0.8], "#VALUE!", /^gi_us:/],
    ["LINK", ["HE", 11, 2, 80, null, 2.4], "#VALUE!", /^band_ghz:/],
    ["TXTIMEPARTS", ["garbage words", 100], "#VALUE!", /^link:/],
  ];
  for (const [id, args, code, message] of refusals) {
    it(`${id}(${args.map((a) => JSON.stringify(a)).join(", ")}) is ${code} with a message`, () => {
      const result = call(bundle, id, ...args);
      expect(result).toBeInstanceOf(SpreadsheetError);
      const err = result as SpreadsheetError;
      expect(err.code).toBe(code);
      expect(err.message).toMatch(message);
    });
  }
});

describe("generated functions.json", () => {
  it("matches the reviewed snapshot (function ids are frozen: they live in users' workbooks)", () => {
    expect(metadata).toMatchSnapshot();
  });
});
