/**
 * examples/site-budget.xlsx: up to date with scripts/make-demo.ts, stored the
 * way Excel saves add-in functions, and — recalculated headless — equal to
 * the core functions called directly on the same inputs. Needs `npm run build`.
 */
import * as fs from "fs";
import * as path from "path";
import ExcelJS from "exceljs";
import * as core from "../../src/core/index";
import { loadAirtally } from "../../src/cli/bundle";
import { recalc, type RecalcResult, type Value } from "../../src/cli/engine";
import { bookFromExcel } from "../../src/cli/xlsx";
import { buildDemo, BUDGET_FIRST_ZONE_ROW, BUDGET_VOICE_SHARE, CLIENT_CLASSES, DEMO_FILE, OFDMA_CAUTION, OFDMA_GI_US, OFDMA_HANDSETS, OFDMA_PACKET_BYTES, OFDMA_RU, QUOTE_CAUTION, QUOTE_ITEMS, RF_CAUTION, ZONES } from "../../scripts/make-demo";

const functions = loadAirtally();

/** Every cell of a workbook as text: sheet!address → formula | value | cached result. */
function cellsOf(wb: ExcelJS.Workbook): Map<string, string> {
  const out = new Map<string, string>();
  wb.eachSheet((ws) =>
    ws.eachRow({ includeEmpty: false }, (row) =>
      row.eachCell({ includeEmpty: false }, (cell) => {
        const v = cell.value as ExcelJS.CellFormulaValue & { shareType?: string; ref?: string };
        const text = cell.type === ExcelJS.ValueType.Formula ? JSON.stringify([cell.formula, v.result ?? null, v.shareType ?? null, v.ref ?? null]) : JSON.stringify(cell.value);
        out.set(`${ws.name}!${cell.address}`, text);
      }),
    ),
  );
  return out;
}

let committed: ExcelJS.Workbook;
let result: RecalcResult;
const value = (sheet: string, address: string): Value | undefined => result.sheets.find((s) => s.name === sheet)!.cells.find((c) => c.address === address)?.value;
const num = (sheet: string, address: string): number => value(sheet, address) as number;

beforeAll(async () => {
  committed = new ExcelJS.Workbook();
  await committed.xlsx.readFile(DEMO_FILE);
  result = recalc(bookFromExcel(committed), functions);
});

describe("the committed demo workbook", () => {
  it("is what scripts/make-demo.ts writes (run `npx tsx scripts/make-demo.ts` after changing either)", async () => {
    const fresh = await buildDemo(functions);
    expect(Object.fromEntries(cellsOf(committed))).toEqual(Object.fromEntries(cellsOf(fresh)));
  });

  it("stores every AIRTALLY call as Excel saves add-in functions (_xldudf_AIRTALLY_NAME)", () => {
    const formulas = [...cellsOf(committed).values()].map((t) => JSON.parse(t)).filter((x) => Array.isArray(x)).map((x) => x[0] as string);
    expect([formulas.some((f) => f.includes("_xldudf_AIRTALLY_")), formulas.some((f) => /AIRTALLY\./.test(f))]).toEqual([true, false]);
  });

  it("recalculates with no error cells and no circular reference", () => {
    expect([result.errors.length, result.cycles.length]).toEqual([0, 0]);
  });

  it("carries the RF caution on the Budget sheet", () => {
    expect(result.sheets.find((s) => s.name === "Budget")!.cells.some((c) => c.value === RF_CAUTION)).toBe(true);
  });

  it("carries the caution on the customer-facing Quote sheet too (its access point count comes from an EIRP)", () => {
    expect(result.sheets.find((s) => s.name === "Quote")!.cells.some((c) => c.value === QUOTE_CAUTION)).toBe(true);
    expect(QUOTE_CAUTION).toMatch(/site survey/);
    expect(QUOTE_CAUTION).toMatch(/vary by country/);
  });

  it("shows every Quote quantity as a whole number, and says the prices are in the user's currency", () => {
    QUOTE_ITEMS.forEach((_item, i) => expect(Number.isInteger(num("Quote", `B${5 + i}`))).toBe(true));
    const quote = committed.getWorksheet("Quote")!;
    expect(QUOTE_ITEMS.map((_item, i) => quote.getCell(`B${5 + i}`).numFmt)).toEqual(QUOTE_ITEMS.map(() => "0"));
    expect([quote.getCell("D4").value, quote.getCell("E4").value]).toEqual(["Unit price (your currency)", "Line total (your currency)"]);
  });
});

describe("the demo, recalculated, equals the core called directly", () => {
  const links = CLIENT_CLASSES.map(([, family, mcs, ss, width, gi, band]) => core.buildLink(family, mcs, ss, width, gi, band, null).text);
  const demands = CLIENT_CLASSES.map((c) => c[7]);
  const beacon = () => core.budget.beaconShare("OFDM 6Mbps 5GHz", 3, 2);
  const target = () => core.sensitivityDbm("HE MCS4 2SS 80MHz") + 5;
  // One plasterboard wall to the cell edge at the default per-wall loss (4 dB at 5 GHz, common practice).
  const reach = () => core.rf.reachM(20, target(), 5500, 30, 0, null, 0, 1);
  // A voice flow: G.711 in 20 ms packets, 50 × 200 octets a second, one packet per VO access = demand ÷ GOODPUT(link, 200, 1, "VO").
  const voiceFlow = () => (50 * 200 * 8) / 1e6 / core.mac.goodputMbps("HE MCS5 1SS 80MHz", 200, 1, "VO");
  const zoneShare = (i: number) =>
    core.budget.mixShare(links.map((l) => [l]), [ZONES[i][2]], demands.map((d) => [d]), 1500) + ZONES[i][3] * 2 * voiceFlow();
  const aps = (i: number) => {
    const share = zoneShare(i);
    return Math.max(core.budget.radios(share, 0.7, beacon()), core.budget.coverageAps(ZONES[i][1], reach()));
  };

  it.each(links.map((l, i) => [i, l]))("writes client class %i's link as LINK does: %s", (i, link) => {
    expect(value("Clients", `H${4 + Number(i)}`)).toBe(link);
  });

  it("puts BEACONSHARE(OFDM 6 Mb/s beacons, 3 SSIDs, 2 APs heard) in the beacon overhead", () => {
    expect(num("Budget", "B16")).toBeCloseTo(beacon(), 12);
  });

  it("puts REACH at the cell-edge target (sensitivity + 5 dB margin) in the cell reach", () => {
    expect(num("Budget", "B17")).toBeCloseTo(reach(), 9);
    // the wall costs 4 dB: the reach is 10^(4 ÷ 30) = 1.36 times shorter than without it (P.1238 eq. (1), N = 30)
    expect(core.rf.reachM(20, target(), 5500, 30) / num("Budget", "B17")).toBeCloseTo(Math.pow(10, 4 / 30), 9);
  });

  it("charges a voice flow per packet: demand ÷ GOODPUT(handset link, 200, 1, VO)", () => {
    expect(num("Budget", BUDGET_VOICE_SHARE)).toBeCloseTo(voiceFlow(), 12);
  });

  it.each(ZONES.map((z, i) => [z[0], i]))("gives %s the airtime MIXSHARE gives its client mix plus two voice flows per call", (_zone, i) => {
    expect(num("Budget", `E${BUDGET_FIRST_ZONE_ROW + Number(i)}`)).toBeCloseTo(zoneShare(Number(i)), 12);
  });

  it.each(ZONES.map((z, i) => [z[0], i]))("plans for %s the larger of RADIOS and COVERAGEAPS", (_zone, i) => {
    expect(num("Budget", `H${BUDGET_FIRST_ZONE_ROW + Number(i)}`)).toBe(aps(Number(i)));
  });

  it("prices the quote from the planned access points (hand sum of the line items × 1.08 contingency)", () => {
    const n = ZONES.reduce((s, _z, i) => s + aps(i), 0);
    const area = ZONES.reduce((s, z) => s + z[1], 0);
    const lines = n * 780 + n * 35 + Math.ceil(n / 24) * 1450 + n * 160 + Math.ceil(n * 1.5) * 95 + (1 + Math.ceil(area / 2000)) * 1100;
    expect(num("Quote", "E14")).toBeCloseTo(lines * 1.08, 6);
  });

  it("spills BREAKDOWN with ACCESS's total last", () => {
    const spill = result.spills.find((s) => s.sheet === "Audit" && s.anchor.col === 1)!;
    expect(num("Audit", `B${spill.area.bottom}`)).toBeCloseTo(core.mac.channelAccess(links[1], 1500).totalUs, 9);
  });

  describe("the OFDMA sheet: the staff handsets one by one against one multi-user exchange", () => {
    const [, family, mcs, ss, width, , band] = CLIENT_CLASSES[0];
    const ruLink = () => core.buildLink(family, mcs, ss, width, OFDMA_GI_US, band, OFDMA_RU).text;
    const rows: [number, "down" | "up", string | null][] = [
      [12, "down", "AP"],
      [13, "up", null],
    ];
    it.each(rows)("row %i (%s): users × ACCESS and GOODPUT one by one, MUACCESS and MUGOODPUT with OFDMA", (r, direction, options) => {
      expect(num("OFDMA", `C${r}`)).toBeCloseTo(OFDMA_HANDSETS * core.mac.channelAccess(links[0], OFDMA_PACKET_BYTES, 1, "VO", null, options).totalUs, 9);
      expect(num("OFDMA", `D${r}`)).toBeCloseTo(core.mac.goodputMbps(links[0], OFDMA_PACKET_BYTES, 1, "VO", null, null, options), 9);
      expect(num("OFDMA", `E${r}`)).toBeCloseTo(core.mu.muAccessUs(ruLink(), OFDMA_HANDSETS, OFDMA_PACKET_BYTES, direction, 1, "VO"), 9);
      expect(num("OFDMA", `F${r}`)).toBeCloseTo(core.mu.muGoodputMbps(ruLink(), OFDMA_HANDSETS, OFDMA_PACKET_BYTES, direction, 1, "VO"), 9);
    });
    it("spills MUBREAKDOWN of the uplink exchange with MUACCESS last, and carries the planning caution", () => {
      const spill = result.spills.find((s) => s.sheet === "OFDMA")!;
      expect(num("OFDMA", `B${spill.area.bottom}`)).toBe(num("OFDMA", "E13"));
      expect(result.sheets.find((s) => s.name === "OFDMA")!.cells.some((c) => c.value === OFDMA_CAUTION)).toBe(true);
    });
  });

  it("spills TXTIMEPARTS of the MPDU with TXTIME last", () => {
    const spill = result.spills.find((s) => s.sheet === "Audit" && s.anchor.col === 4)!;
    expect(num("Audit", `E${spill.area.bottom}`)).toBeCloseTo(core.txtimeUs(links[1], core.mac.mpduBytes(1500)), 9);
  });
});

it("keeps the demo file where the README says", () => {
  const root = path.resolve(__dirname, "../..");
  const readme = fs.readFileSync(path.join(root, "README.md"), "utf8");
  expect(readme).toContain(path.relative(root, DEMO_FILE).split(path.sep).join("/"));
  expect(fs.existsSync(DEMO_FILE)).toBe(true);
});
