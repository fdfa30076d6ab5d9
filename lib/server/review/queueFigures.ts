/**
 * The key numbers of a revision waiting for review, for the review queue: γ and β from its first
 * fit (with model and window), Θ_D from its first derive step, and the number of open discussion
 * threads on the analysis — so a reviewer sees what is asked of them before opening it.
 */
import type { Db } from "../db/client";
import { MODELS } from "../../engine/models";
import { formatBeta, formatGamma, formatUncertainty } from "../../engine/units/format";

export interface QueueFigures {
  /** "4.483(17) mJ mol⁻¹ K⁻²" style texts (value(σ) unit, no symbol), or null when the revision has no such result. */
  gamma: string | null;
  beta: string | null;
  thetaD: string | null;
  model: string | null;
  window: string | null;
  openThreads: number;
}

interface Param { name: string; value: number; stdError: number | null }
interface FitOut { ok?: boolean; result?: { fit?: { model?: string; parameters?: Param[] }; window?: { tMinK: number; tMaxK: number; nPoints: number } } }
interface DeriveOut { ok?: boolean; result?: { quantities?: { name: string; value: number; stdError: number | null; unit: string }[] } }

function modelTitle(name: string | undefined): string | null {
  if (!name) return null;
  const spec = (MODELS as Record<string, { title?: string }>)[name];
  return spec?.title ?? (name === "expression" ? "user expression" : name);
}

const kelvin = (t: number) => String(Number(t.toPrecision(4)));

/** Figures per revision id (revisions without a computed fit still get their thread count). */
export async function queueFigures(db: Db, items: readonly { revisionId: string; analysisId: string }[]): Promise<Map<string, QueueFigures>> {
  const out = new Map<string, QueueFigures>();
  if (items.length === 0) return out;
  const [steps, threads] = await Promise.all([
    db.step.findMany({ where: { revisionId: { in: items.map((i) => i.revisionId) }, kind: { in: ["fit", "derive"] } }, select: { revisionId: true, kind: true, output: true }, orderBy: { position: "asc" } }),
    db.thread.groupBy({ by: ["analysisId"], where: { analysisId: { in: items.map((i) => i.analysisId) }, state: "open" }, _count: { _all: true } }),
  ]);
  const open = new Map(threads.map((t) => [t.analysisId, t._count._all]));
  for (const item of items) {
    const mine = steps.filter((s) => s.revisionId === item.revisionId);
    const fit = mine.find((s) => s.kind === "fit" && (s.output as FitOut | null)?.ok)?.output as FitOut | undefined;
    const derive = mine.find((s) => s.kind === "derive" && (s.output as DeriveOut | null)?.ok)?.output as DeriveOut | undefined;
    const p = (n: string) => fit?.result?.fit?.parameters?.find((x) => x.name === n);
    const g = p("gamma"), b = p("beta");
    const theta = derive?.result?.quantities?.find((q) => q.name === "thetaD");
    const w = fit?.result?.window;
    out.set(item.revisionId, {
      gamma: g ? formatGamma(g.value, g.stdError) : null,
      beta: b ? formatBeta(b.value, b.stdError, undefined) : null,
      thetaD: theta ? `${formatUncertainty(theta.value, theta.stdError, { exponent: "times" })} K` : null,
      model: modelTitle(fit?.result?.fit?.model),
      window: w ? `${kelvin(w.tMinK)}–${kelvin(w.tMaxK)} K, ${w.nPoints} points` : null,
      openThreads: open.get(item.analysisId) ?? 0,
    });
  }
  return out;
}
