/**
 * The dev server's request handler (scripts/serve.js, issue 16) mounted on a
 * plain-HTTP server on 127.0.0.1 at a free port, serving a temporary folder:
 * hostile requests get 400/403/405 and the server keeps answering; no file
 * carries a wildcard CORS header; the CSP limits scripts to office.js's
 * folder. Every request has a 5 s timeout and the server is closed after the
 * suite. (`npm start` itself always serves HTTPS with the dev certificates.)
 */
import * as fs from "fs";
import * as http from "http";
import * as net from "net";
import * as os from "os";
import * as path from "path";
import type { AddressInfo } from "net";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const serve = require("../../scripts/serve.js") as {
  createHandler: (root: string) => http.RequestListener;
  CSP: string;
};

interface Answer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: string;
}

const REQUEST_TIMEOUT_MS = 5_000;
let server: http.Server;
let port: number;
let root: string;
let outside: string;

/** One request with the path sent exactly as given (no client-side normalising). */
function request(rawPath: string, method = "GET", headers: Record<string, string> = {}): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = http.request({ host: "127.0.0.1", port, path: rawPath, method, headers, timeout: REQUEST_TIMEOUT_MS }, (res) => {
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (c) => (body += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on("timeout", () => req.destroy(new Error(`no answer to ${method} ${rawPath} within ${REQUEST_TIMEOUT_MS} ms`)));
    req.on("error", reject);
    req.end();
  });
}

/** A request line written byte for byte on a socket (paths http.request would refuse to send). */
function rawRequest(requestLine: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = net.connect(port, "127.0.0.1", () => socket.end(`${requestLine}\r\nHost: 127.0.0.1\r\nConnection: close\r\n\r\n`));
    let text = "";
    socket.setTimeout(REQUEST_TIMEOUT_MS, () => socket.destroy(new Error(`no answer to ${requestLine}`)));
    socket.on("data", (c) => (text += c.toString("latin1")));
    socket.on("end", () => resolve(text));
    socket.on("error", reject);
  });
}

beforeAll(async () => {
  const base = fs.mkdtempSync(path.join(os.tmpdir(), "airtally-serve-"));
  root = path.join(base, "dist");
  outside = path.join(base, "secret.txt");
  fs.mkdirSync(path.join(root, "help"), { recursive: true });
  fs.writeFileSync(path.join(root, "taskpane.html"), "<!doctype html><title>pane</title>");
  fs.writeFileSync(path.join(root, "functions.json"), '{"functions":[]}');
  fs.writeFileSync(path.join(root, "help", "rate.html"), "<p>rate</p>");
  fs.writeFileSync(outside, "not to be served");
  fs.symlinkSync(outside, path.join(root, "link-out.txt"));
  server = http.createServer(serve.createHandler(root));
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  port = (server.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise((resolve) => server?.close(resolve));
  fs.rmSync(path.dirname(root), { recursive: true, force: true });
});

describe("the dev server's request handler", () => {
  it("serves the pane at / and a file by its path", async () => {
    const pane = await request("/");
    expect(pane.status).toBe(200);
    expect(pane.body).toContain("<title>pane</title>");
    expect((await request("/help/rate.html")).body).toBe("<p>rate</p>");
  });

  it.each(["/%", "/%zz", "/a%", "/%E0%A4%A", "/%00", "/taskpane.html%00.png"])("answers %s with 400 and keeps serving", async (bad) => {
    const answer = await request(bad);
    expect(answer.status).toBe(400);
    expect((await request("/taskpane.html")).status).toBe(200);
  });

  it.each(["POST", "PUT", "DELETE", "PATCH", "OPTIONS", "TRACE"])("refuses %s with 405 and Allow: GET, HEAD", async (method) => {
    const answer = await request("/taskpane.html", method);
    expect(answer.status).toBe(405);
    expect(answer.headers.allow).toBe("GET, HEAD");
    expect(answer.body).not.toContain("pane");
  });

  it("answers HEAD with the headers and no body", async () => {
    const answer = await request("/functions.json", "HEAD");
    expect(answer.status).toBe(200);
    expect(answer.headers["content-length"]).toBe(String('{"functions":[]}'.length));
    expect(answer.body).toBe("");
  });

  it.each(["/../secret.txt", "/%2e%2e/secret.txt", "/%2e%2e%2fsecret.txt", "/help/..%2f..%2fsecret.txt", "/..%5csecret.txt", "/link-out.txt"])(
    "refuses %s (outside the served folder) with 403",
    async (traversal) => {
      const answer = await request(traversal);
      expect(answer.status).toBe(403);
      expect(answer.body).not.toContain("not to be served");
    },
  );

  it("refuses a traversal written raw on the socket", async () => {
    const text = await rawRequest("GET /../../secret.txt HTTP/1.1");
    expect(text).toMatch(/^HTTP\/1\.1 403 /);
    expect(text).not.toContain("not to be served");
  });

  it("answers a missing file and a folder with 404", async () => {
    expect((await request("/nothing.js")).status).toBe(404);
    expect((await request("/help")).status).toBe(404);
  });

  it("sends no wildcard CORS header on any answer", async () => {
    const answers = await Promise.all([
      request("/"),
      request("/functions.json", "GET", { Origin: "https://attacker.example" }),
      request("/taskpane.html", "GET", { Origin: "https://excel.officeapps.live.com" }),
      request("/%"),
      request("/", "POST"),
    ]);
    for (const a of answers) expect(a.headers["access-control-allow-origin"]).toBeUndefined();
  });

  it("allows only an Office on the web origin to read functions.json", async () => {
    const answer = await request("/functions.json", "GET", { Origin: "https://excel.officeapps.live.com" });
    expect(answer.headers["access-control-allow-origin"]).toBe("https://excel.officeapps.live.com");
    expect(answer.headers.vary).toBe("Origin");
    const lookalike = await request("/functions.json", "GET", { Origin: "https://excel.officeapps.live.com.attacker.example" });
    expect(lookalike.headers["access-control-allow-origin"]).toBeUndefined();
  });

  it("sends a CSP whose script-src is this origin and office.js's folder only", async () => {
    const csp = String((await request("/")).headers["content-security-policy"]);
    expect(csp).toBe(serve.CSP);
    const scriptSrc = csp.match(/script-src ([^;]*)/)![1].trim().split(/\s+/);
    expect(scriptSrc).toEqual(["'self'", "https://appsforoffice.microsoft.com/lib/1/hosted/"]);
  });
});
