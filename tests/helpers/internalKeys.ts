/**
 * The engine's and server's own keys, found where they are defined, so display tests need no
 * hand-kept list: quantity names (every `quantity("…"` / `display("…"` / `extrapolate("…"` call
 * under lib/engine), model parameter and model names (the registry), audit actions (every
 * `action: "…"` and the review transitions under lib/server).
 */
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { MODELS } from "@/lib/engine/models";
import { REVIEW_ACTIONS } from "@/lib/server/review/states";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));

function tsFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = path.join(dir, n);
    return statSync(p).isDirectory() ? tsFiles(p) : p.endsWith(".ts") ? [p] : [];
  });
}

function matches(dir: string, re: RegExp): string[] {
  const out = new Set<string>();
  for (const f of tsFiles(path.join(ROOT, dir))) for (const m of readFileSync(f, "utf8").matchAll(re)) out.add(m[1]!);
  return [...out].sort();
}

/** Names of every Quantity the engine builds. */
export const quantityKeys = (): string[] => matches("lib/engine", /\b(?:quantity|display|extrapolate)\(\s*"([A-Za-z][A-Za-z0-9]*)"/g);

export const parameterKeys = (): string[] => [...new Set(Object.values(MODELS).flatMap((m) => m.parameters.map((p) => p.name)))].sort();

export const modelKeys = (): string[] => Object.keys(MODELS);

/** Audit actions recorded by the server ("revision.submit" from the review transitions). */
export function auditActions(): string[] {
  const out = new Set(REVIEW_ACTIONS.map((a) => `revision.${a}`));
  for (const f of tsFiles(path.join(ROOT, "lib/server")))
    for (const call of readFileSync(f, "utf8").matchAll(/recordAudit\(tx,\s*\{([\s\S]*?)objectType/g))
      for (const m of call[1]!.matchAll(/"([a-z]+(?:\.[a-zA-Z]+)+)"/g)) out.add(m[1]!);
  return [...out].sort();
}

/**
 * Keys that must never reach a reader: camelCase or dotted or snake_case keys, and plain keys of
 * four letters or more that are not English words a sentence may use ("beta" is a key, "data"
 * is a word).
 */
export function denyList(): string[] {
  const words = new Set(["data", "note", "nuclear", "magnon", "debye", "einstein", "schottky"]);
  const keys = [...quantityKeys(), ...parameterKeys(), ...modelKeys(), ...auditActions(), "in_review"];
  const keep = keys.filter((k) => /[A-Z._-]/.test(k.slice(1)) || (k.length >= 4 && !words.has(k)));
  // Greek-letter names are keys when written in Latin letters next to a symbol ("γ gamma").
  return [...new Set([...keep, "gamma", "thetaD", "sommerfeld"])];
}

/** Deny-list hits in `text` (whole words, case-sensitive). */
export function internalKeysIn(text: string): string[] {
  return denyList().filter((k) => new RegExp(`(^|[^\\p{L}\\p{N}_])${k.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}(?![\\p{L}\\p{N}_])`, "u").test(text));
}
