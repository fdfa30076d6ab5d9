/**
 * The import boundaries (lib/dev/boundaries.ts): the repository has none broken, and each rule
 * finds what it is meant to find, with file, line and column, in a small tree written here.
 */
import { mkdirSync, rmSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, describe, expect, it } from "vitest";
import { checkBoundaries, formatFinding } from "../../lib/dev/boundaries";

const ROOT = resolve(fileURLToPath(new URL("../../", import.meta.url)));
const TREE = join(ROOT, "tmp", `boundaries-${process.pid}`);

function write(path: string, text: string) {
  mkdirSync(dirname(join(TREE, path)), { recursive: true });
  writeFileSync(join(TREE, path), text);
}

afterAll(() => rmSync(TREE, { recursive: true, force: true }));

describe("checkBoundaries", () => {
  it("checkBoundaries finds nothing in this repository", () => {
    expect(checkBoundaries(ROOT).map(formatFinding)).toEqual([]);
  });

  it("checkBoundaries names every broken rule with its file, line and column", () => {
    write("lib/engine/fit/a.ts", `import { z } from "zod";\nimport { useState } from "react";\nimport { getDb } from "../../server/db/client";\nexport const x = 1;\n`);
    write("lib/engine/b.ts", `const pg = require("pg");\nexport { y } from "@/lib/server/hash";\nconst n = await import("next/server");\n`);
    write("lib/engine/ok.ts", `import { q } from "../engine/fit/a";\nimport type { T } from "./types";\n`);
    write("app/api/x/route.ts", `import { getDb, sqlRows } from "@/lib/server/db/client";\nexport const GET = async () => sqlRows(getDb(), "SELECT 1", []);\n`);
    write("app/page.tsx", `import { PrismaClient } from "@prisma/client";\nconst r = await db.$queryRaw\`SELECT 1\`;\n`);
    write("app/components/C.tsx", `"use client";\nimport type { Db } from "@/lib/server/database";\nimport { formatNumber } from "@/lib/display";\nimport { hash } from "@/lib/server/hash";\n`);
    const got = checkBoundaries(TREE).map((f) => `${f.file}:${f.line}:${f.column} ${f.rule}`).sort();
    expect(got).toEqual([
      "app/api/x/route.ts:1:32 app-no-db",
      "app/api/x/route.ts:2:32 app-no-db",
      "app/components/C.tsx:4:22 client-no-server",
      "app/page.tsx:1:30 app-no-db",
      "app/page.tsx:2:20 app-no-db",
      "lib/engine/b.ts:1:20 engine-pure",
      "lib/engine/b.ts:2:19 engine-pure",
      "lib/engine/b.ts:3:24 engine-pure",
      "lib/engine/fit/a.ts:2:26 engine-pure",
      "lib/engine/fit/a.ts:3:23 engine-pure",
    ]);
  });
});
