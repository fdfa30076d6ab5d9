/**
 * `npm run bench`: every benchmark, printed as markdown tables with the machine they ran on.
 * `npm run bench -- engine` (or import, notebook, browser, cli) runs one part; browser needs a build.
 */
import { cpus, totalmem } from "node:os";

const parts: Record<string, () => Promise<string>> = {
  engine: async () => (await import("./engine")).runEngineBench(),
  import: async () => (await import("./import")).runImportBench(),
  notebook: async () => (await import("./notebook")).runNotebookBench(),
  browser: async () => (await import("./browser")).runBrowserBench(),
  cli: async () => (await import("./cli")).runCliBench(),
  auth: async () => (await import("./authCost")).runAuthBench(),
};

const wanted = process.argv.slice(2).filter((a) => !a.startsWith("-"));
const cpu = cpus()[0]?.model ?? "unknown CPU";
console.log(`Heatbook benchmarks — ${new Date().toISOString().slice(0, 10)}, Node ${process.version}, ${cpus().length} × ${cpu}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB\n`);
for (const [name, run] of Object.entries(parts)) {
  if (wanted.length && !wanted.includes(name)) continue;
  console.log(await run());
  console.log();
}
