/**
 * The Airtally pane (DOM glue only): the function reference with search,
 * "Insert site budget" and "Explain this cell". The logic lives in
 * reference.ts, explain.ts, budgetTemplate.ts and office.ts. Outside Excel the
 * reference still works and the workbook actions show a notice.
 */
import { explainActiveCell, insertSiteBudget } from "./office";
import { searchFunctions, signature, type FunctionMetadata } from "./reference";
import type { Explanation } from "./explain";

function byId<T extends HTMLElement>(id: string): T | null {
  return document.getElementById(id) as T | null;
}

function el<K extends keyof HTMLElementTagNameMap>(tag: K, text?: string, className?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (text !== undefined) e.textContent = text;
  if (className) e.className = className;
  return e;
}

function renderReference(functions: FunctionMetadata[], query: string): void {
  const list = byId("reference");
  if (!list) return;
  list.textContent = "";
  const found = searchFunctions(functions, query);
  for (const fn of found) {
    const dt = el("dt");
    const a = el("a", signature(fn));
    a.href = `help/${fn.name.toLowerCase()}.html`;
    a.target = "_blank";
    a.rel = "noopener";
    dt.append(a);
    list.append(dt, el("dd", fn.description ?? ""));
  }
  const count = byId("reference-count");
  if (count) count.textContent = `${found.length} of ${functions.length} functions`;
}

function cellText(v: unknown): string {
  if (v === null || v === undefined) return "(default)";
  if (Array.isArray(v)) return v.map((row) => (Array.isArray(row) ? row.join(", ") : String(row))).join("; ");
  if (typeof v === "number") return String(+v.toPrecision(10));
  return String(v);
}

function table(rows: (string | number)[][], head?: string[]): HTMLTableElement {
  const t = el("table");
  if (head) {
    const tr = el("tr");
    for (const h of head) tr.append(el("th", h));
    t.append(tr);
  }
  for (const row of rows) {
    const tr = el("tr");
    for (const v of row) tr.append(el("td", cellText(v)));
    t.append(tr);
  }
  return t;
}

function renderExplanation(address: string, x: Explanation): void {
  const out = byId("explain-output");
  if (!out) return;
  out.textContent = "";
  out.append(el("h3", `${address}: ${x.title}`));
  if (x.result !== undefined) out.append(el("p", `Result: ${cellText(x.result)} (${x.resultNote ?? ""})`));
  out.append(el("p", x.message));
  if (x.inputs.length) {
    out.append(el("h4", "Inputs used"));
    const from = { literal: "typed in the formula", cell: "read from the cell", default: "omitted: the default", expression: "a calculation" };
    const shown = (i: Explanation["inputs"][number]) => (i.value === null && i.used != null ? `${cellText(i.used)} (default)` : cellText(i.value));
    out.append(table(x.inputs.map((i) => [i.name, i.text || "—", shown(i), from[i.from]]), ["argument", "as written", "value", "where from"]));
  }
  if (x.table) {
    out.append(el("h4", x.tableTitle ?? "Breakdown"), table(x.table));
  }
  if (x.chain) {
    out.append(el("h4", x.chainTitle ?? "From the breakdown to the result"), table(x.chain));
  }
}

function showStatus(text: string): void {
  const s = byId("status");
  if (s) s.textContent = text;
}

async function start(): Promise<void> {
  let inExcel = false;
  if (typeof Office !== "undefined" && typeof Office.onReady === "function") {
    const info = await Office.onReady();
    inExcel = info.host === Office.HostType.Excel;
  }
  const notice = byId("host-notice");
  if (!inExcel && notice) notice.hidden = false;
  for (const id of ["insert-budget", "explain-cell"]) {
    const b = byId<HTMLButtonElement>(id);
    if (b) b.disabled = !inExcel;
  }
  const metadata = ((await (await fetch("functions.json")).json()) as { functions: FunctionMetadata[] }).functions;
  const search = byId<HTMLInputElement>("search");
  renderReference(metadata, "");
  search?.addEventListener("input", () => renderReference(metadata, search.value));
  if (!inExcel) return;
  byId("insert-budget")?.addEventListener("click", () => {
    insertSiteBudget(Excel)
      .then((name) => showStatus(`Budget written on the new sheet "${name}".`))
      .catch((e) => showStatus(`Could not insert the budget: ${e instanceof Error ? e.message : String(e)}`));
  });
  byId("explain-cell")?.addEventListener("click", () => {
    explainActiveCell(Excel, metadata)
      .then(({ address, explanation }) => renderExplanation(address, explanation))
      .catch((e) => showStatus(`Could not read the cell: ${e instanceof Error ? e.message : String(e)}`));
  });
}

if (typeof document !== "undefined") {
  start().catch((e) => {
    const list = byId("reference");
    if (list) list.textContent = `Could not load the function reference: ${String(e)}`;
  });
}
