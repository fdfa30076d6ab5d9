/**
 * zod schemas of the v1 API that are not shared with the app's forms: query strings, the raw
 * upload's query, and the response shapes (documentation; the handlers build those objects
 * from the server layer's typed results).
 */
import { z } from "zod";
import { pageQuery } from "./pagination";

export const uuidParam = z.string().uuid();

export const listSamplesQuery = pageQuery.extend({
  q: z.string().max(200).optional(),
  archived: z.enum(["exclude", "include", "only"]).default("exclude"),
});

export const listAnalysesQuery = pageQuery.extend({ sampleId: z.string().uuid("sampleId must be a UUID").optional() });

export const getAnalysisQuery = z.object({ revision: z.coerce.number().int().min(1).optional() });

export const getSeriesQuery = z.object({
  include: z.enum(["drafts"]).optional(),
  axis: z.enum(["x", "ea"]).default("x"),
  trendFrom: z.enum(["sealed", "shown"]).default("sealed"),
  format: z.enum(["json", "csv"]).default("json"),
});

/**
 * Query of a raw-text upload (Content-Type text/plain, text/csv or application/octet-stream):
 * columns by 0-based index or by header name; omitted ones are guessed from the header.
 */
export const rawUploadQuery = z.object({
  fileName: z.string().trim().min(1).max(255).default("upload.txt"),
  kind: z.enum(["sample", "addenda"]).default("sample"),
  label: z.string().trim().min(1).max(160).optional(),
  tCol: z.string().max(120).optional(),
  cCol: z.string().max(120).optional(),
  sigmaCol: z.string().max(120).optional(),
  unit: z.string().trim().min(1).max(40).optional(),
  tUnit: z.string().trim().min(1).max(40).optional(),
  fieldT: z.coerce.number().finite().min(-100).max(100).optional(),
  delimiter: z.enum([",", ";", "tab", "whitespace", "auto"]).default("auto"),
});

const valued = z.object({ value: z.number(), stdError: z.number().nullable() }).nullable();

export const sampleOut = z.object({
  id: z.string(), groupId: z.string(), label: z.string(), formula: z.string(), molarMassGPerMol: z.number(), atomsPerFormulaUnit: z.number(),
  massMg: z.number().nullable(), densityGPerCm3: z.number().nullable(), valences: z.record(z.string(), z.number()),
  compositionVariable: z.string().nullable(), compositionValue: z.number().nullable(), seriesLabel: z.string().nullable(),
  notes: z.string(), tags: z.array(z.string()), archived: z.boolean(), version: z.number().int(), createdAt: z.string(), updatedAt: z.string(),
});

export const measurementOut = z.object({
  id: z.string(), sampleId: z.string(), kind: z.enum(["sample", "addenda"]), label: z.string(), fieldT: z.number().describe("T"), notes: z.string(),
  basis: z.enum(["sample", "molar", "specific"]).describe("what C is: J/K (sample), J/(mol K) (molar) or J/(kg K) (specific)"),
  pointCount: z.number().int(), tMinK: z.number(), tMaxK: z.number(), fileName: z.string(), sha256: z.string(), sizeBytes: z.number().int(),
  units: z.record(z.string(), z.string()), columnMapping: z.record(z.string(), z.number()), createdAt: z.string(),
});

export const pointsOut = measurementOut.extend({
  temperatureK: z.array(z.number()), heatCapacity: z.array(z.number()).describe("SI, per `basis`"), sigma: z.array(z.number()).nullable(),
  fieldPointsT: z.array(z.number()).nullable(), sourceLines: z.array(z.number().int()),
});

const revisionSummary = z.object({ id: z.string(), number: z.number().int(), state: z.enum(["open", "in_review", "returned", "sealed", "replaced"]), contentHash: z.string().nullable() });

export const analysisOut = z.object({ id: z.string(), title: z.string(), sampleId: z.string(), archived: z.boolean(), createdAt: z.string(), updatedAt: z.string(), revisions: z.array(revisionSummary) });

export const analysisDetailOut = z.object({
  analysis: analysisOut,
  revisions: z.array(revisionSummary.extend({
    basedOnId: z.string().nullable(), submittedAt: z.string().nullable(), sealedAt: z.string().nullable(), sealedById: z.string().nullable(), createdAt: z.string(),
    steps: z.array(z.object({ id: z.string(), position: z.number().int(), kind: z.string(), title: z.string(), config: z.unknown(), output: z.unknown().describe("stored output {kind, ok, error, warnings, result}; sealed revisions: from the sealed snapshot"), inputHash: z.string().nullable(), engineVersion: z.string().nullable(), computedAt: z.string().nullable() })),
    sealedContext: z.object({
      pinned: z.enum(["full", "chain"]).describe("full: every sample field below as sealed; chain: sealed before composition was pinned (composition fields null)"),
      sample: z.record(z.string(), z.unknown()), note: z.string().nullable(),
      changedSinceSealing: z.array(z.object({ field: z.string(), label: z.string(), sealed: z.unknown(), now: z.unknown() })).describe("sample record fields that differ now from the sealed context"),
    }).nullable().optional().describe("sealed revisions only"),
    signature: z.object({
      signerId: z.string(), signerName: z.string(), signerEmail: z.string(), signerRole: z.string(), meaning: z.string(), statement: z.string(), note: z.string(), signedAt: z.string(),
      method: z.enum(["password", "institution-sign-in"]), acknowledgedThreads: z.array(z.object({ id: z.string(), openedBy: z.string(), excerpt: z.string() })),
    }).nullable().optional().describe("sealed revisions: the reviewer's signature (null when sealed before signatures)"),
  })),
});

export const seriesOut = z.object({ id: z.string(), name: z.string(), compositionVariable: z.string(), description: z.string(), memberIds: z.array(z.string()), createdAt: z.string() });

export const seriesRowOut = z.object({
  sample: z.object({ id: z.string(), label: z.string(), formula: z.string(), archived: z.boolean() }),
  x: z.number().nullable(), electronsPerAtom: z.number().nullable(), axisValue: z.number().nullable(),
  gamma: valued.describe("mJ mol^-1 K^-2 per mole formula unit"), beta: valued.describe("mJ mol^-1 K^-4"), thetaD: valued.describe("K"),
  dosEF: valued.describe("states eV^-1 per f.u."), massRatio: valued, tc: valued.describe("K"), gammaFree: z.number().nullable(),
  draft: z.boolean().describe("true: values from a revision that is NOT sealed"), valueSource: z.enum(["derive", "fit"]).nullable(),
  revision: z.object({ analysisId: z.string(), analysisTitle: z.string(), revisionId: z.string(), revisionNumber: z.number().int(), state: z.string(), contentHash: z.string().nullable(), sealedAt: z.string().nullable(), analysisArchived: z.boolean() }).nullable(),
  context: z.object({
    source: z.enum(["sealed", "sealed-chain-only", "sample-record"]).describe("where formula, x, e/a and the free-electron γ come from: the sealed context, the sealed chain fields (composition from the record), or the record (drafts, no analysis)"),
    changedSinceSealing: z.array(z.string()).describe("\"sample record changed since sealing\" per field: label, sealed → now"),
    note: z.string().nullable(),
  }),
  warnings: z.array(z.string()),
});

export const seriesViewOut = z.object({
  series: seriesOut, axis: z.enum(["x", "ea"]), axisLabel: z.string(), includeDrafts: z.boolean(), trendFrom: z.enum(["sealed", "shown"]),
  units: z.record(z.string(), z.string()), rows: z.array(seriesRowOut),
  trends: z.record(z.string(), z.object({ linear: z.unknown().nullable(), quadratic: z.unknown().nullable() })).describe("per quantity: weighted trend fits (parameters a0, a1, a2 with σ, band, outliers)"),
});

export const page = <T extends z.ZodType>(key: string, item: T) => z.object({ [key]: z.array(item), nextCursor: z.string().nullable() });
export const errorOut = z.object({ error: z.string(), field: z.string().optional() });
