-- Steps stopped at the compute time budget, by the input hash they were computed from: a later
-- computation with the same inputs and no larger budget reports the stop instead of running again.
CREATE TABLE "ComputeStop" (
    "inputHash" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "budgetMs" INTEGER NOT NULL,
    "stoppedAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "ComputeStop_pkey" PRIMARY KEY ("inputHash")
);
