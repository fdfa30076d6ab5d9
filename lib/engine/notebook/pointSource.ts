/**
 * Where each point of a step's output came from, stored compactly: the measurement ids once,
 * then per point the position of its measurement in that list and its index in the
 * measurement. (A list of {measurementId, index} objects repeated a 36-character id per point:
 * 120 kB of a 2 000-point fit output.) Pure and dependency-free, so the browser can use it.
 */

export interface PointSource {
  measurementId: string;
  index: number;
}

export interface PackedSources {
  measurementIds: string[];
  /** Per point: position in measurementIds. */
  measurement: number[];
  /** Per point: index of the point in its measurement. */
  index: number[];
}

/** Pack per-point sources (order kept). */
export function packSources(sources: readonly PointSource[]): PackedSources {
  const measurementIds: string[] = [];
  const at = new Map<string, number>();
  const measurement = new Array<number>(sources.length);
  const index = new Array<number>(sources.length);
  sources.forEach((s, i) => {
    let k = at.get(s.measurementId);
    if (k === undefined) {
      k = measurementIds.push(s.measurementId) - 1;
      at.set(s.measurementId, k);
    }
    measurement[i] = k;
    index[i] = s.index;
  });
  return { measurementIds, measurement, index };
}

/**
 * The source of point i, or null when there is none. Also reads the older unpacked form (a list
 * of objects), which outputs stored before engine 0.2.0 carry.
 */
export function sourceAt(sources: PackedSources | readonly PointSource[] | null | undefined, i: number): PointSource | null {
  if (!sources) return null;
  if (Array.isArray(sources)) return (sources as readonly PointSource[])[i] ?? null;
  const p = sources as PackedSources;
  const k = p.measurement[i];
  const id = k === undefined ? undefined : p.measurementIds[k];
  return id === undefined || p.index[i] === undefined ? null : { measurementId: id, index: p.index[i]! };
}
