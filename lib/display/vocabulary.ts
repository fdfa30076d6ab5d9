/**
 * One vocabulary for display: the names and symbols people read for every quantity, model
 * parameter, model, step kind, revision state and action. Screens, exports and the PDF all go
 * through these tables, so no internal key ("thetaD", "electronDensity", "revision.replace")
 * reaches a reader. Symbols are light markup (lib/display/typeset.ts). Model parameters take
 * their symbol and name from the engine's own specs (lib/engine/models).
 *
 * tests/display/vocabulary.test.ts iterates the engine's registries and the audit actions in
 * the server's source, so a new key without an entry here fails.
 */
import { MODELS } from "../engine/models";
import type { StepKind } from "../engine/notebook/types";
import { plainSymbol } from "./typeset";

export interface Term {
  /** Symbol as markup ("Θ_D"); absent for things that have none. */
  readonly symbol?: string;
  /** Name in words, lower case unless a proper name ("Debye temperature"). */
  readonly label: string;
}

/** Derived and measured quantities, by the engine's `Quantity.name`. */
export const QUANTITIES: Readonly<Record<string, Term>> = Object.freeze({
  gamma: { symbol: "γ", label: "Sommerfeld coefficient" },
  beta: { symbol: "β", label: "lattice T³ coefficient" },
  thetaD: { symbol: "Θ_D", label: "Debye temperature" },
  crossoverT: { symbol: "T*", label: "crossover temperature (γT = βT³)" },
  dosEF: { symbol: "D(E_F)", label: "density of states at the Fermi level" },
  electronDensity: { symbol: "n", label: "conduction-electron density" },
  fermiWavevector: { symbol: "k_F", label: "Fermi wavevector" },
  fermiEnergy: { symbol: "E_F", label: "Fermi energy" },
  fermiTemperature: { symbol: "T_F", label: "Fermi temperature" },
  fermiVelocity: { symbol: "v_F", label: "Fermi velocity" },
  rsOverA0: { symbol: "r_s/a_0", label: "Wigner–Seitz radius in Bohr radii" },
  gammaFree: { symbol: "γ_free", label: "free-electron Sommerfeld coefficient" },
  electronicToClassical: { symbol: "C_el/(3/2 zR)", label: "electronic to classical heat capacity" },
  massRatio: { symbol: "m*/m", label: "thermal effective-mass ratio" },
  lambda: { symbol: "λ", label: "mass-enhancement parameter" },
  lambdaMcMillan: { symbol: "λ (McMillan)", label: "electron–phonon coupling from T_c" },
  tcMcMillan: { symbol: "T_c (McMillan)", label: "transition temperature predicted by McMillan’s formula" },
  wilsonRatio: { symbol: "R_W", label: "Wilson ratio" },
  kadowakiWoods: { symbol: "A/γ²", label: "Kadowaki–Woods ratio" },
  tc: { symbol: "T_c", label: "transition temperature" },
  deltaC: { symbol: "ΔC", label: "heat-capacity jump at T_c" },
  jumpRatio: { symbol: "ΔC/(γ_n T_c)", label: "normalised jump" },
  jumpRatioSuperconductingPart: { symbol: "ΔC/((γ_n − γ_r) T_c)", label: "normalised jump of the superconducting part" },
  gammaResidual: { symbol: "γ_r", label: "residual Sommerfeld coefficient" },
  nonSuperconductingFraction: { symbol: "γ_r/γ_n", label: "non-superconducting fraction" },
  entropyBelowTmin: { symbol: "S(T_min)", label: "entropy below the lowest measured temperature" },
  enthalpyBelowTmin: { symbol: "H(T_min) − H(0)", label: "enthalpy below the lowest measured temperature" },
  reducedChiSquare: { symbol: "χ²_red", label: "reduced chi-square" },
  residualStd: { symbol: "s_res", label: "residual standard deviation" },
  hc2: { symbol: "H_c2", label: "upper critical field" },
});

/** Fit-model parameters, by spec name, from the engine's specs (first spec of a name wins). */
export const PARAMETERS: Readonly<Record<string, Term>> = Object.freeze(
  Object.fromEntries(Object.values(MODELS).flatMap((m) => m.parameters).reverse().map((p) => [p.name, { symbol: p.symbol, label: p.label }])),
);

/** Models as a reader names them: the physics, then the formula. */
export const MODEL_LABELS: Readonly<Record<string, string>> = Object.freeze({
  sommerfeld: "Sommerfeld–Debye (γT + βT³)",
  "sommerfeld-t5": "Sommerfeld–Debye with T⁵ dispersion (γT + βT³ + δT⁵)",
  "sommerfeld-t7": "Sommerfeld–Debye with T⁵ and T⁷ terms (γT + βT³ + δT⁵ + εT⁷)",
  nuclear: "Sommerfeld–Debye with a nuclear tail (γT + βT³ + A_N/T²)",
  magnon: "Sommerfeld–Debye with ferromagnetic magnons (γT + βT³ + BT^{3/2})",
  debye: "electronic term and full Debye lattice (γT + C_D(T; Θ_D))",
  einstein: "Sommerfeld–Debye with Einstein modes (γT + βT³ + n_E C_E(T; Θ_E))",
  schottky: "Sommerfeld–Debye with a two-level Schottky term",
  bcs: "BCS-like exponential (γ_n T_c a exp(−b T_c/T) + βT³)",
  "alpha-model": "α-model superconductor with lattice term (α-model + βT³)",
  expression: "user-defined expression",
});

/** Notebook step kinds. */
export const STEP_KINDS: Readonly<Record<StepKind, Term>> = Object.freeze({
  data: { label: "Data" },
  addenda: { label: "Addenda subtraction" },
  normalise: { label: "Normalisation per mole" },
  fit: { label: "Fit" },
  "joint-fit": { label: "Joint fit across fields" },
  derive: { label: "Derived quantities" },
  transition: { label: "Superconducting transition" },
  "gamma-field": { label: "Sommerfeld coefficient against field" },
  entropy: { label: "Entropy and enthalpy" },
  lattice: { label: "Lattice views" },
  note: { label: "Note" },
});

/** Revision states (keys as stored; lib/server/review/states.ts). */
export const REVISION_STATES: Readonly<Record<"open" | "in_review" | "returned" | "sealed" | "replaced", Term>> = Object.freeze({
  open: { label: "Drafting" },
  in_review: { label: "With reviewer" },
  returned: { label: "Changes requested" },
  sealed: { label: "Sealed" },
  replaced: { label: "Superseded" },
});

/** Review actions (buttons). */
export const REVIEW_ACTIONS: Readonly<Record<"submit" | "withdraw" | "return" | "approve" | "resubmit", Term>> = Object.freeze({
  submit: { label: "Send for review" },
  withdraw: { label: "Take back from review" },
  return: { label: "Ask for changes" },
  approve: { label: "Approve and seal" },
  resubmit: { label: "Send back for review" },
});

/** Audit actions as a phrase after the actor's name ("Rosa sent a revision for review"). */
export const ACTIVITY_ACTIONS: Readonly<Record<string, Term>> = Object.freeze({
  "user.signup": { label: "signed up" },
  "group.create": { label: "created the group" },
  "group.settings": { label: "changed the group settings" },
  "member.invite": { label: "invited" },
  "member.invite.revoke": { label: "revoked an invitation" },
  "member.join": { label: "joined the group" },
  "member.role": { label: "changed a member’s role" },
  "member.remove": { label: "removed a member" },
  "member.leave": { label: "left the group" },
  "sample.create": { label: "added sample" },
  "sample.update": { label: "edited sample" },
  "sample.archive": { label: "archived sample" },
  "sample.restore": { label: "restored sample" },
  "measurement.import": { label: "stored measurement" },
  "analysis.create": { label: "started an analysis" },
  "analysis.rename": { label: "renamed an analysis" },
  "analysis.duplicate": { label: "duplicated an analysis" },
  "analysis.archive": { label: "archived an analysis" },
  "analysis.restore": { label: "restored an analysis" },
  "step.add": { label: "added a notebook step" },
  "step.update": { label: "changed a notebook step" },
  "step.remove": { label: "removed a notebook step" },
  "step.move": { label: "moved a notebook step" },
  "thread.create": { label: "opened a discussion" },
  "comment.create": { label: "commented" },
  "thread.resolve": { label: "resolved a discussion" },
  "thread.reopen": { label: "reopened a discussion" },
  "revision.submit": { label: "sent a revision for review" },
  "revision.withdraw": { label: "took a revision back from review" },
  "revision.return": { label: "asked for changes to a revision" },
  "revision.approve": { label: "approved and sealed a revision" },
  "revision.resubmit": { label: "sent a revision back for review" },
  "revision.replace": { label: "superseded a sealed revision" },
  "revision.revise": { label: "started a new revision" },
  "series.create": { label: "created the series" },
  "series.update": { label: "edited the series" },
  "series.members.add": { label: "added samples to the series" },
  "series.members.remove": { label: "removed samples from the series" },
  "token.create": { label: "created an API token" },
  "token.revoke": { label: "revoked an API token" },
  "token.renew": { label: "renewed an API token" },
});

/** Step configuration fields (the step schemas' keys, and keys nested in them), as markup. */
export const CONFIG_FIELDS: Readonly<Record<string, Term>> = Object.freeze({
  measurementIds: { label: "measurements" },
  measurementId: { label: "measurement" },
  tMinK: { label: "lower window edge T_min (K)" },
  tMaxK: { label: "upper window edge T_max (K)" },
  excluded: { label: "points left out" },
  index: { label: "point" },
  reason: { label: "reason" },
  addendaMeasurementId: { label: "addenda measurement" },
  method: { label: "interpolation of the addenda" },
  smoothingDegree: { label: "smoothing degree" },
  outsideRange: { label: "outside the addenda range" },
  per: { label: "per mole of" },
  massMg: { label: "sample mass (mg)" },
  model: { label: "model" },
  expression: { label: "model expression" },
  weighting: { label: "weighting" },
  scaleErrors: { label: "errors scaled by √χ²_red" },
  fixed: { label: "parameters held fixed" },
  start: { label: "starting values" },
  scan: { label: "window scan" },
  compare: { label: "models compared" },
  fitStepId: { label: "fit used" },
  basis: { label: "basis" },
  densityGPerCm3: { label: "density (g cm⁻³)" },
  valences: { label: "valences" },
  gammaBandMJ: { label: "band-structure γ (mJ mol⁻¹ K⁻²)" },
  muStar: { label: "μ*" },
  tcK: { label: "measured T_c (K)" },
  chi: { label: "susceptibility χ" },
  kwA: { label: "resistivity coefficient A" },
  normalFitStepId: { label: "normal-state fit" },
  normalState: { label: "normal state" },
  window: { label: "construction window" },
  tLowK: { label: "lower edge (K)" },
  tHighK: { label: "upper edge (K)" },
  markdown: { label: "text" },
  value: { label: "value" },
  stdError: { label: "standard error" },
  unit: { label: "unit" },
});

/** "excluded[1].reason" → "points left out › 2 › reason" (markup); "(config)" → "settings". */
export function configPathLabel(path: string): string {
  if (path === "(config)") return "settings";
  return path.split(/\.|(?=\[)/).map((seg) => {
    const idx = /^\[(\d+)\]$/.exec(seg);
    if (idx) return String(Number(idx[1]) + 1);
    return (Object.hasOwn(CONFIG_FIELDS, seg) ? CONFIG_FIELDS[seg]!.label : undefined) ?? term(seg).symbol ?? words(seg);
  }).join(" › ");
}

/** A result key of the revision diff, "derive#1:thetaD" → "Derived quantities" (the step, numbered when repeated). */
export function stepRefLabel(ref: string): string {
  const m = /^([a-z][a-z-]*)#(\d+)$/.exec(ref);
  if (!m) return words(ref);
  return `${stepKindLabel(m[1]!)}${m[2] !== "1" ? ` ${m[2]}` : ""}`;
}

/** Fallback for a key with no entry: its words split from camelCase/dots/underscores, never the key as is. */
function words(key: string): string {
  return key.replace(/([a-z])([A-Z])/g, "$1 $2").replace(/[._#-]+/g, " ").toLowerCase().trim();
}

/** Symbol markup and label of a quantity or parameter by its key (quantities first). */
export function term(key: string): Term {
  return (Object.hasOwn(QUANTITIES, key) ? QUANTITIES[key] : Object.hasOwn(PARAMETERS, key) ? PARAMETERS[key] : undefined) ?? { label: words(key) };
}

/** Symbol markup of a quantity or parameter, else its label. */
export function symbolOf(key: string): string {
  const t = term(key);
  return t.symbol ?? t.label;
}

/** Plain-text symbol ("ΘD" for thetaD) where no markup is possible. */
export function plainSymbolOf(key: string): string {
  return plainSymbol(symbolOf(key));
}

/** "Sommerfeld–Debye (γT + βT³)" for "sommerfeld". */
export function modelLabel(name: string): string {
  return (Object.hasOwn(MODEL_LABELS, name) ? MODEL_LABELS[name] : undefined) ?? (Object.hasOwn(MODELS, name) ? MODELS[name]!.title : words(name));
}

export function stepKindLabel(kind: string): string {
  return (Object.hasOwn(STEP_KINDS, kind) ? STEP_KINDS[kind as StepKind].label : undefined) ?? words(kind);
}

/** "Fit (step 3)" for a step reference such as "fit#3" or a kind and position (0-based). */
export function stepName(kind: string, position: number): string {
  return `${stepKindLabel(kind)} (step ${position + 1})`;
}

export function stateLabel(state: string): string {
  return (Object.hasOwn(REVISION_STATES, state) ? REVISION_STATES[state as keyof typeof REVISION_STATES].label : undefined) ?? words(state);
}

export function reviewActionLabel(action: string): string {
  return (Object.hasOwn(REVIEW_ACTIONS, action) ? REVIEW_ACTIONS[action as keyof typeof REVIEW_ACTIONS].label : undefined) ?? words(action);
}

export function activityLabel(action: string): string {
  return (Object.hasOwn(ACTIVITY_ACTIONS, action) ? ACTIVITY_ACTIONS[action]!.label : undefined) ?? words(action);
}
