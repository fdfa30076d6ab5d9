/**
 * Benchmark table: a joint fit (fitJoint, model zeeman-schottky: γ, β, n, g shared) of 4
 * invented measurements × 200 points at 1, 2, 4, 6 T (γ = 4 mJ mol⁻¹ K⁻², β = 0.25 mJ mol⁻¹ K⁻⁴,
 * n = 0.008, g = 2, σ = 1 % of C, seeded noise), beside a baseline in the same run: the same
 * stacked problem written out by hand and solved by our general Levenberg–Marquardt
 * (lib/engine/fit/lm.ts, central-difference Jacobian) from a fixed start with no search
 * (γ, β from the data's ends, n = 0.001, g = 1). Whole calls are timed, set-up included.
 */
import { fitJoint, JOINT_MODELS, levenbergMarquardt, type JointMeasurement } from "../lib/engine/fit";
import { seeded as normal } from "./recommend";

const TRUTH = { gamma: 4e-3, beta: 2.5e-4, n: 8e-3, g: 2 };

export function jointBenchData(): JointMeasurement[] {
  const z = normal(11);
  const model = JOINT_MODELS["zeeman-schottky"];
  return [1, 2, 4, 6].map((H) => {
    const T = Array.from({ length: 200 }, (_, i) => 0.4 * 30 ** (i / 199));
    const clean = T.map((t) => model.evaluate(t, H, TRUTH));
    const sigma = clean.map((c) => 0.01 * c);
    return { label: `${H} T`, fieldT: H, temperatureK: T, heatCapacity: clean.map((c, i) => c + sigma[i] * z()), sigma };
  });
}

function baseline(data: JointMeasurement[]) {
  const model = JOINT_MODELS["zeeman-schottky"];
  const pts = data.flatMap((d) => d.temperatureK.map((t, i) => ({ t, H: d.fieldT, y: d.heatCapacity[i], s: d.sigma![i] })));
  const problem = {
    m: pts.length,
    n: 4,
    y: Float64Array.from(pts, (p) => p.y),
    w: Float64Array.from(pts, (p) => 1 / p.s),
    model: (p: Float64Array, out: Float64Array) => pts.forEach((q, i) => (out[i] = model.evaluate(q.t, q.H, { gamma: p[0], beta: p[1], n: p[2], g: p[3] }))),
  };
  const hi = pts.reduce((a, q) => (q.t > a.t ? q : a));
  return levenbergMarquardt(problem, [1e-3, hi.y / hi.t ** 3, 1e-3, 1]);
}

/** The markdown table; `median(f, runs)` is the engine bench's timer. */
export function jointTable(median: (f: () => unknown, runs: number) => number): string[] {
  const data = jointBenchData();
  const ours = fitJoint(data, { model: "zeeman-schottky" });
  const base = baseline(data);
  const g = ours.parameters.find((p) => p.key === "g")!;
  const oursMs = median(() => fitJoint(data, { model: "zeeman-schottky" }), 5);
  const baseMs = median(() => baseline(data), 5);
  const detail = `ours: g = ${g.value.toFixed(4)} ± ${g.stdError!.toFixed(4)} (truth 2), χ² = ${ours.chiSquare.toFixed(1)}, converged ${ours.converged}; baseline: g = ${base.p[3].toFixed(4)}, χ² = ${base.chiSquare.toPrecision(6)}, converged ${base.converged}`;
  return [
    "| case | ours median ms | baseline median ms | baseline / ours | what came out |",
    "|---|---:|---:|---:|---|",
    `| joint fit, zeeman-schottky, 4 × 200 points (global start on g, then LM) | ${oursMs.toFixed(0)} | ${baseMs.toFixed(0)} | ${(baseMs / oursMs).toFixed(1)} | ${detail} |`,
    "",
    "Baseline: the stacked problem by plain LM (numerical Jacobian) from a fixed start, no search; it finds the minimum only when that start lies in its basin.",
  ];
}
