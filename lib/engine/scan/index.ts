/** Window robustness: window scans with plateau detection, and model comparison by AICc. */
export { scanWindows, type ScanOptions, type ScanCell, type ScanResult } from "./scanWindows";
export { compareModels, type ModelComparisonRow } from "./compareModels";
export { findPlateau, type Plateau, type PlateauCell } from "./plateau";
export { quantileEdges } from "./grid";
export { solveWindowsByUpdating, type WindowSpan, type WindowSolution } from "./updating";
export { weightedRows, type WeightedRows } from "./weightedRows";
