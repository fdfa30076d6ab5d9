/**
 * The benchmarks' database: a fresh embedded PostgreSQL in `dir`, migrated, with one user, one
 * group and one Nb sample (20 mg, 8.57 g/cm³); removed again when `fn` is done.
 */
import { rmSync } from "node:fs";
import { startEmbeddedDatabase } from "../lib/server/db/embedded";
import { prepareDatabase } from "../lib/server/db/prepare";
import { RUNTIME_ROLE } from "../lib/server/db/roles";
import { auditKeyFromText } from "../lib/server/auditKey";
import { randomBytes } from "node:crypto";
import { createDb, type Db } from "../lib/server/db/client";
import { createGroup } from "../lib/server/groups";
import { memberOf, type Member } from "../lib/server/access";
import { createSample, type SampleInfo } from "../lib/server/samples";

export interface BenchFixture {
  db: Db;
  member: Member;
  sample: SampleInfo;
}

export async function withBenchDatabase<T>(dir: string, fn: (f: BenchFixture) => Promise<T>): Promise<T> {
  rmSync(dir, { recursive: true, force: true });
  const pg = await startEmbeddedDatabase({ dir });
  try {
    // The app's own setting: the owner prepares, the code under measurement runs as the runtime role.
    process.env.HEATBOOK_AUDIT_KEY ??= randomBytes(32).toString("base64url");
    await prepareDatabase({ ownerUrl: pg.ownerUrl, runtimeRole: RUNTIME_ROLE, key: auditKeyFromText(process.env.HEATBOOK_AUDIT_KEY) });
    const db = createDb(pg.runtimeUrl, 4);
    const user = await db.user.create({ data: { email: "bench@example.org", name: "bench" } });
    const group = await createGroup(db, user.id, { name: "Bench group" });
    const member = await memberOf(db, user.id, group.slug);
    const sample = await createSample(db, member, { label: "bench Nb", formula: "Nb", massMg: 20, densityGPerCm3: 8.57 });
    try {
      return await fn({ db, member, sample });
    } finally {
      await db.$disconnect();
    }
  } finally {
    await pg.stop();
    rmSync(dir, { recursive: true, force: true });
    rmSync(`${dir}.log`, { force: true });
    rmSync(pg.credentialsFile, { force: true });
  }
}
