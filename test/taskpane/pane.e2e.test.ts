/**
 * The pane page end to end in headless Chromium (Debian's chromium driven by
 * playwright-core): dist/ served from 127.0.0.1 by scripts/serve.js's handler,
 * office.js routed to the npm copy, no console errors, the outside-Excel notice, search, and a
 * screenshot kept in test-artifacts/. Skips with a printed reason when
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

maybe("the task pane in a browser outside Excel", () => {
  jest.setTimeout(60_000);
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  let browser: any;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  let page: any;
  let server: http.Server;
  const problems: string[] = [];
  let userDataDir: string;

  beforeAll(async () => {
    const { chromium } = await import("playwright-core");
    server = await serve(DIST);
    userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-chromium-"));
    const context = await chromium.launchPersistentContext(userDataDir, {
      executablePath: CHROMIUM,
      headless: true,
      args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    });
    browser = context;
    page = context.pages()[0] ?? (await context.newPage());
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
    const { port } = server.address() as AddressInfo;
    await page.goto(`http://127.0.0.1:${port}/taskpane.html`);
    await page.waitForSelector("#reference dt", { timeout: 30_000 });
  });

  afterAll(async () => {
    await browser?.close();
    await new Promise((r) => server?.close(r));
    if (userDataDir) fs.rmSync(userDataDir, { recursive: true, force: true });
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
    const other = await browser.newPage();
    const requested: string[] = [];
    await other.route("https://appsforoffice.microsoft.com/**", (route: { fulfill: (r: object) => void }, request: { url: () => string }) => {
      const pathname = new URL(request.url()).pathname;
      requested.push(pathname);
      // office.js itself (inside the allowed folder) gets an empty script; anything else would set the flag.
      const body = pathname.startsWith("/lib/1/hosted/") ? "" : "window.__ranOutside = true;";
      route.fulfill({ status: 200, contentType: "text/javascript", body });
    });
    const { port } = server.address() as AddressInfo;
    await other.goto(`http://127.0.0.1:${port}/taskpane.html`);
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
