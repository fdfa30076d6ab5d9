-- One audit chain per group (and one for server-wide events, groupId NULL). Each event carries
-- its place in its chain ("seq", 1, 2, 3 … per group), the previous event's "hash" of the same
-- chain in "prevHash", and in "hash" an HMAC-SHA256 over all its fields under a key that the
-- database does not hold (HEATBOOK_AUDIT_KEY); "keyId" names that key (a MAC of a fixed text,
-- so it reveals nothing about the key). The HMAC is computed by the app (lib/server/audit.ts).
--
-- Events written before this migration keep "seq" NULL until the app's start-up step, which has
-- the key, re-chains them (lib/server/auditUpgrade.ts) and records that in "AuditChainUpgrade".
ALTER TABLE "AuditEvent" ADD COLUMN "seq" INTEGER;
ALTER TABLE "AuditEvent" ADD COLUMN "keyId" TEXT;
CREATE UNIQUE INDEX "AuditEvent_groupId_seq_key" ON "AuditEvent" ("groupId", "seq") NULLS NOT DISTINCT WHERE "seq" IS NOT NULL;

CREATE TABLE "AuditChainUpgrade" (
    "id" SERIAL NOT NULL,
    "at" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "belowId" BIGINT NOT NULL,
    "events" INTEGER NOT NULL,
    "keyId" TEXT NOT NULL,
    "legacyChain" TEXT NOT NULL,
    CONSTRAINT "AuditChainUpgrade_pkey" PRIMARY KEY ("id")
);
CREATE TRIGGER "AuditChainUpgrade_append_only"
  BEFORE UPDATE OR DELETE ON "AuditChainUpgrade"
  FOR EACH ROW EXECUTE FUNCTION heatbook_audit_append_only();
