/**
 * Help pages generated at build time from the same JSDoc that generates
 * functions.json (never written twice). For each `@customfunction` in
 * src/functions/functions.ts: the summary, each argument with its unit and
 * default, the result's unit, `@example` formulas with their values (computed
 * by running the freshly built functions.js in a bare context), the model and
 * its published source (`@remarks`), and the cautions (`@caution`).
 *
 * Used as a webpack plugin (HelpPagesPlugin) and by tests (readHelpEntries).
 */
const fs = require("fs");
const path = require("path");
const vm = require("vm");
const ts = require("typescript");
const { sources, Compilation } = require("webpack");

const CSP = "default-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; object-src 'none'; base-uri 'self'; form-action 'none'";

function tagText(tag) {
  const c = tag.comment;
  if (!c) return "";
  return (typeof c === "string" ? c : c.map((p) => p.text).join("")).trim();
}

/** JSDoc of every @customfunction in a file: {id, name, summary, params, returns, examples, remarks, cautions}. */
function readHelpEntries(file) {
  const text = fs.readFileSync(file, "utf8");
  const source = ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true);
  const entries = [];
  for (const statement of source.statements) {
    if (!ts.isFunctionDeclaration(statement)) continue;
    const docs = ts.getJSDocCommentsAndTags(statement).filter(ts.isJSDoc);
    const doc = docs[docs.length - 1];
    if (!doc || !(doc.tags || []).some((t) => t.tagName.text === "customfunction")) continue;
    const tags = doc.tags || [];
    const summary = (typeof doc.comment === "string" ? doc.comment : (doc.comment || []).map((p) => p.text).join("")).trim();
    const id = tagText(tags.find((t) => t.tagName.text === "customfunction"));
    const params = tags
      .filter((t) => ts.isJSDocParameterTag(t))
      .map((t) => ({ name: t.name.getText().replace(/^\[|\]$/g, ""), optional: t.isBracketed, description: tagText(t).replace(/^- /, "") }));
    const pick = (name) => tags.filter((t) => t.tagName.text === name).map(tagText);
    entries.push({
      id,
      name: statement.name.text,
      summary,
      params,
      returns: pick("returns")[0] || "",
      examples: pick("example"),
      remarks: pick("remarks"),
      cautions: pick("caution"),
      helpUrl: pick("helpurl")[0] || "",
    });
  }
  return entries;
}

/** Split the arguments of a formula call at top-level commas. */
function splitArgs(text) {
  const out = [];
  let depth = 0, quoted = false, current = "";
  for (const ch of text) {
    if (ch === '"') quoted = !quoted;
    if (!quoted && ch === "{") depth++;
    if (!quoted && ch === "}") depth--;
    if (!quoted && depth === 0 && ch === ",") { out.push(current); current = ""; continue; }
    current += ch;
  }
  if (current.length || out.length) out.push(current);
  return out;
}

function literal(text) {
  const t = text.trim();
  if (t === "") return null;
  if (t.startsWith('"')) return t.slice(1, -1).replace(/""/g, '"');
  if (t.startsWith("{")) return t.slice(1, -1).split(";").map((row) => splitArgs(row).map(literal));
  if (/^(TRUE|FALSE)$/i.test(t)) return /^TRUE$/i.test(t);
  const n = Number(t);
  if (!Number.isFinite(n)) throw new Error(`help example: cannot read argument ${t}`);
  return n;
}

/** Evaluate `=AIRTALLY.NAME(args…)` with the registered functions; literal arguments only. */
function evaluateExample(formula, functions) {
  const m = formula.trim().match(/^=AIRTALLY\.([A-Z0-9]+)\((.*)\)$/s);
  if (!m) throw new Error(`help example must read =AIRTALLY.NAME(…): ${formula}`);
  const fn = functions.get(m[1]);
  if (!fn) throw new Error(`help example calls an unknown function: ${m[1]}`);
  const args = splitArgs(m[2]).map(literal);
  try {
    return fn(...args);
  } catch (e) {
    return `${e.code || "#VALUE!"} ${e.message || ""}`.trim();
  }
}

/** Registered functions of a functions.js source, loaded in a bare context. */
function loadFunctions(code) {
  const functions = new Map();
  class SpreadsheetError extends Error { constructor(code, message) { super(message); this.code = code; } }
  const CustomFunctions = { associate: (id, fn) => functions.set(id, fn), Error: SpreadsheetError, ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A" } };
  vm.runInContext(code, vm.createContext({ CustomFunctions }));
  return functions;
}

const escape = (s) => String(s).replace(/[&<>"]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[c]);

function formatValue(value) {
  if (Array.isArray(value)) {
    return `<table>${value.map((row) => `<tr>${row.map((v) => `<td>${escape(typeof v === "number" ? +v.toPrecision(10) : v)}</td>`).join("")}</tr>`).join("")}</table>`;
  }
  return `<code>${escape(typeof value === "number" ? +value.toPrecision(10) : value)}</code>`;
}

function page(title, body) {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${CSP}">
<title>${escape(title)}</title>
<style>body{font-family:system-ui,sans-serif;max-width:46rem;margin:1.5rem auto;padding:0 1rem;color:#1d2a2f;background:#f6f4ee}
h1{color:#234e52}code{background:#e9e4d6;padding:0 .2em}table{border-collapse:collapse}td,th{border:1px solid #c9c2b0;padding:.2em .5em;text-align:left}
.caution{border-left:4px solid #c98a00;background:#fff3cd;padding:.4em .8em}</style></head>
<body>${body}</body></html>
`;
}

function functionPage(entry, functions) {
  const signature = `AIRTALLY.${entry.id}(${entry.params.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ")})`;
  const rows = entry.params.map((p) => `<tr><td><code>${escape(p.name)}</code>${p.optional ? " (optional)" : ""}</td><td>${escape(p.description)}</td></tr>`).join("");
  const examples = entry.examples
    .map((f) => `<tr><td><code>${escape(f)}</code></td><td>${formatValue(evaluateExample(f, functions))}</td></tr>`)
    .join("");
  return page(
    `AIRTALLY.${entry.id}`,
    `<p><a href="index.html">All functions</a></p>
<h1>${escape(signature)}</h1>
<p>${escape(entry.summary)}</p>
<h2>Arguments</h2><table><tr><th>argument</th><th>meaning, unit and default</th></tr>${rows}</table>
<h2>Result</h2><p>${escape(entry.returns)}</p>
${examples ? `<h2>Examples</h2><table><tr><th>formula</th><th>value</th></tr>${examples}</table>` : ""}
${entry.remarks.length ? `<h2>Model and source</h2>${entry.remarks.map((r) => `<p>${escape(r)}</p>`).join("")}` : ""}
${entry.cautions.map((c) => `<p class="caution">${escape(c)}</p>`).join("")}
<p class="caution">Results are planning estimates. They do not replace a site survey; regulatory limits vary by country, and local regulations, codes and licensed practice decide.</p>`,
  );
}

function indexPage(entries) {
  const rows = entries.map((e) => `<tr><td><a href="${e.id.toLowerCase()}.html">AIRTALLY.${e.id}</a></td><td>${escape(e.summary)}</td></tr>`).join("");
  return page("Airtally functions", `<h1>Airtally functions</h1><p>Wi-Fi (IEEE 802.11) link, airtime and site budget functions for Excel.</p><table>${rows}</table>
<p class="caution">Results are planning estimates. They do not replace a site survey; regulatory limits on transmit power, EIRP and channels vary by country, and local regulations, codes and licensed practice decide.</p>`);
}

class HelpPagesPlugin {
  constructor(options) {
    this.input = path.resolve(options.input);
  }
  apply(compiler) {
    compiler.hooks.thisCompilation.tap("HelpPagesPlugin", (compilation) => {
      compilation.hooks.processAssets.tap({ name: "HelpPagesPlugin", stage: Compilation.PROCESS_ASSETS_STAGE_ADDITIONS }, (assets) => {
        const code = assets["functions.js"] && assets["functions.js"].source().toString();
        if (!code) return;
        const functions = loadFunctions(code);
        const entries = readHelpEntries(this.input);
        for (const entry of entries) {
          const file = `help/${entry.id.toLowerCase()}.html`;
          if (entry.helpUrl !== `https://localhost:3000/${file}`) {
            compilation.errors.push(new Error(`${entry.id}: @helpurl must be https://localhost:3000/${file}`));
          }
          compilation.emitAsset(file, new sources.RawSource(functionPage(entry, functions)));
        }
        compilation.emitAsset("help/index.html", new sources.RawSource(indexPage(entries)));
      });
    });
  }
}

module.exports = { HelpPagesPlugin, readHelpEntries, evaluateExample, loadFunctions };
