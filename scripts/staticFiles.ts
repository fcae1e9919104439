/**
 * A small static-file handler for the development server: serves the files
 * under one folder (dist/) with their content types, and nothing outside it.
 *
 * Requests are resolved by decoding the URL path once, refusing NUL bytes and
 * backslashes, normalising it against the root, and refusing any result that
 * leaves the root (so "/../package.json" and its encoded forms get 404, as
 * does a directory). Only GET and HEAD are answered. Types follow the IANA
 * media-type registry (common practice for the extensions a built add-in has).
 *
 * Cost: one stat and one streamed read per request.
 */
import { createReadStream, statSync } from "node:fs";
import type { IncomingMessage, ServerResponse } from "node:http";
import { extname, isAbsolute, join, normalize, relative, resolve } from "node:path";

const CONTENT_TYPES: Readonly<Record<string, string>> = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".json": "application/json; charset=utf-8",
  ".map": "application/json; charset=utf-8",
  ".xml": "application/xml; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".png": "image/png",
  ".svg": "image/svg+xml",
  ".ico": "image/x-icon",
  ".txt": "text/plain; charset=utf-8",
};

/** The media type for a file name; unknown extensions are sent as opaque bytes. */
export function contentType(fileName: string): string {
  return CONTENT_TYPES[extname(fileName).toLowerCase()] ?? "application/octet-stream";
}

/**
 * The file under `root` that a URL path names, or null when it names nothing
 * there (including every attempt to step outside `root`).
 *
 * @example
 * fileFor("/srv/dist", "/assets/icon-32.png"); // "/srv/dist/assets/icon-32.png"
 * fileFor("/srv/dist", "/%2e%2e/secret.txt");  // null
 */
export function fileFor(root: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes("\0") || decoded.includes("\\")) return null;
  const base = resolve(root);
  const candidate = resolve(base, "." + normalize("/" + decoded));
  const inside = relative(base, candidate);
  if (inside === "" || inside.startsWith("..") || isAbsolute(inside)) return null;
  return join(base, inside);
}

function refuse(response: ServerResponse, status: number, text: string): void {
  response.writeHead(status, { "Content-Type": "text/plain; charset=utf-8", "X-Content-Type-Options": "nosniff" });
  response.end(text);
}

/**
 * A request handler serving `root`; "/" goes to `home` (a file name under root).
 *
 * @example
 * createServer(staticHandler(resolve("dist"), "demo.html")).listen(3000);
 */
export function staticHandler(root: string, home: string): (request: IncomingMessage, response: ServerResponse) => void {
  return (request, response) => {
    if (request.method !== "GET" && request.method !== "HEAD") {
      response.setHeader("Allow", "GET, HEAD");
      refuse(response, 405, "Only GET and HEAD are served.\n");
      return;
    }
    const path = new URL(request.url ?? "/", "http://localhost").pathname;
    if (path === "/") {
      response.writeHead(302, { Location: `/${home}` });
      response.end();
      return;
    }
    const file = fileFor(root, path);
    let size = -1;
    if (file !== null) {
      try {
        const stats = statSync(file);
        if (stats.isFile()) size = stats.size;
      } catch {
        size = -1;
      }
    }
    if (file === null || size < 0) {
      refuse(response, 404, "Not found.\n");
      return;
    }
    const headers: Record<string, string | number> = {
      "Content-Type": contentType(file),
      "Content-Length": size,
      "X-Content-Type-Options": "nosniff",
      // Excel fetches the metadata and the script from its own origin.
      "Access-Control-Allow-Origin": "*",
    };
    // Office replaces an icon served with cache directives by a generic one (Microsoft, manifest
    // reference, "Image element"), so only the pages and scripts are marked as not to be cached.
    if (!file.endsWith(".png")) headers["Cache-Control"] = "no-store";
    response.writeHead(200, headers);
    if (request.method === "HEAD") {
      response.end();
      return;
    }
    createReadStream(file).pipe(response);
  };
}
