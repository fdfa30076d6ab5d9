/**
 * Review and lock: the state machine (pure table), transitions with decisions, notices and audit,
 * sealing with a canonical snapshot and content hash, verification, revisions and their diffs,
 * queues, notices, and the report of a sealed revision.
 *
 *   checkTransition(req)                          the table's verdict for one request (pure)
 *   reviewTransition(db, member, aId, rId, input) submit | withdraw | return | approve | resubmit
 *   reviseSealed(db, member, analysisId)          new open revision from the sealed one
 *   verifyRevision(db, member, aId, rId)          hash + file checksums + engine re-run, per step
 *   diffRevisions(db, member, aId, bId)           step/config changes and result moves
 *   awaitingMyReview / sentBackToMe               queues
 *   listNotices / setNoticeRead / markAllNoticesRead
 *   reviewStatus(db, member, analysisId)          revisions, decisions, lock, allowed actions
 *   lockViolation(err)                            a database lock refusal as ConflictError
 *   listAuditEvents(db, member, opts)             the group's audit trail (owners)
 *   buildReport / renderReportPdf                 the report object of a sealed revision, and its PDF
 */
export { checkTransition, availableActions, TRANSITIONS, REVIEW_ACTIONS, SUPERSEDE } from "./states";
export type { RevisionState, ReviewAction, TransitionRule, TransitionRequest, TransitionVerdict } from "./states";
export { reviewTransition, transitionSchema, type TransitionResult } from "./transitions";
export { reviseSealed, supersedeSealed, remapIds, type NewRevision } from "./supersede";
export { buildSnapshot, readinessProblems, SNAPSHOT_FORMAT } from "./snapshot";
export type { RevisionSnapshot, SnapshotMeasurement, SnapshotStep } from "./snapshot";
export { verifyRevision, reproduceSnapshot, contextFromSnapshot, CROSS_VERSION_TOLERANCE, type VerifyReport, type StepVerification } from "./verify";
export { compareJson, type Comparison } from "./compare";
export { diffRevisions, configChanges, type RevisionDiff, type StepDiff, type ResultMove, type FieldChange } from "./diff";
export { stepResults, chainResults, type ResultValue } from "./results";
export { awaitingMyReview, sentBackToMe, type QueueItem, type ReturnedItem } from "./queues";
export { queueFigures, type QueueFigures } from "./queueFigures";
export { listNotices, setNoticeRead, markAllNoticesRead, sendNotices, type NoticeView } from "./notices";
export { reviewStatus, type ReviewStatus } from "./status";
export { lockViolation, isLockViolation } from "./lockError";
export { listAuditEvents, type AuditEventView } from "./auditLog";
export { buildReport, reportFromSnapshot, SAFETY_SENTENCE, type RevisionReport, type ReportValue } from "./report";
export { renderReportPdf } from "./pdf";
