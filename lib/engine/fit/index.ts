/** Fitting: Levenberg–Marquardt, separable global starts, the shared fit core, general regression and the result type. */
export { levenbergMarquardt } from "./lm";
export { weightedJacobian, weightedResiduals, type LeastSquaresProblem, type LevenbergMarquardtOptions, type LevenbergMarquardtResult } from "./problem";
export { fitCore, type ModelCore, type CoreOptions } from "./core";
export { fitCurve, expressionCore, checkSeries, type FitCurveOptions } from "./curve";
export { buildFitResult, type FitResult, type FitParameter, type NamedMatrix } from "./result";
export { fitHeatCapacity, registryCore, type HeatCapacityInput, type HeatCapacityFitOptions, type HeatCapacityFitResult, type FitWindow } from "./heatCapacity";
export { heatCapacityWarnings, type WarningContext } from "./warnings";
export { runsTest, type RunsTestResult } from "./runsTest";
export { applyWeighting, describeQuality, type WeightingChoice, type AppliedWeighting } from "./weighting";
export { fitGlobal, multiStartThetas, type GlobalSearch } from "./global";
export { solveAmplitudes, projected, gridSearch, reducedFit, type SeparableProblem, type Candidate, type Axis } from "./separable";
export { fitExpression, fitSeparableCore, searchBudget, localFitLimit, type SeparableCore } from "./expressionFit";
export { fitJoint, MAX_MEASUREMENTS, MAX_JOINT_PARAMETERS, MAX_JACOBIAN_ENTRIES, type JointMeasurement, type JointFitOptions, type JointParameter, type JointFitResult, type JointMeasurementResult } from "./joint";
export { JOINT_MODELS, compileJointExpression, type JointModelSpec, type JointParameterSpec, type JointRangeData } from "./jointModels";
