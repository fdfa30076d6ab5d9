/**
 * Client-side calls to our JSON routes. Errors come back as `{ error, field?, current? }`
 * (lib/server/http.ts); this turns every outcome into one plain object the forms can show.
 */

export interface ApiResult<T> {
  ok: boolean;
  status: number;
  data: T | null;
  error: string | null;
  field: string | null;
  current: unknown;
}

async function settle<T>(res: Response): Promise<ApiResult<T>> {
  let body: Record<string, unknown> | null = null;
  try {
    body = (await res.json()) as Record<string, unknown>;
  } catch {
    body = null;
  }
  if (res.ok) return { ok: true, status: res.status, data: body as T, error: null, field: null, current: undefined };
  const error = typeof body?.error === "string" ? body.error : `the server answered ${res.status}`;
  const field = typeof body?.field === "string" ? body.field : null;
  return { ok: false, status: res.status, data: null, error, field, current: body?.current };
}

function networkFailure<T>(err: unknown): ApiResult<T> {
  return { ok: false, status: 0, data: null, error: `could not reach the server (${(err as Error).message})`, field: null, current: undefined };
}

/** JSON request (GET without body, or POST/PATCH/DELETE with a JSON body). */
export async function callJson<T>(url: string, method: string, body?: unknown): Promise<ApiResult<T>> {
  try {
    const res = await fetch(url, {
      method,
      headers: body === undefined ? {} : { "content-type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    return await settle<T>(res);
  } catch (err) {
    return networkFailure<T>(err);
  }
}

/** Multipart upload: the file as `file`, everything else as one JSON string `options`. */
export async function callUpload<T>(url: string, file: File, options: unknown): Promise<ApiResult<T>> {
  const form = new FormData();
  form.append("file", file, file.name);
  form.append("options", JSON.stringify(options ?? {}));
  try {
    return await settle<T>(await fetch(url, { method: "POST", body: form }));
  } catch (err) {
    return networkFailure<T>(err);
  }
}

/** The error message for `field` (exact, or a sub-field like "valences.Cu" for "valences"). */
export function errorFor(result: Pick<ApiResult<unknown>, "error" | "field"> | null, field: string): string | null {
  if (!result?.error || !result.field) return null;
  return result.field === field || result.field.startsWith(field + ".") ? besideField(result.error, result.field) : null;
}

/** Under the field itself, "(…, field massMg)" says nothing new: drop it, and any repeated location suffix. */
export function besideField(message: string, field: string): string {
  const name = field.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  return message
    .replace(new RegExp(`^${name}: `), "")
    .replace(new RegExp(`,? ?\\bfield ${name}\\)`, "g"), ")")
    .replace(/ \(\)/g, "")
    .replace(/( \([^()]*\))\1+$/, "$1");
}
