// The static server of `npm run notebooks`: bound to 127.0.0.1, files under its folder only.
// Expected values: HTTP semantics (source: RFC 9110: 200, 403, 404, 405 with Allow) and the files written
// here (by construction).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { request } from "node:http";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { serveStatic, type StaticServer } from "../../scripts/notebooks/serveStatic.ts";

let dir = "";
let served: StaticServer;

/** A raw request (the path is sent as written: no client-side normalisation of `..`). */
function get(path: string, method = "GET"): Promise<{ status: number; type: string; body: string; allow?: string }> {
  return new Promise((resolve, reject) => {
    const req = request({ host: "127.0.0.1", port: served.port, path, method }, (res) => {
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (c) => (body += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, type: String(res.headers["content-type"] ?? ""), body, allow: res.headers.allow as string | undefined }));
    });
    req.on("error", reject);
    req.end();
  });
}

beforeAll(async () => {
  const parent = mkdtempSync(join(tmpdir(), "dotspec-serve-"));
  dir = join(parent, "site");
  mkdirSync(join(dir, "assets"), { recursive: true });
  writeFileSync(join(dir, "index.html"), "<!doctype html><p>start</p>");
  writeFileSync(join(dir, "assets", "a.js"), "export const a = 1;\n");
  writeFileSync(join(parent, "secret.txt"), "outside the served folder\n");
  served = await serveStatic(dir, 0);
});

afterAll(async () => {
  await served?.close();
  if (dir) rmSync(join(dir, ".."), { recursive: true, force: true });
});

describe("serveStatic(dir, port)", () => {
  it("listens on 127.0.0.1 and gives its address as http://127.0.0.1:PORT/", () => {
    const address = served.server.address();
    expect(typeof address === "object" && address?.address).toBe("127.0.0.1");
    expect(served.url).toBe(`http://127.0.0.1:${served.port}/`);
  });

  it("serves / as index.html and files with their content types", async () => {
    const index = await get("/");
    expect(index.status).toBe(200);
    expect(index.type).toBe("text/html; charset=utf-8");
    expect(index.body).toContain("start");
    const js = await get("/assets/a.js");
    expect(js.type).toBe("text/javascript; charset=utf-8");
  });

  it("never serves a file outside its folder, however the path is written", async () => {
    for (const path of ["/../secret.txt", "/assets/../../secret.txt", "/%2e%2e/secret.txt", "/..%2fsecret.txt"]) {
      const res = await get(path);
      expect([403, 404], path).toContain(res.status);
      expect(res.body).not.toContain("outside the served folder");
    }
  });

  it("answers 404 for a missing file or a folder, 405 (with Allow) for other methods", async () => {
    expect((await get("/nothing.html")).status).toBe(404);
    expect((await get("/assets")).status).toBe(404);
    const post = await get("/", "POST");
    expect(post.status).toBe(405);
    expect(post.allow).toBe("GET, HEAD");
  });
});
