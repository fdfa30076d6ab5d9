/**
 * Reading request bodies with limits counted on the bytes as they arrive (a declared
 * Content-Length is checked first, but a chunked body has none): reading stops and the stream is
 * cancelled at the limit, so an oversized upload never costs more memory than the limit.
 * JSON bodies also get a depth limit (checked on the text before parsing) and every string in
 * them — keys too — is refused if it holds a NUL or a bidirectional control character
 * (U+202A–U+202E, U+2066–U+2069: they make a label read differently from what it is).
 */
import { InputError, PayloadTooLargeError } from "../engine/errors";

/** Largest JSON body (bytes); notebooks' step configurations are far below. */
export const MAX_JSON_BYTES = 1024 * 1024;
/** Deepest nesting of arrays and objects in a JSON body. */
export const MAX_JSON_DEPTH = 64;

const mib = (n: number) => `${Math.round((n / 1024 / 1024) * 100) / 100} MiB`;
const sizeText = (n: number) => (n >= 1024 * 1024 ? mib(n) : `${Math.round(n / 1024)} KiB`);

/**
 * The body's bytes, refusing (413) as soon as more than `maxBytes` arrived. The message names
 * `what` and `shownBytes` (default `maxBytes`; e.g. the file limit when `maxBytes` adds room for a
 * multipart form's framing).
 */
export async function readBodyLimited(req: Request, maxBytes: number, what = "request body", field?: string, shownBytes = maxBytes): Promise<Uint8Array> {
  const tooLarge = () => new PayloadTooLargeError(`the ${what} is larger than ${sizeText(shownBytes)}`, field);
  const declared = req.headers.get("content-length");
  if (declared !== null && Number(declared) > maxBytes) throw tooLarge();
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  if (chunks.length === 1) return chunks[0]!;
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** Line and column (1-based) of character `index` in `text`. */
function position(text: string, index: number): string {
  let line = 1;
  let col = 1;
  for (let i = 0; i < index; i++) {
    if (text.charCodeAt(i) === 10) { line++; col = 1; } else col++;
  }
  return `line ${line}, column ${col}`;
}

/** Refuse JSON text nesting deeper than `maxDepth` (before JSON.parse, which would recurse). */
export function assertJsonDepth(text: string, maxDepth = MAX_JSON_DEPTH, field?: string): void {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92) i++; // backslash: skip the escaped character
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 123 || c === 91) {
      if (++depth > maxDepth) throw new InputError(`the JSON nests deeper than ${maxDepth} levels (at ${position(text, i)})`, field ? { field } : undefined);
    } else if (c === 125 || c === 93) depth--;
  }
}

// eslint-disable-next-line no-control-regex
const FORBIDDEN = /[\u0000\u202A-\u202E\u2066-\u2069]/;

function describeChar(ch: string): string {
  const code = `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;
  return ch === "\u0000" ? `a NUL character (${code})` : `the bidirectional control character ${code}`;
}

/** Refuse a string holding NUL or a bidirectional control character, naming the field. */
export function assertCleanText(value: string, field: string): void {
  const m = FORBIDDEN.exec(value);
  if (m) throw new InputError(`invalid ${field}: contains ${describeChar(m[0])} at character ${m.index + 1}; remove it`, { field });
}

/** assertCleanText on every string and key of a parsed JSON value, naming each by its path. */
export function assertCleanJson(value: unknown, path = ""): void {
  if (typeof value === "string") assertCleanText(value, path || "body");
  else if (Array.isArray(value)) value.forEach((v, i) => assertCleanJson(v, path ? `${path}.${i}` : String(i)));
  else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      const at = path ? `${path}.${k}` : k;
      assertCleanText(k, at);
      assertCleanJson(v, at);
    }
  }
}

/** Parse JSON text with the depth limit and the clean-text check; `field` names it in errors. */
export function parseJsonText(text: string, field?: string): unknown {
  assertJsonDepth(text, MAX_JSON_DEPTH, field);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new InputError(field ? `${field} is not valid JSON` : "the request body is not valid JSON", field ? { field } : undefined);
  }
  assertCleanJson(value, field ?? "");
  return value;
}

/** A JSON request body within MAX_JSON_BYTES (413 beyond), depth and clean text (422). */
export async function readJsonBody(req: Request, maxBytes = MAX_JSON_BYTES): Promise<unknown> {
  const bytes = await readBodyLimited(req, maxBytes, "JSON body");
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new InputError("the request body is not valid UTF-8");
  }
  return parseJsonText(text);
}
