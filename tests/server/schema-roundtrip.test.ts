/**
 * schema.prisma and the SQL migrations agree: every model gets a record with every scalar field
 * set (optional ones too) through the generated client, and reads back equal. A column missing
 * from the migrations, or of another type, fails here. Written as the owner: this checks the
 * schema, not the runtime role's privileges (tests/security/db-roles.test.ts does).
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { readFileSync } from "node:fs";
import { randomUUID } from "node:crypto";
import { freshDatabase, type TestDatabase } from "../helpers/db";

interface Field { name: string; type: string; optional: boolean; list: boolean; uuid: boolean; relationTo?: string; fk?: string[] }
interface Model { name: string; fields: Field[] }

function parseSchema(text: string): { models: Model[]; enums: Map<string, string[]> } {
  const enums = new Map<string, string[]>();
  for (const m of text.matchAll(/^enum (\w+) \{\n([\s\S]*?)^\}/gm))
    enums.set(m[1]!, m[2]!.split("\n").map((l) => l.replace(/\/\/.*/, "").trim()).filter(Boolean));
  const models: Model[] = [];
  for (const m of text.matchAll(/^model (\w+) \{\n([\s\S]*?)^\}/gm)) {
    const fields: Field[] = [];
    for (const raw of m[2]!.split("\n")) {
      const line = raw.replace(/\/\/.*/, "").trim();
      if (!line || line.startsWith("@@")) continue;
      const [name, typeRaw] = line.split(/\s+/);
      const type = typeRaw!.replace(/[?\[\]]/g, "");
      const rel = line.match(/@relation\([^)]*fields: \[([^\]]+)\]/);
      fields.push({ name: name!, type, optional: typeRaw!.endsWith("?"), list: typeRaw!.endsWith("[]"), uuid: line.includes("@db.Uuid"), ...(rel ? { relationTo: type, fk: rel[1]!.split(",").map((s) => s.trim()) } : {}) });
    }
    models.push({ name: m[1]!, fields });
  }
  return { models, enums };
}

const SCALARS = new Set(["String", "Int", "Float", "Boolean", "DateTime", "Json", "Bytes", "BigInt"]);

function valueFor(f: Field, enums: Map<string, string[]>, n: number): unknown {
  const one = (): unknown => {
    switch (f.type) {
      case "String": return f.uuid ? randomUUID() : `${f.name}-${n}-ü`;
      case "Int": return 7 + n;
      case "Float": return 1.25e-5 * (n + 1);
      case "Boolean": return true;
      case "DateTime": return new Date(Date.UTC(2026, 0, 2, 3, 4, 5, 678));
      case "Json": return { nested: [1, 2.5, "x"], n };
      case "Bytes": return new Uint8Array([0, 1, 254, 255, n & 255]);
      case "BigInt": return BigInt(1000 + n);
      // A revision is born open: the review-lock triggers refuse inserting one sealed or replaced
      // (tests/server/review-locks.test.ts covers those states).
      default: return f.type === "RevisionState" ? "open" : enums.get(f.type)![enums.get(f.type)!.length - 1];
    }
  };
  return f.list ? [one(), one()] : one();
}

let t: TestDatabase;
beforeAll(async () => { t = await freshDatabase(); });
afterAll(async () => { await t.drop(); });

describe("schema.prisma against the migrations", () => {
  it("round-trips every scalar field of every model through the generated client", async () => {
    const { models, enums } = parseSchema(readFileSync("prisma/schema.prisma", "utf8"));
    const created = new Map<string, Record<string, unknown>>();
    const pending = [...models];
    let guard = 0;
    while (pending.length && guard++ < 100) {
      const model = pending.shift()!;
      const relations = model.fields.filter((f) => f.fk);
      const blocking = relations.filter((r) => r.relationTo !== model.name && !created.has(r.relationTo!));
      if (blocking.length) { pending.push(model); continue; }
      const data: Record<string, unknown> = {};
      const fkFields = new Map<string, Field>();
      for (const r of relations) for (const k of r.fk!) fkFields.set(k, r);
      for (const f of model.fields) {
        if (!SCALARS.has(f.type) && !enums.has(f.type)) continue;
        if (f.name === "id" && f.type === "BigInt") continue;
        const rel = fkFields.get(f.name);
        if (rel) { data[f.name] = rel.relationTo === model.name ? null : (created.get(rel.relationTo!)!.id ?? null); continue; }
        data[f.name] = valueFor(f, enums, guard);
      }
      const delegate = (t.owner() as unknown as Record<string, { create(a: unknown): Promise<Record<string, unknown>> }>)[model.name[0]!.toLowerCase() + model.name.slice(1)]!;
      const row = await delegate.create({ data });
      for (const [k, v] of Object.entries(data)) {
        if (k === "updatedAt") continue; // @updatedAt is set by the client itself
        expect(row[k], `${model.name}.${k}`).toEqual(v instanceof Uint8Array ? expect.anything() : v);
        if (v instanceof Uint8Array) expect(Array.from(row[k] as Uint8Array), `${model.name}.${k}`).toEqual(Array.from(v));
      }
      created.set(model.name, row);
    }
    expect(pending.map((m) => m.name)).toEqual([]);
    expect(created.size).toBe(models.length);
  });
});
