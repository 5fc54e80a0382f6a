/**
 * "Explain this cell": for an AIRTALLY call, the result first, then the
 * inputs it used (literal, read from cells, or omitted — with the value the
 * core applies for an omitted one), its breakdown — the audit table computed
 * by the core for the same arguments (BREAKDOWN for airtime functions,
 * MUBREAKDOWN for the multi-user ones, TXTIMEPARTS for TXTIME, the link's canonical form, rate and sensitivity
 * for PHY lookups) — and, for GOODPUT, EFFICIENCY, SATURATE and CLIENTSHARE,
 * the arithmetic from that breakdown to the result (core resultChain).
 * Pure: the Office glue reads the referenced cells and passes their values.
 */
import { breakdownTable, edcaMixTable, txtimeTable, rateMbps, sensitivityDbm, phy, mu, AirtallyError, resolvedDefault, resultChain } from "../core/index";
import { classify, findCall, type Argument, type Call } from "./formula";
import type { FunctionMetadata } from "./reference";

export interface ExplainPlan {
  formula: string;
  call: Call | null;
  args: Argument[];
  /** Addresses the glue must read (values, as range.values gives them). */
  references: string[];
}

export interface Input {
  name: string;
  text: string;
  /** The value used; null = omitted or empty (the function's default). */
  value: unknown;
  from: "literal" | "cell" | "default" | "expression";
  /** For an omitted argument: the value the function applies (resolved by the core); null when it has none to show. */
  used?: string | number | null;
}

export interface Explanation {
  kind: "airtally" | "other" | "empty";
  title: string;
  message: string;
  inputs: Input[];
  tableTitle?: string;
  table?: (string | number)[][];
  /** The cell's result (or this call's, when the formula does more than the call). */
  result?: unknown;
  resultNote?: string;
  /** From the breakdown to the result, one step a row, the result last. */
  chainTitle?: string;
  chain?: (string | number)[][];
  helpUrl?: string;
}

/** What to read before explaining a formula. */
export function planExplanation(formula: string | null | undefined): ExplainPlan {
  const text = typeof formula === "string" && formula.startsWith("=") ? formula : "";
  const call = text.startsWith("=") ? findCall(text) : null;
  const args = call ? call.args.map(classify) : [];
  const references = args.filter((a): a is Extract<Argument, { kind: "reference" }> => a.kind === "reference").map((a) => a.address);
  return { formula: text, call, args, references: [...new Set(references)] };
}

/** A referenced range's values as the function receives them: one cell → its value, empty → null. */
function argumentValue(values: unknown[][] | undefined, matrix: boolean): unknown {
  if (!values) return null;
  const clean = values.map((row) => row.map((v) => (v === "" ? null : v)));
  if (matrix) return clean;
  return clean.length === 1 && clean[0].length === 1 ? clean[0][0] : clean;
}

type Args = Record<string, unknown>;
type Table = (string | number)[][];

/** The audit table for a call, by function id; null when the function has none. */
function breakdownFor(id: string, a: Args): { title: string; table: Table } | null {
  const access = () => breakdownTable(a.link, a.packet_bytes ?? 1500, a.mpdus, a.access, a.protection, a.mac_options);
  switch (id) {
    case "TXTIME":
    case "TXTIMEPARTS":
      return { title: "TXTIME terms (TXTIMEPARTS)", table: txtimeTable(a.link, a.psdu_bytes) };
    case "ACCESS":
    case "BREAKDOWN":
    case "GOODPUT":
    case "EFFICIENCY":
    case "SATURATE":
    case "CONTENTION":
    case "AGGCOUNT":
    case "CLIENTSHARE":
      return { title: "One channel access (BREAKDOWN)", table: access() };
    case "MUACCESS":
    case "MUGOODPUT":
    case "MUBREAKDOWN":
      return {
        title: "One multi-user exchange (MUBREAKDOWN)",
        table: mu.muBreakdownTable(a.link, a.users, a.packet_bytes, a.direction, a.mpdus, a.access, a.mac_options),
      };
    case "EDCAMIX":
      return { title: "Classes sharing the channel (EDCAMIX)", table: edcaMixTable(a.link, a.access_list, a.counts, a.packet_bytes, a.mpdus, a.protection, a.mac_options) };
    case "RATE":
    case "SENSITIVITY":
    case "PSDUFIT":
      return {
        title: "The link",
        table: [
          ["link (canonical)", phy.asLink(a.link).text],
          ["PHY rate (Mb/s)", rateMbps(a.link)],
          ["minimum sensitivity (dBm)", sensitivityDbm(a.link)],
        ],
      };
    default:
      return null;
  }
}

/** True when the formula is the AIRTALLY call and nothing else, so the cell's value is the call's result. */
function isCallAlone(plan: ExplainPlan): boolean {
  if (!plan.call) return false;
  const bare = plan.formula.replace(/\s+/g, "").toUpperCase();
  const args = plan.call.args.join(",").replace(/\s+/g, "").toUpperCase();
  return bare === `=AIRTALLY.${plan.call.id}(${args})` || bare === `=_XLDUDF_AIRTALLY_${plan.call.id}(${args})`;
}

/** The chain from breakdown to result, or null (no chain for the function, or the inputs are refused). */
function chainFor(id: string, a: Args): Table | null {
  try {
    return resultChain(id, a);
  } catch (e) {
    if (e instanceof AirtallyError) return null;
    throw e;
  }
}

/**
 * Explain a formula given the values of the cells it references (address →
 * range.values) and, when known, the cell's own value (its result).
 */
export function explain(plan: ExplainPlan, metadata: FunctionMetadata[], values: Map<string, unknown[][]>, cellValue?: unknown): Explanation {
  if (!plan.formula) return { kind: "empty", title: "No formula", message: "The selected cell holds no formula. Select a cell with an AIRTALLY formula.", inputs: [] };
  if (!plan.call) {
    return {
      kind: "other",
      title: "Not an Airtally formula",
      message: `${plan.formula} calls no AIRTALLY function, so there is nothing for Airtally to explain. Select a cell whose formula uses AIRTALLY.`,
      inputs: [],
    };
  }
  const id = plan.call.id;
  const fn = metadata.find((m) => (m.id ?? m.name).toUpperCase() === id);
  if (!fn) {
    return { kind: "airtally", title: `AIRTALLY.${id}`, message: `AIRTALLY.${id} is not a function of this version of the add-in.`, inputs: [] };
  }
  const params = fn.parameters ?? [];
  const inputs: Input[] = [];
  const byName: Args = {};
  let unresolved = false;
  params.forEach((p, i) => {
    const arg: Argument = plan.args[i] ?? { kind: "omitted" };
    const matrix = p.dimensionality === "matrix";
    let input: Input;
    switch (arg.kind) {
      case "omitted":
        input = { name: p.name, text: "", value: null, from: "default" };
        break;
      case "literal":
        input = { name: p.name, text: plan.call!.args[i], value: arg.value, from: "literal" };
        break;
      case "reference":
        input = { name: p.name, text: arg.address, value: argumentValue(values.get(arg.address), matrix), from: "cell" };
        break;
      default:
        unresolved = true;
        input = { name: p.name, text: arg.text, value: null, from: "expression" };
    }
    inputs.push(input);
    byName[p.name] = input.value;
  });
  // An argument given as an empty cell is omitted too: the function applies its default.
  for (const input of inputs) {
    if (input.value === null && input.from !== "expression") input.used = resolvedDefault(id, input.name, byName);
  }
  const alone = isCallAlone(plan);
  const shown = alone && cellValue !== undefined ? { result: cellValue, resultNote: "the cell's value" } : {};
  const base = { kind: "airtally" as const, title: `AIRTALLY.${id}`, inputs, helpUrl: fn.helpUrl, ...shown };
  if (unresolved) {
    return { ...base, message: "An argument is a calculation, not a value or a cell; put it in a cell of its own to see the breakdown." };
  }
  const chain = chainFor(id, byName);
  const withChain = chain
    ? {
        chainTitle: "From the breakdown to the result",
        chain,
        ...(alone && cellValue !== undefined ? {} : { result: chain[chain.length - 1][1], resultNote: alone ? "this call's result" : "this call's result (the cell's formula does more than this call)" }),
      }
    : {};
  try {
    const b = breakdownFor(id, byName);
    if (!b) return { ...base, ...withChain, message: `${fn.description ?? ""} No breakdown table for this function; its model and source are on its help page.`.trim() };
    return { ...base, ...withChain, message: fn.description ?? "", tableTitle: b.title, table: b.table };
  } catch (e) {
    const why = e instanceof AirtallyError ? e.message : `internal error: ${e instanceof Error ? e.message : String(e)}`;
    return { ...base, message: `The breakdown could not be computed for these inputs: ${why}` };
  }
}
