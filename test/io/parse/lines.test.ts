// Stage 1 of the importer on its own: lines, comments and metadata.
// Expected values by construction: the indices and texts written in each input (common practice
// (no source) for `#`/`%` comments and `key: value` / `key = value` metadata).
import { describe, expect, it } from "vitest";
import { lineNumber, lineText, readMetadata, splitLines } from "../../../lib/io/parse/lines.ts";
import { expectError } from "../../helpers/errors.ts";

describe("splitLines(text, src)", () => {
  it("sorts lines into content and comments, skipping blank ones, with any line end", () => {
    for (const eol of ["\n", "\r\n", "\r"]) {
      const t = splitLines(["# a: 1", "", "V,I", "  % b = 2", "0,1", "   ", "1,2"].join(eol), "(text)");
      expect(t.content).toEqual([2, 4, 6]);
      expect(t.comments).toEqual([0, 3]);
      expect(Object.fromEntries(t.metadata)).toEqual({ a: "1", b: "2" });
    }
  });

  it("drops a byte-order mark before the first line", () => {
    const t = splitLines("\ufeffV,I\n0,1\n", "(text)");
    expect(t.lines[0]).toBe("V,I");
  });

  it("numbers content rows from 1 in file lines and returns them as written", () => {
    const t = splitLines("# c\n\nV,I\n 0,1\n", "(text)");
    expect([lineNumber(t, 0), lineNumber(t, 1)]).toEqual([3, 4]);
    expect(lineText(t, 1)).toBe(" 0,1");
  });

  it("throws io/empty for white space and io/no-numeric-rows for comments only", () => {
    expectError(() => splitLines(" \n\t\n", "f.csv"), "io/empty", "f.csv: the file is empty");
    expectError(() => splitLines("# a\n% b\n", "f.csv"), "io/no-numeric-rows", "only comment lines (2)");
  });
});

describe("readMetadata(line, into)", () => {
  it("reads key: value and key = value, the first separator deciding", () => {
    const m = new Map<string, string>();
    readMetadata("# eta: 0.85", m);
    readMetadata("%% T = 4.5 K", m);
    readMetadata("# url = http://x", m);
    expect(Object.fromEntries(m)).toEqual({ eta: "0.85", T: "4.5 K", url: "http://x" });
  });

  it("joins the values of a repeated key with '; ' in file order", () => {
    const m = new Map<string, string>();
    readMetadata("# note: a", m);
    readMetadata("# note: b", m);
    expect(m.get("note")).toBe("a; b");
  });

  it("ignores lines whose key is empty, starts with a digit or a sign, or is longer than 80 characters", () => {
    const m = new Map<string, string>();
    for (const line of ["# : x", "# 1: x", "# -2 = 3", `# ${"k".repeat(81)}: x`, "# no separator"]) readMetadata(line, m);
    expect(m.size).toBe(0);
    readMetadata(`# ${"k".repeat(80)}: x`, m);
    expect(m.size).toBe(1);
  });
});
