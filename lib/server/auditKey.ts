/**
 * The audit key: the secret under which every audit event is authenticated (HMAC-SHA256). The
 * database never holds it: it comes from HEATBOOK_AUDIT_KEY (the text itself, at least 32
 * characters) or HEATBOOK_AUDIT_KEY_FILE (a file holding it); `npm start` with the embedded
 * database generates one into the data folder (mode 0600). Events carry only the key's id, an
 * HMAC of a fixed text, which tells which key signed them and reveals nothing of the key.
 */
import { createHmac, randomBytes } from "node:crypto";
import { chmodSync, existsSync, readFileSync, writeFileSync } from "node:fs";
import { canonicalJson } from "../engine/canonical";

export interface AuditKey {
  readonly bytes: Buffer;
  /** 16 hex digits naming the key. */
  readonly id: string;
}

/** A key from its text; throws when it is too short to be a secret. */
export function auditKeyFromText(text: string, where = "HEATBOOK_AUDIT_KEY"): AuditKey {
  const t = text.trim();
  if (t.length < 32) throw new Error(`invalid ${where}: the audit key must be at least 32 characters (it has ${t.length})`);
  const bytes = Buffer.from(t, "utf8");
  return { bytes, id: createHmac("sha256", bytes).update("heatbook audit key id").digest("hex").slice(0, 16) };
}

/** The key from HEATBOOK_AUDIT_KEY or HEATBOOK_AUDIT_KEY_FILE; throws naming both when neither is set. */
export function auditKeyFromEnv(env: Record<string, string | undefined> = process.env): AuditKey {
  if (env.HEATBOOK_AUDIT_KEY) return auditKeyFromText(env.HEATBOOK_AUDIT_KEY);
  if (env.HEATBOOK_AUDIT_KEY_FILE) return auditKeyFromText(readFileSync(env.HEATBOOK_AUDIT_KEY_FILE, "utf8"), env.HEATBOOK_AUDIT_KEY_FILE);
  throw new Error("no audit key: set HEATBOOK_AUDIT_KEY (at least 32 characters) or HEATBOOK_AUDIT_KEY_FILE; `npm start` keeps the embedded database's key in <data folder>/audit-key");
}

let cached: { text: string; key: AuditKey } | null = null;

/** The process's key (from the environment, read once per value). */
export function auditKey(): AuditKey {
  const text = process.env.HEATBOOK_AUDIT_KEY ?? `file:${process.env.HEATBOOK_AUDIT_KEY_FILE ?? ""}`;
  if (cached?.text !== text) cached = { text, key: auditKeyFromEnv() };
  return cached.key;
}

/** Read the key file at `path`, creating it (random, mode 0600) when missing. */
export function loadOrCreateAuditKeyFile(path: string): AuditKey {
  if (!existsSync(path)) writeFileSync(path, randomBytes(32).toString("base64url") + "\n", { mode: 0o600 });
  chmodSync(path, 0o600);
  return auditKeyFromText(readFileSync(path, "utf8"), path);
}

/** HMAC-SHA256 (hex) of a JSON-safe value's canonical JSON under the key. */
export function macOf(key: AuditKey, value: unknown): string {
  return createHmac("sha256", key.bytes).update(canonicalJson(value)).digest("hex");
}
