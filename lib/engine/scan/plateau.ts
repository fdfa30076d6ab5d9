/**
 * Plateau of a window scan. Criterion: the largest set of grid-adjacent windows (T_min or
 * T_max index differing by one) grown from a seed window, where each window joins only if
 * its γ agrees with the running weighted mean of the set within its own standard error
 * (|γ_j − γ̄| ≤ σ_j), and every member still agrees after the mean moves. Ties go to the
 * set with the smaller mean σ(γ). The recommended window is the plateau member with the
 * smallest σ(γ), preferring windows without a T³-range warning. Seeds are tried in grid
 * order, skipping windows already inside the largest plateau found so far (growing from
 * them gives that plateau again or a smaller one in all but contrived cases), and the
 * search stops once a plateau holds every window.
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

/** Grid lookup (i, j) → cell index, −1 when absent. */
interface GridIndex {
  readonly width: number;
  readonly height: number;
  readonly cell: Int32Array;
}

function gridIndex(cells: readonly PlateauCell[]): GridIndex {
  const width = Math.max(...cells.map((c) => c.j)) + 1;
  const height = Math.max(...cells.map((c) => c.i)) + 1;
  const cell = new Int32Array(width * height).fill(-1);
  cells.forEach((c, k) => (cell[c.i * width + c.j] = k));
  return { width, height, cell };
}

const STEPS = [[1, 0], [-1, 0], [0, 1], [0, -1]] as const;

function grow(cells: readonly PlateauCell[], at: GridIndex, seed: number): Plateau {
  const members = [seed];
  const inSet = new Uint8Array(cells.length);
  inSet[seed] = 1;
  let sw = 1 / cells[seed].sigma ** 2;
  let swv = cells[seed].value * sw;
  // every member agrees with a mean m iff m ∈ [max(v − σ), min(v + σ)] over the members
  let lo = cells[seed].value - cells[seed].sigma;
  let hi = cells[seed].value + cells[seed].sigma;
  const queue = new Int32Array(cells.length);
  let head = 0;
  let tail = 0;
  queue[tail++] = seed;
  while (head < tail) {
    const c = cells[queue[head++]];
    for (const [di, dj] of STEPS) {
      const ni = c.i + di;
      const nj = c.j + dj;
      if (ni < 0 || nj < 0 || ni >= at.height || nj >= at.width) continue;
      const k = at.cell[ni * at.width + nj];
      if (k < 0 || inSet[k]) continue;
      const cand = cells[k];
      const w = 1 / cand.sigma ** 2;
      const mean = (swv + w * cand.value) / (sw + w);
      if (mean < Math.max(lo, cand.value - cand.sigma) || mean > Math.min(hi, cand.value + cand.sigma)) continue;
      lo = Math.max(lo, cand.value - cand.sigma);
      hi = Math.min(hi, cand.value + cand.sigma);
      members.push(k);
      inSet[k] = 1;
      sw += w;
      swv += w * cand.value;
      queue[tail++] = k;
    }
  }
  return { members, mean: swv / sw };
}

/** The plateau among `cells` (all with finite value and σ > 0), or null when there are none. */
export function findPlateau(cells: readonly PlateauCell[]): Plateau | null {
  if (cells.length === 0) return null;
  const at = gridIndex(cells);
  let best: Plateau | null = null;
  let bestSigma = Infinity;
  const inBest = new Uint8Array(cells.length);
  for (let seed = 0; seed < cells.length; seed++) {
    if (inBest[seed]) continue;
    const p = grow(cells, at, seed);
    const meanSigma = p.members.reduce((s, m) => s + cells[m].sigma, 0) / p.members.length;
    if (!best || p.members.length > best.members.length || (p.members.length === best.members.length && meanSigma < bestSigma)) {
      best = p;
      bestSigma = meanSigma;
      inBest.fill(0);
      p.members.forEach((k) => (inBest[k] = 1));
      if (p.members.length === cells.length) break;
    }
  }
  return best;
}
