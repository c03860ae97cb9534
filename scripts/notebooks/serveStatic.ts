/**
 * A small static file server bound to 127.0.0.1, for the built notebooks: GET and HEAD only,
 * files under one folder only, no directory listings.
 */
import { createReadStream, statSync } from "node:fs";
import { createServer, type Server } from "node:http";
import { extname, join, normalize, resolve, sep } from "node:path";

const TYPES: Record<string, string> = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".svg": "image/svg+xml",
  ".png": "image/png",
  ".woff2": "font/woff2",
  ".json": "application/json",
  ".csv": "text/csv; charset=utf-8",
  ".tsv": "text/tab-separated-values; charset=utf-8",
  ".txt": "text/plain; charset=utf-8",
  ".dat": "text/plain; charset=utf-8",
};

/** A running server and its address. */
export interface StaticServer {
  server: Server;
  /** `http://127.0.0.1:PORT/` */
  url: string;
  port: number;
  close(): Promise<void>;
}

/**
 * Serves the files under `dir` on 127.0.0.1.
 *
 * @param dir - the folder to serve (`/` is its index.html).
 * @param port - the port; 0 (default) takes a free one.
 */
export function serveStatic(dir: string, port = 0): Promise<StaticServer> {
  const root = resolve(dir);
  const server = createServer((req, res) => {
    if (req.method !== "GET" && req.method !== "HEAD") {
      res.writeHead(405, { allow: "GET, HEAD" }).end();
      return;
    }
    let path: string;
    try {
      path = decodeURIComponent(new URL(req.url ?? "/", "http://127.0.0.1").pathname);
    } catch {
      res.writeHead(400).end();
      return;
    }
    if (path.endsWith("/")) path += "index.html";
    const file = normalize(join(root, path));
    if (file !== root && !file.startsWith(root + sep)) {
      res.writeHead(403).end();
      return;
    }
    let size: number;
    try {
      const s = statSync(file);
      if (!s.isFile()) throw new Error("not a file");
      size = s.size;
    } catch {
      res.writeHead(404, { "content-type": "text/plain; charset=utf-8" }).end("not found\n");
      return;
    }
    res.writeHead(200, { "content-type": TYPES[extname(file).toLowerCase()] ?? "application/octet-stream", "content-length": size, "cache-control": "no-cache" });
    if (req.method === "HEAD") res.end();
    else createReadStream(file).pipe(res);
  });
  return new Promise((resolvePromise, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => {
      const address = server.address();
      const actual = typeof address === "object" && address ? address.port : port;
      resolvePromise({
        server,
        port: actual,
        url: `http://127.0.0.1:${actual}/`,
        close: () => new Promise<void>((done) => server.close(() => done())),
      });
    });
  });
}
