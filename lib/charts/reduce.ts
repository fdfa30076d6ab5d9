/**
 * Shape-preserving reduction of a large curve for the screen: the x range is cut into as many
 * bins as the chart has pixel columns, and each bin keeps its first, last, lowest and highest
 * point (the M4 aggregation of Jugel et al., "M4: a visualization-oriented time series data
 * aggregation", Proc. VLDB Endow. 7 (2014) 797). Drawn at that width, the reduced curve covers
 * the same pixels as the full one: every extreme and every gap stays visible. Fits, exports and
 * CSV files always use every point; only the drawing is reduced.
 */

/** Indices (ascending) of the points to draw; all indices when n ≤ 4 × bins. */
export function reduceForChart(xs: ArrayLike<number>, ys: ArrayLike<number>, options: { bins: number; logX?: boolean }): number[] {
  const n = xs.length;
  if (ys.length !== n) throw new RangeError(`xs has ${n} entries, ys ${ys.length}`);
  const bins = Math.max(1, Math.floor(options.bins));
  if (n <= 4 * bins) return Array.from({ length: n }, (_, i) => i);
  const fx = options.logX ? (x: number) => (x > 0 ? Math.log(x) : NaN) : (x: number) => x;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const x = fx(xs[i]!);
    if (Number.isFinite(x) && Number.isFinite(ys[i]!)) {
      if (x < lo) lo = x;
      if (x > hi) hi = x;
    }
  }
  if (!(hi > lo)) return Array.from({ length: Math.min(n, 4 * bins) }, (_, i) => i);
  const first = new Int32Array(bins).fill(-1);
  const last = new Int32Array(bins).fill(-1);
  const low = new Int32Array(bins).fill(-1);
  const high = new Int32Array(bins).fill(-1);
  const scale = bins / (hi - lo);
  for (let i = 0; i < n; i++) {
    const x = fx(xs[i]!);
    const y = ys[i]!;
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    const b = Math.min(bins - 1, Math.floor((x - lo) * scale));
    if (first[b] < 0) first[b] = i;
    last[b] = i;
    if (low[b] < 0 || y < ys[low[b]!]!) low[b] = i;
    if (high[b] < 0 || y > ys[high[b]!]!) high[b] = i;
  }
  const keep = new Set<number>();
  for (let b = 0; b < bins; b++) for (const i of [first[b]!, last[b]!, low[b]!, high[b]!]) if (i >= 0) keep.add(i);
  return [...keep].sort((a, b) => a - b);
}

/** A measurement series cut to the given indices (σ and source lines follow). */
export function pickPoints<S extends { temperatureK: readonly number[]; heatCapacity: readonly number[]; sigma: readonly number[] | null; sourceLines?: readonly number[] }>(series: S, keep: readonly number[]): S {
  return {
    ...series,
    temperatureK: keep.map((i) => series.temperatureK[i]!),
    heatCapacity: keep.map((i) => series.heatCapacity[i]!),
    sigma: series.sigma ? keep.map((i) => series.sigma![i]!) : null,
    ...(series.sourceLines ? { sourceLines: keep.map((i) => series.sourceLines![i]!) } : {}),
  };
}

/** How many screen columns a measurement's charts are reduced for (wider than any chart drawn). */
export const SCREEN_BINS = 1500;

/**
 * A measurement reduced for its two charts (C vs T on linear and log axes, C/T vs T² over the
 * whole range and over T ≤ each of `rangesK`): the union of the per-column reductions of every
 * view, so each view keeps the extremes of each of its pixel columns. Below 4 × bins points the
 * series is returned whole. `drawn` and `total` let the page say what it shows.
 */
export function reduceMeasurementForScreen<S extends { temperatureK: readonly number[]; heatCapacity: readonly number[]; sigma: readonly number[] | null; sourceLines?: readonly number[] }>(
  series: S, options: { bins?: number; rangesK?: readonly number[] } = {},
): { series: S; drawn: number; total: number } {
  const bins = options.bins ?? SCREEN_BINS;
  const n = series.temperatureK.length;
  if (n <= 4 * bins) return { series, drawn: n, total: n };
  const t = series.temperatureK;
  const c = series.heatCapacity;
  const t2 = Array.from(t, (x) => x * x);
  const overT = Array.from(c, (y, i) => y / t[i]!);
  const keep = new Set<number>();
  for (const i of reduceForChart(t, c, { bins })) keep.add(i);
  for (const i of reduceForChart(t, c, { bins, logX: true })) keep.add(i);
  for (const i of reduceForChart(t2, overT, { bins })) keep.add(i);
  for (const maxK of options.rangesK ?? [10, 5, 3]) {
    const idx: number[] = [];
    for (let i = 0; i < n; i++) if (t[i]! <= maxK) idx.push(i);
    const sub = reduceForChart(idx.map((i) => t2[i]!), idx.map((i) => overT[i]!), { bins });
    for (const j of sub) keep.add(idx[j]!);
  }
  const order = [...keep].sort((a, b) => a - b);
  return { series: pickPoints(series, order), drawn: order.length, total: n };
}

/**
 * One chart's own reduction of a series (already reduced for all views on the server): the
 * first, last, highest and lowest point of each of `bins` columns of this view (x against y,
 * `logX` for a logarithmic x axis), over the points `keep` accepts. Returns the series unchanged
 * when it has at most 4 × bins such points.
 */
export function reduceSeriesForView<S extends { temperatureK: readonly number[]; heatCapacity: readonly number[]; sigma: readonly number[] | null; sourceLines?: readonly number[] }>(
  series: S, view: { x: (t: number, c: number) => number; y: (t: number, c: number) => number; bins: number; logX?: boolean; keep?: (t: number) => boolean },
): S {
  const idx: number[] = [];
  for (let i = 0; i < series.temperatureK.length; i++) if (!view.keep || view.keep(series.temperatureK[i]!)) idx.push(i);
  if (idx.length <= 4 * Math.max(1, Math.floor(view.bins))) return series;
  const xs = idx.map((i) => view.x(series.temperatureK[i]!, series.heatCapacity[i]!));
  const ys = idx.map((i) => view.y(series.temperatureK[i]!, series.heatCapacity[i]!));
  return pickPoints(series, reduceForChart(xs, ys, { bins: view.bins, ...(view.logX ? { logX: true } : {}) }).map((j) => idx[j]!));
}
