/**
 * The "Insert site budget" template: a one-sheet, formula-driven budget (client
 * mix → airtime → radios; EIRP and target → reach → access points for
 * coverage). Pure data; office.ts writes it onto a new sheet.
 */
export const BUDGET_SHEET_BASE = "Airtally budget";
/** Excel's limit on a sheet name's length. */
const SHEET_NAME_MAX = 31;

/** The n-th candidate name: "Airtally budget", "Airtally budget 2", … (within Excel's 31 characters). */
export function candidateSheetName(n: number, base = BUDGET_SHEET_BASE): string {
  const suffix = n <= 1 ? "" : ` ${n}`;
  return base.slice(0, SHEET_NAME_MAX - suffix.length) + suffix;
}

/** The first candidate name not in `existing` (Excel compares sheet names without case). */
export function uniqueSheetName(existing: string[], base = BUDGET_SHEET_BASE): string {
  const taken = new Set(existing.map((s) => s.toLowerCase()));
  for (let n = 1; ; n++) {
    const name = candidateSheetName(n, base);
    if (!taken.has(name.toLowerCase())) return name;
  }
}

export const BUDGET_CAUTION =
  "Planning estimate only; it does not replace a site survey. EIRP and channel use are regulated and limits vary by country; " +
  "RF exposure limits protect people. The EIRP is your figure. Local regulations, codes and licensed practice decide.";

type Row = (string | number)[];

/** The template as range.formulas for A1:E{rows}. */
export function budgetTemplate(): { address: string; formulas: Row[] } {
  const rows: Row[] = [
    ["Site budget (Airtally template, 5 GHz) — change the inputs (numbers) to yours", "", "", "", ""],
    ["", "", "", "", ""],
    ["Client class", "Link", "Clients", "Demand per client (Mb/s)", "Airtime (channels)"],
    ["Laptop", '=AIRTALLY.LINK("HE",9,2,80)', 40, 6, "=C4*AIRTALLY.CLIENTSHARE(B4,D4)"],
    ["Handheld", '=AIRTALLY.LINK("HE",7,2,80)', 60, 4, "=C5*AIRTALLY.CLIENTSHARE(B5,D5)"],
    ["Older laptop", '=AIRTALLY.LINK("VHT",7,2,80)', 15, 3, "=C6*AIRTALLY.CLIENTSHARE(B6,D6)"],
    ["Total airtime (MIXSHARE)", "", "=SUM(C4:C6)", "", "=AIRTALLY.MIXSHARE(B4:B6,C4:C6,D4:D6)"],
    ["", "", "", "", ""],
    ["SSIDs per radio", 3, "", "", ""],
    ["Access points heard on each channel", 2, "", "", ""],
    ["Beacon overhead (BEACONSHARE, beacons at OFDM 6 Mb/s)", '=AIRTALLY.BEACONSHARE("OFDM 6Mbps 5GHz",B9,B10)', "", "", ""],
    ["Max channel utilization (common practice)", 0.7, "", "", ""],
    ["Radios for capacity (RADIOS)", "=AIRTALLY.RADIOS(E7,B12,B11)", "", "", ""],
    ["AP EIRP (dBm) — your figure, within local limits", 20, "", "", ""],
    ["Signal target at cell edge (dBm)", -65, "", "", ""],
    ["Centre frequency (MHz)", 5500, "", "", ""],
    ["Cell reach (m) (REACH)", "=AIRTALLY.REACH(B14,B15,B16)", "", "", ""],
    ["Area to cover (m²)", 1000, "", "", ""],
    ["Access points for coverage (COVERAGEAPS)", "=AIRTALLY.COVERAGEAPS(B18,B17)", "", "", ""],
    ["Access points planned", "=MAX(B13,B19)", "", "", ""],
    ["", "", "", "", ""],
    [BUDGET_CAUTION, "", "", "", ""],
  ];
  return { address: `A1:E${rows.length}`, formulas: rows };
}
