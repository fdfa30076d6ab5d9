/**
 * Background jobs on a PostgreSQL-backed queue (pg-boss): heavy recomputations that the app
 * enqueues and `npm run worker` processes drain.
 *
 *   enqueueJob(db, member, body)   validate, authorise (owner/analyst), JobRun row + queue entry in one transaction
 *   listRuns / getRun              progress and results, for the status routes and the jobs panel
 *   startWorker(opts)              a worker's loop (scripts/worker.ts)
 *   runRefitSeries, runWindowScan  the job kinds
 */
export { enqueueJob, enqueueSchema, type EnqueueInput } from "./enqueue";
export { listJobs, jobStatus } from "./status";
export { listRuns, getRun, runById, jobPool, closeJobPool, type JobView, type JobState, type JobAttempt } from "./runs";
export { startWorker, type WorkerOptions, type RunningWorker } from "./worker";
export { runRefitSeries, refitTargets, type RefitSummary, type RefitTarget } from "./refitSeries";
export { runWindowScan, type WindowScanParams, type WindowScanSummary } from "./windowScan";
export { JOB_KINDS, startBoss, appQueue, queueSettings, type JobKind, type QueueSettings } from "./queue";
export type { JobContext } from "./context";
