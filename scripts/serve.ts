/**
 * `npm start`: builds the add-in (webpack, development mode), serves dist/ on
 * localhost port 3000 and prints how to sideload it into Excel.
 *
 * Excel loads add-ins over https only. The localhost certificate comes from
 * office-addin-dev-certs: `getHttpsServerOptions()` reuses a trusted one or
 * generates a new one in ~/.office-addin-dev-certs and tries to trust its CA,
 * which needs administrator rights. When trusting fails but the
 * files were written, the server still uses https and says how to trust the
 * CA; when there are no certificates at all it falls back to plain http and
 * says so (the demo page works over http; Excel will not load the add-in).
 *
 * The demo page (the pane beside an in-page sheet, no Excel needed) is opened
 * in the desktop's browser when there is one; with https it is also served
 * over plain http on port 3001, so it opens without a certificate warning.
 *
 * Options: --no-build (serve dist/ as it is), --watch (rebuild as sources
 * change), --http (skip certificates), --no-open (print the demo address only).
 */
import { existsSync, readFileSync } from "node:fs";
import { spawn } from "node:child_process";
import { createServer as createHttpServer, type Server } from "node:http";
import { createServer as createHttpsServer } from "node:https";
import { createRequire } from "node:module";
import { homedir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { staticHandler } from "./staticFiles";

const PORT = 3000;
/** Plain-http port for the demo page when the add-in itself is served over https. */
const DEMO_PORT = 3001;
const project = resolve(dirname(fileURLToPath(import.meta.url)), "..");
/** What webpack.config.js builds into: dist/, or EVENSPLIT_DIST for a private build. */
const dist = process.env.EVENSPLIT_DIST ? resolve(process.env.EVENSPLIT_DIST) : join(project, "dist");
const require = createRequire(import.meta.url);

interface Certificates {
  cert: Buffer;
  key: Buffer;
  trusted: boolean;
}

/**
 * Builds dist/ in development mode; with `watch`, keeps rebuilding as sources
 * change (resolving after the first build), so a reload of the pane or the
 * demo page shows the change.
 */
function build(watch: boolean): Promise<void> {
  const webpack = require("webpack") as typeof import("webpack");
  const config = require(join(project, "webpack.config.js")) as (env: unknown, argv: { mode: string }) => import("webpack").Configuration;
  const compiler = webpack(config({}, { mode: "development" }));
  let first = true;
  return new Promise((done, fail) => {
    const report = (error: Error | null, stats?: import("webpack").Stats): void => {
      const problem = error ?? (stats?.hasErrors() ? new Error(stats.toString({ all: false, errors: true })) : null);
      const seconds = ((stats?.endTime ?? 0) - (stats?.startTime ?? 0)) / 1000;
      if (!first) {
        console.log(problem ? `Rebuild failed: ${problem.message}` : `Rebuilt dist/ in ${seconds} s.`);
        return;
      }
      first = false;
      if (problem) return fail(problem);
      console.log(`Built dist/ in ${seconds} s.${watch ? " Watching the sources; reload the page after a change." : ""}`);
      done();
    };
    if (watch) compiler.watch({}, report);
    else compiler.run((error, stats) => compiler.close(() => report(error, stats)));
  });
}

function certificateFiles(): { cert: Buffer; key: Buffer } | null {
  const folder = join(homedir(), ".office-addin-dev-certs");
  const cert = join(folder, "localhost.crt");
  const key = join(folder, "localhost.key");
  return existsSync(cert) && existsSync(key) ? { cert: readFileSync(cert), key: readFileSync(key) } : null;
}

async function certificates(): Promise<Certificates | null> {
  try {
    const devCerts = require("office-addin-dev-certs") as typeof import("office-addin-dev-certs");
    const options = await devCerts.getHttpsServerOptions();
    return { cert: options.cert, key: options.key, trusted: true };
  } catch {
    // Trusting the CA failed (no administrator rights); the generated files may still be there.
    const generated = certificateFiles();
    return generated ? { ...generated, trusted: false } : null;
  }
}

/** How the server ended up serving. */
type Transport = "https" | "https-untrusted" | "http-asked" | "http-fallback";

function instructions(origin: string, transport: Transport, demoOrigin: string): string {
  const lines = [
    "",
    `Evensplit is served at ${origin}/ from dist/.`,
    `  Demo page (no Excel needed): ${demoOrigin}/demo.html`,
    `  Task pane page:              ${origin}/taskpane.html`,
    `  Manifest:                    ${join(project, "manifest.xml")}`,
    "",
  ];
  if (transport === "http-asked" || transport === "http-fallback") {
    lines.push(
      transport === "http-asked"
        ? "Plain http, as asked (--http): Excel will not load the add-in from this server"
        : "Plain http: no localhost certificate could be made, so Excel will not load the add-in",
      "from this server (it loads add-ins over https only). The demo page works as it is.",
      "To get https: npx office-addin-dev-certs install   (needs administrator rights), then npm start again.",
      "",
    );
  } else if (transport === "https-untrusted") {
    lines.push(
      "https with a certificate whose authority is not trusted on this machine yet (the demo page",
      "above is plain http and needs none). Excel needs the authority trusted first:",
      "npx office-addin-dev-certs install   (needs administrator rights), then npm start again.",
      "",
    );
  }
  lines.push(
    "Sideload into Excel on the web:",
    "  open a workbook at office.com, then Home > Add-ins > More Add-ins (or Insert > Add-ins),",
    "  choose My Add-ins > Upload My Add-in and pick manifest.xml.",
    "Sideload into Excel on the desktop:",
    "  Windows: put manifest.xml in a shared folder, add that folder under File > Options > Trust Center >",
    "    Trust Center Settings > Trusted Add-in Catalogs (tick Show in Menu), restart Excel, then",
    "    Home > Add-ins > More Add-ins > Shared Folder and pick Evensplit.",
    "  Mac: copy manifest.xml to ~/Library/Containers/com.microsoft.Excel/Data/Documents/wef/",
    "    (create the folder if needed), restart Excel, then Home > Add-ins and pick Evensplit.",
    "Then type =EVENSPLIT. in a cell, or open Data > Median tests for the pane.",
    "Stop the server with Ctrl+C.",
  );
  return lines.join("\n");
}

async function main(): Promise<void> {
  const args = new Set(process.argv.slice(2));
  if (!args.has("--no-build")) await build(args.has("--watch"));
  if (!existsSync(join(dist, "demo.html"))) {
    console.error("dist/ has no demo.html: run npm run build first (or npm start without --no-build).");
    process.exit(1);
  }
  const asked = args.has("--http");
  const certs = asked ? null : await certificates();
  const transport: Transport = certs ? (certs.trusted ? "https" : "https-untrusted") : asked ? "http-asked" : "http-fallback";
  const handler = staticHandler(dist, "demo.html");
  const server = certs ? createHttpsServer({ cert: certs.cert, key: certs.key }, handler) : createHttpServer(handler);
  const origin = `${certs ? "https" : "http"}://localhost:${PORT}`;
  await listen(server, PORT);
  // The demo page needs no certificate: beside an https server for Excel it is also served over
  // plain http, so a browser on this machine opens it without a certificate warning.
  const demoOrigin = certs ? `http://localhost:${DEMO_PORT}` : origin;
  if (certs) await listen(createHttpServer(handler), DEMO_PORT);
  console.log(instructions(origin, transport, demoOrigin));
  if (!args.has("--no-open")) openInBrowser(`${demoOrigin}/demo.html`);
}

function listen(server: Server, port: number): Promise<void> {
  return new Promise((done) => {
    server.on("error", (error: NodeJS.ErrnoException) => {
      console.error(
        error.code === "EADDRINUSE" ? `Port ${port} is in use: stop the other server first.` : `The server stopped: ${error.message}`,
      );
      process.exit(1);
    });
    server.listen(port, "localhost", done);
  });
}

/**
 * Opens the demo page with the desktop's opener when there is a desktop to
 * open it on; elsewhere (a terminal without a display, CI) the printed
 * address is all there is.
 */
function openInBrowser(url: string): void {
  if (process.env.CI || !process.stdout.isTTY) return;
  const opener =
    process.platform === "darwin"
      ? { command: "open", args: [url] }
      : process.platform === "win32"
        ? { command: "cmd", args: ["/c", "start", "", url] }
        : process.env.DISPLAY || process.env.WAYLAND_DISPLAY
          ? { command: "xdg-open", args: [url] }
          : null;
  if (!opener) return;
  const child = spawn(opener.command, opener.args, { stdio: "ignore", detached: true });
  child.on("error", () => undefined);
  child.unref();
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
