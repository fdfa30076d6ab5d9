import { describe, expect, it } from "vitest";
import { gcEvents, summariseGc } from "@/bench/gcTrace";

// Lines as printed by `node --trace-gc` (Node 20.20.2, V8 11.3), captured from `next start`
// under the load benchmark on 2026-12-02; the log lines between them are the server's own.
const TRACE = [
  "[3932:0x15f115a0]       59 ms: Scavenge 4.6 (4.7) -> 4.2 (5.7) MB, 1.35 / 0.00 ms  (average mu = 1.000, current mu = 1.000) allocation failure; ",
  "   ▲ Next.js 16.4.6",
  "[3932:0x15f115a0]     1941 ms: Mark-Compact 71.7 (98.6) -> 65.9 (102.1) MB, 23.83 / 0.02 ms  (+ 12.1 ms in 44 steps since start of marking, biggest step 8.3 ms, walltime since start of marking 71 ms) (average mu = 0.976, current mu = 0.976) finalize incremental marking via stack guard; GC in old space requested",
  "[3932:0x15f115a0]     2003 ms: Scavenge 80.1 (102.1) -> 70.3 (104.6) MB, 4.10 / 0.00 ms  (average mu = 0.976, current mu = 0.976) allocation failure; ",
  "[3932:0x15f115a0]    11752 ms: Mark-Compact 271.7 (299.9) -> 137.6 (300.9) MB, 9.14 / 0.02 ms  (+ 19.4 ms in 95 steps since start of marking, biggest step 4.2 ms, walltime since start of marking 123 ms) (average mu = 0.992, current mu = 0.997) finalize incremental marking via stack guard; GC in old space requested",
  " ✓ Ready in 512ms",
].join("\n");

describe("gcEvents", () => {
  it("reads the kind, time, heap before and after, and pause of each collection", () => {
    const ev = gcEvents(TRACE);
    expect(ev.map((e) => e.kind)).toEqual(["young", "full", "young", "full"]);
    expect(ev[1]).toEqual({ kind: "full", atMs: 1941, usedBeforeMiB: 71.7, usedAfterMiB: 65.9, pauseMs: 23.83 });
    expect(ev[0]!.pauseMs).toBe(1.35);
  });

  it("skips lines that are not GC traces, and finds nothing in none", () => {
    expect(gcEvents("Ready in 512ms\n[1:0x1] 5 ms: something else 1 (2) -> 3 (4) MB")).toEqual([]);
  });
});

describe("summariseGc", () => {
  it("gives the heap left by the last full collection, the range, the longest pause and the pause share", () => {
    const s = summariseGc(gcEvents(TRACE), 10_000);
    expect(s.fullCollections).toBe(2);
    expect(s.liveAfterLastFullMiB).toBe(137.6);
    expect(s.liveRangeMiB).toEqual([65.9, 137.6]);
    expect(s.maxPauseMs).toBe(23.83);
    // (1.35 + 23.83 + 4.10 + 9.14) ms of 10 000 ms
    expect(s.pauseSharePct).toBeCloseTo(0.3842, 4);
  });

  it("says null, not zero, for the live heap when no full collection ran", () => {
    const s = summariseGc(gcEvents(TRACE).filter((e) => e.kind === "young"), 1000);
    expect(s.liveAfterLastFullMiB).toBeNull();
    expect(s.liveRangeMiB).toBeNull();
  });

  it("refuses a stretch of no time", () => {
    expect(() => summariseGc([], 0)).toThrow("invalid wallMs: 0");
  });
});
