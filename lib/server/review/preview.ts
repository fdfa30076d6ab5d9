/**
 * What approving would seal, for the reviewer's confirmation: the snapshot the approval would
 * build now (same code as sealing) rendered as a report (key numbers with σ, model, window, data
 * files with their checksums, sample context), the analysis's open discussion threads, the
 * meanings a signature can carry, and how the signer's identity will be checked. Reads only.
 */
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { authorise, type Member } from "../access";
import { uuidOrNone } from "../samples";
import { buildSnapshot } from "./snapshot";
import { reportFromSnapshot, type RevisionReport } from "./report";
import { openThreads, SIGNATURE_MEANINGS, FRESH_SIGN_IN_MINUTES, type AcknowledgedThread, type SignatureMeaning } from "./signature";

export interface SealPreview {
  revisionId: string;
  number: number;
  version: number;
  report: Pick<RevisionReport, "title" | "sample" | "provenance" | "fits" | "derived" | "warnings" | "engineVersion">;
  openThreads: AcknowledgedThread[];
  meanings: { key: SignatureMeaning; statement: string }[];
  /** password: the dialog asks for it; institution: a fresh institutional sign-in is needed. */
  identity: "password" | "institution";
  freshSignInMinutes: number;
}

/** The preview of sealing `revisionId` (in review) by the member; ConflictError when it could not be sealed now. */
export async function sealPreview(db: Db, member: Member, analysisId: string, revisionId: string): Promise<SealPreview> {
  authorise(member, "analysis.review");
  const rev = await db.analysisRevision.findFirst({ where: { id: uuidOrNone(revisionId), analysisId: uuidOrNone(analysisId), analysis: { groupId: member.group.id } }, include: { analysis: true } });
  if (!rev) throw new NotFoundError("revision");
  if (rev.state !== "in_review") throw new ConflictError(`revision ${rev.number} is not waiting for review`);
  const now = new Date();
  const placeholder = { signerId: member.userId, signerName: "", signerEmail: "", signerRole: member.role, meaning: "internal" as const, statement: "", note: "", signedAt: now.toISOString(), method: "password" as const, acknowledgedThreads: [] };
  const { snapshot } = await buildSnapshot(db, { ...rev, analysis: rev.analysis }, member.userId, now, placeholder);
  const r = reportFromSnapshot(snapshot, { group: { name: member.group.name, slug: member.group.slug }, state: "sealed", contentHash: "", names: {}, decisions: [] });
  const user = await db.user.findUnique({ where: { id: member.userId }, select: { passwordHash: true } });
  return {
    revisionId: rev.id, number: rev.number, version: rev.version,
    report: { title: r.title, sample: r.sample, provenance: r.provenance, fits: r.fits.map((f) => ({ ...f, plot: { points: null, curve: null, residuals: null, windowIndices: null, scan: null } })), derived: r.derived, warnings: r.warnings, engineVersion: r.engineVersion },
    openThreads: await openThreads(db, rev.analysisId),
    meanings: (Object.keys(SIGNATURE_MEANINGS) as SignatureMeaning[]).map((key) => ({ key, statement: SIGNATURE_MEANINGS[key] })),
    identity: user?.passwordHash ? "password" : "institution",
    freshSignInMinutes: FRESH_SIGN_IN_MINUTES,
  };
}
