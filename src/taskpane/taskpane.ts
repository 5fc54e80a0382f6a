/**
 * The Airtally pane: a searchable function reference built from the add-in's
 * own functions.json. Works outside Office (shows a notice) so it can be
 * tested in a plain browser.
 */
interface FunctionMetadata {
  name: string;
  description?: string;
  parameters?: { name: string; description?: string; optional?: boolean }[];
  result?: { dimensionality?: string };
}

function renderReference(functions: FunctionMetadata[], filter: string): void {
  const list = document.getElementById("reference");
  if (!list) return;
  list.textContent = "";
  const needle = filter.trim().toLowerCase();
  for (const fn of functions) {
    const text = `${fn.name} ${fn.description ?? ""}`.toLowerCase();
    if (needle && !text.includes(needle)) continue;
    const dt = document.createElement("dt");
    const args = (fn.parameters ?? []).map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
    dt.textContent = `AIRTALLY.${fn.name}(${args})`;
    const dd = document.createElement("dd");
    dd.textContent = fn.description ?? "";
    list.append(dt, dd);
  }
}

async function start(): Promise<void> {
  const insideOffice = typeof Office !== "undefined" && typeof Office.onReady === "function";
  if (insideOffice) {
    const info = await Office.onReady();
    if (!info.host) document.getElementById("host-notice")?.removeAttribute("hidden");
  } else {
    document.getElementById("host-notice")?.removeAttribute("hidden");
  }
  const response = await fetch("functions.json");
  const metadata = (await response.json()) as { functions: FunctionMetadata[] };
  const search = document.getElementById("search") as HTMLInputElement | null;
  renderReference(metadata.functions, "");
  search?.addEventListener("input", () => renderReference(metadata.functions, search.value));
}

if (typeof document !== "undefined") {
  start().catch((e) => {
    const list = document.getElementById("reference");
    if (list) list.textContent = `Could not load the function reference: ${String(e)}`;
  });
}
