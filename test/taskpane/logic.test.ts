/**
 * The pane's logic without a browser: the reference search, the budget's
 * sheet naming, "Insert site budget" and "Explain this cell" driven through
 * office-addin-mock. Check values for the breakdown come from the standard.
 */
import { OfficeMockObject } from "office-addin-mock";

// office-addin-mock reads only the OfficeApp enum from office-addin-manifest, whose dependency chain ships ES
// modules that jest's CommonJS runtime cannot load; give it the enum alone (values as in office-addin-manifest).
jest.mock("office-addin-manifest", () => ({
  OfficeApp: { Excel: "excel", OneNote: "onenote", Outlook: "outlook", PowerPoint: "powerpoint", Project: "project", Word: "word" },
}));
import { budgetTemplate, uniqueSheetName } from "../../src/taskpane/budgetTemplate";
import { explain, planExplanation } from "../../src/taskpane/explain";
import { classify, findCall } from "../../src/taskpane/formula";
import { explainActiveCell, insertSiteBudget, type ExcelLike } from "../../src/taskpane/office";
import { searchFunctions, type FunctionMetadata } from "../../src/taskpane/reference";

/** IEEE 802.11-2020 17.4.3 eq. (17-29): 16 + 4 + 4 × ceil((16 + 8·100 + 6) / 24) µs. */
const TXTIME_OFDM6_100 = 16 + 4 + 4 * 35;

const METADATA: FunctionMetadata[] = [
  { id: "TXTIME", name: "TXTIME", description: "PPDU duration for a PSDU.", parameters: [{ name: "link" }, { name: "psdu_bytes" }] },
  { id: "RATE", name: "RATE", description: "PHY data rate of a link.", parameters: [{ name: "link" }] },
  { id: "FSPL", name: "FSPL", description: "Free-space path loss (Friis).", parameters: [{ name: "distance_m" }, { name: "freq_mhz" }] },
  {
    id: "MUACCESS",
    name: "MUACCESS",
    description: "Airtime of one multi-user exchange.",
    parameters: ["link", "users", "packet_bytes", "direction", "mpdus", "access", "mac_options"].map((name, i) => ({ name, optional: i > 2 })),
  },
  {
    id: "GOODPUT",
    name: "GOODPUT",
    description: "Packet-layer goodput of one station alone on the channel.",
    parameters: ["link", "packet_bytes", "mpdus", "access", "protection", "mpdu_loss", "mac_options"].map((name) => ({ name })),
  },
  {
    id: "SATURATE",
    name: "SATURATE",
    description: "Aggregate goodput of identical saturated stations.",
    parameters: ["link", "stations", "packet_bytes", "mpdus", "access", "protection", "mac_options"].map((name) => ({ name })),
  },
  {
    id: "CLIENTSHARE",
    name: "CLIENTSHARE",
    description: "Share of airtime one client needs.",
    parameters: ["link", "demand_mbps", "packet_bytes", "stations", "access", "mac_options", "mpdus"].map((name) => ({ name })),
  },
];

/**
 * OFDM 54 Mb/s at 5 GHz, 1500-octet packets, BE, CCMP-128, by hand (IEEE 802.11-2020 eq. (17-29), Table 9-155):
 * ACCESS = AIFS 43 + mean backoff 67.5 + PPDU 252 + SIFS 16 + Ack 28 = 406.5 µs; goodput = 8 × 1500 ÷ 406.5 Mb/s.
 */
const OFDM54_ACCESS_us = 43 + 67.5 + 252 + 16 + 28;
const OFDM54_GOODPUT_Mbps = (8 * 1500) / OFDM54_ACCESS_us;
/** The TCP ACK's own access: a 94-octet MPDU, PPDU 20 + 4 × 4 = 36 µs; 43 + 67.5 + 36 + 16 + 28 = 190.5 µs. */
const OFDM54_TCP_ACK_us = 43 + 67.5 + 36 + 16 + 28;

describe("reference search", () => {
  it("finds a function by a word of its summary", () => {
    expect(searchFunctions(METADATA, "path loss").map((f) => f.name)).toEqual(["FSPL"]);
  });

  it("finds a function by an argument name", () => {
    expect(searchFunctions(METADATA, "psdu_bytes").map((f) => f.name)).toEqual(["TXTIME"]);
  });
});

describe("reading a formula", () => {
  it("finds the AIRTALLY call and its arguments", () => {
    expect(findCall('=2*AIRTALLY.TXTIME(B1, 100)')).toEqual({ id: "TXTIME", args: ["B1", "100"] });
  });

  it("reads the saved _xldudf_AIRTALLY_ spelling too", () => {
    expect(findCall('=_xldudf_AIRTALLY_RATE("OFDM 6Mbps 5GHz")')).toEqual({ id: "RATE", args: ['"OFDM 6Mbps 5GHz"'] });
  });

  it("ignores AIRTALLY inside a string", () => {
    expect(findCall('="AIRTALLY.RATE(x)"')).toBeNull();
  });

  it("tells a reference from a literal", () => {
    expect([classify("'Site plan'!$B$3"), classify('"HE MCS9"'), classify("50%")]).toEqual([
      { kind: "reference", address: "'Site plan'!$B$3" },
      { kind: "literal", value: "HE MCS9" },
      { kind: "literal", value: 0.5 },
    ]);
  });
});

describe("explain", () => {
  it("says a formula without AIRTALLY has nothing to explain", () => {
    const x = explain(planExplanation("=SUM(A1:A3)"), METADATA, new Map());
    expect([x.kind, /calls no AIRTALLY function/.test(x.message)]).toEqual(["other", true]);
  });

  it("says a constant cell holds no formula", () => {
    expect(explain(planExplanation("42"), METADATA, new Map()).kind).toBe("empty");
  });

  it("shows TXTIME's terms with the standard's total last", () => {
    const x = explain(planExplanation('=AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",100)'), METADATA, new Map());
    expect(x.table![x.table!.length - 1][1]).toBe(TXTIME_OFDM6_100);
  });

  it("explains MUACCESS with the multi-user exchange's terms (MUBREAKDOWN), total last", () => {
    const x = explain(planExplanation('=AIRTALLY.MUACCESS("HE MCS7 1SS 20MHz RU26 GI1.6 BCC 5GHz",9,100,"up",1)'), METADATA, new Map());
    // Hand-derived in test/core/mu/exchange.test.ts: AIFS 43 + backoff 67.5 + Basic Trigger 68 + SIFS 16 + TB PPDU 220 + SIFS 16 + Multi-STA BlockAck 36
    expect([x.tableTitle, x.table![x.table!.length - 1]]).toEqual(["One multi-user exchange (MUBREAKDOWN)", ["total (µs)", 43 + 67.5 + 68 + 16 + 220 + 16 + 36]]);
  });

  it("asks for a cell of its own when an argument is a calculation", () => {
    const x = explain(planExplanation('=AIRTALLY.TXTIME("OFDM 6Mbps 5GHz",50*2)'), METADATA, new Map());
    expect([x.table, x.inputs[1].from]).toEqual([undefined, "expression"]);
  });

  it("reports the core's message when the inputs are invalid", () => {
    const x = explain(planExplanation('=AIRTALLY.RATE("HX MCS1")'), METADATA, new Map());
    expect(x.message).toMatch(/could not be computed.*link: /);
  });
});

/** A mock workbook with the given sheet names; records what is written. */
function mockExcel(existing: string[], newSheetUsed = false) {
  const slot = (name: string) => `sheet_${name.toLowerCase().replace(/[^a-z0-9]/g, "_")}`;
  const worksheets: Record<string, unknown> = {
    added: "",
    newSheet: {
      usedRange: { isNullObject: !newSheetUsed },
      range: { address: "", formulas: "unset" },
      activated: false,
      getUsedRangeOrNullObject() {
        return (this as { usedRange: unknown }).usedRange;
      },
      getRange(address: string) {
        const self = this as { range: { address: string } };
        self.range.address = address;
        return self.range;
      },
      activate() {
        (this as { activated: boolean }).activated = true;
      },
    },
    missing: { isNullObject: true },
    getItemOrNullObject(name: string) {
      const self = this as Record<string, unknown>;
      return self[slot(name)] ?? self.missing;
    },
    add(name: string) {
      const self = this as Record<string, unknown>;
      self.added = name;
      return self.newSheet;
    },
  };
  for (const name of existing) worksheets[slot(name)] = { isNullObject: false, name, range: { formulas: [["user data"]] } };
  const mock = new OfficeMockObject({
    context: { workbook: { worksheets } },
    run: async function (batch: (context: unknown) => Promise<unknown>) {
      return batch((this as { context: unknown }).context);
    },
  });
  return { excel: mock as unknown as ExcelLike, mock: mock as unknown as { context: { workbook: { worksheets: Record<string, any> } } } };
}

describe("insert site budget", () => {
  it("names the sheet after the ones already there (without case)", () => {
    expect(uniqueSheetName(["Airtally budget", "AIRTALLY BUDGET 2"])).toBe("Airtally budget 3");
  });

  it("writes the budget on a new sheet when the first name is taken", async () => {
    const { excel, mock } = mockExcel(["Airtally budget"]);
    expect(await insertSiteBudget(excel)).toBe("Airtally budget 2");
  });

  it("writes the template's formulas on the new sheet", async () => {
    const { excel, mock } = mockExcel([]);
    await insertSiteBudget(excel);
    expect(mock.context.workbook.worksheets.newSheet.range.formulas).toEqual(budgetTemplate().formulas);
  });

  it("leaves the user's sheet of the same name untouched", async () => {
    const { excel, mock } = mockExcel(["Airtally budget"]);
    await insertSiteBudget(excel);
    const range = mock.context.workbook.worksheets.sheet_airtally_budget.range;
    range.load("formulas");
    await range.sync();
    expect(range.formulas).toEqual([["user data"]]);
  });

  it("refuses to write on a sheet that is not empty", async () => {
    const { excel, mock } = mockExcel([], true);
    await expect(insertSiteBudget(excel)).rejects.toThrow(/not empty/);
    const range = mock.context.workbook.worksheets.newSheet.range;
    range.load("formulas");
    await range.sync();
    expect(range.formulas).toBe("unset");
  });
});

describe("explain: result, resolved defaults and the chain to the result", () => {
  const rowValue = (rows: (string | number)[][], label: RegExp) => rows.find((r) => label.test(String(r[0])))?.[1];

  it("puts the cell's value first when the formula is the call alone", () => {
    const x = explain(planExplanation('=AIRTALLY.GOODPUT("OFDM 54Mbps 5GHz",1500)'), METADATA, new Map(), 29.52);
    expect([x.result, x.resultNote]).toEqual([29.52, "the cell's value"]);
  });

  it("gives this call's result, not the cell's, when the formula does more", () => {
    const x = explain(planExplanation('=2*AIRTALLY.GOODPUT("OFDM 54Mbps 5GHz",1500)'), METADATA, new Map(), 59.04);
    expect(x.result).toBeCloseTo(OFDM54_GOODPUT_Mbps, 10);
    expect(x.resultNote).toMatch(/does more/);
  });

  it("shows the values the core applies for omitted arguments", () => {
    const x = explain(planExplanation('=AIRTALLY.GOODPUT("OFDM 54Mbps 5GHz",1500)'), METADATA, new Map());
    const used = Object.fromEntries(x.inputs.map((i) => [i.name, i.used]));
    // OFDM has no A-MPDU: AGGCOUNT is 1 (IEEE 802.11-2020: A-MPDU needs HT or later); BE, no protection, no loss
    expect(used).toMatchObject({ mpdus: "auto = 1 (AGGCOUNT)", access: "BE", protection: "none", mpdu_loss: 0 });
    expect(String(used.mac_options)).toMatch(/CCMP-128/);
  });

  it("takes an empty referenced cell as omitted and shows its default", () => {
    const plan = planExplanation('=AIRTALLY.CLIENTSHARE("OFDM 54Mbps 5GHz",10,B1)');
    const x = explain(plan, METADATA, new Map([["B1", [[""]]]]));
    expect(x.inputs.find((i) => i.name === "packet_bytes")!.used).toBe(1500);
  });

  it("writes GOODPUT's arithmetic from the breakdown: bits ÷ ACCESS µs, the hand value last", () => {
    const x = explain(planExplanation('=AIRTALLY.GOODPUT("OFDM 54Mbps 5GHz",1500)'), METADATA, new Map());
    expect(rowValue(x.chain!, /^packet bits per access/)).toBe(8 * 1500);
    expect(rowValue(x.chain!, /^one channel access/)).toBeCloseTo(OFDM54_ACCESS_us, 9);
    expect(x.table![x.table!.length - 1][1]).toBeCloseTo(OFDM54_ACCESS_us, 9); // the BREAKDOWN total the chain starts from
    expect(x.chain![x.chain!.length - 1]).toEqual(["GOODPUT (Mb/s)", expect.closeTo(OFDM54_GOODPUT_Mbps, 10)]);
  });

  it("adds the TCP ACK access to the chain when mac_options says TCP", () => {
    const x = explain(planExplanation('=AIRTALLY.GOODPUT("OFDM 54Mbps 5GHz",1500,,,,,"TCP")'), METADATA, new Map());
    expect(rowValue(x.chain!, /^TCP ACK access/)).toBeCloseTo(OFDM54_TCP_ACK_us, 9);
    // 2 segments: 2 × 12 000 bits ÷ (2 × 406.5 + 190.5) µs
    expect(x.chain![x.chain!.length - 1][1]).toBeCloseTo((2 * 8 * 1500) / (2 * OFDM54_ACCESS_us + OFDM54_TCP_ACK_us), 10);
  });

  it("writes SATURATE's arithmetic: bits ÷ (success time ÷ (1 − contention share)) equals the result", () => {
    const x = explain(planExplanation('=AIRTALLY.SATURATE("OFDM 54Mbps 5GHz",10,1500)'), METADATA, new Map());
    const viaChain = rowValue(x.chain!, /^aggregate goodput = /) as number;
    const result = x.chain![x.chain!.length - 1];
    expect(result[0]).toBe("SATURATE (Mb/s)");
    expect(viaChain).toBeCloseTo(result[1] as number, 9);
    // the success time is ACCESS without its mean backoff: 406.5 − 67.5 µs
    expect(rowValue(x.chain!, /^less the mean backoff/)).toBeCloseTo(OFDM54_ACCESS_us - 67.5, 9);
  });

  it("writes CLIENTSHARE's arithmetic: demand ÷ goodput, the hand value last", () => {
    const x = explain(planExplanation('=AIRTALLY.CLIENTSHARE("OFDM 54Mbps 5GHz",10)'), METADATA, new Map());
    expect(x.chain![x.chain!.length - 1][1]).toBeCloseTo(10 / OFDM54_GOODPUT_Mbps, 12);
    expect(x.result).toBeCloseTo(10 / OFDM54_GOODPUT_Mbps, 12);
  });

  it("shows no chain when the inputs are refused, and says why", () => {
    const x = explain(planExplanation('=AIRTALLY.GOODPUT("OFDM 55Mbps 5GHz",1500)'), METADATA, new Map());
    expect(x.chain).toBeUndefined();
    expect(x.message).toMatch(/^The breakdown could not be computed/);
  });
});

describe("explain this cell (Excel glue)", () => {
  function mockCell(formula: unknown, refs: Record<string, unknown[][]>, cellValue: unknown = 0) {
    const worksheet = {
      ranges: Object.fromEntries(Object.entries(refs).map(([a, values]) => [a, { values }])),
      getRange(address: string) {
        return (this as { ranges: Record<string, unknown> }).ranges[address];
      },
    };
    const mock = new OfficeMockObject({
      context: { workbook: { cell: { address: "Plan!C3", formulas: [[formula]], values: [[cellValue]], worksheet }, getActiveCell() { return (this as { cell: unknown }).cell; } } },
      run: async function (batch: (context: unknown) => Promise<unknown>) {
        return batch((this as { context: unknown }).context);
      },
    });
    return mock as unknown as ExcelLike;
  }

  it("reads the referenced cells and shows the breakdown for their values", async () => {
    const excel = mockCell("=AIRTALLY.TXTIME(B1,B2)", { B1: [["OFDM 6Mbps 5GHz"]], B2: [[100]] });
    const { explanation } = await explainActiveCell(excel, METADATA);
    expect([explanation.inputs.map((i) => i.value), explanation.table![explanation.table!.length - 1][1]]).toEqual([["OFDM 6Mbps 5GHz", 100], TXTIME_OFDM6_100]);
  });

  it("reads the cell's own value as the result", async () => {
    const excel = mockCell("=AIRTALLY.TXTIME(B1,B2)", { B1: [["OFDM 6Mbps 5GHz"]], B2: [[100]] }, TXTIME_OFDM6_100);
    const { explanation } = await explainActiveCell(excel, METADATA);
    expect([explanation.result, explanation.resultNote]).toEqual([TXTIME_OFDM6_100, "the cell's value"]);
  });

  it("explains that a native formula is not Airtally's", async () => {
    const { explanation } = await explainActiveCell(mockCell("=SUM(A1:A2)", {}), METADATA);
    expect(explanation.kind).toBe("other");
  });
});
