/** Derived quantities from γ and β: one module per concept, composed by deriveAll. */
export type { Measured } from "./measured";
export { checkMeasured, MILLI_PER_UNIT } from "./measured";
export { thetaDFromBeta, betaFromThetaD, debyeTemperature } from "./debye";
export { gammaPerDosFactor, dosFromGamma, gammaFromDos, densityOfStates } from "./dos";
export type { MassDensityInput, LatticeInput, CubicOrHexagonal } from "./electronDensity";
export { electronDensityFromMassDensity, electronDensityFromLattice, conventionalCellVolume, ATOMS_PER_CONVENTIONAL_CELL } from "./electronDensity";
export type { FreeElectronGas } from "./freeElectron";
export { freeElectronGas, gammaFree, electronicToClassicalRatio } from "./freeElectron";
export { thermalMassRatio } from "./effectiveMass";
export { lambdaFromBandGamma, mcMillanTc, lambdaFromMcMillan, mcMillanTcQuantity, lambdaFromMcMillanQuantity } from "./coupling";
export type { MolarSusceptibilityUnit } from "./magnetic";
export { molarSusceptibilitySI, wilsonRatio, kadowakiWoodsRatio, KADOWAKI_WOODS_UNIVERSAL } from "./magnetic";
export type { PlausibilityInput } from "./plausibility";
export { coefficientWarnings, derivedWarnings } from "./plausibility";
export type { FreeElectronSource, LatticeSpec } from "./deriveFreeElectron";
export type { CouplingInput, MagneticInput } from "./deriveCoupling";
export type { MoleBasis, FormulaInfo, DeriveInput, DerivedResult } from "./deriveAll";
export { deriveAll } from "./deriveAll";
