-- Background jobs: what the app shows about each job (progress, result, attempts).
-- The queue itself lives in the "pgboss" schema, which pg-boss creates and migrates on its own
-- start (lib/server/jobs/queue.ts); this table is ours and is written in the same transaction
-- as the queue entry when a job is enqueued.
CREATE TABLE "JobRun" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "kind" TEXT NOT NULL,
    "params" JSONB NOT NULL,
    "state" TEXT NOT NULL DEFAULT 'queued',
    "done" INTEGER NOT NULL DEFAULT 0,
    "total" INTEGER NOT NULL DEFAULT 0,
    "message" TEXT NOT NULL DEFAULT '',
    "result" JSONB,
    "error" TEXT,
    "attempts" JSONB NOT NULL DEFAULT '[]',
    "completions" INTEGER NOT NULL DEFAULT 0,
    "createdById" UUID,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "startedAt" TIMESTAMP(3),
    "finishedAt" TIMESTAMP(3),
    "updatedAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "JobRun_pkey" PRIMARY KEY ("id"),
    CONSTRAINT "JobRun_state_check" CHECK ("state" IN ('queued', 'running', 'done', 'failed')),
    CONSTRAINT "JobRun_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE
);

CREATE INDEX "JobRun_groupId_createdAt_idx" ON "JobRun"("groupId", "createdAt" DESC);
