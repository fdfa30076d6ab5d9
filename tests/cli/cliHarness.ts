/** In-process harness for the heatbook CLI: an injected CliIo with in-memory files. */
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";

export async function runCli(argv: string[], files: Record<string, string> = {}): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const io: CliIo = {
    out: (t) => (out += t.endsWith("\n") ? t : t + "\n"),
    err: (t) => (err += t.endsWith("\n") ? t : t + "\n"),
    readFile: (path) => {
      if (!(path in files)) throw new Error(`ENOENT: no such file ${path}`);
      return new TextEncoder().encode(files[path]);
    },
    env: {},
  };
  const code = await main(argv, io);
  return { code, out, err };
}
