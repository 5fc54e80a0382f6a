/**
 * Writes examples/site-budget.xlsx: a site budget and quote for an invented
 * venue (Brindlecombe Conference Centre) by an invented integrator (Corvid &
 * Pike Systems). Every number on the Budget, Quote and Audit sheets is a live
 * formula; the inputs are the constants on Clients, Zones and the Budget's
 * assumptions.
 *
 * AIRTALLY calls are written in the form Excel itself saves them
 * (`_xldudf_AIRTALLY_NAME(…)`, see src/cli/storedForm.ts and DEVELOPERS.md),
 * so the workbook opens with working formulas once the add-in is loaded. The
 * cached values come from recalculating with the built add-in (dist/), and
 * spills are stored as array formulas over the cells they fill.
 *
 *   npm run build && npx tsx scripts/make-demo.ts      # regenerate
 *
 * test/examples/demo.test.ts checks that the committed file is what this
 * script writes.
 */
import * as path from "path";
import ExcelJS from "exceljs";
import { loadAirtally, type AirtallyFunction } from "../src/cli/bundle";
import { recalc } from "../src/cli/engine";
import { toStoredFormula } from "../src/cli/storedForm";
import { bookFromExcel, writeResults } from "../src/cli/xlsx";

export const DEMO_FILE = path.resolve(__dirname, "../examples/site-budget.xlsx");

/** Fixed document dates so regenerating changes nothing but what the script changed. */
const DOCUMENT_DATE = new Date(Date.UTC(2025, 0, 15, 9, 0, 0));

export const VENUE = "Brindlecombe Conference Centre";
export const INTEGRATOR = "Corvid & Pike Systems";

/** The RF caution shown on the Budget sheet (README "Cautions", same policy). */
export const RF_CAUTION =
  "Caution: planning estimate only — it does not replace a site survey. Transmit power, EIRP and channel use are regulated " +
  "and the limits vary by country; RF exposure limits protect people. The EIRP above is your figure: Airtally never suggests " +
  "a transmit power. Local regulations, codes and licensed practice decide.";

/**
 * The caution on the customer-facing Quote sheet, whose access point count
 * comes from a coverage estimate built on the EIRP (README "Cautions").
 */
export const QUOTE_CAUTION =
  "Caution: the access point count is a planning estimate from the Budget sheet (coverage from your EIRP figure) — it does not " +
  "replace a site survey. Transmit power, EIRP and channel use are regulated and the limits vary by country; RF exposure limits " +
  "protect people. Airtally never suggests a transmit power. Local regulations, codes and licensed practice decide.";

type Cell = string | number | { f: string };
const f = (formula: string): { f: string } => ({ f: formula });

/** Client classes: [class, family, mcs, streams, width MHz, GI µs (blank = family default), band GHz, demand Mb/s]. */
export const CLIENT_CLASSES: [string, string, number, number, number, number | null, number, number][] = [
  ["Staff handheld", "HE", 7, 2, 80, 0.8, 5, 4],
  ["Delegate laptop", "HE", 9, 2, 80, 0.8, 5, 6],
  ["Older laptop", "VHT", 7, 2, 80, null, 5, 3],
  ["Stage streaming encoder", "VHT", 9, 1, 80, null, 5, 12],
  ["Badge reader", "HT", 3, 1, 20, null, 5, 0.2],
];

/** Zones: [zone, area m², active clients per class (same order as CLIENT_CLASSES), voice calls on handsets at once]. */
export const ZONES: [string, number, number[], number][] = [
  ["Great Hall", 1800, [160, 220, 60, 2, 40], 6],
  ["Breakout suites", 900, [40, 120, 30, 0, 10], 4],
  ["Atrium and registration", 650, [30, 60, 10, 0, 25], 8],
  ["Speakers' lounge", 150, [5, 15, 5, 1, 2], 2],
];

/**
 * The voice class: a handset call sent one packet per AC_VO access (no
 * aggregation), charged per packet by CLIENTSHARE's mpdus = 1. ITU-T G.711
 * (64 kb/s) in 20 ms packets (RFC 3551 §4.5's default packetization for
 * PCMU): 160 octets of audio + RTP 12 + UDP 8 + IPv4 20 = 200-octet IP
 * packets, 50 a second = 0.08 Mb/s in each direction; a call is one such
 * flow down (AP to handset) and one up, each its own accesses.
 */
export const VOICE = { family: "HE", mcs: 5, streams: 1, widthMHz: 80, packetBytes: 200, demandMbps: (200 * 8 * 50) / 1e6, flowsPerCall: 2 };

const TEAL = "FF234E52";
const SAND = "FFF6F4EE";

function put(ws: ExcelJS.Worksheet, ref: string, value: Cell, numFmt?: string): ExcelJS.Cell {
  const cell = ws.getCell(ref);
  cell.value = typeof value === "object" ? ({ formula: toStoredFormula(value.f) } as ExcelJS.CellFormulaValue) : value;
  if (numFmt) cell.numFmt = numFmt;
  return cell;
}

function title(ws: ExcelJS.Worksheet, text: string, subtitle: string): void {
  put(ws, "A1", text).font = { bold: true, size: 14, color: { argb: TEAL } };
  put(ws, "A2", subtitle).font = { italic: true, color: { argb: "FF4A5A60" } };
}

function header(ws: ExcelJS.Worksheet, row: number, labels: string[]): void {
  // Two lines of 11-point text: wrapped labels print whole (a spreadsheet does not grow a row for wrapped text on its own when printing).
  ws.getRow(row).height = 30;
  labels.forEach((label, i) => {
    const cell = ws.getCell(row, i + 1);
    cell.value = label;
    cell.font = { bold: true, color: { argb: SAND } };
    cell.fill = { type: "pattern", pattern: "solid", fgColor: { argb: TEAL } };
    cell.alignment = { wrapText: true, vertical: "middle" };
  });
}

function widths(ws: ExcelJS.Worksheet, w: number[]): void {
  w.forEach((width, i) => (ws.getColumn(i + 1).width = width));
}

const col = (i: number) => String.fromCharCode(65 + i);

/**
 * Print setup: every sheet one page wide (as many pages tall as it needs),
 * the Quote on one page. `fitToPage` is the flag that turns on fit-to
 * (the sheet's sheetPr/pageSetUpPr fitToPage attribute in SpreadsheetML,
 * ECMA-376 Part 1; section number not given, from memory only); without it
 * a spreadsheet prints at its scale and ignores fitToWidth/fitToHeight.
 * fitToHeight 0 means "as many pages tall as needed".
 */
function printSetup(ws: ExcelJS.Worksheet, orientation: "portrait" | "landscape", onePage = false): void {
  ws.pageSetup = {
    ...ws.pageSetup,
    orientation,
    paperSize: 9, // A4
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: onePage ? 1 : 0,
    margins: { left: 0.5, right: 0.5, top: 0.6, bottom: 0.6, header: 0.3, footer: 0.3 },
  };
}

function clientsSheet(wb: ExcelJS.Workbook): void {
  const ws = wb.addWorksheet("Clients");
  title(ws, `Client classes — ${VENUE}`, "One row per kind of client: its PHY link (AIRTALLY.LINK) and the traffic one active client of the class asks for.");
  header(ws, 3, ["Class", "Family", "MCS", "Streams", "Width (MHz)", "GI (µs)", "Band (GHz)", "Link", "PHY rate (Mb/s)", "Demand per client (Mb/s)"]);
  CLIENT_CLASSES.forEach(([name, family, mcs, ss, width, gi, band, demand], i) => {
    const r = 4 + i;
    put(ws, `A${r}`, name);
    put(ws, `B${r}`, family);
    put(ws, `C${r}`, mcs);
    put(ws, `D${r}`, ss);
    put(ws, `E${r}`, width);
    if (gi !== null) put(ws, `F${r}`, gi);
    put(ws, `G${r}`, band);
    put(ws, `H${r}`, f(`AIRTALLY.LINK(B${r},C${r},D${r},E${r},F${r},G${r})`));
    put(ws, `I${r}`, f(`AIRTALLY.RATE(H${r})`), "0.0");
    put(ws, `J${r}`, demand, "0.0");
  });
  widths(ws, [24, 8, 6, 8, 11, 8, 10, 34, 14, 22]);
  printSetup(ws, "landscape");
}

function zonesSheet(wb: ExcelJS.Workbook): void {
  const ws = wb.addWorksheet("Zones");
  title(ws, `Zones — ${VENUE}`, "Active clients per class in each zone at the busiest hour; demand is clients × demand per client (Clients sheet).");
  const classes = CLIENT_CLASSES.length;
  header(ws, 3, ["Zone", "Area (m²)", ...CLIENT_CLASSES.map(() => ""), "Clients", "Demand (Mb/s)", "Voice calls (handsets)"]);
  for (let i = 0; i < classes; i++) put(ws, `${col(2 + i)}3`, f(`Clients!A${4 + i}`));
  const first = col(2);
  const last = col(1 + classes);
  ZONES.forEach(([zone, area, counts, calls], i) => {
    const r = 4 + i;
    put(ws, `A${r}`, zone);
    put(ws, `${col(4 + classes)}${r}`, calls);
    put(ws, `B${r}`, area, "#,##0");
    counts.forEach((n, j) => put(ws, `${col(2 + j)}${r}`, n));
    put(ws, `${col(2 + classes)}${r}`, f(`SUM(${first}${r}:${last}${r})`));
    put(ws, `${col(3 + classes)}${r}`, f(`MMULT(${first}${r}:${last}${r},Clients!$J$4:$J$${3 + classes})`), "0.0");
  });
  widths(ws, [26, 11, ...CLIENT_CLASSES.map(() => 14), 10, 14, 14]);
  printSetup(ws, "landscape");
}

/** Budget rows: the zone table starts here. */
export const BUDGET_FIRST_ZONE_ROW = 25;
/** Budget cell of one voice flow's airtime (CLIENTSHARE with mpdus = 1). */
export const BUDGET_VOICE_SHARE = "B22";

function budgetSheet(wb: ExcelJS.Workbook): void {
  const ws = wb.addWorksheet("Budget");
  title(ws, `Airtime and coverage budget — ${VENUE}, 5 GHz`, `Prepared by ${INTEGRATOR} (fictional). Each access point is counted with one 5 GHz radio.`);
  header(ws, 4, ["Assumption", "Value", "Note"]);
  const rows: [string, Cell, string, string?][] = [
    ["SSIDs per radio", 3, "each SSID beacons on its own"],
    ["Access points heard on each channel", 2, "the own AP included"],
    ["Beacon link", f('AIRTALLY.LINK("OFDM",6,,,,5)'), "lowest basic rate"],
    ["Packet size (bytes)", 1500, "IP datagram"],
    ["Max channel utilization", 0.7, "common practice", "0%"],
    ["AP EIRP (dBm)", 20, "your figure, within your local limits", "0"],
    ["Cell-edge link", f('AIRTALLY.LINK("HE",4,2,80)'), "slowest link the plan accepts"],
    ["Fade margin (dB)", 5, "common practice", "0"],
    ["Signal target at cell edge (dBm)", f("AIRTALLY.SENSITIVITY(B11)+B12"), "minimum sensitivity + margin", "0.0"],
    ["Centre frequency (MHz)", 5500, "", "0"],
    ["Distance power coefficient N", 30, "ITU-R P.1238 (INDOORLOSS default)", "0"],
    ["Beacon overhead (share of airtime)", f("AIRTALLY.BEACONSHARE(B7,B5,B6)"), "BEACONSHARE, default beacon of a typical 5 GHz AP", "0.0%"],
    ["Cell reach (m)", f("AIRTALLY.REACH(B10,B13,B14,B15,0,,0,B23)"), "REACH, no floors, walls from B23", "0.0"],
    ["Airtime one delegate laptop needs", f("AIRTALLY.CLIENTSHARE(Clients!H5,Clients!J5,B8)"), "CLIENTSHARE", "0.00%"],
    ["Voice handset link", f(`AIRTALLY.LINK("${VOICE.family}",${VOICE.mcs},${VOICE.streams},${VOICE.widthMHz})`), "voice calls on handsets"],
    ["Voice flow, one direction (Mb/s)", VOICE.demandMbps, "G.711, 20 ms packets: 50 × 200 bytes a second", "0.00"],
    ["Voice packet (bytes)", VOICE.packetBytes, "160 audio + RTP 12 + UDP 8 + IP 20", "0"],
    ["Airtime one voice flow needs", f("AIRTALLY.CLIENTSHARE(B19,B20,B21,1,\"VO\",,1)"), "CLIENTSHARE on VO, one packet per access (mpdus 1)", "0.00%"],
    ["Walls to the cell edge", 1, "plasterboard, 4 dB at 5 GHz (common practice; a survey decides)", "0"],
  ];
  rows.forEach(([label, value, note, fmt], i) => {
    const r = 5 + i;
    put(ws, `A${r}`, label);
    put(ws, `B${r}`, value, fmt);
    put(ws, `C${r}`, note).font = { italic: true, color: { argb: "FF4A5A60" } };
  });
  const top = BUDGET_FIRST_ZONE_ROW;
  header(ws, top - 1, ["Zone", "Area (m²)", "Clients", "Demand (Mb/s)", "Airtime (channels)", "Radios for capacity", "APs for coverage", "APs planned", "Voice calls"]);
  const lastClass = 3 + CLIENT_CLASSES.length;
  ZONES.forEach((_, i) => {
    const r = top + i;
    const z = 4 + i;
    put(ws, `A${r}`, f(`Zones!A${z}`));
    put(ws, `B${r}`, f(`Zones!B${z}`), "#,##0");
    put(ws, `C${r}`, f(`Zones!${col(2 + CLIENT_CLASSES.length)}${z}`), "0");
    put(ws, `D${r}`, f(`Zones!${col(3 + CLIENT_CLASSES.length)}${z}`), "0.0");
    put(ws, `I${r}`, f(`Zones!${col(4 + CLIENT_CLASSES.length)}${z}`), "0");
    // Data classes in full A-MPDUs (MIXSHARE) + each call's two voice flows, one packet per VO access.
    const voice = `I${r}*${VOICE.flowsPerCall}*$B$22`; // B22: BUDGET_VOICE_SHARE
    put(ws, `E${r}`, f(`AIRTALLY.MIXSHARE(Clients!$H$4:$H$${lastClass},Zones!C${z}:${col(1 + CLIENT_CLASSES.length)}${z},Clients!$J$4:$J$${lastClass},$B$8)+${voice}`), "0.00");
    put(ws, `F${r}`, f(`AIRTALLY.RADIOS(E${r},$B$9,$B$16)`), "0");
    put(ws, `G${r}`, f(`AIRTALLY.COVERAGEAPS(B${r},$B$17)`), "0");
    put(ws, `H${r}`, f(`MAX(F${r},G${r})`), "0");
  });
  const bottom = top + ZONES.length - 1;
  const total = bottom + 1;
  put(ws, `A${total}`, "Total").font = { bold: true };
  for (const [c, fmt] of [["B", "#,##0"], ["C", "0"], ["D", "0.0"], ["E", "0.00"], ["F", "0"], ["G", "0"], ["H", "0"], ["I", "0"]] as const) {
    put(ws, `${c}${total}`, f(`SUM(${c}${top}:${c}${bottom})`), fmt).font = { bold: true };
  }
  const caution = total + 2;
  ws.mergeCells(`A${caution}:I${caution + 2}`);
  const c = put(ws, `A${caution}`, RF_CAUTION);
  c.alignment = { wrapText: true, vertical: "top" };
  c.fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFFFF3CD" } };
  widths(ws, [36, 22, 34, 14, 18, 18, 16, 12, 10]);
  printSetup(ws, "landscape");
}

/** Quote line items: [item, quantity formula, unit, unit price (invented)]. */
export const QUOTE_ITEMS: [string, string, string, number][] = [
  ["HE (802.11ax) access point, 2 spatial streams", `Budget!H${BUDGET_FIRST_ZONE_ROW + ZONES.length}`, "each", 780],
  ["Ceiling mount kit", "B5", "each", 35],
  ["PoE switch, 24 ports", "ROUNDUP(B5/24,0)", "each", 1450],
  ["Structured cabling run per access point", "B5", "each", 160],
  ["Installation labour (1.5 h per access point, whole hours)", "ROUNDUP(B5*1.5,0)", "hours", 95],
  ["Site survey before and after installation", `1+ROUNDUP(Budget!B${BUDGET_FIRST_ZONE_ROW + ZONES.length}/2000,0)`, "days", 1100],
];

function quoteSheet(wb: ExcelJS.Workbook): void {
  const ws = wb.addWorksheet("Quote");
  title(
    ws,
    `Quote CPS-0142 — ${VENUE} wireless network`,
    `${INTEGRATOR} (fictional). Quantities follow the Budget sheet; prices are invented for this example and are in your own currency.`,
  );
  header(ws, 4, ["Item", "Quantity", "Unit", "Unit price (your currency)", "Line total (your currency)"]);
  QUOTE_ITEMS.forEach(([item, qty, unit, price], i) => {
    const r = 5 + i;
    put(ws, `A${r}`, item);
    put(ws, `B${r}`, f(qty), "0");
    put(ws, `C${r}`, unit);
    put(ws, `D${r}`, price, "#,##0.00");
    put(ws, `E${r}`, f(`B${r}*D${r}`), "#,##0.00");
  });
  const last = 4 + QUOTE_ITEMS.length;
  const sub = last + 2;
  put(ws, `A${sub}`, "Subtotal").font = { bold: true };
  put(ws, `E${sub}`, f(`SUM(E5:E${last})`), "#,##0.00");
  put(ws, `A${sub + 1}`, "Contingency");
  put(ws, `B${sub + 1}`, 0.08, "0%");
  put(ws, `E${sub + 1}`, f(`E${sub}*B${sub + 1}`), "#,##0.00");
  put(ws, `A${sub + 2}`, "Total").font = { bold: true };
  put(ws, `E${sub + 2}`, f(`E${sub}+E${sub + 1}`), "#,##0.00").font = { bold: true };
  const caution = sub + 4;
  ws.mergeCells(`A${caution}:E${caution + 2}`);
  const c = put(ws, `A${caution}`, QUOTE_CAUTION);
  c.alignment = { wrapText: true, vertical: "top" };
  c.fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFFFF3CD" } };
  widths(ws, [48, 10, 8, 16, 18]);
  printSetup(ws, "portrait", true);
}

function auditSheet(wb: ExcelJS.Workbook): void {
  const ws = wb.addWorksheet("Audit");
  title(ws, "Audit — where one delegate laptop's airtime goes", "BREAKDOWN, TXTIMEPARTS and EDCAMIX spill their tables; each row is one term with its unit.");
  put(ws, "A3", "Link");
  put(ws, "B3", f("Clients!H5"));
  put(ws, "A4", "Packet (bytes)");
  put(ws, "B4", f("Budget!B8"));
  put(ws, "A5", "MPDU (bytes)");
  put(ws, "B5", f("AIRTALLY.MPDU(B4)"));
  put(ws, "D3", "Access category");
  put(ws, "E3", "Stations");
  put(ws, "D4", "VO");
  put(ws, "E4", 2);
  put(ws, "D5", "BE");
  put(ws, "E5", 8);
  header(ws, 7, ["One channel access (BREAKDOWN)", "", "", "TXTIME of one MPDU (TXTIMEPARTS)", "", "", "VO and BE sharing the channel (EDCAMIX)"]);
  put(ws, "A8", f("AIRTALLY.BREAKDOWN(B3,B4)"));
  put(ws, "D8", f("AIRTALLY.TXTIMEPARTS(B3,B5)"));
  put(ws, "G8", f("AIRTALLY.EDCAMIX(B3,D4:D5,E4:E5,B4)"));
  widths(ws, [40, 12, 4, 30, 12, 4, 18, 12, 14, 14, 14]);
  printSetup(ws, "landscape");
}

/** The planning caution of the OFDMA comparison (README "Cautions", same policy). */
export const OFDMA_CAUTION =
  "Caution: planning estimate only. MUACCESS and MUGOODPUT assume every handset has a packet waiting, equal resource units, " +
  "no MU-MIMO, no random access (UORA) and no other traffic or collisions; real access point schedulers differ. " +
  "Measurements and a site survey decide.";

/** OFDMA comparison inputs: voice packet (bytes), handsets per exchange, RU per handset, GI of the RU link (µs). */
export const OFDMA_PACKET_BYTES = 200;
export const OFDMA_HANDSETS = 8;
export const OFDMA_RU = "RU106";
export const OFDMA_GI_US = 1.6;

/**
 * One by one against OFDMA for the staff handsets (Clients row 4): the same
 * handsets, one voice packet each. One by one, each handset gets a channel
 * access of its own on the whole channel, so a round costs users × ACCESS
 * and the handsets together get GOODPUT; with OFDMA one exchange serves them
 * all on their RUs (MUACCESS, MUGOODPUT).
 */
function ofdmaSheet(wb: ExcelJS.Workbook): void {
  const ws = wb.addWorksheet("OFDMA");
  title(ws, "OFDMA for the staff handsets — one by one or in one multi-user exchange", "One voice packet per handset, access category VO, alone on the channel; the link is the Staff handheld class on the Clients sheet.");
  header(ws, 4, ["Assumption", "Value", "Note"]);
  const rows: [string, Cell, string][] = [
    ["Handset link (whole channel)", f("Clients!H4"), "Clients sheet, Staff handheld"],
    ["Voice packet (bytes)", OFDMA_PACKET_BYTES, "G.711 20 ms: 160 + RTP 12 + UDP 8 + IPv4 20 (common practice)"],
    ["Handsets per exchange", OFDMA_HANDSETS, "every one with a packet waiting"],
    ["RU per handset", OFDMA_RU, `${OFDMA_HANDSETS} × RU106 fit an 80 MHz channel`],
    ["Handset link on its RU", f(`AIRTALLY.LINK(Clients!B4,Clients!C4,Clients!D4,Clients!E4,${OFDMA_GI_US},Clients!G4,B8)`), "GI 1.6 µs: what a TB PPDU (up) allows"],
  ];
  rows.forEach(([label, value, note], i) => {
    const r = 5 + i;
    put(ws, `A${r}`, label);
    put(ws, `B${r}`, value);
    put(ws, `C${r}`, note).font = { italic: true, color: { argb: "FF4A5A60" } };
  });
  header(ws, 11, ["Direction", "MAC options one by one", "One by one: airtime for all handsets (µs)", "One by one: all handsets together (Mb/s)", "OFDMA: MUACCESS (µs)", "OFDMA: MUGOODPUT (Mb/s)", "OFDMA ÷ one by one"]);
  // The AP sends downlink packets (its EDCA defaults, as MUACCESS takes); each handset sends its own uplink packet.
  ([["down", "AP"], ["up", ""]] as const).forEach(([direction, options], i) => {
    const r = 12 + i;
    put(ws, `A${r}`, direction);
    if (options) put(ws, `B${r}`, options);
    put(ws, `C${r}`, f(`$B$7*AIRTALLY.ACCESS($B$5,$B$6,1,"VO",,B${r})`), "0.0");
    put(ws, `D${r}`, f(`AIRTALLY.GOODPUT($B$5,$B$6,1,"VO",,,B${r})`), "0.00");
    put(ws, `E${r}`, f(`AIRTALLY.MUACCESS($B$9,$B$7,$B$6,A${r},1,"VO")`), "0.0");
    put(ws, `F${r}`, f(`AIRTALLY.MUGOODPUT($B$9,$B$7,$B$6,A${r},1,"VO")`), "0.00");
    put(ws, `G${r}`, f(`F${r}/D${r}`), "0.0");
  });
  header(ws, 15, ["One uplink exchange, term by term (MUBREAKDOWN)", ""]);
  put(ws, "A16", f('AIRTALLY.MUBREAKDOWN(B9,B7,B6,"up",1,"VO")'));
  const caution = 30;
  ws.mergeCells(`A${caution}:G${caution + 2}`);
  const c = put(ws, `A${caution}`, OFDMA_CAUTION);
  c.alignment = { wrapText: true, vertical: "top" };
  c.fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFFFF3CD" } };
  widths(ws, [62, 26, 22, 22, 18, 18, 14]);
  printSetup(ws, "landscape");
}

/** The demo workbook, recalculated with the given add-in build. */
export async function buildDemo(functions: Map<string, AirtallyFunction>): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  wb.creator = INTEGRATOR;
  wb.lastModifiedBy = INTEGRATOR;
  wb.created = DOCUMENT_DATE;
  wb.modified = DOCUMENT_DATE;
  clientsSheet(wb);
  zonesSheet(wb);
  budgetSheet(wb);
  quoteSheet(wb);
  auditSheet(wb);
  ofdmaSheet(wb);
  const result = recalc(bookFromExcel(wb), functions);
  if (result.errors.length || result.cycles.length) {
    const list = result.errors.map((e) => `${e.sheet}!${e.address} ${JSON.stringify(e.value)}`).join("\n");
    throw new Error(`the demo workbook has error cells:\n${list}`);
  }
  writeResults(wb, result);
  return wb;
}

if (require.main === module) {
  buildDemo(loadAirtally())
    .then((wb) => wb.xlsx.writeFile(DEMO_FILE))
    .then(() => process.stdout.write(`wrote ${path.relative(process.cwd(), DEMO_FILE)}\n`))
    .catch((e) => {
      process.stderr.write(`make-demo: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    });
}
