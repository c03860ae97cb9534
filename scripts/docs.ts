/**
 * `npm run docs`: the API reference, one Markdown page per package entry, generated from the doc
 * comments that the compiled declarations keep (dist/*.d.ts; the script builds dist/ first).
 *
 *   npm run docs             # writes docs/api/index.md ("dotspec") and docs/api/core.md ("dotspec/core")
 *
 * Every export gets its declaration (all overloads; an interface or options type with its
 * documented fields) and its doc comment. The run fails, listing them, when a public export has
 * no doc comment (the same check runs in `npm test`: test/package/apiDocs.test.ts).
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { apiPages } from "./apiPages.ts";

const ROOT = join(dirname(fileURLToPath(import.meta.url)), "..");
const OUT = join(ROOT, "docs", "api");

execFileSync(process.execPath, [join(ROOT, "scripts", "build.mjs")], { stdio: "inherit" });
const { pages, undocumented, counts } = apiPages();
if (undocumented.length) {
  console.error(`docs: ${undocumented.length} public export(s) without a doc comment:\n  ${undocumented.join("\n  ")}`);
  process.exit(1);
}
mkdirSync(OUT, { recursive: true });
for (const [name, text] of Object.entries(pages)) writeFileSync(join(OUT, name), text);
console.log(`docs: docs/api/index.md (${counts.index} exports, ${counts.nodeOnly} Node-only) and docs/api/core.md (${counts.core} exports)`);
