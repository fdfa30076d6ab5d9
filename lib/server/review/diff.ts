/**
 * What changed between two revisions of an analysis: steps added, removed or changed (with
 * field-level changes of their configuration), and how each result moved (old → new with
 * uncertainties). Steps are paired by kind and order: the k-th step of a kind in one revision
 * with the k-th of that kind in the other (step ids differ between revisions). Sealed
 * revisions are read from their snapshot, others from their stored steps.
 */
import type { Db } from "../db/client";
import { InputError, NotFoundError } from "../../engine/errors";
import { authorise, type Member } from "../access";
import { uuidOrNone } from "../samples";
import { parseStepConfig } from "../../engine/notebook";
import { chainResults, type ResultValue } from "./results";
import type { RevisionSnapshot } from "./snapshot";
import { intactSnapshot } from "./served";

export interface FieldChange { path: string; from: unknown; to: unknown }

export interface StepDiff {
  status: "added" | "removed" | "changed" | "unchanged";
  kind: string;
  /** 1-based occurrence of this kind in the chain. */
  occurrence: number;
  positionA: number | null;
  positionB: number | null;
  changes: FieldChange[];
}

export interface ResultMove {
  key: string;
  name: string;
  symbol: string;
  unit: string;
  from: { value: number; stdError: number | null } | null;
  to: { value: number; stdError: number | null } | null;
  /** to − from, and that change over the two σ combined in quadrature (null if unknown). */
  change: number | null;
  changeInSigmas: number | null;
}

export interface RevisionDiff {
  a: { id: string; number: number; state: string };
  b: { id: string; number: number; state: string };
  steps: StepDiff[];
  results: ResultMove[];
}

interface ChainStep { position: number; kind: string; config: unknown; output: unknown }

/** Field-level differences of two JSON values, paths like "tMaxK" or "measurementIds[1]". */
export function configChanges(a: unknown, b: unknown, path = ""): FieldChange[] {
  if (JSON.stringify(a) === JSON.stringify(b)) return [];
  const isObj = (v: unknown) => v !== null && typeof v === "object" && !Array.isArray(v);
  if (isObj(a) && isObj(b)) {
    const keys = [...new Set([...Object.keys(a as object), ...Object.keys(b as object)])].sort();
    return keys.flatMap((k) => configChanges((a as Record<string, unknown>)[k] ?? null, (b as Record<string, unknown>)[k] ?? null, path ? `${path}.${k}` : k));
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    const n = Math.max(a.length, b.length);
    return Array.from({ length: n }, (_, i) => configChanges(a[i] ?? null, b[i] ?? null, `${path}[${i}]`)).flat();
  }
  return [{ path: path || "(config)", from: a ?? null, to: b ?? null }];
}

/** The configuration with its defaults filled, so an omitted default is not a change. */
function withDefaults(kind: string, config: unknown): unknown {
  try {
    return parseStepConfig(kind, config);
  } catch {
    return config;
  }
}

function pairSteps(a: ChainStep[], b: ChainStep[]): StepDiff[] {
  const byKind = (xs: ChainStep[]) => { const m = new Map<string, ChainStep[]>(); for (const s of xs) m.set(s.kind, [...(m.get(s.kind) ?? []), s]); return m; };
  const ka = byKind(a), kb = byKind(b);
  const out: StepDiff[] = [];
  for (const kind of new Set([...a.map((s) => s.kind), ...b.map((s) => s.kind)])) {
    const xa = ka.get(kind) ?? [], xb = kb.get(kind) ?? [];
    for (let i = 0; i < Math.max(xa.length, xb.length); i++) {
      const sa = xa[i], sb = xb[i];
      const changes = sa && sb ? configChanges(withDefaults(kind, sa.config), withDefaults(kind, sb.config)) : [];
      out.push({ status: !sa ? "added" : !sb ? "removed" : changes.length ? "changed" : "unchanged", kind, occurrence: i + 1, positionA: sa?.position ?? null, positionB: sb?.position ?? null, changes });
    }
  }
  return out.sort((x, y) => (x.positionB ?? x.positionA ?? 0) - (y.positionB ?? y.positionA ?? 0));
}

function moveResults(a: ResultValue[], b: ResultValue[]): ResultMove[] {
  const ma = new Map(a.map((r) => [r.key, r])), mb = new Map(b.map((r) => [r.key, r]));
  const keys = [...new Set([...b.map((r) => r.key), ...a.map((r) => r.key)])];
  return keys.map((key) => {
    const ra = ma.get(key), rb = mb.get(key);
    const ref = (rb ?? ra)!;
    const change = ra && rb ? rb.value - ra.value : null;
    const s = ra && rb && ra.stdError !== null && rb.stdError !== null ? Math.hypot(ra.stdError, rb.stdError) : null;
    return {
      key, name: ref.name, symbol: ref.symbol, unit: ref.unit,
      from: ra ? { value: ra.value, stdError: ra.stdError } : null, to: rb ? { value: rb.value, stdError: rb.stdError } : null,
      change, changeInSigmas: change !== null && s ? change / s : null,
    };
  });
}

async function loadChain(db: Db, member: Member, id: string) {
  const rev = await db.analysisRevision.findFirst({ where: { id: uuidOrNone(id), analysis: { groupId: member.group.id } }, include: { steps: { orderBy: { position: "asc" } } } });
  if (!rev) throw new NotFoundError("revision");
  const snap: RevisionSnapshot | null = rev.snapshot ? intactSnapshot(rev) : null;
  const steps: ChainStep[] = snap
    ? snap.inputs.steps.map((s, i) => ({ position: s.position, kind: s.kind, config: s.config, output: snap.outputs.steps[i]?.output ?? null }))
    : rev.steps.map((s) => ({ position: s.position, kind: s.kind, config: s.config, output: s.output }));
  return { rev, steps };
}

/** Diff revision `aId` (older) against `bId` (newer) of the same analysis (`analysisId`, if given). */
export async function diffRevisions(db: Db, member: Member, aId: string, bId: string, analysisId?: string): Promise<RevisionDiff> {
  authorise(member, "group.read");
  const [a, b] = await Promise.all([loadChain(db, member, aId), loadChain(db, member, bId)]);
  if (analysisId !== undefined && a.rev.analysisId !== analysisId) throw new NotFoundError("revision");
  if (a.rev.analysisId !== b.rev.analysisId) throw new InputError("the two revisions belong to different analyses", { field: "b" });
  return {
    a: { id: a.rev.id, number: a.rev.number, state: a.rev.state },
    b: { id: b.rev.id, number: b.rev.number, state: b.rev.state },
    steps: pairSteps(a.steps, b.steps),
    results: moveResults(chainResults(a.steps), chainResults(b.steps)),
  };
}
