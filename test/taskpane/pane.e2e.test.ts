/**
 * The pane page end to end in headless Chromium (Debian's chromium driven by
 * playwright-core): dist/ served from 127.0.0.1 by scripts/serve.js's handler, office.js routed to the npm
 * copy, no console errors, the outside-Excel notice, search, and a
 * screenshot kept in test-artifacts/; then the same page with office.js
 * replaced by a stub Excel host (one active cell and the cells it reads), so
 * "Explain this cell" renders the result, the resolved defaults and the
 * chain from the breakdown to the result. Skips with a printed reason when
 * chromium is not installed (CI installs it) or dist/ is not built.
 */
import * as fs from "fs";
import * as http from "http";
import * as os from "os";
import * as path from "path";
import type { AddressInfo } from "net";

const ROOT = path.resolve(__dirname, "../..");
const DIST = path.join(ROOT, "dist");
const CHROMIUM = "/usr/bin/chromium";
const OFFICE_DIST = path.join(ROOT, "node_modules/@microsoft/office-js/dist");
/** office.js (outside an Office client) frames its telemetry page on this host; the pane's CSP allows exactly that frame. */
const OFFICE_TELEMETRY = "https://telemetryservice.firstpartyapps.oaspapps.com/**";
const ARTIFACTS = path.join(ROOT, "test-artifacts");

const missing = !fs.existsSync(CHROMIUM) ? `${CHROMIUM} not found` : !fs.existsSync(path.join(DIST, "taskpane.html")) ? "dist/ is not built (npm run build)" : null;
if (missing) console.log(`skipping the pane end-to-end test: ${missing}`);
const maybe = missing ? describe.skip : describe;

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { createHandler } = require("../../scripts/serve.js") as { createHandler: (root: string) => http.RequestListener };

/** dist/ through the dev server's own handler (its CSP header applies on top of the page's meta CSP), over plain HTTP. */
function serve(dir: string): Promise<http.Server> {
  const server = http.createServer(createHandler(dir));
  return new Promise((resolve) => server.listen(0, "127.0.0.1", () => resolve(server)));
}

/** A served dist/ and a headless Chromium page on it; `close` ends both and removes the profile. */
interface Pane {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  page: any;
  /** The browser context, for a second page of the same profile. */
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  context: any;
  close: () => Promise<void>;
  port: number;
}

async function openChromium(): Promise<Pane> {
  const { chromium } = await import("playwright-core");
  const server = await serve(DIST);
  const userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-chromium-"));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM,
    headless: true,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const close = async () => {
    await context.close();
    await new Promise((r) => server.close(r));
    fs.rmSync(userDataDir, { recursive: true, force: true });
  };
  return { page, context, close, port: (server.address() as AddressInfo).port };
}

maybe("the task pane in a browser outside Excel", () => {
  jest.setTimeout(60_000);
  let pane: Pane;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  let page: any;
  const problems: string[] = [];

  beforeAll(async () => {
    pane = await openChromium();
    page = pane.page;
    // office.js and the files it loads next to itself (o15apptofilemappingtable.js, …) come from the npm copy.
    await page.route("https://appsforoffice.microsoft.com/**", (route: { fulfill: (r: object) => void }, request: { url: () => string }) => {
      const file = path.join(OFFICE_DIST, new URL(request.url()).pathname.replace(/^\/lib\/1\/hosted\//, ""));
      if (file.startsWith(OFFICE_DIST) && fs.existsSync(file)) route.fulfill({ status: 200, contentType: "text/javascript", body: fs.readFileSync(file, "utf8") });
      else route.fulfill({ status: 404, body: "" });
    });
    // The machine has no internet: the telemetry frame gets an empty page, so no request fails.
    await page.route(OFFICE_TELEMETRY, (route: { fulfill: (r: object) => void }) => route.fulfill({ status: 200, contentType: "text/html", body: "<!doctype html><title></title>" }));
    page.on("console", (msg: { type: () => string; text: () => string }) => {
      if (msg.type() === "error") problems.push(`console: ${msg.text()}`);
    });
    page.on("pageerror", (e: Error) => problems.push(`page error: ${e.message}`));
    await page.goto(`http://127.0.0.1:${pane.port}/taskpane.html`);
    await page.waitForSelector("#reference dt", { timeout: 30_000 });
  });

  afterAll(async () => {
    await pane?.close();
  });

  it("lists every registered function in the reference", async () => {
    const metadata = JSON.parse(fs.readFileSync(path.join(DIST, "functions.json"), "utf8"));
    expect(await page.locator("#reference dt").count()).toBe(metadata.functions.length);
  });

  it("narrows the reference to the functions a search names", async () => {
    await page.fill("#search", "sensitivity");
    const names: string[] = await page.locator("#reference dt").allTextContents();
    expect(names.length).toBeGreaterThan(0);
    expect(names.some((n) => n.startsWith("AIRTALLY.SENSITIVITY("))).toBe(true);
    expect(names.some((n) => n.startsWith("AIRTALLY.BREAKDOWN("))).toBe(false);
    await page.fill("#search", "");
  });

  it("shows the outside-Excel notice and disables the workbook buttons", async () => {
    expect(await page.isVisible("#host-notice")).toBe(true);
    expect(await page.isDisabled("#insert-budget")).toBe(true);
    expect(await page.isDisabled("#explain-cell")).toBe(true);
  });

  it("blocks a script from any other path of the Office host (CSP script-src is office.js's folder only)", async () => {
    // A second page of the same context, so its expected CSP report stays out of the first page's console check.
    const other = await pane.context.newPage();
    const requested: string[] = [];
    await other.route("https://appsforoffice.microsoft.com/**", (route: { fulfill: (r: object) => void }, request: { url: () => string }) => {
      const pathname = new URL(request.url()).pathname;
      requested.push(pathname);
      // office.js itself (inside the allowed folder) gets an empty script; anything else would set the flag.
      const body = pathname.startsWith("/lib/1/hosted/") ? "" : "window.__ranOutside = true;";
      route.fulfill({ status: 200, contentType: "text/javascript", body });
    });
    await other.goto(`http://127.0.0.1:${pane.port}/taskpane.html`);
    const blocked: string = await other.evaluate(
      () =>
        new Promise<string>((resolve) => {
          document.addEventListener("securitypolicyviolation", (e) => resolve(`${e.violatedDirective} ${e.blockedURI}`), { once: true });
          const script = document.createElement("script");
          script.src = "https://appsforoffice.microsoft.com/lib/2/other.js";
          script.onload = () => resolve("loaded");
          document.head.appendChild(script);
        }),
    );
    expect(blocked).toMatch(/^script-src(-elem)? https:\/\/appsforoffice\.microsoft\.com\/lib\/2\/other\.js$/);
    expect(requested).not.toContain("/lib/2/other.js");
    expect(await other.evaluate(() => (window as unknown as { __ranOutside?: boolean }).__ranOutside === true)).toBe(false);
    await other.close();
  });

  it("logs no console errors and keeps a screenshot", async () => {
    fs.mkdirSync(ARTIFACTS, { recursive: true });
    await page.screenshot({ path: path.join(ARTIFACTS, "taskpane.png"), fullPage: true });
    expect(problems).toEqual([]);
  });
});

/**
 * A stand-in for office.js inside Excel: Office.onReady says Excel, and
 * Excel.run hands the batch a workbook whose active cell holds a GOODPUT
 * formula reading B1 (the link); CustomFunctions takes the registrations of
 * the shared runtime's functions.js. Only what the page calls exists.
 */
const EXCEL_HOST_STUB = `
window.Office = { HostType: { Excel: "Excel" }, onReady: function () { return Promise.resolve({ host: "Excel" }); } };
window.CustomFunctions = { associate: function () {}, Error: function (code, message) { this.code = code; this.message = message; }, ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A" } };
(function () {
  var ranges = { B1: { values: [["OFDM 54Mbps 5GHz"]], load: function () {} } };
  var worksheet = { getRange: function (a) { return ranges[a]; } };
  var cell = { address: "Plan!C3", formulas: [["=AIRTALLY.GOODPUT(B1,1500)"]], values: [[29.52029520295203]], worksheet: worksheet, load: function () {} };
  var context = { workbook: { getActiveCell: function () { return cell; }, worksheets: { getItem: function () { return worksheet; } } }, sync: function () { return Promise.resolve(); } };
  window.Excel = { run: function (batch) { return batch(context); } };
})();
`;

maybe("the task pane in a stub Excel host: Explain this cell", () => {
  jest.setTimeout(60_000);
  let pane: Pane;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  let page: any;
  const problems: string[] = [];

  beforeAll(async () => {
    pane = await openChromium();
    page = pane.page;
    await page.route("https://appsforoffice.microsoft.com/**", (route: { fulfill: (r: object) => void }) => route.fulfill({ status: 200, contentType: "text/javascript", body: EXCEL_HOST_STUB }));
    page.on("pageerror", (e: Error) => problems.push(`page error: ${e.message}`));
    await page.goto(`http://127.0.0.1:${pane.port}/taskpane.html`);
    await page.waitForSelector("#explain-cell:not([disabled])", { timeout: 30_000 });
    await page.click("#explain-cell");
    await page.waitForSelector("#explain-output h4", { timeout: 30_000 });
  });

  afterAll(async () => {
    await pane?.close();
  });

  const output = async (): Promise<string> => ((await page.innerText("#explain-output")) as string).replace(/\s+/g, " ");

  it("shows the result first: the cell's value", async () => {
    const text = await output();
    expect(text).toMatch(/Result: 29\.52\d* \(the cell's value\)/);
    expect(text.indexOf("Result:")).toBeLessThan(text.indexOf("Inputs used"));
  });

  it("shows the value the core applies for each omitted argument", async () => {
    const text = await output();
    // OFDM has no A-MPDU, so "auto" is 1 MPDU (AGGCOUNT); BE and no protection are the catalog defaults
    expect(text).toMatch(/mpdus — auto = 1 \(AGGCOUNT\) \(default\)/);
    expect(text).toMatch(/access — BE \(default\)/);
  });

  it("shows the arithmetic from the breakdown to the result: 12000 bits ÷ 406.5 µs", async () => {
    const text = await output();
    // IEEE 802.11-2020 eq. (17-29): ACCESS = 43 + 67.5 + 252 + 16 + 28 = 406.5 µs for 1500 octets at 54 Mb/s
    expect(text).toMatch(/From the breakdown to the result/);
    expect(text).toMatch(/goodput without loss = 12000 bits ÷ 406\.5 µs/);
    expect(text).toMatch(/GOODPUT \(Mb\/s\) 29\.52/);
    expect(problems).toEqual([]);
  });
});
