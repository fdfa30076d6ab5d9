/**
 * Reading V8's `--trace-gc` lines (one per collection, on the server's stdout) for the load
 * benchmark's memory table. RSS alone cannot show a leak here: V8 lets the old generation fill
 * with garbage to several hundred MiB before a full collection, so RSS sits near its high-water
 * mark whatever is live. The heap left after each full collection (Mark-Compact) is what is
 * live; a leak shows as that figure climbing from round to round.
 *
 * A line looks like (Node 20, V8 11.3):
 *   [3932:0x15f115a0]  1941 ms: Mark-Compact 71.7 (98.6) -> 65.9 (102.1) MB, 23.83 / 0.02 ms  (+ …
 *   [3932:0x15f115a0]    59 ms: Scavenge 4.6 (4.7) -> 4.2 (5.7) MB, 1.35 / 0.00 ms  (average …
 * "A (B) -> C (D) MB": heap used (committed) before -> after; V8's MB are 2^20 bytes (MiB).
 * The first figure after "MB," is the pause on the main thread in ms.
 */

export interface GcEvent {
  kind: "full" | "young";
  /** Milliseconds since the process started, as V8 prints it. */
  atMs: number;
  usedBeforeMiB: number;
  usedAfterMiB: number;
  pauseMs: number;
}

const LINE = /(\d+(?:\.\d+)?) ms: (Mark-Compact(?: \(reduce\))?|Scavenge|Minor Mark-Compact|Minor Mark-Sweep) ([\d.]+) \([\d.]+\) -> ([\d.]+) \([\d.]+\) MB, ([\d.]+) \//;

/** Every collection named in `text` (lines that are not GC traces are skipped). */
export function gcEvents(text: string): GcEvent[] {
  const out: GcEvent[] = [];
  for (const line of text.split("\n")) {
    const m = LINE.exec(line);
    if (!m) continue;
    out.push({ kind: m[2]!.startsWith("Mark-Compact") ? "full" : "young", atMs: Number(m[1]), usedBeforeMiB: Number(m[3]), usedAfterMiB: Number(m[4]), pauseMs: Number(m[5]) });
  }
  return out;
}

export interface GcSummary {
  fullCollections: number;
  /** Heap left by the last full collection (MiB), or null if there was none. */
  liveAfterLastFullMiB: number | null;
  /** Smallest and largest heap left by a full collection (MiB). */
  liveRangeMiB: [number, number] | null;
  /** Longest single pause (ms), and all pauses together as a share of `wallMs` (%). */
  maxPauseMs: number;
  pauseSharePct: number;
}

/** What the collections in `events` add up to over a stretch of `wallMs` milliseconds. */
export function summariseGc(events: GcEvent[], wallMs: number): GcSummary {
  if (!(wallMs > 0)) throw new Error(`invalid wallMs: ${wallMs}`);
  const full = events.filter((e) => e.kind === "full").map((e) => e.usedAfterMiB);
  const pauses = events.map((e) => e.pauseMs);
  return {
    fullCollections: full.length,
    liveAfterLastFullMiB: full.at(-1) ?? null,
    liveRangeMiB: full.length ? [Math.min(...full), Math.max(...full)] : null,
    maxPauseMs: pauses.length ? Math.max(...pauses) : 0,
    pauseSharePct: (100 * pauses.reduce((a, b) => a + b, 0)) / wallMs,
  };
}
