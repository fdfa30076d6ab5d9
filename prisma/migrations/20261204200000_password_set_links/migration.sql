-- Password-set links: a group owner issues one for a member whose account has no password (e.g.
-- restored from a group backup, which carries no password hashes). The link is shown once; only
-- the SHA-256 of its token is stored. It expires, and is used at most once (usedAt, set in the
-- same transaction that sets the password).
CREATE TABLE "PasswordSetLink" (
    "id" UUID NOT NULL,
    "userId" UUID NOT NULL,
    "groupId" UUID NOT NULL,
    "tokenHash" TEXT NOT NULL,
    "createdById" UUID NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "expiresAt" TIMESTAMP(3) NOT NULL,
    "usedAt" TIMESTAMP(3),
    CONSTRAINT "PasswordSetLink_pkey" PRIMARY KEY ("id")
);

CREATE UNIQUE INDEX "PasswordSetLink_tokenHash_key" ON "PasswordSetLink"("tokenHash");
CREATE INDEX "PasswordSetLink_userId_idx" ON "PasswordSetLink"("userId");

ALTER TABLE "PasswordSetLink" ADD CONSTRAINT "PasswordSetLink_userId_fkey"
  FOREIGN KEY ("userId") REFERENCES "User"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "PasswordSetLink" ADD CONSTRAINT "PasswordSetLink_groupId_fkey"
  FOREIGN KEY ("groupId") REFERENCES "Group"("id") ON DELETE CASCADE ON UPDATE CASCADE;
