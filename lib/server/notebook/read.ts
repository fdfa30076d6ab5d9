/**
 * What opening a notebook reads, in one SQL round trip: the analysis (group-scoped) with its
 * sample's label, every revision, the steps of the chosen revision (default: the newest; a
 * revision id of another analysis finds none) without their outputs, and the sample fields a
 * chain reads, and the group's measurements whose id appears in a step's configuration (a superset
 * of those the steps name; the caller picks those), without their points. Through Prisma the same took five queries (each include is one more), and that
 * dominated a cached notebook read under load (see "Scaling out" in README.md).
 */
import { isoTimestampSql, sqlRows, type Db } from "../db/client";
import type { ChainMeasurement, ChainSample } from "../../engine/notebook";
import type { RevisionStateName } from "./analyses";
import { uuidOrNone } from "../ids";

export interface RevisionRow {
  id: string; number: number; state: RevisionStateName; version: number; basedOnId: string | null; contentHash: string | null;
  submittedAt: Date | null; sealedAt: Date | null; sealedById: string | null; createdAt: Date;
}

export interface StepRow {
  id: string; position: number; kind: string; title: string; config: unknown; version: number;
  inputHash: string | null; engineVersion: string | null; computedAt: Date | null; updatedAt: Date;
}

export interface NotebookRows {
  analysis: { id: string; title: string; sampleId: string; archivedAt: Date | null; updatedAt: Date; sample: { label: string } };
  /** Newest first. */
  revisions: RevisionRow[];
  /** The chosen revision's id (null: no such revision) and its steps in order. */
  revisionId: string | null;
  steps: StepRow[];
  sample: ChainSample;
  /** By id, without point arrays (what input hashes read). */
  measurements: Record<string, ChainMeasurement>;
}


/**
 * The statement, with the group id, analysis id and revision id (NULL: the newest) as the SQL
 * expressions given; it gives one text column "row", or no row when the analysis is not found.
 */
export function notebookSql(group: string, analysis: string, revision: string): string {
  return `
WITH a AS (SELECT * FROM "Analysis" WHERE "id" = ${analysis} AND "groupId" = ${group}),
rev AS (SELECT r."id" FROM "AnalysisRevision" r JOIN a ON r."analysisId" = a."id"
        WHERE ${revision} IS NULL OR r."id" = ${revision} ORDER BY r."number" DESC LIMIT 1)
SELECT json_build_object(
  'analysis', json_build_object('id', a."id", 'title', a."title", 'sampleId', a."sampleId", 'archivedAt', ${isoTimestampSql('a."archivedAt"')}, 'updatedAt', ${isoTimestampSql('a."updatedAt"')}),
  'sample', json_build_object('id', s."id", 'label', s."label", 'formula', s."formula", 'molarMassGPerMol', s."molarMassGPerMol",
    'atomsPerFormulaUnit', s."atomsPerFormulaUnit", 'massMg', s."massMg", 'densityGPerCm3', s."densityGPerCm3", 'valences', s."valences"),
  'revisions', (SELECT coalesce(json_agg(json_build_object('id', r."id", 'number', r."number", 'state', r."state", 'version', r."version",
      'basedOnId', r."basedOnId", 'contentHash', r."contentHash", 'submittedAt', ${isoTimestampSql('r."submittedAt"')}, 'sealedAt', ${isoTimestampSql('r."sealedAt"')},
      'sealedById', r."sealedById", 'createdAt', ${isoTimestampSql('r."createdAt"')}) ORDER BY r."number" DESC), '[]'::json)
    FROM "AnalysisRevision" r WHERE r."analysisId" = a."id"),
  'revisionId', (SELECT "id" FROM rev),
  'steps', (SELECT coalesce(json_agg(json_build_object('id', st."id", 'position', st."position", 'kind', st."kind", 'title', st."title",
      'config', st."config", 'version', st."version", 'inputHash', st."inputHash", 'engineVersion', st."engineVersion",
      'computedAt', ${isoTimestampSql('st."computedAt"')}, 'updatedAt', ${isoTimestampSql('st."updatedAt"')}) ORDER BY st."position"), '[]'::json)
    FROM "Step" st WHERE st."revisionId" = (SELECT "id" FROM rev)),
  'measurements', (SELECT coalesce(json_agg(json_build_object('id', m."id", 'label', m."label", 'kind', m."kind", 'basis', m."basis",
      'fieldT', m."fieldT", 'pointCount', m."pointCount", 'sha256', f."sha256")), '[]'::json)
    FROM "Measurement" m JOIN "StoredFile" f ON f."id" = m."fileId"
    WHERE m."groupId" = ${group} AND strpos((SELECT string_agg(c."config"::text, ' ') FROM "Step" c WHERE c."revisionId" = (SELECT "id" FROM rev)), m."id"::text) > 0)
)::text AS "row"
FROM a JOIN "Sample" s ON s."id" = a."sampleId"`;
}

const SQL = notebookSql("$3::uuid", "$1::uuid", "$2::uuid");

const date = (v: string | null): Date | null => (v === null ? null : new Date(v));

type Raw = {
  analysis: { id: string; title: string; sampleId: string; archivedAt: string | null; updatedAt: string };
  sample: Omit<ChainSample, "valences"> & { valences: Record<string, number> | null };
  revisions: (Omit<RevisionRow, "submittedAt" | "sealedAt" | "createdAt"> & { submittedAt: string | null; sealedAt: string | null; createdAt: string })[];
  revisionId: string | null;
  steps: (Omit<StepRow, "computedAt" | "updatedAt"> & { computedAt: string | null; updatedAt: string })[];
  measurements: Pick<ChainMeasurement, "id" | "label" | "kind" | "basis" | "fieldT" | "sha256" | "pointCount">[];
};

/** The notebook's rows, or null when the analysis is not in the group. */
export async function readNotebookRows(db: Db, groupId: string, analysisId: string, revisionId?: string): Promise<NotebookRows | null> {
  // Ids that are not UUIDs name nothing (as the nil UUID, which is never a row's id).
  const rows = await sqlRows<{ row: string }>(db, SQL, [...notebookParams(analysisId, revisionId), groupId]);
  return rows.length === 0 ? null : parseNotebookRow(rows[0]!.row);
}

/** The analysis and revision ids as parameters of notebookSql (ids that are not UUIDs name nothing). */
export function notebookParams(analysisId: string, revisionId?: string): [string, string | null] {
  return [uuidOrNone(analysisId), revisionId === undefined ? null : uuidOrNone(revisionId)];
}

/** The rows from the statement's "row" text. */
export function parseNotebookRow(text: string): NotebookRows {
  const r = JSON.parse(text) as Raw;
  return {
    analysis: { ...r.analysis, archivedAt: date(r.analysis.archivedAt), updatedAt: new Date(r.analysis.updatedAt), sample: { label: r.sample.label } },
    revisions: r.revisions.map((v) => ({ ...v, submittedAt: date(v.submittedAt), sealedAt: date(v.sealedAt), createdAt: new Date(v.createdAt) })),
    revisionId: r.revisionId,
    steps: r.steps.map((s) => ({ ...s, computedAt: date(s.computedAt), updatedAt: new Date(s.updatedAt) })),
    sample: { ...r.sample, valences: r.sample.valences ?? {} },
    measurements: Object.fromEntries(r.measurements.map((m) => [m.id, { ...m, temperatureK: [], heatCapacity: [], sigma: null }])),
  };
}
