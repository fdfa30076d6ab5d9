import { readFileSync } from "node:fs";

/** What a CLI command may touch: output streams and file reads (so tests can inject them). */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  readFile(path: string): Uint8Array;
  env: Record<string, string | undefined>;
}

export const defaultIo: CliIo = {
  out: (text) => process.stdout.write(text.endsWith("\n") ? text : text + "\n"),
  err: (text) => process.stderr.write(text.endsWith("\n") ? text : text + "\n"),
  readFile: (path) => readFileSync(path),
  env: process.env,
};
