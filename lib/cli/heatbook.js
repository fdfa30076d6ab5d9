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
