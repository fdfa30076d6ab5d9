/**
 * The integrity checks that `heatbook audit verify` (whole database, owner URL) and the group's
 * Verify (button and route) run, in order. Each check gets the scope and returns findings.
 *
 * HOOK: other integrity checks plug in by adding an entry to INTEGRITY_CHECKS below (e.g. "the
 * sealed revisions match what is served", lib/server/review/**). A check must honour
 * `scope.groupIds` (null = every group) and name each problem (what, where) in `problems`.
 */
import type { Db } from "./db/client";
import type { AuditKey } from "./auditKey";
import { verifyAuditChains, type AuditReport, type CheckpointHead } from "./auditVerify";
import { describeMismatch, verifySealedRevisions } from "./review/integrity";

export interface IntegrityScope {
  db: Db;
  key: AuditKey;
  /** The groups to check; null = the whole database (server-wide audit chain included). */
  groupIds: string[] | null;
  /** Chain heads from a checkpoint kept outside the database, if one was given. */
  checkpoint?: Map<string | null, CheckpointHead>;
  /** Re-run the engine on sealed revisions (default true; restore compares stored data only). */
  engine?: boolean;
}

export interface IntegrityFinding {
  /** Short name of the check, e.g. "audit chains". */
  check: string;
  ok: boolean;
  /** One line: what was checked and the outcome. */
  summary: string;
  problems: { where: string; message: string }[];
  /** The check's own full report (JSON-safe). */
  detail?: unknown;
}

export interface IntegrityCheck {
  name: string;
  run(scope: IntegrityScope): Promise<IntegrityFinding>;
}

/** The audit chains: every chain in scope, with the key, against the checkpoint if given. */
export const auditChainsCheck: IntegrityCheck = {
  name: "audit chains",
  async run(scope) {
    const report: AuditReport = await verifyAuditChains(scope.db, { key: scope.key, ...(scope.checkpoint ? { checkpoint: scope.checkpoint } : {}), ...(scope.groupIds ? { groupIds: scope.groupIds } : {}) });
    const summary = report.ok
      ? `audit chains intact: ${report.chains.length} ${report.chains.length === 1 ? "chain" : "chains"}, ${report.checked} events signed and linked${scope.checkpoint ? ", none missing against the checkpoint" : " (no checkpoint given: the newest events are checked only against one)"}`
      : `audit chains BROKEN: ${report.problems.length} ${report.problems.length === 1 ? "problem" : "problems"}; first: ${report.reason}`;
    return { check: this.name, ok: report.ok, summary, problems: report.problems.map((p) => ({ where: p.eventId ? `event ${p.eventId}${p.seq !== null ? ` (seq ${p.seq})` : ""}` : p.groupId ?? "server", message: `[${p.kind}] ${p.message}` })), detail: report };
  },
};

/**
 * Sealed revisions against their snapshots (lib/server/review/integrity.ts): stored step rows,
 * measurements, files, the seal's audit event and an engine re-run; names every mismatch. Sample
 * records edited since sealing are named as notes, not failures (the sealed context is pinned).
 */
export const sealedRevisionsCheck: IntegrityCheck = {
  name: "sealed revisions",
  async run(scope) {
    const groups = scope.groupIds ?? [undefined];
    const all = await Promise.all(groups.map((groupId) => verifySealedRevisions(scope.db, { ...(groupId ? { groupId } : {}), engine: scope.engine ?? true })));
    const checked = all.reduce((n, r) => n + r.checked, 0);
    const mismatches = all.flatMap((r) => r.mismatches);
    const notes = all.flatMap((r) => r.contextChanged);
    const ok = mismatches.length === 0;
    const summary = ok
      ? `sealed revisions verified: ${checked} checked against their snapshots (stored steps, measurements, files, seal events${scope.engine ?? true ? ", engine re-run" : ""})${notes.length ? `; ${notes.length} with the sample record changed since sealing (sealed numbers unchanged)` : ""}`
      : `sealed revisions NOT verified: ${mismatches.length} ${mismatches.length === 1 ? "mismatch" : "mismatches"} in ${checked} sealed revisions; first: ${describeMismatch(mismatches[0]!)}`;
    return { check: this.name, ok, summary, problems: mismatches.map((m) => ({ where: `analysis ${m.analysisId} revision ${m.number}`, message: m.what })), detail: { checked, mismatches, contextChanged: notes } };
  },
};

/** Run in this order. Add further checks here (see the module comment). */
export const INTEGRITY_CHECKS: IntegrityCheck[] = [auditChainsCheck, sealedRevisionsCheck];

/** Run every check; ok when all are. */
export async function runIntegrityChecks(scope: IntegrityScope, checks: readonly IntegrityCheck[] = INTEGRITY_CHECKS): Promise<{ ok: boolean; findings: IntegrityFinding[] }> {
  const findings: IntegrityFinding[] = [];
  for (const c of checks) findings.push(await c.run(scope));
  return { ok: findings.every((f) => f.ok), findings };
}

export interface GroupVerification {
  ok: boolean;
  /** The group's own audit chain (counts are this group's only). */
  chain: { ok: boolean; checked: number; firstBrokenId: string | null; reason: string | null; problems: AuditReport["problems"]; headSeq: number | null };
  /** Upgrades that re-chained events written before per-group chains: when, and below which event id. */
  rechained: { at: string; belowId: string }[];
  /** Every check's outcome, without the checks' server-wide detail. */
  findings: IntegrityFinding[];
}

/** The group's Verify (button and route): every integrity check on this group alone. */
export async function verifyGroup(db: Db, groupId: string, key: AuditKey): Promise<GroupVerification> {
  const { ok, findings } = await runIntegrityChecks({ db, key, groupIds: [groupId] });
  const audit = findings.find((f) => f.check === auditChainsCheck.name)!.detail as AuditReport;
  const own = audit.chains.find((c) => c.groupId === groupId);
  return {
    ok,
    chain: { ok: audit.ok, checked: audit.checked, firstBrokenId: audit.firstBrokenId, reason: audit.reason, problems: audit.problems, headSeq: own?.head?.seq ?? null },
    rechained: audit.rechained.map((u) => ({ at: u.at, belowId: u.belowId })),
    findings: findings.map(({ detail: _detail, ...f }) => f),
  };
}
