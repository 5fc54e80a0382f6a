#!/usr/bin/env node
/**
 * `npm start`: serves dist/ at https://localhost:3000 (loopback only) with the
 * certificates of office-addin-dev-certs, then prints how to load the add-in.
 *
 * office-addin-dev-certs is asked once to generate its CA and localhost
 * certificate; the files are then read from ~/.office-addin-dev-certs. (As
 * root on Linux the CA install step cannot reach the system store; Excel on
 * the web needs the CA trusted by the browser — see README.)
 *
 * The request handler is exported (createHandler) so tests can mount it on a
 * plain-HTTP server on 127.0.0.1; `npm start` itself always serves HTTPS.
 * Hostile requests never stop the server: a malformed URL is 400, a method
 * other than GET/HEAD is 405 with Allow, a path outside dist/ (by `..`,
 * encoded separators, NUL or a symbolic link) is 403.
 */
const fs = require("fs");
const https = require("https");
const path = require("path");

const DEFAULT_PORT = 3000;
const DIST = path.resolve(__dirname, "..", "dist");
const TYPES = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".json": "application/json; charset=utf-8",
  ".xml": "application/xml; charset=utf-8",
  ".png": "image/png",
  ".css": "text/css; charset=utf-8",
  ".map": "application/json; charset=utf-8",
  ".xlsx": "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
};
/**
 * Scripts: our own origin and office.js's folder on Office's CDN only (the
 * files office.js loads sit beside it there), not every path of that host.
 * Keep in step with the meta CSP of src/taskpane/taskpane.html.
 */
const OFFICE_JS_FOLDER = "https://appsforoffice.microsoft.com/lib/1/hosted/";
const CSP =
  `default-src 'self'; script-src 'self' ${OFFICE_JS_FOLDER}; style-src 'self' 'unsafe-inline'; ` +
  "img-src 'self' data:; connect-src 'self'; frame-src https://telemetryservice.firstpartyapps.oaspapps.com; " +
  "object-src 'none'; base-uri 'self'; form-action 'none'";
const ALLOWED_METHODS = "GET, HEAD";
/**
 * CORS: no wildcard. The pane loads functions.js and its pages from this same
 * origin, which needs no CORS at all. The one cross-origin read is Excel on
 * the web fetching the custom-functions metadata (Microsoft's "Custom
 * functions metadata" page: the server hosting the JSON file must have CORS
 * enabled for Excel on the web). So only functions.json answers, and only an
 * Origin of an Office on the web host (https://<name>.officeapps.live.com,
 * the Excel on the web origin; from memory), echoed back with Vary: Origin.
 * Every other file and origin gets no Access-Control-Allow-Origin.
 */
const CORS_FILES = new Set(["functions.json"]);
const OFFICE_WEB_ORIGIN = /^https:\/\/[a-z0-9-]+(\.[a-z0-9-]+)*\.officeapps\.live\.com$/;

/** A plain-text answer with no file behind it. */
function refuse(res, status, text, extraHeaders = {}) {
  res.writeHead(status, { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-cache", ...extraHeaders });
  res.end(`${text}\n`);
}

/** The request path as a file path relative to the root, or null when it cannot name a file (malformed escape, NUL). */
function relativePathOf(rawUrl) {
  const pathPart = String(rawUrl).split(/[?#]/, 1)[0];
  let decoded;
  try {
    decoded = decodeURIComponent(pathPart);
  } catch {
    return null; // URIError: "%", "%zz", a lone surrogate
  }
  if (decoded.includes("\0")) return null;
  return decoded.replace(/\\/g, "/").replace(/^\/+/, "") || "taskpane.html";
}

/** The value, or null when reading the file system threw (gone, unreadable). */
function attempt(read) {
  try {
    return read();
  } catch {
    return null;
  }
}

/** CORS headers for this file and Origin (see CORS_FILES). */
function corsHeaders(rel, origin) {
  if (!CORS_FILES.has(rel) || typeof origin !== "string" || !OFFICE_WEB_ORIGIN.test(origin)) return {};
  return { "Access-Control-Allow-Origin": origin, Vary: "Origin" };
}

/**
 * The request handler serving `root` (default dist/). Only files inside the
 * root's real path are served: a `..`, an encoded one (%2e%2e%2f) or a
 * symbolic link pointing out is 403.
 */
function createHandler(root = DIST) {
  const realRoot = fs.realpathSync(root);
  return function handler(req, res) {
    if (req.method !== "GET" && req.method !== "HEAD") {
      return refuse(res, 405, "method not allowed: use GET or HEAD", { Allow: ALLOWED_METHODS });
    }
    const rel = relativePathOf(req.url ?? "/");
    if (rel === null) return refuse(res, 400, "bad request: malformed URL");
    const file = path.resolve(realRoot, rel);
    if (!file.startsWith(realRoot + path.sep)) return refuse(res, 403, "forbidden: outside the served folder");
    const real = attempt(() => fs.realpathSync(file));
    if (real !== null && !real.startsWith(realRoot + path.sep)) return refuse(res, 403, "forbidden: outside the served folder");
    const stat = real === null ? null : attempt(() => fs.statSync(real));
    if (stat === null || !stat.isFile()) return refuse(res, 404, "not found");
    res.writeHead(200, {
      "Content-Type": TYPES[path.extname(real)] || "application/octet-stream",
      "Content-Length": stat.size,
      "Content-Security-Policy": CSP,
      "X-Content-Type-Options": "nosniff",
      "Cache-Control": "no-cache",
      ...corsHeaders(rel, req.headers.origin),
    });
    if (req.method === "HEAD") return res.end();
    const stream = fs.createReadStream(real);
    stream.on("error", () => res.destroy()); // a file removed mid-read ends this response, not the server
    stream.pipe(res);
  };
}

async function certificates() {
  const certs = require("office-addin-dev-certs");
  const defaults = require("office-addin-dev-certs/lib/defaults");
  const files = [defaults.caCertificatePath, defaults.localhostCertificatePath, defaults.localhostKeyPath];
  if (!files.every((f) => fs.existsSync(f))) {
    await certs.generateCertificates(...files);
  }
  return { ca: fs.readFileSync(files[0]), cert: fs.readFileSync(files[1]), key: fs.readFileSync(files[2]), caPath: files[0] };
}

async function main() {
  const port = Number(process.env.PORT || DEFAULT_PORT);
  if (!fs.existsSync(path.join(DIST, "functions.js"))) {
    console.error("dist/ is missing: run `npm run build:dev` first (npm start does it for you).");
    process.exit(1);
  }
  const { ca, cert, key, caPath } = await certificates();
  https.createServer({ ca, cert, key }, createHandler(DIST)).listen(port, "127.0.0.1", () => {
    const manifest = path.join(DIST, "manifest.xml");
    console.log(`Airtally is served at https://localhost:${port}/ (loopback only). Ctrl+C stops it.

Load the add-in:
  Excel on the web:  Insert > Add-ins > Upload My Add-in, choose ${manifest}
  Excel on Windows or macOS (sideload, needs Excel installed):
                     npx office-addin-debugging start ${manifest} desktop --app excel
The browser or Excel must trust the development CA: ${caPath}
Then type =AIRTALLY. in a cell. Results are planning estimates; local regulations decide.`);
  });
}

module.exports = { createHandler, CSP, OFFICE_JS_FOLDER, ALLOWED_METHODS };

if (require.main === module) {
  main().catch((e) => {
    console.error(`npm start failed: ${e.message}`);
    process.exit(1);
  });
}
