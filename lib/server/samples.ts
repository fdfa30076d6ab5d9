/**
 * Samples of a group: create, edit (optimistic version), list with search, archive.
 * The formula is parsed by the engine's chemistry module: molar mass (IUPAC standard atomic
 * weights) and atoms per formula unit are stored with the sample.
 */
import { z } from "zod";
import { isoTimestampSql, sqlRows, type Db } from "./db/client";
import { uuidOrNone } from "./ids";
import { ConflictError, InputError, NotFoundError } from "../engine/errors";
import { parseFormula } from "../engine/chemistry";
import { recordAudit } from "./audit";
import { authorise, type Member } from "./access";
import { parseInput } from "./validate";
import { contentHash } from "./hash";

const finitePositive = (what: string) => z.number({ error: `${what} must be a number` }).finite().positive(`${what} must be > 0`);

export const sampleSchema = z.object({
  label: z.string().trim().min(1, "a label is needed").max(120),
  formula: z.string().trim().min(1, "a chemical formula is needed").max(200),
  massMg: finitePositive("mass").nullable().optional(),
  densityGPerCm3: finitePositive("density").nullable().optional(),
  valences: z.record(z.string(), z.number().finite().min(0).max(8)).optional(),
  compositionVariable: z.string().trim().max(40).nullable().optional(),
  compositionValue: z.number().finite().nullable().optional(),
  seriesLabel: z.string().trim().max(120).nullable().optional(),
  notes: z.string().max(20_000).optional(),
  tags: z.array(z.string().trim().min(1).max(40)).max(30).optional(),
});

export const sampleUpdateSchema = sampleSchema.partial().extend({ version: z.number().int().positive() });

export interface SampleInfo {
  id: string;
  groupId: string;
  label: string;
  formula: string;
  molarMassGPerMol: number;
  atomsPerFormulaUnit: number;
  massMg: number | null;
  densityGPerCm3: number | null;
  valences: Record<string, number>;
  compositionVariable: string | null;
  compositionValue: number | null;
  seriesLabel: string | null;
  notes: string;
  tags: string[];
  archived: boolean;
  version: number;
  createdAt: string;
  updatedAt: string;
}

type SampleRow = Awaited<ReturnType<Db["sample"]["findFirstOrThrow"]>>;

export function toSampleInfo(s: SampleRow): SampleInfo {
  return {
    id: s.id, groupId: s.groupId, label: s.label, formula: s.formula, molarMassGPerMol: s.molarMassGPerMol,
    atomsPerFormulaUnit: s.atomsPerFormulaUnit, massMg: s.massMg, densityGPerCm3: s.densityGPerCm3,
    valences: (s.valences ?? {}) as Record<string, number>, compositionVariable: s.compositionVariable,
    compositionValue: s.compositionValue, seriesLabel: s.seriesLabel, notes: s.notes, tags: s.tags,
    archived: s.archivedAt !== null, version: s.version, createdAt: s.createdAt.toISOString(), updatedAt: s.updatedAt.toISOString(),
  };
}

function chemistryOf(formula: string) {
  try {
    return parseFormula(formula);
  } catch (err) {
    if (err instanceof InputError) throw new InputError(err.baseMessage, { ...err.where, field: "formula" });
    throw err;
  }
}

/** Valences must name elements of the formula. */
function checkValences(valences: Record<string, number> | undefined, symbols: string[]): void {
  for (const el of Object.keys(valences ?? {}))
    if (!symbols.includes(el)) throw new InputError(`valence given for ${el}, which is not in the formula`, { field: `valences.${el}` });
}

export async function createSample(db: Db, member: Member, input: unknown): Promise<SampleInfo> {
  authorise(member, "sample.write");
  const data = parseInput(sampleSchema, input);
  const chem = chemistryOf(data.formula);
  checkValences(data.valences, chem.elements.map((e) => e.symbol));
  return db.$transaction(async (tx) => {
    const s = await tx.sample.create({
      data: {
        groupId: member.group.id, label: data.label, formula: data.formula, molarMassGPerMol: chem.molarMassGPerMol,
        atomsPerFormulaUnit: chem.atomsPerFormulaUnit, massMg: data.massMg ?? null, densityGPerCm3: data.densityGPerCm3 ?? null,
        valences: data.valences ?? {}, compositionVariable: data.compositionVariable ?? null, compositionValue: data.compositionValue ?? null,
        seriesLabel: data.seriesLabel ?? null, notes: data.notes ?? "", tags: data.tags ?? [], createdById: member.userId,
      },
    });
    const info = toSampleInfo(s);
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "sample.create", objectType: "sample", objectId: s.id, afterHash: contentHash(info) });
    return info;
  });
}

export async function getSample(db: Db, member: Member, id: string): Promise<SampleInfo> {
  authorise(member, "group.read");
  const s = await db.sample.findFirst({ where: { id: uuidOrNone(id), groupId: member.group.id } });
  if (!s) throw new NotFoundError("sample");
  return toSampleInfo(s);
}

export { uuidOrNone } from "./ids";


/**
 * The plain list (no search) in one bare SQL statement as JSON text (group id as the SQL
 * expression `group`; archived, take, skip as parameters p(0), p(1), p(2)): it is on every sample
 * page's path, and the same rows through Prisma cost several times the CPU (README, "Scaling
 * out"). Same order as the Prisma query below (ascending, nulls last, as PostgreSQL sorts).
 */
export function sampleListSql(group: string, p: (k: number) => string): string {
  return `
SELECT coalesce(json_agg(json_build_object('id', s."id", 'groupId', s."groupId", 'label', s."label", 'formula', s."formula",
  'molarMassGPerMol', s."molarMassGPerMol", 'atomsPerFormulaUnit', s."atomsPerFormulaUnit", 'massMg', s."massMg",
  'densityGPerCm3', s."densityGPerCm3", 'valences', coalesce(s."valences", '{}'::jsonb), 'compositionVariable', s."compositionVariable",
  'compositionValue', s."compositionValue", 'seriesLabel', s."seriesLabel", 'notes', s."notes", 'tags', to_json(s."tags"),
  'archived', s."archivedAt" IS NOT NULL, 'version', s."version", 'createdAt', ${isoTimestampSql('s."createdAt"')}, 'updatedAt', ${isoTimestampSql('s."updatedAt"')})
  ORDER BY s."seriesLabel", s."compositionValue", s."label"), '[]'::json)::text AS "list"
FROM (SELECT * FROM "Sample" WHERE "groupId" = ${group} AND ("archivedAt" IS NOT NULL) = ${p(0)}::boolean
      ORDER BY "seriesLabel", "compositionValue", "label" LIMIT ${p(1)}::int OFFSET ${p(2)}::int) s`;
}

const LIST_SQL = sampleListSql("$1::uuid", (k) => `$${k + 2}`);

/** The list's parameters (archived, take, skip) for sampleListSql; InputError names a bad page field. */
export function sampleListParams(opts: { archived?: boolean; take?: number; skip?: number }): [boolean, number, number] {
  for (const [field, v] of [["take", opts.take], ["skip", opts.skip]] as const)
    if (v !== undefined && !(Number.isInteger(v) && v >= 0)) throw new InputError(`invalid ${field}: ${v} (a whole number ≥ 0)`, { field });
  return [opts.archived === true, Math.min(opts.take ?? 200, 500), opts.skip ?? 0];
}

export async function listSamples(db: Db, member: Member, opts: { q?: string; archived?: boolean; take?: number; skip?: number } = {}): Promise<SampleInfo[]> {
  authorise(member, "group.read");
  const q = opts.q?.trim();
  const params = sampleListParams(opts);
  if (!q) {
    const [row] = await sqlRows<{ list: string }>(db, LIST_SQL, [member.group.id, ...params]);
    return JSON.parse(row!.list) as SampleInfo[];
  }
  const rows = await db.sample.findMany({
    where: {
      groupId: member.group.id,
      archivedAt: opts.archived ? { not: null } : null,
      ...(q
        ? { OR: [{ label: { contains: q, mode: "insensitive" } }, { formula: { contains: q, mode: "insensitive" } }, { seriesLabel: { contains: q, mode: "insensitive" } }, { notes: { contains: q, mode: "insensitive" } }, { tags: { has: q } }] }
        : {}),
    },
    orderBy: [{ seriesLabel: "asc" }, { compositionValue: "asc" }, { label: "asc" }],
    take: Math.min(opts.take ?? 200, 500),
    skip: opts.skip ?? 0,
  });
  return rows.map(toSampleInfo);
}

export async function updateSample(db: Db, member: Member, id: string, input: unknown): Promise<SampleInfo> {
  authorise(member, "sample.write");
  const { version, ...data } = parseInput(sampleUpdateSchema, input);
  const before = await getSample(db, member, id);
  if (before.archived) throw new ConflictError("an archived sample cannot be edited; restore it first");
  const chem = data.formula !== undefined ? chemistryOf(data.formula) : null;
  const formulaSymbols = (chem ?? chemistryOf(before.formula)).elements.map((e) => e.symbol);
  checkValences(data.valences ?? before.valences, formulaSymbols);
  return db.$transaction(async (tx) => {
    const result = await tx.sample.updateMany({
      where: { id, groupId: member.group.id, version },
      data: {
        ...data,
        ...(chem ? { molarMassGPerMol: chem.molarMassGPerMol, atomsPerFormulaUnit: chem.atomsPerFormulaUnit } : {}),
        version: { increment: 1 },
      },
    });
    if (result.count === 0) {
      const current = await tx.sample.findFirst({ where: { id } });
      throw new ConflictError("someone else saved this sample first; your changes were not applied — reload to see theirs", current ? toSampleInfo(current) : undefined);
    }
    const after = toSampleInfo(await tx.sample.findFirstOrThrow({ where: { id } }));
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "sample.update", objectType: "sample", objectId: id, beforeHash: contentHash(before), afterHash: contentHash(after) });
    return after;
  });
}

export async function setSampleArchived(db: Db, member: Member, id: string, archived: boolean): Promise<SampleInfo> {
  authorise(member, "sample.write");
  const before = await getSample(db, member, id);
  return db.$transaction(async (tx) => {
    const s = await tx.sample.update({ where: { id: before.id }, data: { archivedAt: archived ? new Date() : null, version: { increment: 1 } } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: archived ? "sample.archive" : "sample.restore", objectType: "sample", objectId: id });
    return toSampleInfo(s);
  });
}
