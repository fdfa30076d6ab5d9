/**
 * Corrections: addenda subtraction and normalisation to molar heat capacity.
 *
 *   subtractAddenda(sample, addenda, options)   C_net = C_total − C_addenda(T), σ propagated, never extrapolated
 *   normalise(data, options)                    J/K → J/(mol K) per mole formula unit or of atoms
 *   molarToSample(data, options)                J/(mol K) → J/K (reverse)
 *   changeMolarBasis(data, to, r)               per f.u. ↔ per atom
 *   specificToMolar(data, options)              J/(kg K) → J/(mol K)
 *   fitSmoothing / evaluateSmoothing            the addenda smoothing polynomial on its own
 */
export { subtractAddenda } from "./subtract";
export type { AddendaOptions, AddendaResult } from "./subtract";
export { changeMolarBasis, molarToSample, normalise, specificToMolar } from "./normalise";
export type { NormaliseOptions, NormalisedResult } from "./normalise";
export { evaluateSmoothing, fitSmoothing } from "./smooth";
export type { PolynomialSmoothing, SmoothingAbscissa } from "./smooth";
export { interpolateLinear, sortCurve } from "./interpolate";
export type { SortedCurve } from "./interpolate";
export type { MolarBasis, MolarCurve, Provenance, SampleCurve } from "./types";
