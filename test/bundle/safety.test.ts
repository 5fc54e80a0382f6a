/**
 * Safety of what the build emits (issue 7): the functions bundle makes no
 * network calls and evaluates no strings as code, and every page carries a
 * Content-Security-Policy whose scripts come from the page's origin and, for
 * the pane, office.js's folder on Office's CDN only. Scans dist/ (run `npm run build` first). The
 * production-dependency audit is in .ci/run (npm audit --omit=dev), not here.
 */
import * as fs from "fs";
import * as path from "path";
import { DIST } from "./loadBundle";

const bundleText = fs.readFileSync(path.join(DIST, "functions.js"), "utf8");

/** The bundle with string literals, template text and comments blanked, so a help text that says "fetch" is not code. */
function codeOnly(source: string): string {
  let out = "";
  let i = 0;
  while (i < source.length) {
    const c = source[i];
    const next = source[i + 1];
    if (c === "/" && next === "/") {
      while (i < source.length && source[i] !== "\n") i++;
    } else if (c === "/" && next === "*") {
      const end = source.indexOf("*/", i + 2);
      i = end < 0 ? source.length : end + 2;
    } else if (c === '"' || c === "'" || c === "`") {
      out += c + c; // keep an empty literal so `x["fetch"]`-style access is still visible as ["…"] below
      i++;
      while (i < source.length && source[i] !== c) i += source[i] === "\\" ? 2 : 1;
      i++;
    } else {
      out += c;
      i++;
    }
  }
  return out;
}

/** Identifiers that reach the network or turn text into code. */
const FORBIDDEN: [string, RegExp][] = [
  ["fetch(", /(^|[^\w$.])fetch\s*\(/],
  [".fetch(", /\.\s*fetch\s*\(/],
  ["XMLHttpRequest", /\bXMLHttpRequest\b/],
  ["WebSocket", /\bWebSocket\b/],
  ["EventSource", /\bEventSource\b/],
  ["importScripts", /\bimportScripts\b/],
  ["sendBeacon", /\bsendBeacon\b/],
  ["eval", /(^|[^\w$])eval\s*\(/],
  ["new Function", /\bnew\s+Function\b/],
  ["Function( constructor call", /(^|[^\w$.])Function\s*\(/],
  ["setTimeout/setInterval with a string", /\bset(?:Timeout|Interval)\s*\(\s*["'`]/],
  ["dynamic import()", /(^|[^\w$.])import\s*\(/],
];

/** The same names as string literals (e.g. globalThis["fetch"]) — reaching them by name is no better. */
const FORBIDDEN_NAMES = ["fetch", "XMLHttpRequest", "WebSocket", "EventSource", "importScripts", "sendBeacon", "eval", "Function"];

describe("functions bundle safety", () => {
  const code = codeOnly(bundleText);

  it("strips literals and comments without losing the code (the scan sees the registration calls)", () => {
    expect(code).toMatch(/CustomFunctions\.associate\(/);
  });

  for (const [name, pattern] of FORBIDDEN) {
    it(`has no ${name} in dist/functions.js`, () => {
      const m = code.match(pattern);
      expect(m ? code.slice(Math.max(0, (m.index ?? 0) - 60), (m.index ?? 0) + 60) : null).toBeNull();
    });
  }

  it("does not name a network or code-evaluation global in a string literal", () => {
    const found = FORBIDDEN_NAMES.filter((n) => new RegExp(`["'\`]${n}["'\`]`).test(bundleText));
    expect(found).toEqual([]);
  });

  it("contains no http(s) URL other than the help pages' origin and published references", () => {
    // Help URLs live in functions.json, not the bundle; a URL in the code would be a place it could talk to.
    const urls = bundleText.match(/https?:\/\/[^\s"'`)]+/g) ?? [];
    expect(urls.filter((u) => !/^https:\/\/localhost:3000\//.test(u))).toEqual([]);
  });
});

/** The folder office.js is served from (taskpane.html loads `${OFFICE_JS_FOLDER}office.js`; the files it loads sit beside it). */
const OFFICE_JS_FOLDER = "https://appsforoffice.microsoft.com/lib/1/hosted/";

describe("pages", () => {
  const pages: string[] = [];
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.name.endsWith(".html")) pages.push(full);
    }
  };
  walk(DIST);

  it("emits at least the task pane", () => {
    expect(pages.map((p) => path.relative(DIST, p))).toContain("taskpane.html");
  });

  for (const page of pages) {
    const rel = path.relative(DIST, page);
    it(`${rel} carries a Content-Security-Policy meta in its head that forbids eval and limits scripts`, () => {
      const html = fs.readFileSync(page, "utf8");
      const head = html.split(/<\/head>/i)[0];
      // Attribute quotes are optional in HTML (the minifier drops them).
      const meta = head.match(/<meta[^>]+http-equiv=["']?Content-Security-Policy["']?[\s>][^>]*>?/i);
      expect(meta).not.toBeNull();
      const policy = head.slice(meta!.index).match(/content=(?:"([^"]*)"|'([^']*)')/i)?.slice(1).find((x) => x !== undefined) ?? "";
      expect(policy).toMatch(/default-src [^;]*/);
      expect(policy).not.toMatch(/unsafe-eval/);
      // Scripts limited to the page's own origin (and Office's CDN for the pane), never a wildcard.
      const scriptSrc = (policy.match(/script-src ([^;]*)/) ?? policy.match(/default-src ([^;]*)/))![1].trim().split(/\s+/);
      expect(scriptSrc).not.toContain("*");
      // A host source is scoped to a folder (issue 16): office.js's, not every path of the Office host.
      const hosts = scriptSrc.filter((s) => /^https?:/.test(s));
      expect(hosts.filter((s) => s !== OFFICE_JS_FOLDER)).toEqual([]);
      // Every external script the page loads falls under that folder.
      const external = [...head.matchAll(/<script[^>]+src=["']?(https?:[^"'\s>]+)/gi)].map((m) => m[1]);
      expect(external.filter((src) => !src.startsWith(OFFICE_JS_FOLDER))).toEqual([]);
    });
  }
});
