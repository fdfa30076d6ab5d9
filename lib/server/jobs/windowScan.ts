/**
 * Job "window-scan": a large window scan of one fit step — a gridSize × gridSize grid of
 * T_min × T_max windows instead of the notebook's 20 × 20 — computed in row chunks so
 * progress can be shown. The chain is computed up to the step (the data the fit sees: molar,
 * after addenda and normalisation), each chunk is scanWindows over a slice of the T_min edges
 * with all T_max edges, and the plateau is found once over the whole grid. The step itself is
 * not changed; the result lives in the job.
 */
import { NotFoundError } from "../../engine/errors";
import { computeChain, parseStepConfig, type StepSpec } from "../../engine/notebook";
import { findPlateau, quantileEdges, scanWindows, type ScanCell } from "../../engine/scan";
import { weightingOf, type FitConfig } from "../../engine/notebook/steps/fit";
import { getModel } from "../../engine/models/registry";
import { loadContext } from "../notebook/context";
import type { JobContext } from "./context";

export interface WindowScanParams {
  analysisId: string;
  stepId: string;
  gridSize: number;
}

export interface WindowScanSummary {
  model: string;
  gridSize: number;
  cells: ScanCell[];
  plateauCells: number;
  plateauGamma: number | null;
  recommended: ScanCell | null;
}

async function fitInput(ctx: JobContext, p: WindowScanParams) {
  const step = await ctx.db.step.findFirst({ where: { id: p.stepId, revision: { analysisId: p.analysisId, analysis: { groupId: ctx.groupId } } }, select: { revisionId: true, position: true, kind: true, config: true, revision: { select: { analysis: { select: { sampleId: true } } } } } });
  if (!step || step.kind !== "fit") throw new NotFoundError("fit step");
  const rows = await ctx.db.step.findMany({ where: { revisionId: step.revisionId, position: { lte: step.position } }, orderBy: { position: "asc" } });
  const specs: StepSpec[] = rows.map((r) => ({ id: r.id, kind: r.kind as StepSpec["kind"], config: r.config }));
  const chainCtx = await loadContext(ctx.db, ctx.groupId, step.revision.analysis.sampleId, specs);
  const outputs = computeChain(specs.slice(0, -1), chainCtx);
  const data = outputs.at(-1)?.state.dataset;
  if (!data) throw new NotFoundError("data above the fit step");
  const config = parseStepConfig("fit", step.config) as FitConfig;
  const r = data.basis === "atom" ? 1 : chainCtx.sample.atomsPerFormulaUnit;
  // the step's own weighting (data σ, none, relative or absolute σ)
  const sigma = weightingOf(config, data.heatCapacity, data.sigma).sigma;
  const input = { temperatureK: data.temperatureK, heatCapacity: data.heatCapacity, ...(sigma ? { sigma } : {}) };
  return { input, options: { model: config.model === "expression" ? "sommerfeld" : config.model, r, fixed: Object.keys(config.fixed).length ? config.fixed : undefined } };
}

/** Run the scan chunk by chunk; `ctx.progress` is told after each chunk of T_min edges. */
export async function runWindowScan(ctx: JobContext, p: WindowScanParams): Promise<WindowScanSummary> {
  const { input, options } = await fitInput(ctx, p);
  const sorted = Float64Array.from(input.temperatureK).sort();
  // The notebook scan's own rule (scanWindows): at least 8 points and 3 more than the parameters.
  const minPoints = Math.max(8, getModel(options.model).parameters.length + 3);
  const tMin = quantileEdges(sorted, 0, 0.5, p.gridSize);
  const tMax = quantileEdges(sorted, Math.min(1, (minPoints - 1) / Math.max(1, sorted.length - 1)), 1, p.gridSize);
  const cells: ScanCell[] = [];
  const pos: { i: number; j: number }[] = [];
  const chunk = Math.max(1, Math.ceil(tMin.length / 20));
  for (let start = 0; start < tMin.length; start += chunk) {
    const slice = tMin.slice(start, start + chunk);
    const part = scanWindows(input, { ...options, minPoints, tMinGridK: slice, tMaxGridK: tMax });
    for (const c of part.cells) {
      cells.push(c);
      pos.push({ i: tMin.indexOf(c.tMinK), j: tMax.indexOf(c.tMaxK) });
    }
    await ctx.pause();
    await ctx.progress(Math.min(tMin.length, start + chunk), tMin.length, `${cells.length} windows fitted`);
  }
  const usable = cells.map((c, k) => ({ c, k })).filter(({ c }) => c.converged && c.gamma !== null && c.gammaStdError !== null && c.gammaStdError > 0);
  const plateau = findPlateau(usable.map(({ c, k }) => ({ ...pos[k]!, value: c.gamma!, sigma: c.gammaStdError! })));
  const members = plateau ? plateau.members.map((m) => cells[usable[m]!.k]!) : [];
  const clean = members.filter((c) => !c.beyondT3Range);
  // a "plateau" of one window is no plateau: no window is recommended then (never the narrowest-σ, i.e. widest, window by default)
  const recommended = members.length < 2 ? null : (clean.length ? clean : members).reduce<ScanCell | null>((a, b) => (a === null || b.gammaStdError! < a.gammaStdError! ? b : a), null);
  return { model: options.model, gridSize: p.gridSize, cells, plateauCells: members.length, plateauGamma: plateau?.mean ?? null, recommended };
}
