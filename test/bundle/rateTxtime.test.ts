/**
 * RATE and TXTIME agree, through the built bundle, on every HE and EHT
 * resource unit, MCS, guard interval, stream count and DCM setting the
 * standard allows (and HE's ER SU and STBC forms): RATE × T_SYM is the N_DBPS that TXTIMEPARTS reports, and
 * that N_DBPS is a whole number of bits (802.11ax-2021 27.5 and 802.11be-2024
 * 36.5 list an integer N_DBPS; the data rate column is N_DBPS ÷ T_SYM).
 * Links the standard refuses (#VALUE!) are skipped, and counted, so the test
 * cannot pass by refusing everything.
 */
import { call, loadBundle, SpreadsheetError } from "./loadBundle";

const bundle = loadBundle();

// 802.11ax-2021 27.3.8 / 802.11be-2024 36.3.8: T_SYM = 12.8 µs + GI.
const T_SYM: Record<string, number> = { "0.8": 13.6, "1.6": 14.4, "3.2": 16 };
// Each RU once, in the smallest channel that holds it, plus the whole channel of each width (27.3.2, 36.3.2).
const HOME: Record<string, number> = { RU26: 20, RU52: 20, RU106: 20, RU242: 20, RU484: 40, RU996: 80, RU2x996: 160 };
const FAMILIES = [
  { family: "HE", widths: [20, 40, 80, 160], maxMcs: 11 },
  { family: "EHT", widths: [20, 40, 80, 160, 320], maxMcs: 13 },
];

function linksOf(family: string, widths: number[], maxMcs: number): string[] {
  const shapes: string[] = widths.map((w) => `${w}MHz`);
  for (const [ru, w] of Object.entries(HOME)) shapes.push(`${w}MHz ${ru}`);
  if (family === "EHT") shapes.push("320MHz RU2x996");
  if (family === "HE") shapes.push("20MHz ER", "20MHz ER RU106", "20MHz STBC", "80MHz RU484 STBC");
  const out: string[] = [];
  for (const shape of shapes) for (const gi of Object.keys(T_SYM)) for (let ss = 1; ss <= 8; ss++)
    for (let m = 0; m <= maxMcs; m++) for (const dcm of ["", " DCM"]) out.push(`${family} MCS${m} ${ss}SS ${shape} GI${gi}${dcm} 6GHz`);
  return out;
}

function nDbpsOf(parts: unknown): number {
  const row = (parts as unknown[][]).find((r) => r[0] === "N_DBPS (bits)");
  if (!row) throw new Error(`TXTIMEPARTS has no N_DBPS row: ${JSON.stringify(parts)}`);
  return row[1] as number;
}

describe.each(FAMILIES)("$family: RATE × T_SYM = TXTIMEPARTS' N_DBPS (through the bundle)", ({ family, widths, maxMcs }) => {
  it("holds for every valid RU, MCS, GI, stream count and DCM setting", () => {
    let checked = 0;
    const mismatches: string[] = [];
    for (const text of linksOf(family, widths, maxMcs)) {
      const rate = call(bundle, "RATE", text);
      if (rate instanceof SpreadsheetError) continue; // a combination the standard forbids
      const nDbps = nDbpsOf(call(bundle, "TXTIMEPARTS", text, 1000));
      const gi = text.match(/GI(\d\.\d)/)![1];
      const bits = (rate as number) * T_SYM[gi];
      if (!Number.isInteger(nDbps) || Math.abs(bits - nDbps) > 1e-6) mismatches.push(`${text}: RATE × T_SYM = ${bits}, N_DBPS = ${nDbps}`);
      checked++;
    }
    expect(mismatches.slice(0, 5)).toEqual([]);
    // Whole channels and RUs, 3 GIs, 8 streams, every MCS, with DCM where allowed: thousands of links, not a handful.
    expect(checked).toBeGreaterThan(2000);
  });
});

describe("the corrected rate the audit found (802.11ax-2021 27.5: N_DBPS 8166 for HE-MCS 11, 996 tones, 1 SS)", () => {
  it("RATE(\"HE MCS11 1SS 80MHz GI0.8 5GHz\") is 8166 ÷ 13.6 = 600.441 Mb/s, as TXTIMEPARTS counts it", () => {
    expect(call(bundle, "RATE", "HE MCS11 1SS 80MHz GI0.8 5GHz")).toBeCloseTo(8166 / 13.6, 9);
    expect(nDbpsOf(call(bundle, "TXTIMEPARTS", "HE MCS11 1SS 80MHz GI0.8 5GHz", 1500))).toBe(8166);
  });
});
