/**
 * Notebooks on the server: analyses and their revisions, the chain of steps (edited with
 * optimistic concurrency), server-side computation cached by input hash, discussion threads,
 * and change notices over PostgreSQL LISTEN/NOTIFY.
 */
export { listAnalyses, createAnalysis, renameAnalysis, setAnalysisArchived, duplicateAnalysis, openNotebook, notebookJson, editableRevision, EDITABLE_STATES } from "./analyses";
export type { AnalysisSummary, RevisionInfo, NotebookView, RevisionStateName } from "./analyses";
export { addStep, updateStep, removeStep, moveStep } from "./steps";
export { computeRevisionSteps, type StepView, type StoredOutput, type ComputeResult } from "./compute";
export { loadContext, loadSample, loadMeasurements, inputHashes, referencedMeasurements } from "./context";
export { listThreads, createThread, replyToThread, setThreadState, mentionedHandles, type ThreadView, type CommentView } from "./threads";
export { notify, EVENT_CHANNEL, type NotebookEvent } from "./events";
