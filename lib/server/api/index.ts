/**
 * The JSON API's shared code (/api/v1).
 *
 *   v1(spec, handler)              token auth → rate limit → scope → role → parse → JSON
 *   ENDPOINTS                      every operation: method, path, zod schemas, access
 *   openApiDocument()              OpenAPI 3.1 from ENDPOINTS
 *   PgTokenBucketLimiter, apiLimiter rate limit shared by all instances (PostgreSQL)
 *   pageQuery, encodeCursor, …     keyset pagination
 *   pageSamples, pageMeasurements, listApiAnalyses, getApiAnalysis, uploadMeasurement, resolveColumns
 */
export { v1 } from "./endpoint";
export type { EndpointSpec, V1Context, V1Handler, HttpMethod } from "./endpoint";
export { ENDPOINTS, OPENAPI_PATH } from "./endpoints";
export type { EndpointName } from "./endpoints";
export { openApiDocument, jsonSchemaOf } from "./openapi";
export { PgTokenBucketLimiter, apiLimiter, setApiLimiter, apiLimitOptions, type RateLimiter } from "./rateLimit";
export type { BucketOptions, TakeResult } from "./rateLimit";
export { pageQuery, encodeCursor, decodeCursor, afterCursor, pageOf, MAX_PAGE } from "./pagination";
export { pageSamples, pageMeasurements } from "./queries";
export { listApiAnalyses, getApiAnalysis } from "./analyses";
export type { ApiAnalysis, ApiRevision, ApiStep } from "./analyses";
export { uploadMeasurement } from "./upload";
export { resolveColumns } from "./columns";
export type { ColumnChoice, ResolvedMapping } from "./columns";
