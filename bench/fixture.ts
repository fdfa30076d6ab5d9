/**
 * The benchmarks' database: a fresh embedded PostgreSQL in `dir`, migrated, with one user, one
 * group and one Nb sample (20 mg, 8.57 g/cm³); removed again when `fn` is done.
 */
import { rmSync } from "node:fs";
import { startEmbeddedDatabase } from "../lib/server/db/embedded";
import { migrate } from "../lib/server/db/migrate";
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
    await migrate(pg.url);
    const db = createDb(pg.url, 4);
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
  }
}
