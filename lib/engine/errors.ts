/**
 * Domain error classes, one file for the whole product.
 *
 * Invalid input throws at once (tier one); a poor or unconverged fit is not an
 * exception but a status in the result (tier two). Route handlers map these
 * classes to HTTP statuses: InputError → 422, NotFoundError → 404,
 * ForbiddenError → 403, UnauthenticatedError → 401, ConflictError → 409.
 */

/** Where in an input something went wrong: any of file, line, column, field. */
export interface Location {
  file?: string;
  line?: number;
  column?: number;
  field?: string;
}

function describeLocation(where: Location | undefined): string {
  if (!where) return "";
  const parts: string[] = [];
  if (where.file) parts.push(where.file);
  if (where.line !== undefined) parts.push(`line ${where.line}`);
  if (where.column !== undefined) parts.push(`column ${where.column}`);
  if (where.field) parts.push(`field ${where.field}`);
  return parts.length ? ` (${parts.join(", ")})` : "";
}

/** Invalid input: a value that cannot be used, with where it came from. */
export class InputError extends Error {
  readonly where: Location | undefined;
  /** The message without the location suffix (to re-locate an error without repeating it). */
  readonly baseMessage: string;
  constructor(message: string, where?: Location) {
    super(message + describeLocation(where));
    this.name = "InputError";
    this.where = where;
    this.baseMessage = message;
  }
  /** The field named in `where`, if any (used by forms and the JSON API). */
  get field(): string | undefined {
    return this.where?.field;
  }
}

/** Shorthand for the common "invalid NAME: VALUE" message. */
export function invalid(name: string, value: unknown, why?: string, where?: Location): InputError {
  const shown = typeof value === "string" ? JSON.stringify(value) : String(value);
  return new InputError(`invalid ${name}: ${shown}${why ? ` (${why})` : ""}`, where ?? { field: name });
}

export class NotFoundError extends Error {
  constructor(what: string) {
    super(`${what} not found`);
    this.name = "NotFoundError";
  }
}

export class ForbiddenError extends Error {
  constructor(message = "not allowed") {
    super(message);
    this.name = "ForbiddenError";
  }
}

export class UnauthenticatedError extends Error {
  constructor(message = "sign in first") {
    super(message);
    this.name = "UnauthenticatedError";
  }
}

/** A write that lost a race (optimistic concurrency) or hit a locked record. */
export class ConflictError extends Error {
  readonly current: unknown;
  constructor(message: string, current?: unknown) {
    super(message);
    this.name = "ConflictError";
    this.current = current;
  }
}

/** A request body over its size limit (counted on the bytes as they arrived). */
export class PayloadTooLargeError extends Error {
  readonly field: string | undefined;
  constructor(message: string, field?: string) {
    super(message);
    this.name = "PayloadTooLargeError";
    this.field = field;
  }
}
