/**
 * CLI start-up: wall time of `heatbook --help` as shipped (node lib/cli/heatbook.js → the compiled
 * lib/cli/dist, built first by scripts/build-cli.mjs) beside the former start (the TypeScript sources
 * through tsx's loader, compiled at every start), both measured in this run, interleaved, as the
 * median of N runs each. Each run is a fresh `node` process.
 */
import { spawnSync } from "node:child_process";
import { loadavg } from "node:os";

const OLD_START = "import { register } from 'tsx/esm/api'; register(); const { main } = await import('./lib/cli/main.ts'); process.exitCode = await main(process.argv.slice(1));";

function timeRun(args: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, args, { encoding: "utf8" });
  const ms = performance.now() - t0;
  if (r.status !== 0 || (args[0] !== "-e" && !r.stdout.includes("usage: heatbook"))) throw new Error(`bench cli: ${args.join(" ")} failed (${r.status}): ${r.stderr}`);
  return ms;
}

const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

export async function runCliBench(n = 11): Promise<string> {
  const build = spawnSync(process.execPath, ["scripts/build-cli.mjs", "--quiet"], { encoding: "utf8" });
  if (build.status !== 0) throw new Error(`bench cli: build failed: ${build.stderr}`);
  const compiled: number[] = [];
  const tsx: number[] = [];
  const floor: number[] = [];
  timeRun(["lib/cli/heatbook.js", "--help"]); // warm the file cache for both
  timeRun(["--input-type=module", "-e", OLD_START, "--", "--help"]);
  for (let i = 0; i < n; i++) {
    compiled.push(timeRun(["lib/cli/heatbook.js", "--help"]));
    tsx.push(timeRun(["--input-type=module", "-e", OLD_START, "--", "--help"]));
    floor.push(timeRun(["-e", ""]));
  }
  const row = (label: string, v: number[]) => `| ${label} | ${median(v).toFixed(0)} ms | ${Math.min(...v).toFixed(0)}–${Math.max(...v).toFixed(0)} ms |`;
  return [
    `### CLI start-up (\`heatbook --help\`, median of ${n} fresh processes each, interleaved; target < 500 ms)`,
    "",
    "| start | median | range |",
    "|---|---:|---:|",
    row("compiled JavaScript (lib/cli/heatbook.js → lib/cli/dist)", compiled),
    row("TypeScript through tsx (the former start)", tsx),
    row("floor: `node -e \"\"` (an empty Node process)", floor),
    "",
    `Ratio tsx / compiled: ${(median(tsx) / median(compiled)).toFixed(1)}×; load average at the end ${loadavg().map((l) => l.toFixed(2)).join(", ")} (2 cores shared).`,
  ].join("\n");
}
