-- Steps stopped at the compute time budget (or the worker's memory limit), by the input hash they
-- were computed from: a later computation with the same inputs and no larger budget reports the
-- stop ("error", as the step showed it) instead of running again.
CREATE TABLE "ComputeStop" (
    "inputHash" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "budgetMs" INTEGER NOT NULL,
    "error" TEXT NOT NULL,
    "stoppedAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "ComputeStop_pkey" PRIMARY KEY ("inputHash")
);
