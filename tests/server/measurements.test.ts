/** Measurement import: preview stores nothing, acceptance is one transaction, bad rows store nothing. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { createHash } from "node:crypto";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample } from "../../lib/server/samples";
import { getMeasurement, getOriginalFile, importMeasurement, previewImport } from "../../lib/server/measurements";
import { expectClose } from "../helpers/expectClose";

let t: TestDatabase;
let g: GroupFixture;
let sampleId: string;
beforeAll(async () => {
  t = await freshDatabase();
  g = await makeGroup(t.db);
  sampleId = (await createSample(t.db, g.members.analyst, { label: "M-1", formula: "Nb", massMg: 10 })).id;
});
afterAll(async () => { await t.drop(); });

const enc = (s: string) => new TextEncoder().encode(s);
const request = { kind: "sample", label: "zero field", mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "mJ/K" } };

describe("measurement import", () => {
  it("previewImport reports delimiter, decimal comma and guessed roles and stores nothing", async () => {
    const before = await t.db.storedFile.count();
    const p = previewImport(g.members.analyst, "a.csv", enc("T (K);C (mJ/K);err (mJ/K)\n2,0;0,015;0,0001\n3,0;0,025;0,0001\n"));
    expect(p.delimiter).toBe(";");
    expect(p.decimalComma).toBe(true);
    expect(p.guesses.temperature?.index).toBe(0);
    expect(p.guesses.heatCapacity?.index).toBe(1);
    expect(p.guesses.sigma?.index).toBe(2);
    expect(p.rows[0]!.values).toEqual([2, 0.015, 0.0001]);
    expect(await t.db.storedFile.count()).toBe(before);
  });

  it("importMeasurement keeps the original bytes with their SHA-256 and stores points in SI", async () => {
    const text = "# exported\r\nT (K),C (mJ/K),err\r\n2.0,0.015,1e-4\r\n3.0,0.0251,1e-4\r\n";
    const m = await importMeasurement(t.db, g.members.analyst, sampleId, "b.csv", enc(text), request);
    const original = await getOriginalFile(t.db, g.members.viewer, m.id);
    expect(Buffer.from(original.bytes).toString("utf8")).toBe(text);
    expect(original.sha256).toBe(createHash("sha256").update(text).digest("hex"));
    const full = await getMeasurement(t.db, g.members.viewer, m.id);
    expect(full.temperatureK).toEqual([2, 3]);
    expectClose(full.heatCapacity[1]!, 2.51e-5, { rel: 1e-15 }); // 0.0251 mJ/K = 2.51e-5 J/K exactly as defined
    for (const s of full.sigma!) expectClose(s, 1e-7, { rel: 2e-16 }); // mJ→J through mathjs: one rounding step
    expect(full.sourceLines).toEqual([3, 4]);
    expect(full.basis).toBe("sample");
  });

  it("importMeasurement of a file with a bad row names its line and column and stores nothing", async () => {
    const before = [await t.db.storedFile.count(), await t.db.measurement.count(), await t.db.auditEvent.count()];
    const text = "T,C,err\n2.0,0.015,1e-4\n3.0,abc,1e-4\n4.0,0.04,1e-4\n";
    await expect(importMeasurement(t.db, g.members.analyst, sampleId, "bad.csv", enc(text), request)).rejects.toThrow(/line 3.*column 2|bad\.csv/);
    expect([await t.db.storedFile.count(), await t.db.measurement.count(), await t.db.auditEvent.count()]).toEqual(before);
  });

  it("importMeasurement with an unknown unit names the unit field and stores nothing", async () => {
    const before = await t.db.measurement.count();
    await expect(importMeasurement(t.db, g.members.analyst, sampleId, "u.csv", enc("T,C\n2,1\n"), { ...request, mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "furlongs" } })).rejects.toThrow(/furlongs/);
    expect(await t.db.measurement.count()).toBe(before);
  });

  it("importMeasurement by a viewer is refused", async () => {
    await expect(importMeasurement(t.db, g.members.viewer, sampleId, "v.csv", enc("T,C\n2,1\n"), request)).rejects.toMatchObject({ name: "ForbiddenError" });
  });

  it("importMeasurement takes a 100 000-row file whole, exactly", async () => {
    const lines = ["T (K)\tC (J/K)"];
    for (let i = 0; i < 100_000; i++) {
      const T = 0.4 + i * 2e-4;
      lines.push(`${T}\t${(1e-6 * T + 2e-8 * T ** 3).toExponential(12)}`);
    }
    const m = await importMeasurement(t.db, g.members.analyst, sampleId, "big.tsv", enc(lines.join("\n")), {
      kind: "sample", label: "big", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "J/K" },
    });
    expect(m.pointCount).toBe(100_000);
    const full = await getMeasurement(t.db, g.members.viewer, m.id);
    expect(full.temperatureK[99_999]).toBe(Number(String(0.4 + 99_999 * 2e-4)));
    expect(full.sourceLines[99_999]).toBe(100_001);
  });
});
