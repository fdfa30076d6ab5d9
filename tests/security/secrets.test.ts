/**
 * Secrets come only from the environment: no tracked file holds a private key, a cloud or
 * chat token, a literal NEXTAUTH_SECRET / OIDC client secret, or a connection string with a
 * password other than the embedded local database's (which only listens on 127.0.0.1 and is
 * created by lib/server/db/embedded.ts; production sets DATABASE_URL). The app reads
 * NEXTAUTH_SECRET from the environment (scripts/start.ts generates one into .data/ otherwise).
 */
import { describe, it, expect } from "vitest";
import { execFileSync } from "node:child_process";
import { readFileSync, statSync } from "node:fs";

const files = execFileSync("git", ["ls-files"], { encoding: "utf8" }).split("\n").filter((f) => f && !/^package-lock\.json$|\.(png|jpg|ico|woff2?|pdf|gz)$/.test(f));

const PATTERNS: [string, RegExp][] = [
  ["private key", /-----BEGIN (RSA |EC |OPENSSH |DSA )?PRIVATE KEY-----/],
  ["AWS access key", /\bAKIA[0-9A-Z]{16}\b/],
  ["GitHub token", /\bgh[pousr]_[A-Za-z0-9]{36}\b/],
  ["Slack token", /\bxox[abprs]-[A-Za-z0-9-]{10,}/],
  ["literal NEXTAUTH_SECRET", /NEXTAUTH_SECRET\s*[:=]\s*["'`][^"'`$]{8,}["'`]/],
  ["literal OIDC client secret", /CLIENT_SECRET\s*[:=]\s*["'`][^"'`$]{8,}["'`]/],
  ["connection string with a password", /postgres(?:ql)?:\/\/[^:\s/"'`]+:(?!heatbook-local@|\$\{|PASSWORD|pass@|password@)[^@\s"'`]{3,}@/],
  ["API token of ours", /\bhb_[A-Za-z0-9_-]{30,}/],
];

describe("secrets only from the environment", () => {
  it("no tracked file holds a secret", () => {
    const found: string[] = [];
    for (const f of files) {
      let text: string;
      try {
        if (statSync(f).size > 2_000_000) continue;
        text = readFileSync(f, "utf8");
      } catch {
        continue; // deleted in the working tree
      }
      for (const [what, re] of PATTERNS) if (re.test(text)) found.push(`${f}: ${what}`);
    }
    expect(files.length).toBeGreaterThan(100);
    expect(found).toEqual([]);
  });

  it("the pattern list catches a planted secret (the scan can fail)", () => {
    // Assembled at run time so this file itself holds none of them.
    const planted = ["-----BEGIN " + "PRIVATE KEY-----", "NEXTAUTH_" + "SECRET = \"s3cr3t-value-123\"", "postgresql://app:" + "hunter22@db.example:5432/x"];
    for (const text of planted) expect(PATTERNS.some(([, re]) => re.test(text))).toBe(true);
  });

  it("the session secret is read from the environment", () => {
    const start = readFileSync("scripts/start.ts", "utf8");
    expect(start).toMatch(/process\.env\.NEXTAUTH_SECRET/);
    expect(readFileSync(".gitignore", "utf8")).toMatch(/^\.data\/?$/m);
  });
});
