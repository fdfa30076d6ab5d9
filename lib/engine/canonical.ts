/**
 * Canonical JSON: object keys sorted, no whitespace, numbers in JavaScript's shortest
 * round-trip form, `undefined` members dropped. Two equal values always give the same text,
 * so its SHA-256 is a content hash. Non-finite numbers and other non-JSON values throw.
 */
export function canonicalJson(value: unknown): string {
  if (value === null) return "null";
  switch (typeof value) {
    case "number":
      if (!Number.isFinite(value)) throw new TypeError(`canonical JSON cannot hold ${value}`);
      return JSON.stringify(value);
    case "string":
    case "boolean":
      return JSON.stringify(value);
    case "object": {
      if (value instanceof Date) return JSON.stringify(value.toISOString());
      if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
      if (ArrayBuffer.isView(value)) return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
      const entries = Object.entries(value as Record<string, unknown>)
        .filter(([, v]) => v !== undefined)
        .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
      return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
    }
    case "bigint":
      return JSON.stringify(value.toString());
    default:
      throw new TypeError(`canonical JSON cannot hold a ${typeof value}`);
  }
}
