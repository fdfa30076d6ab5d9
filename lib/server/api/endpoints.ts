/**
 * Every /api/v1 operation, as data: the route files wrap their handler with `v1(ENDPOINTS.x, …)`
 * and the OpenAPI document is built from this table, so the schemas documented are the objects
 * the handlers validate with. Paths are relative to /api/v1.
 */
import { z } from "zod";
import { sampleSchema, sampleUpdateSchema } from "../samples";
import { importSchema } from "../measurements";
import type { EndpointSpec } from "./endpoint";
import { pageQuery } from "./pagination";
import {
  analysisDetailOut, analysisOut, getAnalysisQuery, getSeriesQuery, listAnalysesQuery, listSamplesQuery, measurementOut, page, pointsOut, rawUploadQuery,
  sampleOut, seriesOut, seriesViewOut,
} from "./schemas";

const spec = <S extends EndpointSpec>(s: S): S => s;

export const ENDPOINTS = {
  listSamples: spec({ operationId: "listSamples", method: "GET", path: "/samples", tag: "samples", summary: "List the group's samples", access: "read", action: "group.read", query: listSamplesQuery, response: page("samples", sampleOut) }),
  createSample: spec({ operationId: "createSample", method: "POST", path: "/samples", tag: "samples", summary: "Create a sample (molar mass and atoms per f.u. from the formula)", access: "write", action: "sample.write", body: sampleSchema, bodyKind: "json", response: z.object({ sample: sampleOut }), successStatus: 201 }),
  getSample: spec({ operationId: "getSample", method: "GET", path: "/samples/{id}", tag: "samples", summary: "One sample", access: "read", action: "group.read", response: z.object({ sample: sampleOut }) }),
  updateSample: spec({ operationId: "updateSample", method: "POST", path: "/samples/{id}", tag: "samples", summary: "Update a sample (partial; `version` from the last read, 409 if someone saved first)", access: "write", action: "sample.write", body: sampleUpdateSchema, bodyKind: "json", response: z.object({ sample: sampleOut }) }),
  listSampleMeasurements: spec({ operationId: "listSampleMeasurements", method: "GET", path: "/samples/{id}/measurements", tag: "measurements", summary: "The sample's measurements (without points)", access: "read", action: "group.read", query: pageQuery, response: page("measurements", measurementOut) }),
  uploadMeasurement: spec({
    operationId: "uploadMeasurement", method: "POST", path: "/samples/{id}/measurements", tag: "measurements", access: "write", action: "measurement.write",
    summary: "Upload a measurement file",
    description: "Either multipart/form-data with a `file` part and an `options` part (JSON, schema ImportOptions — the same as the app's import), or the raw file as the body (text/plain, text/csv, application/octet-stream) with the query parameters below (columns by 0-based index or header name; omitted columns and the heat-capacity unit are taken from the header). The original bytes are stored unchanged with their SHA-256.",
    body: importSchema, bodyKind: "upload", query: rawUploadQuery, response: z.object({ measurement: measurementOut }), successStatus: 201,
  }),
  getMeasurement: spec({ operationId: "getMeasurement", method: "GET", path: "/measurements/{id}", tag: "measurements", summary: "A measurement with its points (SI: K, C per basis, T)", access: "read", action: "group.read", response: z.object({ measurement: pointsOut }) }),
  listAnalyses: spec({ operationId: "listAnalyses", method: "GET", path: "/analyses", tag: "analyses", summary: "The group's analyses (optionally of one sample) with revision states and content hashes", access: "read", action: "group.read", query: listAnalysesQuery, response: page("analyses", analysisOut) }),
  getAnalysis: spec({ operationId: "getAnalysis", method: "GET", path: "/analyses/{id}", tag: "analyses", summary: "An analysis: revisions with state, content hash and every step's stored output", access: "read", action: "group.read", query: getAnalysisQuery, response: analysisDetailOut }),
  listSeries: spec({ operationId: "listSeries", method: "GET", path: "/series", tag: "series", summary: "The group's composition series", access: "read", action: "group.read", response: z.object({ series: z.array(seriesOut) }) }),
  getSeries: spec({
    operationId: "getSeries", method: "GET", path: "/series/{id}", tag: "series", access: "read", action: "group.read", query: getSeriesQuery, response: seriesViewOut, alsoProduces: ["text/csv"],
    summary: "A series: per member the values of its newest sealed revision (γ, β, Θ_D, D(E_F), m*/m, T_c with σ) and trend fits",
    description: "`include=drafts` adds, per sample, the newest unsealed revision newer than its seal as a separate row with `draft: true`. `format=csv` answers text/csv.",
  }),
} as const satisfies Record<string, EndpointSpec>;

export type EndpointName = keyof typeof ENDPOINTS;

/** The document itself is public (no token): GET /api/v1/openapi.json. */
export const OPENAPI_PATH = "/openapi.json";
