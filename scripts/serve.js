#!/usr/bin/env node
/**
 * `npm start`: serves dist/ at https://localhost:3000 (loopback only) with the
 * certificates of office-addin-dev-certs, then prints how to load the add-in.
 *
 * office-addin-dev-certs is asked once to generate its CA and localhost
 * certificate; the files are then read from ~/.office-addin-dev-certs. (As
 * root on Linux the CA install step cannot reach the system store; Excel on
 * the web needs the CA trusted by the browser — see README.)
 */
const fs = require("fs");
const https = require("https");
const path = require("path");

const PORT = Number(process.env.PORT || 3000);
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
const CSP =
  "default-src 'self'; script-src 'self' https://appsforoffice.microsoft.com; style-src 'self' 'unsafe-inline'; " +
  "img-src 'self' data:; connect-src 'self'; frame-src https://telemetryservice.firstpartyapps.oaspapps.com; " +
  "object-src 'none'; base-uri 'self'";

async function certificates() {
  const certs = require("office-addin-dev-certs");
  const defaults = require("office-addin-dev-certs/lib/defaults");
  const files = [defaults.caCertificatePath, defaults.localhostCertificatePath, defaults.localhostKeyPath];
  if (!files.every((f) => fs.existsSync(f))) {
    await certs.generateCertificates(...files);
  }
  return { ca: fs.readFileSync(files[0]), cert: fs.readFileSync(files[1]), key: fs.readFileSync(files[2]), caPath: files[0] };
}

function handler(req, res) {
  const url = new URL(req.url, `https://localhost:${PORT}`);
  const rel = decodeURIComponent(url.pathname).replace(/^\/+/, "") || "taskpane.html";
  const file = path.resolve(DIST, rel);
  if (!file.startsWith(DIST + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
    res.writeHead(404, { "Content-Type": "text/plain" });
    return res.end("not found");
  }
  res.writeHead(200, {
    "Content-Type": TYPES[path.extname(file)] || "application/octet-stream",
    "Content-Security-Policy": CSP,
    "Access-Control-Allow-Origin": "*",
    "Cache-Control": "no-cache",
  });
  fs.createReadStream(file).pipe(res);
}

async function main() {
  if (!fs.existsSync(path.join(DIST, "functions.js"))) {
    console.error("dist/ is missing: run `npm run build:dev` first (npm start does it for you).");
    process.exit(1);
  }
  const { ca, cert, key, caPath } = await certificates();
  https.createServer({ ca, cert, key }, handler).listen(PORT, "127.0.0.1", () => {
    const manifest = path.join(DIST, "manifest.xml");
    console.log(`Airtally is served at https://localhost:${PORT}/ (loopback only). Ctrl+C stops it.

Load the add-in:
  Excel on the web:  Insert > Add-ins > Upload My Add-in, choose ${manifest}
  Excel on Windows or macOS (sideload, needs Excel installed):
                     npx office-addin-debugging start ${manifest} desktop --app excel
The browser or Excel must trust the development CA: ${caPath}
Then type =AIRTALLY. in a cell. Results are planning estimates; local regulations decide.`);
  });
}

main().catch((e) => {
  console.error(`npm start failed: ${e.message}`);
  process.exit(1);
});
