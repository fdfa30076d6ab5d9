/**
 * Route-handler plumbing: every handler runs inside `route(...)`, which maps domain errors to
 * HTTP statuses with a JSON body `{ error, field? }` and logs anything unexpected before a 500.
 * Order inside a handler: parse → authorise → call the engine → persist → respond.
 */
import { NextResponse } from "next/server";
import { ConflictError, ForbiddenError, InputError, NotFoundError, PayloadTooLargeError, UnauthenticatedError } from "../engine/errors";
import { readJsonBody } from "./body";
import { lockViolation } from "./review/lockError";

export interface ErrorBody {
  error: string;
  field?: string;
  current?: unknown;
}

export function errorResponse(raw: unknown): NextResponse<ErrorBody> {
  // A refusal by the database's lock triggers (sealed revisions, the audit trail) is a conflict.
  const err = lockViolation(raw);
  if (err instanceof InputError) return NextResponse.json({ error: err.message, ...(err.field ? { field: err.field } : {}) }, { status: 422 });
  if (err instanceof UnauthenticatedError) return NextResponse.json({ error: err.message }, { status: 401 });
  if (err instanceof ForbiddenError) return NextResponse.json({ error: err.message }, { status: 403 });
  if (err instanceof NotFoundError) return NextResponse.json({ error: err.message }, { status: 404 });
  if (err instanceof PayloadTooLargeError) return NextResponse.json({ error: err.message, ...(err.field ? { field: err.field } : {}) }, { status: 413 });
  if (err instanceof ConflictError) return NextResponse.json({ error: err.message, ...(err.current !== undefined ? { current: err.current } : {}) }, { status: 409 });
  if (isDatabaseDown(err)) return NextResponse.json({ error: "the database is not reachable right now; try again in a moment" }, { status: 503 });
  console.error("unexpected error in route handler", err);
  return NextResponse.json({ error: "internal error" }, { status: 500 });
}

const DOWN_CODES = new Set(["P1001", "P1002", "P1008", "P1017", "ECONNREFUSED", "ECONNRESET", "57P01", "57P02", "57P03", "08000", "08003", "08006"]);
const DOWN_TEXT = /ECONNREFUSED|ECONNRESET|terminating connection|Connection terminated|connection (?:is )?closed|Can't reach database server|DatabaseNotReachable|the database system is (?:starting up|shutting down)/i;

/** PostgreSQL unreachable or restarting (Prisma's P1001/P1017, pg's connection errors), anywhere in the cause chain. */
function isDatabaseDown(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== "object" || depth > 5) return false;
  const e = err as { code?: unknown; errorCode?: unknown; message?: unknown; cause?: unknown; meta?: { driverAdapterError?: { cause?: unknown } } };
  if ((typeof e.code === "string" && DOWN_CODES.has(e.code)) || (typeof e.errorCode === "string" && DOWN_CODES.has(e.errorCode))) return true;
  if (typeof e.message === "string" && DOWN_TEXT.test(e.message)) return true;
  return isDatabaseDown(e.cause, depth + 1) || isDatabaseDown(e.meta?.driverAdapterError?.cause, depth + 1);
}

type Handler<C> = (req: Request, ctx: C) => Promise<Response>;

export function route<C>(handler: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    try {
      return await handler(req, ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/**
 * Read a JSON body: at most 1 MiB counted as it arrives (413 beyond), nesting at most 64 deep,
 * no NUL or bidirectional control character in any string (422 naming the field); see body.ts.
 */
export async function jsonBody(req: Request): Promise<unknown> {
  return readJsonBody(req);
}
