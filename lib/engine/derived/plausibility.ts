/**
 * Warnings a physicist would attach to derived quantities. The magnitude ranges are common
 * practice (no single source), as listed in the project's design brief: simple metals
 * γ ≈ 0.5–2 mJ mol⁻¹ K⁻², transition metals and alloys ≈ 1–15, heavy fermions ≥ 100;
 * Θ_D from ~100 K (soft metals) to ~500 K and above.
 */

export interface PlausibilityInput {
  /** γ per mole formula unit [mJ mol⁻¹ K⁻²] and its σ (null if unknown). */
  readonly gammaMJ: number;
  readonly gammaSigmaMJ: number | null;
  /** γ per mole of atoms [mJ mol⁻¹ K⁻²] for the per-element ranges. */
  readonly gammaPerAtomMJ: number;
  readonly betaMJ: number;
  readonly betaSigmaMJ: number | null;
  readonly correlationGammaBeta?: number;
  readonly thetaDK?: number;
  readonly massRatio?: number;
  readonly lambda?: number;
}

const fmt = (x: number) => x.toPrecision(3);

/** Warnings on γ and β themselves: sign, significance, typical magnitudes, correlation. */
export function coefficientWarnings(p: PlausibilityInput): string[] {
  const w: string[] = [];
  if (p.gammaMJ < 0) w.push(`negative γ = ${fmt(p.gammaMJ)} mJ mol^-1 K^-2 is unphysical: check the addenda subtraction, a nuclear A/T² tail, or the fit window`);
  else if (p.gammaSigmaMJ !== null && p.gammaMJ < 2 * p.gammaSigmaMJ) w.push(`γ = ${fmt(p.gammaMJ)} ± ${fmt(p.gammaSigmaMJ)} mJ mol^-1 K^-2 is within 2σ of zero`);
  else if (p.gammaPerAtomMJ > 0 && p.gammaPerAtomMJ < 0.3) w.push(`γ = ${fmt(p.gammaPerAtomMJ)} mJ mol-atoms^-1 K^-2 is below the simple-metal range 0.5–2 (common practice): semimetal, semiconductor, or a normalisation error (per atom vs per formula unit)?`);
  if (p.gammaMJ >= 100) w.push(`γ = ${fmt(p.gammaMJ)} mJ mol^-1 K^-2 is in the heavy-fermion range (≥ 100, common practice)`);
  if (p.betaMJ <= 0) w.push(`non-positive β = ${fmt(p.betaMJ)} mJ mol^-1 K^-4 is unphysical for a lattice term: Θ_D not computed`);
  else if (p.betaSigmaMJ !== null && p.betaSigmaMJ > 0.5 * p.betaMJ) w.push(`β is poorly determined (σ/β = ${fmt(p.betaSigmaMJ / p.betaMJ)}): widen the temperature window`);
  if (p.correlationGammaBeta !== undefined && Math.abs(p.correlationGammaBeta) > 0.98) {
    w.push(`|correlation(γ, β)| = ${fmt(Math.abs(p.correlationGammaBeta))} > 0.98: γ and β are not separately determined by this window`);
  }
  return w;
}

/** Warnings on quantities derived from γ and β: Θ_D range, m* / m, λ. */
export function derivedWarnings(p: PlausibilityInput): string[] {
  const w: string[] = [];
  if (p.thetaDK !== undefined && p.thetaDK < 100) w.push(`Θ_D = ${fmt(p.thetaDK)} K is below the usual ~100 K of soft metals (common practice): low-lying optical or Einstein modes, magnons, or a window past the T³ range?`);
  if (p.thetaDK !== undefined && p.thetaDK > 1000) w.push(`Θ_D = ${fmt(p.thetaDK)} K is unusually high for a metal (typical 100–500 K, common practice): is β too small, or the atoms per formula unit wrong?`);
  if (p.massRatio !== undefined && p.massRatio > 50) w.push(`m*/m = ${fmt(p.massRatio)} > 50: heavy-fermion behaviour, the free-electron comparison is only a scale`);
  if (p.massRatio !== undefined && p.massRatio > 0 && p.massRatio < 0.5) w.push(`m*/m = ${fmt(p.massRatio)} < 0.5: check the valences (electrons per formula unit) and the density`);
  if (p.lambda !== undefined && p.lambda < 0) w.push(`λ = ${fmt(p.lambda)} < 0: γ below γ_band; check that both are on the same mole basis`);
  if (p.lambda !== undefined && p.lambda > 2) w.push(`λ = ${fmt(p.lambda)} > 2: beyond the range McMillan's formula was fitted to (common practice: λ ≲ 1.5–2)`);
  return w;
}
