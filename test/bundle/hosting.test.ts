/**
 * The production build for hosting: with AIRTALLY_HOST set, every
 * https://localhost:3000/ URL in the manifest, the function metadata and the
 * pages is rewritten to that host, and nothing of localhost is left.
 * Builds into a temporary folder so the other suites' dist/ is untouched.
 */
import { execFileSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";

const ROOT = path.resolve(__dirname, "../..");
const HOST = "https://addins.example.org/airtally/";

describe("production build with AIRTALLY_HOST", () => {
  let out: string;
  beforeAll(() => {
    out = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-host-"));
    execFileSync(process.execPath, [require.resolve("webpack-cli/bin/cli.js"), "--mode", "production"], {
      cwd: ROOT,
      env: { ...process.env, AIRTALLY_HOST: HOST, AIRTALLY_OUT: out },
      stdio: "pipe",
    });
  }, 120_000);
  afterAll(() => fs.rmSync(out, { recursive: true, force: true }));

  it("rewrites the manifest's URLs to the host", () => {
    const manifest = fs.readFileSync(path.join(out, "manifest.xml"), "utf8");
    expect(manifest).not.toContain("localhost");
    expect(manifest).toContain(`${HOST}functions.js`);
    expect(manifest).toContain(`${HOST}taskpane.html`);
    expect(manifest).toContain(`<AppDomain>https://addins.example.org</AppDomain>`);
  });

  it("rewrites the help links in functions.json", () => {
    const metadata = JSON.parse(fs.readFileSync(path.join(out, "functions.json"), "utf8"));
    for (const fn of metadata.functions) expect(fn.helpUrl).toBe(`${HOST}help/${fn.id.toLowerCase()}.html`);
  });

  it("leaves no localhost URL in any emitted text file", () => {
    const leftovers: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const file = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(file);
        else if (/\.(html|json|xml|js)$/.test(entry.name) && fs.readFileSync(file, "utf8").includes("https://localhost:3000")) leftovers.push(file);
      }
    };
    walk(out);
    expect(leftovers).toEqual([]);
  });
});
