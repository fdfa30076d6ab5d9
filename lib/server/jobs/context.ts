/** What a job handler gets from the worker: the database, the job's group and actor, progress. */
import type { Db } from "../db/client";

export interface JobContext {
  db: Db;
  jobId: string;
  groupId: string;
  actorId: string;
  /** Store progress where the app reads it (JobRun.done/total/message). */
  progress(done: number, total: number, message: string): Promise<void>;
  /** Wait between units of work (HEATBOOK_JOB_PAUSE_MS; 0 by default, the crash tests slow jobs down with it). */
  pause(): Promise<void>;
}
