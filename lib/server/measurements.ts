/**
 * Measurements: an uploaded delimited file is previewed (nothing stored), then accepted with a
 * column mapping and units. Acceptance stores the original bytes with their SHA-256 and the
 * parsed points in SI, all in one transaction: a file with bad rows stores nothing.
 */
import { z } from "zod";
import type { Db } from "./db/client";
import { InputError, NotFoundError } from "../engine/errors";
import { parseDelimited, guessColumnRoles, extractPoints, checkTemperatures, type Ambiguity, type ParsedTable, type RoleGuesses, type TemperatureChecks } from "../engine/importer";
import { reduceForChart } from "../charts/reduce";
import { toSI, heatCapacityBasis } from "../engine/units";
import { recordAudit } from "./audit";
import { authorise, type Member } from "./access";
import { parseInput } from "./validate";
import { sha256Hex } from "./hash";
import { uuidOrNone } from "./samples";
import { packFloat64, packInt32, unpackFloat64, unpackInt32 } from "./packing";

export const MAX_UPLOAD_BYTES = 20 * 1024 * 1024;
const PREVIEW_ROWS = 15;
/** Listed bad lines in a preview; the rest are counted. */
const PREVIEW_ISSUES = 50;
/** Pixel columns the preview curve is reduced to (reduceForChart keeps ≤ 4 points per column). */
const PREVIEW_CURVE_BINS = 800;

export const HEAT_CAPACITY_UNITS = ["J/K", "mJ/K", "µJ/K", "J/(mol K)", "mJ/(mol K)", "J/(g K)"] as const;

export const parseOptionsSchema = z.object({
  delimiter: z.enum([",", ";", "\t", "whitespace", "auto"]).optional(),
  decimalComma: z.union([z.boolean(), z.literal("auto")]).optional(),
});

export const importSchema = z.object({
  kind: z.enum(["sample", "addenda"]),
  label: z.string().trim().min(1, "a label is needed").max(160),
  fieldT: z.number().finite().min(-100).max(100).optional(),
  notes: z.string().max(20_000).optional(),
  mapping: z.object({
    temperature: z.number().int().min(0),
    heatCapacity: z.number().int().min(0),
    sigma: z.number().int().min(0).optional(),
    field: z.number().int().min(0).optional(),
  }),
  units: z.object({
    temperature: z.string().trim().min(1).default("K"),
    heatCapacity: z.string().trim().min(1, "choose the heat-capacity unit"),
    field: z.string().trim().min(1).optional(),
  }),
  /** σ of every point as this percentage of |C|, for files without a σ column (not with mapping.sigma). */
  sigmaPercent: z.number().finite().gt(0, "the relative σ must be above 0 %").max(100, "the relative σ must be at most 100 %").optional(),
  parse: parseOptionsSchema.optional(),
}).refine((r) => !(r.sigmaPercent !== undefined && r.mapping.sigma !== undefined), { message: "give either a σ column or a relative σ, not both", path: ["sigmaPercent"] });

export type ImportRequest = z.infer<typeof importSchema>;

/** Decode uploaded bytes: UTF-8 when valid, otherwise Windows-1252 (common for instrument exports). */
export function decodeText(bytes: Uint8Array): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder("windows-1252").decode(bytes);
  }
}

function checkSize(fileName: string, bytes: Uint8Array): void {
  if (bytes.byteLength === 0) throw new InputError("the file is empty", { file: fileName });
  if (bytes.byteLength > MAX_UPLOAD_BYTES) throw new InputError(`the file is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MiB`, { file: fileName });
}

/** The preview request's own fields: how to read the file, and (optionally) which column is what. */
export const previewSchema = z.object({
  parse: parseOptionsSchema.optional(),
  mapping: z.object({
    temperature: z.number().int().min(0),
    heatCapacity: z.number().int().min(0),
    sigma: z.number().int().min(0).optional(),
  }).optional(),
});

/** What the mapped columns hold, row by row: every bad line (first 50, then a count) and order checks. */
export interface PreviewChecks {
  mapping: { temperature: number; heatCapacity: number; sigma?: number };
  /** Rows that would be refused at storing, with line, column and reason. */
  invalid: { line: number; column: number; field?: string; message: string }[];
  invalidCount: number;
  temperatures: TemperatureChecks;
  /** Accepted rows. */
  validCount: number;
  /** The parsed curve for a look before storing, in the file's own units; reduced per pixel column when large. */
  curve: { temperature: number[]; heatCapacity: number[]; line: number[]; reduced: boolean; total: number };
}

export interface ImportPreview {
  fileName: string;
  sizeBytes: number;
  sha256: string;
  delimiter: string;
  decimalComma: boolean;
  headerLine: number | null;
  columns: { index: number; name: string; unitText: string | null }[];
  rows: { line: number; values: (number | null)[] }[];
  rowCount: number;
  guesses: RoleGuesses;
  issues: { line: number; column: number; field?: string; message: string }[];
  issueCount: number;
  preamble: string[];
  /** The file reads two ways; nothing can be stored until the delimiter and decimal mark are chosen. */
  ambiguity: Ambiguity | null;
  /** Checks of the mapped columns (the request's mapping, else the guessed one); null without T and C columns. */
  checks: PreviewChecks | null;
}

function parse(fileName: string, bytes: Uint8Array, options?: z.infer<typeof parseOptionsSchema>): ParsedTable {
  checkSize(fileName, bytes);
  return parseDelimited(decodeText(bytes), { fileName, ...(options ?? {}) });
}

/**
 * Parse and report, store nothing. `request` is `{ parse?, mapping? }`; without a mapping the
 * guessed T and C (and σ) columns are checked. Every bad row of the mapped columns is listed
 * (first 50, then a count), as are repeated and non-increasing temperatures, and the curve comes
 * back (reduced per pixel column when large) so the user sees it before storing.
 */
export function previewImport(member: Member, fileName: string, bytes: Uint8Array, request?: unknown): ImportPreview {
  authorise(member, "measurement.write");
  const req = request === undefined ? {} : parseInput(previewSchema, request);
  const t = parse(fileName, bytes, req.parse);
  const guesses = guessColumnRoles(t.columns);
  const n = Math.min(PREVIEW_ROWS, t.rowCount);
  const rows = Array.from({ length: n }, (_, r) => ({
    line: t.lineNumbers[r]!,
    values: t.rows.map((col) => (Number.isNaN(col[r]!) ? null : col[r]!)),
  }));
  return {
    fileName, sizeBytes: bytes.byteLength, sha256: sha256Hex(bytes), delimiter: t.delimiter, decimalComma: t.decimalComma,
    headerLine: t.headerLine ?? null, columns: t.columns.map((c) => ({ index: c.index, name: c.name, unitText: c.unitText ?? null })),
    rows, rowCount: t.rowCount, guesses, issues: t.issues.slice(0, PREVIEW_ISSUES), issueCount: t.issueCount, preamble: t.preamble.slice(0, 20),
    ambiguity: t.ambiguity ?? null,
    checks: previewChecks(t, req.mapping ?? guessedMapping(guesses)),
  };
}

function guessedMapping(g: RoleGuesses): PreviewChecks["mapping"] | undefined {
  if (!g.temperature || !g.heatCapacity || g.temperature.index === g.heatCapacity.index) return undefined;
  const sigma = g.sigma && g.sigma.index !== g.temperature.index && g.sigma.index !== g.heatCapacity.index ? g.sigma.index : undefined;
  return { temperature: g.temperature.index, heatCapacity: g.heatCapacity.index, ...(sigma !== undefined ? { sigma } : {}) };
}

function previewChecks(t: ParsedTable, mapping: PreviewChecks["mapping"] | undefined): PreviewChecks | null {
  if (!mapping) return null;
  let points;
  try {
    points = extractPoints(t, mapping, { onInvalid: "skip" });
  } catch (err) {
    if (err instanceof InputError && /no valid data rows/.test(err.message)) {
      const all = extractPoints(t, { temperature: mapping.temperature, heatCapacity: mapping.heatCapacity }, { onInvalid: "skip" }).skipped;
      return emptyChecks(mapping, all);
    }
    throw err;
  }
  const keep = reduceForChart(points.temperature, points.heatCapacity, { bins: PREVIEW_CURVE_BINS });
  return {
    mapping,
    invalid: points.skipped.slice(0, PREVIEW_ISSUES), invalidCount: points.skipped.length,
    temperatures: checkTemperatures(points.temperature, points.lineNumbers),
    validCount: points.temperature.length,
    curve: {
      temperature: keep.map((i) => points.temperature[i]!), heatCapacity: keep.map((i) => points.heatCapacity[i]!),
      line: keep.map((i) => points.lineNumbers[i]!), reduced: keep.length < points.temperature.length, total: points.temperature.length,
    },
  };
}

function emptyChecks(mapping: PreviewChecks["mapping"], skipped: PreviewChecks["invalid"]): PreviewChecks {
  return {
    mapping, invalid: skipped.slice(0, PREVIEW_ISSUES), invalidCount: skipped.length,
    temperatures: checkTemperatures([], []), validCount: 0,
    curve: { temperature: [], heatCapacity: [], line: [], reduced: false, total: 0 },
  };
}

export interface MeasurementInfo {
  id: string;
  sampleId: string;
  kind: "sample" | "addenda";
  label: string;
  fieldT: number;
  notes: string;
  basis: "sample" | "molar" | "specific";
  pointCount: number;
  tMinK: number;
  tMaxK: number;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  units: Record<string, string>;
  columnMapping: Record<string, number>;
  createdAt: string;
}

export interface MeasurementPoints extends MeasurementInfo {
  temperatureK: number[];
  heatCapacity: number[];
  sigma: number[] | null;
  fieldPointsT: number[] | null;
  sourceLines: number[];
}

/** Accept an import: validate every row, convert to SI, store file + points + audit in one transaction. */
export async function importMeasurement(db: Db, member: Member, sampleId: string, fileName: string, bytes: Uint8Array, input: unknown): Promise<MeasurementInfo & { warnings: string[] }> {
  authorise(member, "measurement.write");
  const req = parseInput(importSchema, input);
  const sample = await db.sample.findFirst({ where: { id: uuidOrNone(sampleId), groupId: member.group.id, archivedAt: null } });
  if (!sample) throw new NotFoundError("sample");
  const table = parse(fileName, bytes, req.parse);
  if (table.ambiguity) {
    throw new InputError(`ambiguous file: ${table.ambiguity.message}`, { file: fileName, line: table.ambiguity.line, field: "parse" });
  }
  const points = extractPoints(table, req.mapping);
  const order = checkTemperatures(points.temperature, points.lineNumbers);
  const basis = heatCapacityBasis(req.units.heatCapacity);
  const temperatureK = toSI(points.temperature, req.units.temperature, "temperature");
  const heatCapacity = toSI(points.heatCapacity, req.units.heatCapacity, "heatCapacity");
  const sigma: number[] = points.sigma
    ? toSI(points.sigma, req.units.heatCapacity, "heatCapacity")
    : req.sigmaPercent !== undefined ? heatCapacity.map((c) => (Math.abs(c) * req.sigmaPercent!) / 100) : [];
  if (sigma.some((s) => !(s > 0))) {
    const r = sigma.findIndex((s) => !(s > 0));
    throw new InputError(`a relative σ of ${req.sigmaPercent} % gives σ = 0 where C = 0`, { file: fileName, line: points.lineNumbers[r], field: "sigmaPercent" });
  }
  if (points.field && !req.units.field) throw new InputError("choose the unit of the field column", { field: "units.field" });
  const fieldPointsT: number[] = points.field ? toSI(points.field, req.units.field!, "field") : [];
  let tMin = Infinity;
  let tMax = -Infinity;
  for (const t of temperatureK) {
    if (t < tMin) tMin = t;
    if (t > tMax) tMax = t;
  }
  const sha256 = sha256Hex(bytes);
  return db.$transaction(async (tx) => {
    const file = await tx.storedFile.create({ data: { groupId: member.group.id, fileName, sizeBytes: bytes.byteLength, sha256, bytes: Buffer.from(bytes) } });
    const m = await tx.measurement.create({
      data: {
        groupId: member.group.id, sampleId: sample.id, fileId: file.id, kind: req.kind, label: req.label, fieldT: req.fieldT ?? 0,
        notes: req.notes ?? "", columnMapping: req.sigmaPercent !== undefined ? { ...req.mapping, sigmaPercentOfC: req.sigmaPercent } : req.mapping, units: req.units, basis, pointCount: temperatureK.length, tMinK: tMin, tMaxK: tMax,
        temperatureK: packFloat64(temperatureK), heatCapacity: packFloat64(heatCapacity), sigma: sigma.length ? packFloat64(sigma) : null,
        fieldPointsT: fieldPointsT.length ? packFloat64(fieldPointsT) : null, sourceLines: packInt32(points.lineNumbers), createdById: member.userId,
      },
    });
    await recordAudit(tx, {
      groupId: member.group.id, actorId: member.userId, action: "measurement.import", objectType: "measurement", objectId: m.id,
      afterHash: sha256, detail: { fileName, points: temperatureK.length, kind: req.kind, sampleId: sample.id },
    });
    return { ...toInfo(m), fileName, sha256, sizeBytes: bytes.byteLength, warnings: orderWarnings(order) };
  }, { timeout: 60_000 });
}

/** Sentences for the store summary: repeated and non-increasing temperatures, with their first lines. */
function orderWarnings(c: TemperatureChecks): string[] {
  const lines = (f: { line: number }[], count: number) => `line${count === 1 ? "" : "s"} ${f.slice(0, 5).map((x) => x.line).join(", ")}${count > 5 ? ` and ${count - 5} more` : ""}`;
  const out: string[] = [];
  if (c.duplicateCount > 0) out.push(`${c.duplicateCount} repeated temperature${c.duplicateCount === 1 ? "" : "s"} (${lines(c.duplicates, c.duplicateCount)})`);
  if (c.decreasingCount > 0) out.push(`${c.decreasingCount} temperature${c.decreasingCount === 1 ? "" : "s"} lower than the row before (${lines(c.decreasing, c.decreasingCount)})`);
  return out;
}

type Row = Awaited<ReturnType<Db["measurement"]["findFirstOrThrow"]>>;

function toInfo(m: Omit<Row, "temperatureK" | "heatCapacity" | "sigma" | "fieldPointsT" | "sourceLines">): Omit<MeasurementInfo, "fileName" | "sha256" | "sizeBytes"> {
  return {
    id: m.id, sampleId: m.sampleId, kind: m.kind, label: m.label, fieldT: m.fieldT, notes: m.notes, basis: m.basis, pointCount: m.pointCount,
    tMinK: m.tMinK, tMaxK: m.tMaxK, units: m.units as Record<string, string>, columnMapping: m.columnMapping as Record<string, number>, createdAt: m.createdAt.toISOString(),
  };
}

const LIST_SELECT = {
  id: true, sampleId: true, groupId: true, fileId: true, kind: true, label: true, fieldT: true, notes: true, columnMapping: true, units: true,
  basis: true, pointCount: true, tMinK: true, tMaxK: true, createdById: true, createdAt: true, archivedAt: true,
  file: { select: { fileName: true, sha256: true, sizeBytes: true } },
} as const;

export async function listMeasurements(db: Db, member: Member, opts: { sampleId?: string; take?: number } = {}): Promise<MeasurementInfo[]> {
  authorise(member, "group.read");
  const rows = await db.measurement.findMany({
    where: { groupId: member.group.id, archivedAt: null, ...(opts.sampleId ? { sampleId: uuidOrNone(opts.sampleId) } : {}) },
    select: LIST_SELECT,
    orderBy: { createdAt: "desc" },
    take: Math.min(opts.take ?? 200, 500),
  });
  return rows.map((m) => ({ ...toInfo(m), fileName: m.file.fileName, sha256: m.file.sha256, sizeBytes: m.file.sizeBytes }));
}

export async function getMeasurement(db: Db, member: Member, id: string): Promise<MeasurementPoints> {
  authorise(member, "group.read");
  const m = await db.measurement.findFirst({ where: { id: uuidOrNone(id), groupId: member.group.id }, include: { file: { select: { fileName: true, sha256: true, sizeBytes: true } } } });
  if (!m) throw new NotFoundError("measurement");
  return {
    ...toInfo(m), fileName: m.file.fileName, sha256: m.file.sha256, sizeBytes: m.file.sizeBytes,
    temperatureK: unpackFloat64(m.temperatureK), heatCapacity: unpackFloat64(m.heatCapacity), sigma: m.sigma ? unpackFloat64(m.sigma) : null,
    fieldPointsT: m.fieldPointsT ? unpackFloat64(m.fieldPointsT) : null, sourceLines: unpackInt32(m.sourceLines),
  };
}

/** The original uploaded bytes, unchanged, with their name and checksum. */
export async function getOriginalFile(db: Db, member: Member, measurementId: string): Promise<{ fileName: string; sha256: string; bytes: Uint8Array }> {
  authorise(member, "group.read");
  const m = await db.measurement.findFirst({ where: { id: uuidOrNone(measurementId), groupId: member.group.id }, include: { file: true } });
  if (!m) throw new NotFoundError("measurement");
  return { fileName: m.file.fileName, sha256: m.file.sha256, bytes: new Uint8Array(m.file.bytes) };
}
