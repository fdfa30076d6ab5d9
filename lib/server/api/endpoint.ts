/**
 * The shared plumbing of every /api/v1 route handler, in the fixed order:
 * bearer token → rate limit → token scope → group role → parse path/query/body → handler → JSON.
 *
 * Statuses: missing/unknown/revoked token 401 (with WWW-Authenticate), rate limit 429 with
 * Retry-After, read token on a write 403, role not allowed 403, a record of another group 404
 * (it does not exist for this token), invalid input 422 `{error, field}`.
 * Each handler carries its EndpointSpec (`handler.spec`); the OpenAPI document is built from the
 * same specs, so what is documented is what is validated.
 */
import { NextResponse } from "next/server";
import type { z } from "zod";
import { getDb, type Db } from "../db/client";
import { ForbiddenError, UnauthenticatedError } from "../../engine/errors";
import { authorise, type Member } from "../access";
import type { Action } from "../permissions";
import { errorResponse, jsonBody } from "../http";
import { assertCleanText } from "../body";
import { parseInput } from "../validate";
import { authenticateToken, type TokenScope } from "../tokens";
import { apiLimiter, type TakeResult } from "./rateLimit";

export type HttpMethod = "GET" | "POST" | "PATCH" | "DELETE";

export interface EndpointSpec {
  readonly operationId: string;
  readonly method: HttpMethod;
  /** OpenAPI path under /api/v1, e.g. "/samples/{id}". */
  readonly path: string;
  readonly summary: string;
  readonly description?: string;
  readonly tag: string;
  /** "write" needs a read_write token. */
  readonly access: "read" | "write";
  readonly action: Action;
  readonly query?: z.ZodObject;
  /** JSON body schema; for "upload" endpoints the schema of the `options` part. */
  readonly body?: z.ZodType;
  readonly bodyKind?: "json" | "upload";
  readonly response: z.ZodType;
  readonly successStatus?: number;
  /** Extra response media types, e.g. text/csv. */
  readonly alsoProduces?: readonly string[];
}

export interface V1Context<S extends EndpointSpec> {
  req: Request;
  db: Db;
  member: Member;
  tokenId: string;
  scope: TokenScope;
  params: Record<string, string>;
  query: S["query"] extends z.ZodObject ? z.infer<S["query"]> : Record<string, never>;
  body: S["bodyKind"] extends "upload" ? undefined : S["body"] extends z.ZodType ? z.infer<S["body"]> : undefined;
}

type RouteCtx = { params: Promise<Record<string, string>> };
export type V1Handler<S extends EndpointSpec> = ((req: Request, ctx: RouteCtx) => Promise<Response>) & { spec: S };

class RateLimited extends Error {
  constructor(readonly take: TakeResult) {
    super(`rate limit exceeded: at most ${take.limit} requests in a burst; retry in ${take.retryAfterSeconds} s`);
  }
}

function bearer(req: Request): string {
  const h = req.headers.get("authorization") ?? "";
  const m = /^Bearer\s+(\S+)\s*$/i.exec(h);
  if (!m) throw new UnauthenticatedError("send an API token: Authorization: Bearer hb_…");
  return m[1]!;
}

function limitHeaders(t: TakeResult): Record<string, string> {
  return { "X-RateLimit-Limit": String(t.limit), "X-RateLimit-Remaining": String(t.remaining), ...(t.allowed ? {} : { "Retry-After": String(t.retryAfterSeconds) }) };
}

function failure(err: unknown): Response {
  if (err instanceof RateLimited) return NextResponse.json({ error: err.message }, { status: 429, headers: limitHeaders(err.take) });
  const res = errorResponse(err);
  if (res.status === 401) res.headers.set("WWW-Authenticate", 'Bearer realm="heatbook"');
  return res;
}

/** The query parameters, each refused if it holds a NUL or a bidirectional control character. */
function cleanQuery(req: Request): Record<string, string> {
  const query = Object.fromEntries(new URL(req.url).searchParams);
  for (const [k, v] of Object.entries(query)) assertCleanText(v, k);
  return query;
}

/** Wrap a v1 handler: see the module comment for the order of checks. */
export function v1<S extends EndpointSpec>(spec: S, handler: (ctx: V1Context<S>) => Promise<unknown>): V1Handler<S> {
  const fn = async (req: Request, ctx: RouteCtx): Promise<Response> => {
    try {
      const db = getDb();
      const principal = await authenticateToken(db, bearer(req));
      const take = await apiLimiter(db).take(principal.tokenId);
      if (!take.allowed) throw new RateLimited(take);
      if (spec.access === "write" && principal.scope !== "read_write") throw new ForbiddenError("this API token is read-only: create a read_write token to change data");
      authorise(principal.member, spec.action);
      const params = ctx?.params ? await ctx.params : {};
      const query = spec.query ? parseInput(spec.query, cleanQuery(req)) : {};
      const body = spec.body && spec.bodyKind !== "upload" ? parseInput(spec.body, await jsonBody(req)) : undefined;
      const out = await handler({ req, db, member: principal.member, tokenId: principal.tokenId, scope: principal.scope, params, query, body } as V1Context<S>);
      const res = out instanceof Response ? out : NextResponse.json(out, { status: spec.successStatus ?? 200 });
      for (const [k, v] of Object.entries(limitHeaders(take))) res.headers.set(k, v);
      return res;
    } catch (err) {
      return failure(err);
    }
  };
  return Object.assign(fn, { spec });
}
