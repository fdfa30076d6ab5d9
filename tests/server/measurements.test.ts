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

describe("import preview checks and refusals", () => {
  const mapping = { temperature: 0, heatCapacity: 1 };
  const units = { temperature: "K", heatCapacity: "mJ/K" };

  it("previewImport lists every refused row of the mapped columns at preview time, the first 50 and a count", () => {
    const lines = ["T (K),C (mJ/K)"];
    for (let i = 0; i < 80; i++) lines.push(i % 2 ? `${-1 - i},0.5` : `${1 + i},0.5`);
    const p = previewImport(g.members.analyst, "neg.csv", enc(lines.join("\n")), { mapping });
    expect(p.checks?.invalidCount).toBe(40);
    expect(p.checks?.invalid).toHaveLength(40);
    expect(p.checks?.invalid[0]).toMatchObject({ line: 3, column: 1, field: "T" });
    expect(p.checks?.invalid[0]!.message).toMatch(/temperature must be finite and > 0/);
    const many = ["T,C", ...Array.from({ length: 120 }, (_, i) => `-${i + 1},1`), "5,1"];
    const q = previewImport(g.members.analyst, "many.csv", enc(many.join("\n")), { mapping });
    expect(q.checks?.invalidCount).toBe(120);
    expect(q.checks?.invalid).toHaveLength(50);
  });

  it("previewImport flags repeated and decreasing temperatures with their lines and returns the curve", () => {
    const p = previewImport(g.members.analyst, "dup.csv", enc("T,C\n1,0.1\n2,0.2\n2,0.21\n3,0.3\n2.5,0.25\n"));
    expect(p.checks?.temperatures.duplicates).toEqual([{ line: 4, otherLine: 3, value: 2 }]);
    expect(p.checks?.temperatures.decreasing).toEqual([{ line: 6, otherLine: 5, value: 2.5 }]);
    expect(p.checks?.curve).toMatchObject({ temperature: [1, 2, 2, 3, 2.5], total: 5, reduced: false });
  });

  it("previewImport reduces a 100 000-point curve per pixel column and says so", () => {
    const lines = ["T,C"];
    for (let i = 0; i < 100_000; i++) { const T = 0.5 + i * 1e-4; lines.push(`${T},${(0.002 * T + 1e-4 * T ** 3).toPrecision(8)}`); }
    const p = previewImport(g.members.analyst, "big.csv", enc(lines.join("\n")));
    expect(p.checks?.curve.reduced).toBe(true);
    expect(p.checks?.curve.total).toBe(100_000);
    expect(p.checks!.curve.temperature.length).toBeLessThanOrEqual(3200);
  });

  it("previewImport reports a decimal comma in a comma-delimited file and importMeasurement refuses to store it, naming the line", async () => {
    const text = "T (K),C (mJ/K)\n1,5,2,3\n2,0,4,6\n";
    const p = previewImport(g.members.analyst, "dc.csv", enc(text));
    expect(p.ambiguity).toMatchObject({ kind: "decimal-comma", line: 1 });
    const before = await t.db.storedFile.count();
    await expect(importMeasurement(t.db, g.members.analyst, sampleId, "dc.csv", enc(text), { kind: "sample", label: "dc", mapping, units }))
      .rejects.toThrow(/ambiguous file.*dc\.csv, line 1/);
    expect(await t.db.storedFile.count()).toBe(before);
    const chosen = await importMeasurement(t.db, g.members.analyst, sampleId, "dc.csv", enc(text), { kind: "sample", label: "dc", mapping, units, parse: { delimiter: "," } });
    expect(chosen.pointCount).toBe(2);
  });

  it("importMeasurement stores σ as a percentage of C when asked, and says so in the mapping", async () => {
    const m = await importMeasurement(t.db, g.members.analyst, sampleId, "pct.csv", enc("T,C\n2,0.5\n3,-1.0\n"), { kind: "sample", label: "pct", mapping, units, sigmaPercent: 2 });
    const full = await getMeasurement(t.db, g.members.viewer, m.id);
    expectClose(full.sigma![0]!, 0.02 * 0.5e-3, { rel: 1e-12 });
    expectClose(full.sigma![1]!, 0.02 * 1.0e-3, { rel: 1e-12 });
    expect(full.columnMapping).toMatchObject({ sigmaPercentOfC: 2 });
    await expect(importMeasurement(t.db, g.members.analyst, sampleId, "pct.csv", enc("T,C,s\n2,0.5,0.1\n"), { kind: "sample", label: "x", mapping: { ...mapping, sigma: 2 }, units, sigmaPercent: 2 }))
      .rejects.toThrow(/either a σ column or a relative σ/);
  });

  it("importMeasurement stores repeated temperatures and answers with a warning naming their lines", async () => {
    const m = await importMeasurement(t.db, g.members.analyst, sampleId, "rep.csv", enc("T,C\n1,0.1\n2,0.2\n2,0.2\n"), { kind: "sample", label: "rep", mapping, units });
    expect(m.warnings).toEqual(["1 repeated temperature (line 4)"]);
  });
});
