/**
 * Fuzzing every API payload schema with fast-check (seeded, bounded): each zod schema exported
 * by the server layer (lib/server/*.ts and its areas, the v1 API's lib/server/api/schemas.ts;
 * found by walking the modules, so a new schema is fuzzed without editing this file) and every
 * notebook step configuration (parseStepConfig per step kind). Properties: parseInput either
 * returns or throws InputError — never anything else — and for an object payload the error
 * names the field it is about; a step configuration's error names "config.<field>".
 */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { readdirSync, statSync } from "node:fs";
import { join } from "node:path";
import { z } from "zod";
import { parseInput } from "../../lib/server/validate";
import { parseStepConfig, STEP_ORDER } from "../../lib/engine/notebook";
import { InputError } from "../../lib/engine/errors";

const SEED = 20261202;

function serverModules(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return name === "generated" || name === "demo" ? [] : serverModules(path);
    return name.endsWith(".ts") && !name.endsWith(".d.ts") ? [path] : [];
  });
}

async function schemas(): Promise<[string, z.ZodType][]> {
  const out: [string, z.ZodType][] = [];
  for (const file of serverModules("lib/server").sort()) {
    const mod = (await import(/* @vite-ignore */ `../../${file}`)) as Record<string, unknown>;
    for (const [name, value] of Object.entries(mod)) if (value instanceof z.ZodType && !/Out$/.test(name)) out.push([`${file}: ${name}`, value]);
  }
  return out;
}

const payload = fc.oneof(
  { weight: 3, arbitrary: fc.dictionary(fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom("name", "title", "kind", "email", "version", "config", "sampleId", "seriesId", "action", "label", "formula", "role", "__proto__", "constructor")), fc.jsonValue({ maxDepth: 3 }), { maxKeys: 8 }) },
  fc.jsonValue({ maxDepth: 4 }),
  fc.anything({ maxDepth: 2 }),
);

function expectInputOrOk(schema: z.ZodType, value: unknown): void {
  try {
    parseInput(schema, value);
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    expect((err as Error).message.length).toBeGreaterThan(3);
    const isObject = value !== null && typeof value === "object" && !Array.isArray(value);
    if (isObject && schema instanceof z.ZodObject) expect((err as InputError).field, `no field for ${JSON.stringify(value)}`).toBeTruthy();
  }
}

describe("every payload schema under fuzzing", () => {
  it("parseInput of random payloads against each server schema gives a value or an InputError naming the field", async () => {
    const all = await schemas();
    expect(all.length).toBeGreaterThanOrEqual(20);
    for (const [, schema] of all) fc.assert(fc.property(payload, (value) => { expectInputOrOk(schema, value); }), { seed: SEED, numRuns: 150 });
  }, 120_000);

  it.each(STEP_ORDER)("parseStepConfig(%s, random) gives a configuration or an InputError on config.<field>", (kind) => {
    fc.assert(fc.property(payload, (value) => {
      try {
        parseStepConfig(kind, value);
      } catch (err) {
        expect(err).toBeInstanceOf(InputError);
        expect((err as InputError).field).toMatch(/^config/);
      }
    }), { seed: SEED, numRuns: 400 });
  });
});
