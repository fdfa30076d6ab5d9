/**
 * The OpenAPI 3.1 document of /api/v1, built from ENDPOINTS with zod 4's z.toJSONSchema (JSON
 * Schema 2020-12, which OpenAPI 3.1 uses as is). Request schemas are converted in "input" mode
 * (fields with defaults are optional), responses in "output" mode.
 */
import { z } from "zod";
import { ENGINE_VERSION } from "../../engine/version";
import type { EndpointSpec } from "./endpoint";
import { ENDPOINTS, OPENAPI_PATH } from "./endpoints";
import { errorOut } from "./schemas";

type Json = Record<string, unknown>;

/** JSON Schema of a zod schema without the $schema key (OpenAPI embeds it). */
export function jsonSchemaOf(schema: z.ZodType, io: "input" | "output"): Json {
  const { $schema: _drop, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: "any" }) as Json;
  return rest;
}

function pathParams(path: string): Json[] {
  return [...path.matchAll(/\{(\w+)\}/g)].map((m) => ({ name: m[1], in: "path", required: true, schema: { type: "string", format: "uuid" } }));
}

function queryParams(spec: EndpointSpec): Json[] {
  if (!spec.query) return [];
  const js = jsonSchemaOf(spec.query, "input") as { properties?: Record<string, Json>; required?: string[] };
  return Object.entries(js.properties ?? {}).map(([name, schema]) => ({ name, in: "query", required: (js.required ?? []).includes(name), schema }));
}

const ERRORS: Record<string, string> = {
  "401": "missing, unknown or revoked token", "403": "read-only token on a write, or the role does not allow it", "404": "not found in the token's group",
  "422": "invalid input; `field` names it", "429": "rate limit; see Retry-After",
};

function requestBody(spec: EndpointSpec): Json | undefined {
  if (!spec.body) return undefined;
  if (spec.bodyKind === "upload") {
    return {
      required: true,
      content: {
        "multipart/form-data": { schema: { type: "object", required: ["file"], properties: { file: { type: "string", format: "binary" }, options: { type: "string", contentMediaType: "application/json", contentSchema: { $ref: "#/components/schemas/ImportOptions" } } } } },
        "text/plain": { schema: { type: "string" } },
        "application/octet-stream": { schema: { type: "string", format: "binary" } },
      },
    };
  }
  return { required: true, content: { "application/json": { schema: jsonSchemaOf(spec.body, "input") } } };
}

function operation(spec: EndpointSpec): Json {
  const ok: Json = { description: "success", content: { "application/json": { schema: jsonSchemaOf(spec.response, "output") }, ...Object.fromEntries((spec.alsoProduces ?? []).map((t) => [t, { schema: { type: "string" } }])) } };
  const errors = Object.fromEntries(Object.entries(ERRORS).map(([code, description]) => [code, { description, content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } } }]));
  const body = requestBody(spec);
  return {
    operationId: spec.operationId, summary: spec.summary, ...(spec.description ? { description: spec.description } : {}), tags: [spec.tag],
    "x-heatbook-access": spec.access === "write" ? "read_write token" : "read or read_write token", "x-heatbook-role-action": spec.action,
    parameters: [...pathParams(spec.path), ...queryParams(spec)], ...(body ? { requestBody: body } : {}),
    responses: { [String(spec.successStatus ?? 200)]: ok, ...errors },
  };
}

/** The whole document. */
export function openApiDocument(): Json {
  const paths: Record<string, Json> = {};
  for (const spec of Object.values(ENDPOINTS) as EndpointSpec[]) (paths[spec.path] ??= {})[spec.method.toLowerCase()] = operation(spec);
  paths[OPENAPI_PATH] = { get: { operationId: "getOpenApi", summary: "This document", security: [], tags: ["meta"], responses: { "200": { description: "OpenAPI 3.1 JSON" } } } };
  return {
    openapi: "3.1.0",
    info: {
      title: "Heatbook API", version: "1", "x-engine-version": ENGINE_VERSION,
      description: "JSON API for a group's samples, measurements, analyses and series. A personal access token (Settings → API tokens) is scoped to one group and to read or read_write. Lists are paged with `limit` and `cursor` (`nextCursor` in the answer). Rate limit: a token bucket per token, kept in memory per app process (burst 120, 2 requests/s by default). Errors are `{error, field?}`.",
    },
    servers: [{ url: "/api/v1" }],
    security: [{ bearer: [] }],
    components: {
      securitySchemes: { bearer: { type: "http", scheme: "bearer", description: "hb_… personal access token" } },
      schemas: { Error: jsonSchemaOf(errorOut, "output"), ImportOptions: jsonSchemaOf(ENDPOINTS.uploadMeasurement.body, "input") },
    },
    paths,
  };
}
