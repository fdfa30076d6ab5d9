/**
 * Plateau of a window scan. Criterion: the largest set of grid-adjacent windows (T_min or
 * T_max index differing by one) grown from a seed window, where each window joins only if
 * its γ agrees with the running weighted mean of the set within its own standard error
 * (|γ_j − γ̄| ≤ σ_j), and every member still agrees after the mean moves. Ties go to the
 * set with the smaller mean σ(γ). The recommended window is the plateau member with the
 * smallest σ(γ), preferring windows without a T³-range warning.
 */

export interface PlateauCell {
  readonly i: number;
  readonly j: number;
  readonly value: number;
  readonly sigma: number;
}

export interface Plateau {
  /** Indices into the cell list. */
  readonly members: number[];
  readonly mean: number;
}

function grow(cells: readonly PlateauCell[], at: Map<string, number>, seed: number): Plateau {
  const members = [seed];
  const inSet = new Set(members);
  let sw = 1 / cells[seed].sigma ** 2;
  let swv = cells[seed].value * sw;
  // every member agrees with a mean m iff m ∈ [max(v − σ), min(v + σ)] over the members
  let lo = cells[seed].value - cells[seed].sigma;
  let hi = cells[seed].value + cells[seed].sigma;
  const queue = [seed];
  while (queue.length) {
    const c = cells[queue.shift()!];
    for (const [di, dj] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) {
      const k = at.get(`${c.i + di},${c.j + dj}`);
      if (k === undefined || inSet.has(k)) continue;
      const cand = cells[k];
      const w = 1 / cand.sigma ** 2;
      const mean = (swv + w * cand.value) / (sw + w);
      if (mean < Math.max(lo, cand.value - cand.sigma) || mean > Math.min(hi, cand.value + cand.sigma)) continue;
      lo = Math.max(lo, cand.value - cand.sigma);
      hi = Math.min(hi, cand.value + cand.sigma);
      members.push(k);
      inSet.add(k);
      sw += w;
      swv += w * cand.value;
      queue.push(k);
    }
  }
  return { members, mean: swv / sw };
}

/** The plateau among `cells` (all with finite value and σ > 0), or null when there are none. */
export function findPlateau(cells: readonly PlateauCell[]): Plateau | null {
  if (cells.length === 0) return null;
  const at = new Map(cells.map((c, k) => [`${c.i},${c.j}`, k]));
  let best: Plateau | null = null;
  let bestSigma = Infinity;
  for (let seed = 0; seed < cells.length; seed++) {
    const p = grow(cells, at, seed);
    const meanSigma = p.members.reduce((s, m) => s + cells[m].sigma, 0) / p.members.length;
    if (!best || p.members.length > best.members.length || (p.members.length === best.members.length && meanSigma < bestSigma)) {
      best = p;
      bestSigma = meanSigma;
    }
  }
  return best;
}
