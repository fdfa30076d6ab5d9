#!/usr/bin/env node
/**
 * Builds the `heatbook` command into plain JavaScript: lib/cli/main.ts and everything it imports
 * from this repository (lib/engine, lib/server for backup/audit) become ES modules in
 * lib/cli/dist/ (git-ignored); packages from node_modules stay imports. Each subcommand is its
 * own chunk, so `heatbook --help` loads only the dispatcher. Runs in `postinstall` (so `npm ci`
 * produces it), before `npm run heatbook`, and in tests/cli/cliHarness.ts (buildCliOnce).
 * Written in JavaScript so that it runs with plain node; esbuild is pinned in package.json.
 *
 * Usage: node scripts/build-cli.mjs [--out DIR] [--quiet]
 */
import { build } from "esbuild";
import { fileURLToPath } from "node:url";
import { dirname, join, relative, resolve } from "node:path";
import { renameSync, rmSync } from "node:fs";

const root = resolve(dirname(fileURLToPath(import.meta.url)), "..");

/** Build into `outDir` (default lib/cli/dist); resolves with the entry file's path. */
export async function buildCli({ outDir = join(root, "lib/cli/dist"), quiet = false } = {}) {
  const started = performance.now();
  // Build beside the target, then swap it in, so a running `heatbook` never sees half a build.
  const fresh = `${outDir}.build-${process.pid}`;
  const stale = `${outDir}.old-${process.pid}`;
  rmSync(fresh, { recursive: true, force: true });
  await build({
    absWorkingDir: root,
    entryPoints: { main: join(root, "lib/cli/main.ts") },
    outdir: fresh,
    bundle: true,
    splitting: true,
    format: "esm",
    platform: "node",
    target: "node20.19",
    packages: "external",
    tsconfig: join(root, "tsconfig.json"),
    chunkNames: "chunks/[name]-[hash]",
    legalComments: "none",
    logLevel: "warning",
  });
  rmSync(stale, { recursive: true, force: true });
  try {
    renameSync(outDir, stale);
  } catch (e) {
    if (e.code !== "ENOENT") throw e;
  }
  renameSync(fresh, outDir);
  rmSync(stale, { recursive: true, force: true });
  if (!quiet) console.log(`heatbook CLI built into ${relative(root, outDir) || "."} in ${Math.round(performance.now() - started)} ms`);
  return join(outDir, "main.js");
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const args = process.argv.slice(2);
  const at = args.indexOf("--out");
  await buildCli({ outDir: at >= 0 ? resolve(args[at + 1]) : undefined, quiet: args.includes("--quiet") });
}
