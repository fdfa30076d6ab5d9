/**
 * Worker-thread entry of the compute pool (pool.ts): computes notebook chains with the engine
 * bundle (engineBundle.mjs) and reports each step as it starts and ends, so the pool can keep
 * the finished steps of a task it stops at its time budget. Plain JavaScript on disk (Next does
 * not bundle it); see DEVELOPERS.md "Heavy work off the request thread".
 *
 * Messages in:  { task, steps, context, from, state, skip: { [index]: output } }
 * Messages out: { task, type: "start", index } · { task, type: "step", index, output }
 *               { task, type: "end" } · { task, type: "error", message, stack }
 */
import { parentPort, workerData } from "node:worker_threads";
import { pathToFileURL } from "node:url";
import { ensureEngineBundle } from "./engineBundle.mjs";

const engine = await import(pathToFileURL(await ensureEngineBundle(workerData.root)).href);
const testHooks = workerData.testHooks === true;
const pause = new Int32Array(new SharedArrayBuffer(4));

/**
 * Test hooks (only with HEATBOOK_TEST_HOOKS=1), from a step's raw config: __testSlowMs blocks this
 * thread that long; __testAllocMb keeps that many MiB of live objects (to reach the heap limit).
 */
function testHooksFor(spec) {
  if (!testHooks || !spec.config || typeof spec.config !== "object") return;
  const ms = Number(spec.config.__testSlowMs);
  if (ms > 0) Atomics.wait(pause, 0, 0, ms);
  const mb = Number(spec.config.__testAllocMb);
  const kept = [];
  for (let i = 0; mb > 0 && i < mb; i++) kept.push(Array.from({ length: 131072 }, (_, k) => ({ k })));
  return kept.length;
}

parentPort.on("message", (msg) => {
  const { task, steps, context, from, skip } = msg;
  let state = msg.state ?? engine.EMPTY_STATE;
  try {
    for (let i = from; i < steps.length; i++) {
      const known = skip?.[i];
      if (known) {
        // A step already stopped at the budget for these inputs: its failure, and the state it got.
        parentPort.postMessage({ task, type: "step", index: i, output: { ...known, state } });
        continue;
      }
      parentPort.postMessage({ task, type: "start", index: i });
      testHooksFor(steps[i]);
      const output = engine.computeStep(steps[i], state, context);
      parentPort.postMessage({ task, type: "step", index: i, output });
      state = output.state;
    }
    parentPort.postMessage({ task, type: "end" });
  } catch (err) {
    parentPort.postMessage({ task, type: "error", message: err instanceof Error ? err.message : String(err), stack: err instanceof Error ? err.stack : undefined });
  }
});
parentPort.postMessage({ type: "ready" });
