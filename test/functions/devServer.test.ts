/**
 * The development server's file handler (scripts/staticFiles.ts), run on a
 * random local port over a temporary folder. Content types as registered with
 * IANA (text/html, text/javascript per RFC 9239, application/json,
 * application/xml, image/png); traversal attempts from the usual catalogue of
 * encodings (common practice).
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { createServer, request, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { contentType, fileFor, staticHandler } from "../../scripts/staticFiles";

const top = mkdtempSync(join(tmpdir(), "evensplit-serve-"));
const root = join(top, "dist");
let server: Server;
let port = 0;

beforeAll(async () => {
  mkdirSync(join(root, "assets"), { recursive: true });
  writeFileSync(join(root, "demo.html"), "<p>demo</p>");
  writeFileSync(join(root, "functions.js"), "1;");
  writeFileSync(join(root, "assets", "icon-16.png"), Buffer.from([0x89, 0x50]));
  writeFileSync(join(top, "secret.txt"), "not for the network");
  server = createServer(staticHandler(root, "demo.html"));
  await new Promise<void>((done) => server.listen(0, "127.0.0.1", done));
  port = (server.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise((done) => server.close(done));
  rmSync(top, { recursive: true, force: true });
});

/** Sends a raw request path (not normalised by a URL parser) and collects the answer. */
function get(rawPath: string, method = "GET"): Promise<{ status: number; headers: Record<string, unknown>; body: string }> {
  return new Promise((done, fail) => {
    const req = request({ host: "127.0.0.1", port, path: rawPath, method }, (res) => {
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (chunk: string) => (body += chunk));
      res.on("end", () => done({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on("error", fail);
    req.end();
  });
}

describe("the development server", () => {
  it("serves files with their content types", async () => {
    const page = await get("/demo.html");
    expect(page.status).toBe(200);
    expect(page.headers["content-type"]).toBe("text/html; charset=utf-8");
    expect(page.body).toBe("<p>demo</p>");
    expect((await get("/functions.js")).headers["content-type"]).toBe("text/javascript; charset=utf-8");
    const icon = await get("/assets/icon-16.png");
    expect(icon.headers["content-type"]).toBe("image/png");
    // Office needs to cache icons: no cache directives on images (Microsoft, manifest reference, "Image element").
    expect(icon.headers["cache-control"]).toBeUndefined();
    expect(contentType("functions.json")).toBe("application/json; charset=utf-8");
    expect(contentType("manifest.xml")).toBe("application/xml; charset=utf-8");
    expect(contentType("notes.bin")).toBe("application/octet-stream");
  });

  it("sends the front page to the demo", async () => {
    const home = await get("/");
    expect(home.status).toBe(302);
    expect(home.headers.location).toBe("/demo.html");
  });

  it.each([
    "/../secret.txt",
    "/%2e%2e/secret.txt",
    "/assets/../../secret.txt",
    "/%2e%2e%2fsecret.txt",
    "/..%5csecret.txt",
    "/demo.html%00.png",
    "/%E0%A4%A",
  ])("never serves anything outside dist/: %s", async (attempt) => {
    const answer = await get(attempt);
    expect(answer.status).toBe(404);
    expect(answer.body).not.toContain("not for the network");
  });

  it("maps names inside the folder and nothing else", () => {
    expect(fileFor(root, "/assets/icon-16.png")).toBe(join(root, "assets", "icon-16.png"));
    expect(fileFor(root, "/assets/../demo.html")).toBe(join(root, "demo.html"));
    expect(fileFor(root, "/")).toBeNull();
  });

  it("answers only GET and HEAD; a folder or a missing file is not found", async () => {
    expect((await get("/demo.html", "POST")).status).toBe(405);
    const head = await get("/demo.html", "HEAD");
    expect(head.status).toBe(200);
    expect(head.body).toBe("");
    expect((await get("/assets")).status).toBe(404);
    expect((await get("/nothing.js")).status).toBe(404);
  });
});
