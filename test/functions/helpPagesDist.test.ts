/**
 * The built add-in serves a help page at every function's helpUrl: dist/functions.json
 * (or EVENSPLIT_DIST's) read as the build left it, each address fetched from the
 * development server's handler (scripts/staticFiles.ts) over dist/. helpUrl as in
 * Microsoft, "Manually create JSON metadata for custom functions".
 */
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { helpFiles } from "../../scripts/helpPages";
import { staticHandler } from "../../scripts/staticFiles";
import { DIST, distText } from "./dist";

let server: Server;
let origin = "";

beforeAll(async () => {
  server = createServer(staticHandler(DIST, "demo.html"));
  await new Promise<void>((done) => server.listen(0, "127.0.0.1", done));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise((done) => server.close(done));
});

describe("dist/functions.json's help links", () => {
  it("name, for every function, a page the development server serves with that function's help", async () => {
    const { functions } = JSON.parse(distText("functions.json")) as { functions: { id: string; name: string; helpUrl?: string }[] };
    expect(functions.length).toBeGreaterThanOrEqual(20);
    for (const fn of functions) {
      expect(fn.helpUrl, fn.id).toBe(`https://localhost:3000/help/${fn.id.toLowerCase()}.html`);
      const response = await fetch(`${origin}/${fn.helpUrl!.slice("https://localhost:3000/".length)}`);
      expect(response.status, fn.helpUrl).toBe(200);
      expect(response.headers.get("content-type")).toBe("text/html; charset=utf-8");
      expect(await response.text()).toContain(`EVENSPLIT.${fn.name}`);
    }
  });

  it("are the pages the generator writes, byte for byte: no later minimizer rewrites them (it once decoded &lt;&gt; to a bare <>)", () => {
    const metadata = JSON.parse(distText("functions.json")) as { functions: { helpUrl?: string }[] };
    // The generator's input is the metadata plugin's output, before help links were added.
    for (const fn of metadata.functions) delete fn.helpUrl;
    const expected = helpFiles(
      JSON.stringify(metadata),
      readFileSync("src/functions/functions.ts", "utf8"),
      readFileSync("src/taskpane/taskpane.css", "utf8"),
    );
    for (const [name, text] of expected.files) expect(distText(name), name).toBe(text);
    expect(distText("help/pvalue.html")).toContain("<code>&lt;&gt;</code>");
  });
});
