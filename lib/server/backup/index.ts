/**
 * Group backup: one archive (gzipped JSON lines, format.ts) with everything of a group, restored
 * into an empty database with ids, timestamps, content hashes and the audit chain intact.
 *
 *   exportGroup(db, slugOrId)          → { archive, counts }
 *   restoreGroup(db, archive)          → RestoreReport (refuses a non-empty database)
 *   readArchive(archive)               parse + check without touching a database
 *   verifyGroupAuditChain(db, groupId) per-group chain check (how it differs from the global one: verify.ts)
 *   verifySealedRevisions(db, groupId, expected?)
 */
export { exportGroup } from "./exportGroup";
export type { ExportResult } from "./exportGroup";
export { restoreGroup, readArchive } from "./restoreGroup";
export type { RestoreReport } from "./restoreGroup";
export { verifyGroupAuditChain, verifySealedRevisions, sealedEntries } from "./verify";
export type { GroupChainReport, SealReport } from "./verify";
export { BACKUP_FORMAT, BACKUP_VERSION, TABLES } from "./format";
