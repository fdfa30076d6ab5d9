/** Window robustness: window scans with plateau detection, and model comparison by AICc. */
export { scanWindows, type ScanOptions, type ScanCell, type ScanResult } from "./scanWindows";
export { compareModels, type ModelComparisonRow } from "./compareModels";
export { findPlateau, type Plateau, type PlateauCell } from "./plateau";
export { quantileEdges } from "./grid";
export { solveWindowsByUpdating, type WindowSpan, type WindowSolution } from "./updating";
export { weightedRows, type WeightedRows } from "./weightedRows";
export { recommendFit, systematicSpread, DEFAULT_CANDIDATES, MIN_ACCEPTABLE, type RecommendOptions, type Recommendation, type CandidateScan, type ModelChoiceRow, type WindowRef } from "./recommend";
export type { CandidateCell } from "./candidateCell";
export { testWindow, DEFAULT_TEST_LEVEL, type WindowTests } from "./windowTests";
export { chiSquareSurvival, upperRegularizedGamma, logGamma } from "./tail";
export { formatStatSyst } from "./statSyst";
export { gapCandidateCells, schottkyGapDerivative, gapGrid, PEAK_LIMIT } from "./gapCandidate";
export { minimizeBrent } from "./brent";
export { departures, missingTermText, type Departure } from "./diagnose";
