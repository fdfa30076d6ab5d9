import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { makeAnalysis } from "./apiFixtures";
import { createSample } from "../../lib/server/samples";

let src: TestDatabase;
let dst: TestDatabase;
let A: GroupFixture;
const dir = mkdtempSync(join(tmpdir(), "hb-backup-"));

function io(env: Record<string, string>) {
  const out: string[] = [];
  const err: string[] = [];
  const cli: CliIo = { out: (t) => out.push(t), err: (t) => err.push(t), readFile: (p) => readFileSync(p), env };
  return { cli, out, err };
}

beforeAll(async () => {
  src = await freshDatabase();
  dst = await freshDatabase();
  A = await makeGroup(src.db, "CLI backup");
  const s = await createSample(src.db, A.members.analyst, { label: "Ta", formula: "Ta" });
  await makeAnalysis(src.db, A.members.analyst, { sampleId: s.id, gamma: [5.9, 0.1], beta: [0.2, 0.01], state: "sealed" });
});
afterAll(async () => { await src.drop(); await dst.drop(); rmSync(dir, { recursive: true, force: true }); });

describe("heatbook backup", () => {
  it("heatbook backup export then restore into an empty database verifies and exits 0", async () => {
    const file = join(dir, "group.hbk.gz");
    const key = process.env.HEATBOOK_AUDIT_KEY!;
    const ex = io({ HEATBOOK_OWNER_DATABASE_URL: src.ownerUrl, HEATBOOK_AUDIT_KEY: key });
    expect(await main(["backup", "export", "--group", A.slug, "--out", file], ex.cli)).toBe(0);
    expect(ex.out[0]).toMatch(/AnalysisRevision 1/);
    const re = io({ HEATBOOK_OWNER_DATABASE_URL: dst.ownerUrl, HEATBOOK_AUDIT_KEY: key });
    expect(await main(["backup", "restore", file], re.cli)).toBe(0);
    expect(re.out[0]).toMatch(/audit chain verified identical .*sealed revisions verified \(1\)/);
    const again = io({ HEATBOOK_OWNER_DATABASE_URL: dst.ownerUrl, HEATBOOK_AUDIT_KEY: key });
    expect(await main(["backup", "restore", file], again.cli)).toBe(1);
    expect(again.err[0]).toMatch(/empty database/);
  });
  it("heatbook backup without a database URL, the audit key or --group exits 2 naming what is missing", async () => {
    const none = io({});
    expect(await main(["backup", "export", "--out", "x"], none.cli)).toBe(2);
    expect(none.err[0]).toMatch(/HEATBOOK_OWNER_DATABASE_URL/);
    const noKey = io({ HEATBOOK_OWNER_DATABASE_URL: src.ownerUrl });
    expect(await main(["backup", "export", "--group", A.slug, "--out", "x"], noKey.cli)).toBe(2);
    expect(noKey.err[0]).toMatch(/HEATBOOK_AUDIT_KEY/);
    expect(await main(["backup", "export", "--out", "x"], io({ HEATBOOK_OWNER_DATABASE_URL: src.ownerUrl, HEATBOOK_AUDIT_KEY: process.env.HEATBOOK_AUDIT_KEY! }).cli)).toBe(2);
  });
});
