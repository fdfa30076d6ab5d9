/**
 * vitest setup file: a test may read files only inside this repository (and the system's own
 * places: the temporary folder, /proc, /sys, /dev, /etc, /usr). A clone on a user's machine has
 * nothing beside it, so a test that reads `../something` passes here and fails there. Reading
 * outside throws at the call, and each file's run ends with an assertion that nothing tried.
 */
import fs from "node:fs";
import { syncBuiltinESMExports } from "node:module";
import { tmpdir } from "node:os";
import { resolve, sep } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, expect } from "vitest";

const ROOT = resolve(fileURLToPath(new URL("../../", import.meta.url)));
const ALLOWED = [ROOT, resolve(tmpdir()), "/proc", "/sys", "/dev", "/etc", "/usr", "/tmp"];
const attempts: string[] = [];

/** True when `p` (a path, file URL, buffer or descriptor) lies inside the repository or a system place. */
export function insideAllowed(p: unknown): boolean {
  if (typeof p === "number") return true;
  let path: string;
  if (p instanceof URL) path = fileURLToPath(p);
  else if (Buffer.isBuffer(p)) path = p.toString("utf8");
  else if (typeof p === "string") path = p.startsWith("file:") ? fileURLToPath(p) : p;
  else return true;
  const abs = resolve(path);
  return ALLOWED.some((root) => abs === root || abs.startsWith(root + sep));
}

function guard<F extends (...args: never[]) => unknown>(name: string, original: F): F {
  return function (this: unknown, ...args: Parameters<F>) {
    if (!insideAllowed(args[0])) {
      const where = String(args[0]);
      attempts.push(`${name}(${where})`);
      throw new Error(`a test read outside the repository: ${name}(${where}); keep what tests need inside the repository`);
    }
    return original.apply(this, args);
  } as F;
}

const READERS = ["readFileSync", "readFile", "createReadStream", "readdirSync", "readdir", "openSync", "open", "opendirSync", "opendir"] as const;
for (const name of READERS) (fs as unknown as Record<string, unknown>)[name] = guard(name, fs[name] as never);
for (const name of ["readFile", "readdir", "open", "opendir"] as const) {
  (fs.promises as unknown as Record<string, unknown>)[name] = guard(`promises.${name}`, fs.promises[name] as never);
}
syncBuiltinESMExports();

/** The refused reads so far, cleared (for the test of this guard itself). */
export function takeRefusedReads(): string[] {
  return attempts.splice(0);
}

afterAll(() => {
  expect(attempts, "files read outside the repository").toEqual([]);
});
