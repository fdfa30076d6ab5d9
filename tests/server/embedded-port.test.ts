/** The embedded PostgreSQL keeps the port it chose first (stored in its data folder), so a worker started apart finds it. */
import { describe, it, expect, afterAll } from "vitest";
import { rmSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import { resolve, join } from "node:path";
import pg from "pg";
import { embeddedDatabaseUrl, freePort, startEmbeddedDatabase, storedPort } from "../../lib/server/db/embedded";

const dir = resolve(`.data/test-port-${process.pid}`);
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
  rmSync(`${dir}.log`, { force: true });
});

async function selectOne(url: string): Promise<number> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const r = await c.query("SELECT 1 AS one");
  await c.end();
  return r.rows[0].one as number;
}

describe("embedded database port", () => {
  it("startEmbeddedDatabase starts again on the port it chose first, and embeddedDatabaseUrl reaches it", async () => {
    const first = await startEmbeddedDatabase({ dir });
    await first.stop();
    expect(storedPort(dir)).toBe(first.port);
    const second = await startEmbeddedDatabase({ dir });
    try {
      expect(second.port).toBe(first.port);
      expect(await selectOne(embeddedDatabaseUrl(dir)!)).toBe(1);
    } finally {
      await second.stop();
    }
  });

  it("startEmbeddedDatabase with an explicit port uses it and stores it as the one in use", async () => {
    const port = await freePort();
    const db = await startEmbeddedDatabase({ dir, port });
    await db.stop();
    expect(db.port).toBe(port);
    expect(storedPort(dir)).toBe(port);
  });

  it("startEmbeddedDatabase refuses, naming the file, when another program holds the stored port", async () => {
    const blocker = createServer();
    await new Promise<void>((ok) => blocker.listen(storedPort(dir)!, "127.0.0.1", ok));
    try {
      await expect(startEmbeddedDatabase({ dir })).rejects.toThrow(/port \d+ \(stored in .*heatbook\.port\) is taken by another program.*HEATBOOK_PG_PORT/);
    } finally {
      await new Promise((ok) => blocker.close(ok));
    }
  });

  it("storedPort refuses a damaged port file with its path", () => {
    writeFileSync(join(dir, "heatbook.port"), "not a port\n");
    expect(() => storedPort(dir)).toThrow(/invalid port in .*heatbook\.port: "not a port"/);
  });
});
