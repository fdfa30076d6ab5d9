/** Helpers for the v1 API tests: call route handlers directly with a bearer token. */
type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface CallOptions {
  token?: string;
  params?: Record<string, string>;
  json?: unknown;
  body?: BodyInit;
  headers?: Record<string, string>;
  method?: string;
}

/** Call `handler` as Next would for `path` (under /api/v1) and return status, headers and parsed body. */
export async function call(handler: Handler, path: string, opts: CallOptions = {}): Promise<{ status: number; headers: Headers; body: any; text: string }> {
  const headers: Record<string, string> = { ...(opts.headers ?? {}) };
  if (opts.token) headers.authorization = `Bearer ${opts.token}`;
  let body = opts.body;
  if (opts.json !== undefined) {
    headers["content-type"] = "application/json";
    body = JSON.stringify(opts.json);
  }
  const method = opts.method ?? (body !== undefined ? "POST" : "GET");
  const req = new Request(`http://localhost/api/v1${path}`, { method, headers, ...(body !== undefined ? { body } : {}) });
  const res = await handler(req, { params: Promise.resolve(opts.params ?? {}) });
  const text = await res.text();
  let parsed: unknown = null;
  try { parsed = JSON.parse(text); } catch { parsed = null; }
  return { status: res.status, headers: res.headers, body: parsed, text };
}
