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

/** Test hook (only with HEATBOOK_TEST_HOOKS=1): a step whose raw config has __testSlowMs blocks this thread that long. */
function testSlowness(spec) {
  const ms = testHooks && spec.config && typeof spec.config === "object" ? Number(spec.config.__testSlowMs) : 0;
  if (ms > 0) Atomics.wait(pause, 0, 0, ms);
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
      testSlowness(steps[i]);
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
