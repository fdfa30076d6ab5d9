/**
 * The notebook engine (TypeScript under lib/engine) as one ES module on disk, for worker threads.
 *
 * Why a file: Next.js bundles the server code into .next/server, but a worker thread needs an
 * entry file on disk that Node can load as it is. The worker entry (chainWorker.mjs) is plain
 * JavaScript; it asks this module for the engine, which esbuild bundles from the sources in
 * ~60 ms into node_modules/.cache/heatbook-engine/<hash>.mjs, the hash covering every file under
 * lib/engine (so a bundle is never stale: a changed source gets a new file). Packages (mathjs, zod)
 * stay imports, resolved from node_modules. The same path runs under `next start`, `next dev`,
 * vitest and the job workers. Plain JavaScript on purpose: Next never bundles this file.
 */
import { createHash } from "node:crypto";
import { mkdirSync, readdirSync, readFileSync, renameSync, existsSync } from "node:fs";
import { join } from "node:path";

function sourceFiles(dir) {
  const out = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|mts|js|mjs|json)$/.test(e.name)) out.push(p);
  }
  return out.sort();
}

/** Absolute path of the engine bundle for the sources under `root`/lib/engine (built if missing). */
export async function ensureEngineBundle(root) {
  const engineDir = join(root, "lib", "engine");
  const h = createHash("sha256");
  for (const f of sourceFiles(engineDir)) h.update(f.slice(engineDir.length)).update("\0").update(readFileSync(f)).update("\0");
  const cacheDir = join(root, "node_modules", ".cache", "heatbook-engine");
  const file = join(cacheDir, `${h.digest("hex").slice(0, 24)}.mjs`);
  if (existsSync(file)) return file;
  mkdirSync(cacheDir, { recursive: true });
  const { build } = await import("esbuild");
  // Written under a temporary name and renamed: workers starting together never read half a file.
  const tmp = `${file}.${process.pid}.${Math.random().toString(36).slice(2)}.tmp`;
  await build({
    entryPoints: [join(engineDir, "notebook", "index.ts")], bundle: true, platform: "node", format: "esm",
    target: "node20", packages: "external", outfile: tmp, logLevel: "error", absWorkingDir: root,
  });
  renameSync(tmp, file);
  return file;
}
