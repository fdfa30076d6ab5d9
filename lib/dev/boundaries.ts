/**
 * Import boundaries of the code base, checked by `npm run lint` and by a test:
 *
 *  engine-pure   lib/engine imports no framework, database or server code: not next, react,
 *                react-dom, @prisma/*, pg, pg-boss, nor anything under lib/server or app/.
 *  app-no-db     app/ never touches the database client: no @prisma/*, pg, pg-boss, no module
 *                under lib/server/db or lib/server/generated, and no query of its own
 *                ($queryRaw, $executeRaw, $transaction, sqlRows). It hands lib/server functions the
 *                handle from lib/server/database.ts.
 *  client-no-server  a "use client" file imports nothing from lib/server except types.
 *
 * Each finding names the file, line and column of the import or call.
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, relative, resolve, sep } from "node:path";

export interface Finding {
  file: string;
  line: number;
  column: number;
  rule: "engine-pure" | "app-no-db" | "client-no-server";
  message: string;
}

const SOURCE = /\.(ts|tsx|mts|cts|js|mjs|jsx)$/;
const SKIP = new Set(["node_modules", "generated", ".next", "dist"]);

function files(dir: string): string[] {
  let names: string[];
  try { names = readdirSync(dir); } catch { return []; }
  return names.flatMap((name) => {
    if (SKIP.has(name)) return [];
    const full = join(dir, name);
    if (statSync(full).isDirectory()) return files(full);
    return SOURCE.test(name) ? [full] : [];
  });
}

interface ImportSite { spec: string; typeOnly: boolean; index: number }

/** Module specifiers of import/export-from statements, dynamic import() and require(). */
function imports(text: string): ImportSite[] {
  const out: ImportSite[] = [];
  const stmt = /(^|[;\n])\s*(import|export)\s+(type\s+)?([^;]*?)\s*from\s*["']([^"']+)["']|(^|[;\n])\s*import\s*["']([^"']+)["']|\bimport\s*\(\s*["']([^"']+)["']\s*\)|\brequire\s*\(\s*["']([^"']+)["']\s*\)/g;
  for (const m of text.matchAll(stmt)) {
    const spec = m[5] ?? m[7] ?? m[8] ?? m[9];
    if (!spec) continue;
    const at = m.index! + m[0].indexOf(spec) - 1;
    out.push({ spec, typeOnly: Boolean(m[3]), index: at });
  }
  return out;
}

function position(text: string, index: number): { line: number; column: number } {
  const before = text.slice(0, index);
  const line = before.split("\n").length;
  return { line, column: index - before.lastIndexOf("\n") };
}

/** The repository path a specifier points at ("@/x" and relative ones), or null for a package. */
function target(root: string, file: string, spec: string): string | null {
  if (spec.startsWith("@/")) return spec.slice(2);
  if (spec.startsWith(".")) return relative(root, resolve(dirname(file), spec)).split(sep).join("/");
  return null;
}

const FRAMEWORK = /^(next|react|react-dom|pg|pg-boss)(\/|$)|^@prisma\//;
const DATABASE_PACKAGE = /^(pg|pg-boss)(\/|$)|^@prisma\//;
const QUERY = /\$queryRaw(Unsafe)?\b|\$executeRaw(Unsafe)?\b|\$transaction\b|\bsqlRows\s*\(/g;

/** Every boundary finding under `root` (a checkout). */
export function checkBoundaries(root: string): Finding[] {
  const found: Finding[] = [];
  const add = (file: string, text: string, index: number, rule: Finding["rule"], message: string) =>
    found.push({ file: relative(root, file).split(sep).join("/"), ...position(text, index), rule, message });
  for (const file of files(join(root, "lib", "engine"))) {
    const text = readFileSync(file, "utf8");
    for (const im of imports(text)) {
      const t = target(root, file, im.spec);
      if (FRAMEWORK.test(im.spec)) add(file, text, im.index, "engine-pure", `the engine imports ${im.spec}: keep lib/engine free of framework and database packages`);
      else if (t !== null && (t.startsWith("lib/server") || t.startsWith("app/") || t === "app")) add(file, text, im.index, "engine-pure", `the engine imports ${im.spec} (${t}): lib/engine must not depend on server or app code`);
    }
  }
  for (const file of files(join(root, "app"))) {
    const text = readFileSync(file, "utf8");
    const client = /^\s*(["'])use client\1/.test(text);
    for (const im of imports(text)) {
      const t = target(root, file, im.spec);
      if (DATABASE_PACKAGE.test(im.spec)) add(file, text, im.index, "app-no-db", `app/ imports ${im.spec}: go through a lib/server function`);
      else if (t !== null && (t.startsWith("lib/server/db") || t.startsWith("lib/server/generated"))) add(file, text, im.index, "app-no-db", `app/ imports the database client (${im.spec}): take the handle from lib/server/database.ts and call lib/server functions`);
      else if (client && !im.typeOnly && t !== null && t.startsWith("lib/server")) add(file, text, im.index, "client-no-server", `a client component imports ${im.spec}: only types may come from lib/server`);
    }
    for (const m of text.matchAll(QUERY)) add(file, text, m.index!, "app-no-db", `app/ runs a query (${m[0].replace(/\s*\($/, "")}): move it into lib/server`);
  }
  return found;
}

export function formatFinding(f: Finding): string {
  return `${f.file}:${f.line}:${f.column}: ${f.rule}: ${f.message}`;
}
