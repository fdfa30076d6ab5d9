-- Issue 15 (sign-in, sessions, tokens, invitations): server-side sessions, sign-in throttle
-- buckets counted under a row lock, API token expiry, a shared API rate-limit bucket, and an
-- outbox for messages to an address (mail delivery is the operator's).

-- One row per signed-in browser session; the JWT cookie carries only its id.
CREATE TABLE "Session" (
    "id" UUID NOT NULL,
    "userId" UUID NOT NULL,
    "createdAt" TIMESTAMPTZ(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "lastSeenAt" TIMESTAMPTZ(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "expiresAt" TIMESTAMPTZ(3) NOT NULL,
    "endedAt" TIMESTAMPTZ(3),
    "endReason" TEXT,
    "userAgent" TEXT NOT NULL DEFAULT '',
    CONSTRAINT "Session_pkey" PRIMARY KEY ("id")
);
CREATE INDEX "Session_userId_idx" ON "Session"("userId");
ALTER TABLE "Session" ADD CONSTRAINT "Session_userId_fkey" FOREIGN KEY ("userId") REFERENCES "User"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- Sign-in back-off state per key (account + client, or client address); read and written under
-- the row's lock, so parallel attempts cannot exceed the allowance.
CREATE TABLE "SignInThrottle" (
    "key" TEXT NOT NULL,
    "failures" INTEGER NOT NULL DEFAULT 0,
    "blockedUntil" TIMESTAMPTZ(3),
    "lastFailureAt" TIMESTAMPTZ(3),
    CONSTRAINT "SignInThrottle_pkey" PRIMARY KEY ("key")
);

-- The attempt log is replaced by SignInThrottle.
DROP TABLE "SignInAttempt";

-- API tokens expire. Existing tokens get the default lifetime counted from this migration.
ALTER TABLE "ApiToken" ADD COLUMN "expiresAt" TIMESTAMP(3);
UPDATE "ApiToken" SET "expiresAt" = (now() AT TIME ZONE 'UTC') + interval '90 days';
ALTER TABLE "ApiToken" ALTER COLUMN "expiresAt" SET NOT NULL;
ALTER TABLE "ApiToken" ADD COLUMN "renewedAt" TIMESTAMP(3);

-- The v1 API's per-token rate limit, shared by every app instance: one row per token, updated
-- in one statement per request.
CREATE TABLE "ApiRateBucket" (
    "key" TEXT NOT NULL,
    "tokens" DOUBLE PRECISION NOT NULL,
    "at" TIMESTAMPTZ(3) NOT NULL,
    "allowed" BOOLEAN NOT NULL,
    CONSTRAINT "ApiRateBucket_pkey" PRIMARY KEY ("key")
);

-- Messages to an e-mail address (e.g. "someone tried to sign up with your address"). Heatbook
-- has no mail server: the operator delivers these (sentAt marks delivered ones).
CREATE TABLE "Outbox" (
    "id" UUID NOT NULL,
    "toEmail" TEXT NOT NULL,
    "subject" TEXT NOT NULL,
    "body" TEXT NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "sentAt" TIMESTAMP(3),
    CONSTRAINT "Outbox_pkey" PRIMARY KEY ("id")
);
CREATE INDEX "Outbox_sentAt_idx" ON "Outbox"("sentAt");
