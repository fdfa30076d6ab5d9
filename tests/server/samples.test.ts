/** Samples: formula parsing on save, validation naming the field, optimistic concurrency, search, archive. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample, getSample, listSamples, setSampleArchived, toSampleInfo, updateSample } from "../../lib/server/samples";
import { expectClose } from "../helpers/expectClose";

let t: TestDatabase;
let g: GroupFixture;
beforeAll(async () => { t = await freshDatabase(); g = await makeGroup(t.db); });
afterAll(async () => { await t.drop(); });

describe("samples", () => {
  it("createSample stores molar mass and atoms per formula unit parsed from (Ti0.5V0.5)3Al", async () => {
    const s = await createSample(t.db, g.members.analyst, { label: "TVA-1", formula: "(Ti0.5V0.5)3Al", massMg: 15 });
    // IUPAC 2021 standard atomic weights (abridged): Ti 47.867, V 50.942, Al 26.982 (26.9815384).
    expectClose(s.molarMassGPerMol, 1.5 * 47.867 + 1.5 * 50.942 + 26.9815384, { rel: 1e-4 });
    expect(s.atomsPerFormulaUnit).toBe(4);
  });

  it("createSample with a bad formula names the formula field", async () => {
    await expect(createSample(t.db, g.members.analyst, { label: "bad", formula: "Nb0.75Xx0.25" })).rejects.toMatchObject({ field: "formula" });
  });

  it("createSample with a negative mass names the massMg field", async () => {
    await expect(createSample(t.db, g.members.analyst, { label: "bad", formula: "Cu", massMg: -3 })).rejects.toMatchObject({ field: "massMg" });
  });

  it("createSample with a valence for an element not in the formula names that valence", async () => {
    await expect(createSample(t.db, g.members.analyst, { label: "v", formula: "Cu", valences: { Ag: 1 } })).rejects.toMatchObject({ field: "valences.Ag" });
  });

  it("createSample by a viewer or reviewer is refused", async () => {
    for (const role of ["viewer", "reviewer"] as const)
      await expect(createSample(t.db, g.members[role], { label: "x", formula: "Cu" })).rejects.toMatchObject({ name: "ForbiddenError" });
  });

  it("updateSample with a stale version is refused and changes nothing", async () => {
    const s = await createSample(t.db, g.members.analyst, { label: "C-1", formula: "Cu" });
    const first = await updateSample(t.db, g.members.analyst, s.id, { label: "C-1a", version: s.version });
    expect(first.version).toBe(s.version + 1);
    await expect(updateSample(t.db, g.members.owner, s.id, { label: "C-1b", version: s.version })).rejects.toMatchObject({ name: "ConflictError" });
    expect((await getSample(t.db, g.members.viewer, s.id)).label).toBe("C-1a");
  });

  it("listSamples finds by label, formula or tag and hides archived ones", async () => {
    const s = await createSample(t.db, g.members.analyst, { label: "Searchable", formula: "PdH0.7", tags: ["hydride"] });
    expect((await listSamples(t.db, g.members.viewer, { q: "pdh" })).map((x) => x.id)).toContain(s.id);
    expect((await listSamples(t.db, g.members.viewer, { q: "hydride" })).map((x) => x.id)).toContain(s.id);
    await setSampleArchived(t.db, g.members.analyst, s.id, true);
    expect((await listSamples(t.db, g.members.viewer, { q: "Searchable" })).length).toBe(0);
    expect((await listSamples(t.db, g.members.viewer, { q: "Searchable", archived: true })).length).toBe(1);
  });

  it("listSamples without a search gives exactly what the Prisma rows map to, in the same order, paged, and refuses a bad page", async () => {
    for (const [label, series, x] of [["S-b", "NbMo", 0.3], ["S-a", "NbMo", 0.1], ["S-c", null, null], ["S-d", "NbMo", null]] as const)
      await createSample(t.db, g.members.analyst, { label, formula: "Nb", massMg: 12.5, densityGPerCm3: 8.57, tags: ["t1", "t2"], ...(series ? { seriesLabel: series } : {}), ...(x !== null ? { compositionVariable: "x", compositionValue: x } : {}) });
    const rows = await t.db.sample.findMany({ where: { groupId: g.groupId, archivedAt: null }, orderBy: [{ seriesLabel: "asc" }, { compositionValue: "asc" }, { label: "asc" }] });
    const listed = await listSamples(t.db, g.members.viewer);
    expect(listed).toEqual(rows.map(toSampleInfo));
    expect(await listSamples(t.db, g.members.viewer, { take: 2, skip: 1 })).toEqual(rows.slice(1, 3).map(toSampleInfo));
    const archived = await t.db.sample.findMany({ where: { groupId: g.groupId, archivedAt: { not: null } }, orderBy: [{ seriesLabel: "asc" }, { compositionValue: "asc" }, { label: "asc" }] });
    expect(await listSamples(t.db, g.members.viewer, { archived: true })).toEqual(archived.map(toSampleInfo));
    await expect(listSamples(t.db, g.members.viewer, { take: Number("many") })).rejects.toMatchObject({ name: "InputError", field: "take" });
    await expect(listSamples(t.db, g.members.viewer, { skip: -1 })).rejects.toMatchObject({ name: "InputError", field: "skip" });
  });

  it("getSample of another group's sample is not found", async () => {
    const other = await makeGroup(t.db, "Other");
    const s = await createSample(t.db, other.members.analyst, { label: "theirs", formula: "Cu" });
    await expect(getSample(t.db, g.members.owner, s.id)).rejects.toMatchObject({ name: "NotFoundError" });
    await expect(getSample(t.db, g.members.owner, "not-a-uuid")).rejects.toMatchObject({ name: "NotFoundError" });
  });
});
