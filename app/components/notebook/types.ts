/**
 * What the notebook page's client components receive (JSON from the server; see
 * lib/server/notebook). Structural copies so no server module is imported into the browser.
 */
import type { RevisionState } from "./display";

export interface StepOutputView {
  kind: string;
  ok: boolean;
  error: string | null;
  /** The configuration field at fault when the step was not computed (a schema key, dotted). */
  field?: string | null;
  warnings: string[];
  result: unknown;
}

export interface StepView {
  id: string;
  position: number;
  kind: string;
  title: string;
  config: Record<string, unknown>;
  version: number;
  output: StepOutputView | null;
  inputHash: string;
  fresh: boolean;
  engineVersion: string | null;
  computedAt: string | null;
  updatedAt: string;
}

export interface RevisionView {
  id: string;
  number: number;
  state: RevisionState;
  version: number;
  basedOnId: string | null;
  contentHash: string | null;
  submittedAt: string | null;
  sealedAt: string | null;
  sealedBy: string | null;
  createdAt: string;
}

export interface NotebookData {
  analysis: { id: string; title: string; sampleId: string; sampleLabel: string; archived: boolean };
  revision: RevisionView;
  revisions: RevisionView[];
  editable: boolean;
  steps: StepView[];
  computeMillis: number;
  /** The server answered before the computation ended; a live event follows when it does. */
  computing?: boolean;
  /** Sealed revisions whose stored snapshot no longer matches its content hash: why nothing is shown. */
  sealProblem?: string | null;
}

export interface Anchor {
  plot: string;
  xMin: number;
  xMax: number;
  yMin?: number;
  yMax?: number;
  points?: { measurementId: string; index: number }[];
}

export interface ThreadData {
  id: string;
  stepId: string | null;
  anchor: Anchor | null;
  state: "open" | "resolved";
  createdAt: string;
  resolvedAt: string | null;
  comments: { id: string; authorId: string; authorName: string; body: string; createdAt: string }[];
}

export interface ModelInfo {
  name: string;
  title: string;
  formula: string;
  parameters: { name: string; displayUnit: string; displayFactor: number; description: string; symbol?: string; defaultShared?: boolean }[];
}

export interface MeasurementChoice {
  id: string;
  label: string;
  kind: "sample" | "addenda";
  fieldT: number;
  basis: "sample" | "molar" | "specific";
  pointCount: number;
  tMinK: number;
  tMaxK: number;
}

/** Everything a step card needs besides its own step. */
export interface NotebookContext {
  slug: string;
  apiBase: string;
  analysisId: string;
  editable: boolean;
  canComment: boolean;
  models: ModelInfo[];
  /** Models for fits across fields (joint fit step). */
  jointModels: ModelInfo[];
  measurements: MeasurementChoice[];
  steps: StepView[];
  revisionVersion: number;
  revisionId: string;
  threads: ThreadData[];
  refresh: () => Promise<void>;
  startThread: (stepId: string | null, anchor: Anchor | null) => void;
  /** Members by @handle, for mention completion. */
  mentionables: { handle: string; name: string }[];
}
