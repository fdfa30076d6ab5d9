import { describe, it, expect } from "vitest";
import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { openApiDocument, jsonSchemaOf, ENDPOINTS, type EndpointSpec } from "../../lib/server/api";
import { importSchema } from "../../lib/server/measurements";
import { sampleSchema, sampleUpdateSchema } from "../../lib/server/samples";

const ROOT = join(process.cwd(), "app/api/v1");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? routeFiles(p) : name === "route.ts" ? [p] : [];
  });
}

/** app/api/v1/samples/[id]/route.ts → /samples/{id} */
function pathOf(file: string): string {
  const rel = relative(ROOT, file).split("/").slice(0, -1).map((seg) => seg.replace(/^\[(\w+)\]$/, "{$1}"));
  return "/" + rel.join("/");
}

type Doc = { openapi: string; paths: Record<string, Record<string, any>>; components: { schemas: Record<string, unknown> } };

async function routes() {
  const out: { file: string; path: string; method: string; handler: { spec?: EndpointSpec } }[] = [];
  for (const file of routeFiles(ROOT)) {
    const mod = (await import(file)) as Record<string, unknown>;
    expect(mod.dynamic, `${file} exports dynamic = "force-dynamic"`).toBe("force-dynamic");
    for (const m of METHODS) if (typeof mod[m] === "function") out.push({ file, path: pathOf(file), method: m, handler: mod[m] as { spec?: EndpointSpec } });
  }
  return out;
}

describe("openApiDocument", () => {
  it("openApiDocument documents every app/api/v1 route file and method", async () => {
    const doc = openApiDocument() as Doc;
    expect(doc.openapi).toBe("3.1.0");
    const found = await routes();
    expect(found.length).toBeGreaterThanOrEqual(12);
    for (const r of found) expect(doc.paths[r.path]?.[r.method.toLowerCase()], `${r.method} ${r.path} (${r.file})`).toBeDefined();
  });
  it("openApiDocument lists no operation that has no route handler", async () => {
    const doc = openApiDocument() as Doc;
    const found = new Set((await routes()).map((r) => `${r.method} ${r.path}`));
    for (const [path, ops] of Object.entries(doc.paths)) for (const method of Object.keys(ops)) expect(found.has(`${method.toUpperCase()} ${path}`), `${method} ${path}`).toBe(true);
  });
  it("every v1 handler except the document itself carries the spec of its own path and method", async () => {
    for (const r of await routes()) {
      if (r.path === "/openapi.json") continue;
      expect(r.handler.spec, `${r.method} ${r.path}`).toBeDefined();
      expect(r.handler.spec!.path).toBe(r.path);
      expect(r.handler.spec!.method).toBe(r.method);
      expect(Object.values(ENDPOINTS)).toContain(r.handler.spec);
    }
  });
  it("the documented request bodies and query parameters are the handlers' zod schemas", async () => {
    const doc = openApiDocument() as Doc;
    for (const r of await routes()) {
      const spec = r.handler.spec;
      if (!spec) continue;
      const op = doc.paths[r.path]![r.method.toLowerCase()];
      if (spec.body && spec.bodyKind === "json") expect(op.requestBody.content["application/json"].schema).toEqual(jsonSchemaOf(spec.body, "input"));
      if (spec.bodyKind === "upload") expect(doc.components.schemas.ImportOptions).toEqual(jsonSchemaOf(spec.body!, "input"));
      const documented = op.parameters.filter((p: { in: string }) => p.in === "query").map((p: { name: string }) => p.name).sort();
      const declared = spec.query ? Object.keys(spec.query.shape).sort() : [];
      expect(documented, `${r.method} ${r.path} query`).toEqual(declared);
      const pathNames = op.parameters.filter((p: { in: string }) => p.in === "path").map((p: { name: string }) => p.name);
      expect(pathNames).toEqual([...r.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]));
    }
  });
  it("the endpoint table uses the very schemas the server layer validates with", () => {
    expect(ENDPOINTS.createSample.body).toBe(sampleSchema);
    expect(ENDPOINTS.updateSample.body).toBe(sampleUpdateSchema);
    expect(ENDPOINTS.uploadMeasurement.body).toBe(importSchema);
  });
});
