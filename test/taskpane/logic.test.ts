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
];

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

describe("explain this cell (Excel glue)", () => {
  function mockCell(formula: unknown, refs: Record<string, unknown[][]>) {
    const worksheet = {
      ranges: Object.fromEntries(Object.entries(refs).map(([a, values]) => [a, { values }])),
      getRange(address: string) {
        return (this as { ranges: Record<string, unknown> }).ranges[address];
      },
    };
    const mock = new OfficeMockObject({
      context: { workbook: { cell: { address: "Plan!C3", formulas: [[formula]], worksheet }, getActiveCell() { return (this as { cell: unknown }).cell; } } },
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

  it("explains that a native formula is not Airtally's", async () => {
    const { explanation } = await explainActiveCell(mockCell("=SUM(A1:A2)", {}), METADATA);
    expect(explanation.kind).toBe("other");
  });
});
