-- CreateEnum
CREATE TYPE "Role" AS ENUM ('owner', 'analyst', 'reviewer', 'viewer');
CREATE TYPE "MeasurementKind" AS ENUM ('sample', 'addenda');
CREATE TYPE "HeatCapacityBasis" AS ENUM ('sample', 'molar', 'specific');
CREATE TYPE "RevisionState" AS ENUM ('open', 'in_review', 'returned', 'sealed', 'replaced');
CREATE TYPE "ThreadState" AS ENUM ('open', 'resolved');
CREATE TYPE "TokenScope" AS ENUM ('read', 'read_write');

-- CreateTable
CREATE TABLE "User" (
    "id" UUID NOT NULL,
    "email" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "passwordHash" TEXT,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "User_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "SignInAttempt" (
    "id" BIGSERIAL NOT NULL,
    "email" TEXT NOT NULL,
    "ip" TEXT NOT NULL,
    "succeeded" BOOLEAN NOT NULL,
    "at" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "SignInAttempt_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Group" (
    "id" UUID NOT NULL,
    "name" TEXT NOT NULL,
    "slug" TEXT NOT NULL,
    "allowSelfApproval" BOOLEAN NOT NULL DEFAULT false,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Group_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Membership" (
    "id" UUID NOT NULL,
    "userId" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "role" "Role" NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Membership_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Invitation" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "email" TEXT NOT NULL,
    "role" "Role" NOT NULL,
    "tokenHash" TEXT NOT NULL,
    "invitedById" UUID NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "expiresAt" TIMESTAMP(3) NOT NULL,
    "acceptedAt" TIMESTAMP(3),
    "acceptedById" UUID,
    "revokedAt" TIMESTAMP(3),
    CONSTRAINT "Invitation_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Sample" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "label" TEXT NOT NULL,
    "formula" TEXT NOT NULL,
    "molarMassGPerMol" DOUBLE PRECISION NOT NULL,
    "atomsPerFormulaUnit" DOUBLE PRECISION NOT NULL,
    "massMg" DOUBLE PRECISION,
    "densityGPerCm3" DOUBLE PRECISION,
    "latticeJson" JSONB,
    "valences" JSONB NOT NULL DEFAULT '{}',
    "compositionVariable" TEXT,
    "compositionValue" DOUBLE PRECISION,
    "seriesLabel" TEXT,
    "notes" TEXT NOT NULL DEFAULT '',
    "tags" TEXT[] DEFAULT ARRAY[]::TEXT[],
    "archivedAt" TIMESTAMP(3),
    "createdById" UUID,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    "version" INTEGER NOT NULL DEFAULT 1,
    CONSTRAINT "Sample_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "StoredFile" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "fileName" TEXT NOT NULL,
    "mediaType" TEXT NOT NULL DEFAULT 'text/plain',
    "sizeBytes" INTEGER NOT NULL,
    "sha256" TEXT NOT NULL,
    "bytes" BYTEA NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "StoredFile_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Measurement" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "sampleId" UUID NOT NULL,
    "fileId" UUID NOT NULL,
    "kind" "MeasurementKind" NOT NULL,
    "label" TEXT NOT NULL,
    "fieldT" DOUBLE PRECISION NOT NULL DEFAULT 0,
    "notes" TEXT NOT NULL DEFAULT '',
    "columnMapping" JSONB NOT NULL,
    "units" JSONB NOT NULL,
    "basis" "HeatCapacityBasis" NOT NULL,
    "pointCount" INTEGER NOT NULL,
    "tMinK" DOUBLE PRECISION NOT NULL,
    "tMaxK" DOUBLE PRECISION NOT NULL,
    "temperatureK" BYTEA NOT NULL,
    "heatCapacity" BYTEA NOT NULL,
    "sigma" BYTEA,
    "fieldPointsT" BYTEA,
    "sourceLines" BYTEA NOT NULL,
    "createdById" UUID,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "archivedAt" TIMESTAMP(3),
    CONSTRAINT "Measurement_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Analysis" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "sampleId" UUID NOT NULL,
    "title" TEXT NOT NULL,
    "archivedAt" TIMESTAMP(3),
    "createdById" UUID,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Analysis_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "AnalysisRevision" (
    "id" UUID NOT NULL,
    "analysisId" UUID NOT NULL,
    "number" INTEGER NOT NULL,
    "state" "RevisionState" NOT NULL DEFAULT 'open',
    "basedOnId" UUID,
    "submittedById" UUID,
    "submittedAt" TIMESTAMP(3),
    "sealedById" UUID,
    "sealedAt" TIMESTAMP(3),
    "contentHash" TEXT,
    "snapshot" JSONB,
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdById" UUID,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "AnalysisRevision_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Step" (
    "id" UUID NOT NULL,
    "revisionId" UUID NOT NULL,
    "position" INTEGER NOT NULL,
    "kind" TEXT NOT NULL,
    "title" TEXT NOT NULL DEFAULT '',
    "config" JSONB NOT NULL,
    "version" INTEGER NOT NULL DEFAULT 1,
    "inputHash" TEXT,
    "output" JSONB,
    "engineVersion" TEXT,
    "computedAt" TIMESTAMP(3),
    "updatedById" UUID,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Step_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "ReviewDecision" (
    "id" UUID NOT NULL,
    "revisionId" UUID NOT NULL,
    "reviewerId" UUID NOT NULL,
    "decision" TEXT NOT NULL,
    "comment" TEXT NOT NULL DEFAULT '',
    "at" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "ReviewDecision_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Thread" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "analysisId" UUID NOT NULL,
    "stepId" UUID,
    "anchor" JSONB,
    "state" "ThreadState" NOT NULL DEFAULT 'open',
    "createdById" UUID NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "resolvedAt" TIMESTAMP(3),
    CONSTRAINT "Thread_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Comment" (
    "id" UUID NOT NULL,
    "threadId" UUID NOT NULL,
    "authorId" UUID NOT NULL,
    "body" TEXT NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Comment_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Notice" (
    "id" UUID NOT NULL,
    "userId" UUID NOT NULL,
    "groupId" UUID,
    "kind" TEXT NOT NULL,
    "message" TEXT NOT NULL,
    "link" TEXT NOT NULL DEFAULT '',
    "readAt" TIMESTAMP(3),
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Notice_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "AuditEvent" (
    "id" BIGSERIAL NOT NULL,
    "groupId" UUID,
    "actorId" UUID,
    "at" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "action" TEXT NOT NULL,
    "objectType" TEXT NOT NULL,
    "objectId" TEXT NOT NULL,
    "beforeHash" TEXT,
    "afterHash" TEXT,
    "detail" JSONB NOT NULL DEFAULT '{}',
    "prevHash" TEXT NOT NULL,
    "hash" TEXT NOT NULL,
    CONSTRAINT "AuditEvent_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Series" (
    "id" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "name" TEXT NOT NULL,
    "compositionVariable" TEXT NOT NULL DEFAULT 'x',
    "description" TEXT NOT NULL DEFAULT '',
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Series_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "SeriesMember" (
    "seriesId" UUID NOT NULL,
    "sampleId" UUID NOT NULL,
    CONSTRAINT "SeriesMember_pkey" PRIMARY KEY ("seriesId","sampleId")
);

CREATE TABLE "ApiToken" (
    "id" UUID NOT NULL,
    "userId" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "name" TEXT NOT NULL,
    "prefix" TEXT NOT NULL,
    "tokenHash" TEXT NOT NULL,
    "scope" "TokenScope" NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "lastUsedAt" TIMESTAMP(3),
    "revokedAt" TIMESTAMP(3),
    CONSTRAINT "ApiToken_pkey" PRIMARY KEY ("id")
);

-- CreateIndex
CREATE UNIQUE INDEX "User_email_key" ON "User"("email");
CREATE INDEX "SignInAttempt_email_at_idx" ON "SignInAttempt"("email", "at");
CREATE INDEX "SignInAttempt_ip_at_idx" ON "SignInAttempt"("ip", "at");
CREATE UNIQUE INDEX "Group_slug_key" ON "Group"("slug");
CREATE INDEX "Membership_groupId_idx" ON "Membership"("groupId");
CREATE UNIQUE INDEX "Membership_userId_groupId_key" ON "Membership"("userId", "groupId");
CREATE UNIQUE INDEX "Invitation_tokenHash_key" ON "Invitation"("tokenHash");
CREATE INDEX "Invitation_groupId_idx" ON "Invitation"("groupId");
CREATE INDEX "Sample_groupId_archivedAt_idx" ON "Sample"("groupId", "archivedAt");
CREATE INDEX "StoredFile_groupId_idx" ON "StoredFile"("groupId");
CREATE INDEX "Measurement_groupId_sampleId_idx" ON "Measurement"("groupId", "sampleId");
CREATE INDEX "Analysis_groupId_sampleId_idx" ON "Analysis"("groupId", "sampleId");
CREATE UNIQUE INDEX "AnalysisRevision_analysisId_number_key" ON "AnalysisRevision"("analysisId", "number");
CREATE INDEX "Step_revisionId_position_idx" ON "Step"("revisionId", "position");
CREATE INDEX "Thread_analysisId_idx" ON "Thread"("analysisId");
CREATE INDEX "Comment_threadId_idx" ON "Comment"("threadId");
CREATE INDEX "Notice_userId_readAt_idx" ON "Notice"("userId", "readAt");
CREATE UNIQUE INDEX "AuditEvent_hash_key" ON "AuditEvent"("hash");
CREATE INDEX "AuditEvent_groupId_at_idx" ON "AuditEvent"("groupId", "at");
CREATE UNIQUE INDEX "Series_groupId_name_key" ON "Series"("groupId", "name");
CREATE UNIQUE INDEX "ApiToken_tokenHash_key" ON "ApiToken"("tokenHash");

-- AddForeignKey
ALTER TABLE "Membership" ADD CONSTRAINT "Membership_userId_fkey" FOREIGN KEY ("userId") REFERENCES "User"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Membership" ADD CONSTRAINT "Membership_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Invitation" ADD CONSTRAINT "Invitation_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Invitation" ADD CONSTRAINT "Invitation_invitedById_fkey" FOREIGN KEY ("invitedById") REFERENCES "User"("id") ON DELETE RESTRICT ON UPDATE CASCADE;
ALTER TABLE "Sample" ADD CONSTRAINT "Sample_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "StoredFile" ADD CONSTRAINT "StoredFile_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Measurement" ADD CONSTRAINT "Measurement_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Measurement" ADD CONSTRAINT "Measurement_sampleId_fkey" FOREIGN KEY ("sampleId") REFERENCES "Sample"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Measurement" ADD CONSTRAINT "Measurement_fileId_fkey" FOREIGN KEY ("fileId") REFERENCES "StoredFile"("id") ON DELETE RESTRICT ON UPDATE CASCADE;
ALTER TABLE "Analysis" ADD CONSTRAINT "Analysis_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Analysis" ADD CONSTRAINT "Analysis_sampleId_fkey" FOREIGN KEY ("sampleId") REFERENCES "Sample"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "AnalysisRevision" ADD CONSTRAINT "AnalysisRevision_analysisId_fkey" FOREIGN KEY ("analysisId") REFERENCES "Analysis"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "AnalysisRevision" ADD CONSTRAINT "AnalysisRevision_basedOnId_fkey" FOREIGN KEY ("basedOnId") REFERENCES "AnalysisRevision"("id") ON DELETE SET NULL ON UPDATE CASCADE;
ALTER TABLE "Step" ADD CONSTRAINT "Step_revisionId_fkey" FOREIGN KEY ("revisionId") REFERENCES "AnalysisRevision"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "ReviewDecision" ADD CONSTRAINT "ReviewDecision_revisionId_fkey" FOREIGN KEY ("revisionId") REFERENCES "AnalysisRevision"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Thread" ADD CONSTRAINT "Thread_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Thread" ADD CONSTRAINT "Thread_analysisId_fkey" FOREIGN KEY ("analysisId") REFERENCES "Analysis"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Thread" ADD CONSTRAINT "Thread_stepId_fkey" FOREIGN KEY ("stepId") REFERENCES "Step"("id") ON DELETE SET NULL ON UPDATE CASCADE;
ALTER TABLE "Comment" ADD CONSTRAINT "Comment_threadId_fkey" FOREIGN KEY ("threadId") REFERENCES "Thread"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Comment" ADD CONSTRAINT "Comment_authorId_fkey" FOREIGN KEY ("authorId") REFERENCES "User"("id") ON DELETE RESTRICT ON UPDATE CASCADE;
ALTER TABLE "Notice" ADD CONSTRAINT "Notice_userId_fkey" FOREIGN KEY ("userId") REFERENCES "User"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "Series" ADD CONSTRAINT "Series_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "SeriesMember" ADD CONSTRAINT "SeriesMember_seriesId_fkey" FOREIGN KEY ("seriesId") REFERENCES "Series"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "SeriesMember" ADD CONSTRAINT "SeriesMember_sampleId_fkey" FOREIGN KEY ("sampleId") REFERENCES "Sample"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "ApiToken" ADD CONSTRAINT "ApiToken_userId_fkey" FOREIGN KEY ("userId") REFERENCES "User"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "ApiToken" ADD CONSTRAINT "ApiToken_groupId_fkey" FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
