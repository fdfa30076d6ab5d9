"use client";
/**
 * A fit step's result: the C/T vs T² chart (drag to choose a new window, or shift-drag / the
 * "comment" mode to discuss a range of points), residuals lined up beneath, the parameter table
 * with compact standard errors, fit statistics (χ²_red only with known σ, else the residual
 * standard deviation), correlations, the model-and-window recommendation with both σ, the window
 * scan with its plateau, and the model comparison.
 */
import { useCallback, useMemo, useState } from "react";
import { fitPlot, residualPlot, scanPlot, candidatesPlot, fitCsv, scanCsv, defaultMaxTK, type FitStepResult, type RangeBand, type StoredRecommendation } from "@/lib/charts/notebook";
import { formatStatSyst } from "@/lib/engine/scan/statSyst";
import { ChartBox, type RangePick } from "./ChartBox";
import { BASIS_LABEL, compact, num, paramSymbol, unitText } from "./display";
import { Sym } from "../Sym";
import { formatRange, modelLabel } from "@/lib/display";
import type { Anchor, ModelInfo, NotebookContext, StepView } from "./types";
import { sourceAt } from "@/lib/engine/notebook/pointSource";

interface Props {
  step: StepView;
  result: FitStepResult;
  ctx: NotebookContext;
  save: (config: Record<string, unknown>) => Promise<boolean>;
}

function displayOf(models: ModelInfo[], model: string, name: string, siUnit: string): { factor: number; unit: string; description: string } {
  const spec = models.find((m) => m.name === model)?.parameters.find((p) => p.name === name);
  if (spec) return { factor: spec.displayFactor, unit: unitText(spec.displayUnit), description: spec.description };
  return { factor: 1, unit: unitText(siUnit), description: "parameter of the expression (SI)" };
}

const RANGES = [{ value: "auto", label: "T ≤ 1.5 × window Tmax" }, { value: "10", label: "T ≤ 10 K" }, { value: "all", label: "all points" }];

export function FitView({ step, result: r, ctx, save }: Props) {
  const [range, setRange] = useState("auto");
  const [mode, setMode] = useState<"window" | "comment">("window");
  // A user expression's parameters keep the names the user gave them (g is not the registry's g₁/g₀).
  const userModel = (step.config as { model?: string }).model === "expression";
  const [pending, setPending] = useState<{ tMinK: number; tMaxK: number; n: number } | null>(null);
  const [xDomain, setXDomain] = useState<[number, number] | null>(null);
  const maxTK = range === "auto" ? defaultMaxTK(r) : range === "all" ? null : Number(range);
  const anchors: RangeBand[] = useMemo(() => ctx.threads.filter((t) => t.stepId === step.id && t.anchor?.plot === "ct-vs-t2").map((t) => ({ xMin: t.anchor!.xMin, xMax: t.anchor!.xMax, label: `#${ctx.threads.indexOf(t) + 1}`, faded: t.state === "resolved" })), [ctx.threads, step.id]);
  const selection = pending ? { xMin: pending.tMinK ** 2, xMax: pending.tMaxK ** 2 } : null;
  const build = useCallback((width: number) => fitPlot(r, { width, maxTK, anchors, selection }), [r, maxTK, anchors, selection?.xMin, selection?.xMax]); // eslint-disable-line react-hooks/exhaustive-deps
  const buildRes = useCallback((width: number) => residualPlot(r, { width, ...(xDomain ? { xDomain } : {}) }), [r, xDomain]);
  const current = r.fit.parameters.find((p) => p.name === "gamma");
  const buildScan = useCallback((width: number) => scanPlot(r.scan!, { width, basis: r.basis, current: current ? { tMaxK: r.window.tMaxK, gammaSI: current.value } : null }), [r, current]);
  const onDrawn = useCallback((d: [number, number]) => setXDomain((old) => (old && old[0] === d[0] && old[1] === d[1] ? old : d)), []);

  function onRange(pick: RangePick) {
    const lo = Math.sqrt(Math.max(pick.xMin, 0)), hi = Math.sqrt(Math.max(pick.xMax, 0));
    const inside = r.points.temperatureK.map((t, i) => ({ t, i })).filter(({ t }) => t >= lo && t <= hi);
    if (pick.shift || mode === "comment") {
      const anchor: Anchor = { plot: "ct-vs-t2", xMin: pick.xMin, xMax: pick.xMax, points: inside.map(({ i }) => sourceAt(r.points.source, i)).filter((s) => s !== null) };
      ctx.startThread(step.id, anchor);
      return;
    }
    if (!ctx.editable || inside.length < 2) return;
    // The window's edges are the outermost points inside the drag (never below the lowest point
    // or above the highest), exactly: a rounded edge could drop the last point from the fit.
    const ts = inside.map(({ t }) => t);
    setPending({ tMinK: Math.min(...ts), tMaxK: Math.max(...ts), n: inside.length });
  }

  async function usePending(w: { tMinK: number; tMaxK: number }) {
    if (await save({ ...step.config, tMinK: w.tMinK, tMaxK: w.tMaxK })) setPending(null);
  }

  const f = r.fit;
  const rec = r.scan?.recommended ?? null;
  const sigmaKnown = r.weighting?.sigmaKnown ?? f.weighted;
  // outputs stored before `quality` existed: unweighted χ² is the residual sum of squares
  const residualSd = r.quality ? r.quality.residualStdDev : !f.weighted && f.chiSquare !== null && f.dof > 0 ? Math.sqrt(f.chiSquare / f.dof) : null;
  return (
    <div className="nb-result">
      <ChartBox
        title={<>C/T against T² <span className="muted">· the window is shaded; hollow points are outside it</span></>}
        name="fit-ct-vs-t2" label="C over T against T squared with the fitted model" testId="chart-fit"
        build={build} csv={() => fitCsv(r)} onRange={onRange} onDrawn={onDrawn}
        paperHref={`${ctx.apiBase}/analyses/${ctx.analysisId}/steps/${step.id}/figure?chart=fit&revision=${ctx.revisionId}`}
        dragHint={ctx.editable ? (mode === "window" ? "Drag across the chart to choose a new fit window; shift-drag to comment on a range of points." : "Drag across the chart to comment on that range of points.") : "Drag across the chart to comment on a range of points."}
        controls={<>
          <label htmlFor={`range-${step.id}`}>Show</label>
          <select id={`range-${step.id}`} value={range} onChange={(e) => setRange(e.target.value)}>{RANGES.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}</select>
          {ctx.editable && (
            <span role="radiogroup" aria-label="Dragging on the chart" className="nb-toggle">
              <label className="checkbox"><input type="radio" name={`mode-${step.id}`} checked={mode === "window"} onChange={() => setMode("window")} /> sets the window</label>
              <label className="checkbox"><input type="radio" name={`mode-${step.id}`} checked={mode === "comment"} onChange={() => setMode("comment")} data-testid="comment-range-mode" /> comments on a range</label>
            </span>
          )}
        </>}
        footer={pending && (
          <div className="nb-pending" role="status">
            New window {num(pending.tMinK)}–{num(pending.tMaxK)} K ({pending.n} points)
            <button type="button" className="small" onClick={() => usePending(pending)} data-testid="use-window">Use this window</button>
            <button type="button" className="quiet small" onClick={() => setPending(null)}>Cancel</button>
          </div>
        )}
      />
      {f.residuals.length > 0 && <ChartBox title={<>Residuals (C − <Sym m="C_fit" />)/T</>} name="fit-residuals" label="Residuals of the fit" build={buildRes} csv={() => fitCsv(r)} testId="chart-residuals" />}
      <div className="nb-tables">
        <section aria-label="Fitted parameters">
          <h4>Parameters <span className="muted small">({BASIS_LABEL[r.basis]}; value(σ): σ is one standard error in the last digits)</span></h4>
          <table className="nb-compact" data-testid="fit-parameters">
            <thead><tr><th>Parameter</th><th className="num">Value(σ)</th><th>Unit</th><th className="num">σ/|value|</th><th /></tr></thead>
            <tbody>
              {f.parameters.map((p) => {
                const d = displayOf(ctx.models, f.modelName, p.name, p.unit);
                return (
                  <tr key={p.name} title={d.description}>
                    <td><Sym m={userModel ? p.name : paramSymbol(p.name)} /></td>
                    <td className="num" data-testid={`param-${p.name}`}>{compact(p.value * d.factor, p.stdError === null ? null : p.stdError * d.factor)}</td>
                    <td className="nb-unit">{d.unit}</td>
                    <td className="num">{p.stdError !== null && p.value !== 0 ? `${num((100 * p.stdError) / Math.abs(p.value), 2)} %` : "—"}</td>
                    <td className="small muted">{p.fixed ? "held fixed" : p.atBound ? "at its bound" : ""}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </section>
        <section aria-label="Fit statistics">
          <h4>Fit statistics</h4>
          <dl className="facts nb-facts">
            <dt>Solved by</dt><dd>{f.method === "linear-qr" ? "linear least squares (Householder QR)" : `Levenberg–Marquardt, ${f.evaluations} evaluations`}{f.converged ? "" : " — not converged"}</dd>
            <dt>Points, free parameters</dt><dd>{f.nData}, {f.nFree} (ν = {f.dof})</dd>
            <dt>Fit variable</dt><dd>{r.fitVariable ?? "C(T)"}</dd>
            {sigmaKnown
              ? <><dt>χ², <Sym m="χ²_red" /></dt><dd>{num(f.chiSquare, 4)}, <strong>{num(f.reducedChiSquare, 3)}</strong></dd></>
              : <><dt>Residual standard deviation</dt><dd data-testid="fit-residual-sd"><strong>{num(residualSd === null ? null : residualSd * 1e3, 3)}</strong> mJ mol⁻¹ K⁻¹ <span className="muted small">(σ unknown: no reduced χ²)</span></dd></>}
            <dt>AICc, BIC</dt><dd>{num(f.aicc, 5)}, {num(f.bic, 5)} <span className="muted small">(only differences matter)</span></dd>
            <dt>Weights</dt><dd data-testid="fit-weighting-text">{r.weighting?.text ?? (f.weighted ? "weighted by 1/σ²" : "unweighted (standard errors from the residual scatter)")}{f.weighted && <>; errors {f.errorsScaledByReducedChiSquare ? <>scaled by √<Sym m="χ²_red" /></> : "from σ as given"}</>}</dd>
          </dl>
        </section>
        {f.correlation && f.correlation.names.length > 1 && (
          <section aria-label="Correlation matrix">
            <h4>Correlations</h4>
            <table className="nb-compact nb-corr">
              <thead><tr><th />{f.correlation.names.map((n) => <th key={n} className="num"><Sym m={userModel ? n : paramSymbol(n)} /></th>)}</tr></thead>
              <tbody>{f.correlation.matrix.map((row, i) => (
                <tr key={i}><th><Sym m={paramSymbol(f.correlation!.names[i]!)} /></th>{row.map((c, j) => <td key={j} className={`num${i !== j && c !== null && Math.abs(c) > 0.98 ? " nb-bad" : ""}`}>{c === null ? "—" : c.toFixed(3)}</td>)}</tr>
              ))}</tbody>
            </table>
          </section>
        )}
      </div>
      {r.recommendation && <RecommendationView rec={r.recommendation} basis={r.basis} />}
      {r.scan && (
        <div className="nb-scan">
          <ChartBox title={<>Window scan: γ against <Sym m="T_max" /> for each <Sym m="T_min" /> <span className="muted">· ringed: plateau · large ring: recommended · diamond: this fit</span></>} name="window-scan" label="Window scan of gamma" testId="chart-scan" paperHref={`${ctx.apiBase}/analyses/${ctx.analysisId}/steps/${step.id}/figure?chart=scan&revision=${ctx.revisionId}`} build={buildScan} csv={() => scanCsv(r.scan!)} />
          <p className="nb-reason" data-testid="scan-reason"><strong>Recommendation.</strong> {r.scan.reason}</p>
          {rec && ctx.editable && (
            <button type="button" className="quiet small" onClick={() => usePending({ tMinK: rec.tMinK, tMaxK: rec.tMaxK })}>Use the recommended window {formatRange(rec.tMinK, rec.tMaxK, "K")}</button>
          )}
        </div>
      )}
      {r.comparison && r.comparison.length > 0 && (
        <section aria-label="Model comparison">
          <h4>Models on the same window <span className="muted small">(lowest AICc first; w = Akaike weight)</span></h4>
          <div className="table-scroll">
            <table className="nb-compact" data-testid="model-comparison">
              <thead><tr><th>Model</th><th className="num">k</th><th className="num"><Sym m="χ²_red" /></th><th className="num">ΔAICc</th><th className="num">w</th><th className="num">ΔBIC</th><th className="num">γ (mJ mol⁻¹ K⁻²)</th><th className="num">β (mJ mol⁻¹ K⁻⁴)</th></tr></thead>
              <tbody>{[...r.comparison].sort((a, b) => (a.deltaAicc ?? Infinity) - (b.deltaAicc ?? Infinity)).map((row) => (
                <tr key={row.model}>
                  <td><Sym m={modelLabel(row.model)} />{!row.converged && <span className="nb-bad"> (not converged)</span>}</td>
                  <td className="num">{row.nFree}</td>
                  <td className="num">{num(row.reducedChiSquare, 3)}</td>
                  <td className="num">{num(row.deltaAicc, 3)}</td>
                  <td className="num">{row.akaikeWeight === null ? "—" : row.akaikeWeight.toFixed(3)}</td>
                  <td className="num">{num(row.deltaBic, 3)}</td>
                  <td className="num">{row.gamma ? compact(row.gamma.value * 1e3, row.gamma.stdError === null ? null : row.gamma.stdError * 1e3) : "—"}</td>
                  <td className="num">{row.beta ? compact(row.beta.value * 1e3, row.beta.stdError === null ? null : row.beta.stdError * 1e3) : "—"}</td>
                </tr>
              ))}</tbody>
            </table>
          </div>
        </section>
      )}
    </div>
  );
}

/** The model-and-window recommendation: the chosen model, window, γ and β as value(stat)(syst), the reason and the rules. */
function RecommendationView({ rec, basis }: { rec: StoredRecommendation; basis: FitStepResult["basis"] }) {
  const build = useCallback((width: number) => candidatesPlot(rec, { width, basis }), [rec, basis]);
  const both = (v: number | null, stat: number | null, syst: number | null) => (v === null ? "—" : formatStatSyst(v * 1e3, stat === null ? null : stat * 1e3, syst === null ? null : syst * 1e3));
  return (
    <section className="nb-scan" aria-label="Recommended model and window" data-testid="recommendation">
      <h4>Recommended model and window</h4>
      {rec.recommended && rec.window ? (
        <dl className="facts nb-facts">
          <dt>Model</dt><dd data-testid="recommendation-model">{rec.modelTitle}</dd>
          <dt>Window</dt><dd>{num(rec.window.tMinK)}–{num(rec.window.tMaxK)} K ({rec.window.nPoints} points)</dd>
          <dt>γ (stat)(syst)</dt><dd data-testid="recommendation-gamma">{both(rec.gamma, rec.gammaStdError, rec.gammaSystematicError)} mJ mol⁻¹ K⁻²</dd>
          <dt>β (stat)(syst)</dt><dd>{both(rec.beta, rec.betaStdError, rec.betaSystematicError)} mJ mol⁻¹ K⁻⁴</dd>
          <dt>Fits acceptable</dt><dd>{rec.acceptableFits} of {rec.totalFits} (model, window) fits</dd>
        </dl>
      ) : <p className="nb-bad"><strong>Not recommended.</strong></p>}
      <ChartBox title={<>Candidates: γ against T_max <span className="muted">· filled: the model describes the data in that window · ring: recommended · band: ± total σ</span></>} name="recommendation-candidates" label="Gamma of every candidate model and window" testId="chart-candidates" build={build} />
      <p className="nb-reason" data-testid="recommendation-reason"><strong>Why.</strong> {rec.reason}</p>
      <details className="small"><summary>How the choice is made</summary><p>{rec.method}</p></details>
    </section>
  );
}
