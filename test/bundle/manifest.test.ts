/**
 * Offline cross-check of manifest.xml (the online validator needs internet;
 * `npm run validate` runs it where there is). Checks the elements the
 * add-in manifest schema requires for a TaskPaneApp with VersionOverrides
 * v1.0, that every resid resolves to a resource, every URL is https and
 * points at a file the build emits, and that the version moves with
 * functions.json.
 */
import * as fs from "fs";
import * as path from "path";
import { XMLParser } from "fast-xml-parser";
import { DIST } from "./loadBundle";

const ROOT = path.resolve(__dirname, "../..");
// Comments are not part of the document the host reads.
const xml = fs.readFileSync(path.join(ROOT, "manifest.xml"), "utf8").replace(/<!--[\s\S]*?-->/g, "");
const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: "@", removeNSPrefix: true });
const doc = parser.parse(xml).OfficeApp;

function collect(node: unknown, key: string, out: unknown[] = []): unknown[] {
  if (Array.isArray(node)) node.forEach((n) => collect(n, key, out));
  else if (node && typeof node === "object") {
    for (const [k, v] of Object.entries(node)) {
      if (k === key) out.push(v);
      collect(v, key, out);
    }
  }
  return out;
}

const resources = doc.VersionOverrides.Resources;
const asArray = <T>(x: T | T[]): T[] => (Array.isArray(x) ? x : [x]);
const resourceIds = new Set<string>(
  [resources.Images.Image, resources.Urls.Url, resources.ShortStrings.String, resources.LongStrings.String]
    .flatMap((list) => asArray(list))
    .map((r: { "@id": string }) => r["@id"]),
);

describe("manifest.xml", () => {
  it("has the required top-level elements in schema order", () => {
    // Order required by the add-in manifest schema (OfficeApp, v1.1) for these elements
    const order = ["Id", "Version", "ProviderName", "DefaultLocale", "DisplayName", "Description", "IconUrl", "HighResolutionIconUrl", "SupportUrl", "AppDomains", "Hosts", "Requirements", "DefaultSettings", "Permissions", "VersionOverrides"];
    const positions = order.map((el) => xml.indexOf(`<${el}`));
    expect(positions.every((p) => p > 0)).toBe(true);
    expect([...positions].sort((a, b) => a - b)).toEqual(positions);
  });

  it("has its own GUID and a four-part version", () => {
    expect(doc.Id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(String(doc.Version)).toMatch(/^\d+\.\d+\.\d+\.\d+$/);
  });

  it("declares a shared runtime with a long lifetime and requires SharedRuntime 1.1", () => {
    const runtime = doc.VersionOverrides.Hosts.Host.Runtimes.Runtime;
    expect(runtime["@lifetime"]).toBe("long");
    expect(runtime["@resid"]).toBe("Taskpane.Url");
    expect(doc.Requirements.Sets.Set["@Name"]).toBe("SharedRuntime");
  });

  it("registers the CustomFunctions extension point in the AIRTALLY namespace", () => {
    const points = asArray(doc.VersionOverrides.Hosts.Host.AllFormFactors.ExtensionPoint);
    const cf = points.find((p: { "@type": string }) => p["@type"] === "CustomFunctions");
    expect(cf.Script.SourceLocation["@resid"]).toBe("Functions.Script.Url");
    expect(cf.Page.SourceLocation["@resid"]).toBe("Taskpane.Url");
    expect(cf.Metadata.SourceLocation["@resid"]).toBe("Functions.Metadata.Url");
    const ns = asArray(resources.ShortStrings.String).find((s: { "@id": string }) => s["@id"] === cf.Namespace["@resid"]);
    expect(ns["@DefaultValue"]).toBe("AIRTALLY");
  });

  it("resolves every resid to a resource", () => {
    const resids = collect(doc.VersionOverrides.Hosts, "@resid") as string[];
    expect(resids.length).toBeGreaterThan(10);
    for (const id of resids) expect(resourceIds.has(id) ? id : `missing ${id}`).toBe(id);
  });

  it("keeps resource ids within the 32-character limit and short strings within 125 characters", () => {
    for (const id of resourceIds) expect(id.length).toBeLessThanOrEqual(32);
    for (const s of asArray(resources.ShortStrings.String) as { "@DefaultValue": string }[]) expect(s["@DefaultValue"].length).toBeLessThanOrEqual(125);
  });

  it("uses https URLs that point at files the build emits", () => {
    const urls = xml.match(/https:\/\/[^"<\s]+/g) ?? [];
    const local = urls.filter((u) => u.startsWith("https://localhost:3000/"));
    expect(local.length).toBeGreaterThan(5);
    for (const url of local) {
      const file = url.replace("https://localhost:3000/", "");
      const emitted = fs.existsSync(path.join(DIST, file));
      expect(emitted ? url : `not emitted: ${url}`).toBe(url);
    }
  });

  it("ships icons of the sizes it names, as PNG", () => {
    for (const size of [16, 32, 64, 80]) {
      const png = fs.readFileSync(path.join(ROOT, "assets", `icon-${size}.png`));
      expect(png.subarray(1, 4).toString("ascii")).toBe("PNG");
      expect(png.readUInt32BE(16)).toBe(size); // IHDR width
    }
  });

  it("moves the version whenever functions.json changes", () => {
    // The snapshot below pairs the manifest version with a digest of the
    // generated metadata: a change to one without the other fails here.
    const crypto = require("crypto") as typeof import("crypto");
    const metadata = fs.readFileSync(path.join(DIST, "functions.json"), "utf8");
    const digest = crypto.createHash("sha256").update(metadata).digest("hex").slice(0, 16);
    const pairs = JSON.parse(fs.readFileSync(path.join(ROOT, "test/bundle/metadata-versions.json"), "utf8")) as Record<string, string>;
    expect(pairs[digest] ?? `functions.json digest ${digest} is new: bump <Version> in manifest.xml and record the pair in test/bundle/metadata-versions.json`).toBe(String(doc.Version));
  });
});
