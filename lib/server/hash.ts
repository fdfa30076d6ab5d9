import { createHash } from "node:crypto";
import { canonicalJson } from "../engine/canonical";

/** SHA-256 (hex) of bytes or text. */
export function sha256Hex(data: string | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}

/** Content hash of a JSON-safe value: SHA-256 of its canonical JSON. */
export function contentHash(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}
