#!/usr/bin/env node
// Entry point of the `heatbook` command (package.json "bin"): runs the compiled CLI in
// lib/cli/dist/, which scripts/build-cli.mjs builds from lib/cli/main.ts (in `postinstall`, so
// `npm ci` produces it; `npm run heatbook` rebuilds it first). Plain node, no TypeScript loader.
import { existsSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { dirname, join } from "node:path";

const entry = join(dirname(fileURLToPath(import.meta.url)), "dist", "main.js");
if (!existsSync(entry)) {
  process.stderr.write(`heatbook: the compiled CLI is missing (${entry}): run 'npm run build:cli' (npm ci builds it)\n`);
  process.exit(1);
}
const { main } = await import(pathToFileURL(entry).href);
process.exitCode = await main(process.argv.slice(2));
