/** inGroup: the signed-in user and their membership of the route's group in one query; 401 and 404 kept apart. */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, makeUser, type GroupFixture } from "./fixtures";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import { inGroup } from "../../lib/server/handler";
import { createSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";
import { createAnalysis, openNotebook } from "../../lib/server/notebook";
import * as notebookRoute from "../../app/api/groups/[slug]/analyses/[id]/route";
import * as samplesRoute from "../../app/api/groups/[slug]/samples/route";
import { listSamples } from "../../lib/server/samples";

let t: TestDatabase;
let g: GroupFixture;
const get = () => new Request("http://localhost/api/x");

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db);
});
afterAll(async () => { await t.drop(); });

describe("inGroup", () => {
  it("inGroup gives the member's role, group and user, by the group's slug or its id", async () => {
    session.userId = g.members.reviewer.userId;
    const bySlug = await inGroup(get(), g.slug);
    expect(bySlug.member).toEqual(g.members.reviewer);
    const user = await t.db.user.findUniqueOrThrow({ where: { id: g.members.reviewer.userId }, select: { id: true, email: true, name: true } });
    expect(bySlug.user).toEqual(user);
    expect((await inGroup(get(), g.groupId)).member).toEqual(g.members.reviewer);
  });

  it("inGroup answers 404 for a group the user is not in (or that does not exist) and 401 when signed out or the user is gone", async () => {
    const outsider = await makeUser(t.db, "outsider");
    session.userId = outsider.id;
    await expect(inGroup(get(), g.slug)).rejects.toMatchObject({ name: "NotFoundError" });
    await expect(inGroup(get(), "no-such-group")).rejects.toMatchObject({ name: "NotFoundError" });
    session.userId = null;
    await expect(inGroup(get(), g.slug)).rejects.toMatchObject({ name: "UnauthenticatedError" });
    await t.db.user.delete({ where: { id: outsider.id } });
    session.userId = outsider.id;
    await expect(inGroup(get(), g.slug)).rejects.toMatchObject({ name: "UnauthenticatedError" });
  });

  it("GET of a notebook reads membership and notebook in one statement: the member gets the view, others 404, signed out 401", async () => {
    const s = await createSample(t.db, g.members.analyst, { label: "H-1", formula: "Cu", massMg: 50 });
    // Invented test curve: C = n(γT + βT³) for 50 mg of Cu, γ = 0.69 mJ/(mol K²), β = 0.048 mJ/(mol K⁴).
    const n = 50e-3 / 63.546;
    const csv = ["T (K),C (J/K)", ...Array.from({ length: 40 }, (_, i) => { const T = 1.5 + 0.1 * i; return `${T},${n * (0.69e-3 * T + 0.048e-3 * T ** 3)}`; })].join("\n");
    await importMeasurement(t.db, g.members.analyst, s.id, "cu.csv", new TextEncoder().encode(csv), { kind: "sample", label: "0 T", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "J/K" } });
    const a = await createAnalysis(t.db, g.members.analyst, { sampleId: s.id, title: "Cu γ" });
    const get = async (id: string, query = "", slug = g.slug) => {
      const res = await notebookRoute.GET(new Request(`http://localhost/api/groups/${slug}/analyses/${id}${query}`), { params: Promise.resolve({ slug, id }) });
      return { status: res.status, body: (await res.json()) as { notebook?: { steps: { output: unknown }[]; revision: { id: string } } } };
    };
    session.userId = g.members.viewer.userId;
    const first = await get(a.id);
    expect(first.status).toBe(200);
    session.userId = g.members.analyst.userId;
    const viaRoute = await get(a.id);
    const direct = await openNotebook(t.db, g.members.analyst, a.id);
    expect({ ...viaRoute.body.notebook, computeMillis: 0 }).toEqual(JSON.parse(JSON.stringify({ ...direct, computeMillis: 0 })));
    expect((await get(a.id, `?revision=${direct.revision.id}`)).status).toBe(200);
    expect((await get(a.id, "?revision=00000000-0000-4000-8000-000000000000")).status).toBe(404);
    expect((await get("not-a-uuid")).status).toBe(404);
    const other = await makeGroup(t.db, "Elsewhere");
    session.userId = other.members.owner.userId;
    expect((await get(a.id)).status).toBe(404);
    expect((await get(a.id, "", other.slug)).status).toBe(404);
    session.userId = null;
    expect((await get(a.id)).status).toBe(401);
  });

  it("GET of the sample list gives what listSamples gives, in one statement with the membership; a bad page is 422 only for members", async () => {
    await createSample(t.db, g.members.analyst, { label: "L-2", formula: "Nb" });
    await createSample(t.db, g.members.analyst, { label: "L-1", formula: "Mo", seriesLabel: "NbMo" });
    const get = async (query = "", slug = g.slug) => {
      const res = await samplesRoute.GET(new Request(`http://localhost/api/groups/${slug}/samples${query}`), { params: Promise.resolve({ slug }) });
      return { status: res.status, body: (await res.json()) as { samples?: unknown[]; field?: string } };
    };
    session.userId = g.members.viewer.userId;
    const plain = await get();
    expect(plain.status).toBe(200);
    expect(plain.body.samples).toEqual(JSON.parse(JSON.stringify(await listSamples(t.db, g.members.viewer))));
    expect((await get("?take=1&skip=1")).body.samples).toEqual(JSON.parse(JSON.stringify(await listSamples(t.db, g.members.viewer, { take: 1, skip: 1 }))));
    expect((await get("?q=L-1")).body.samples).toHaveLength(1);
    expect(await get("?take=lots")).toMatchObject({ status: 422, body: { field: "take" } });
    const other = await makeGroup(t.db, "Yet another");
    session.userId = other.members.owner.userId;
    expect((await get()).status).toBe(404);
    expect((await get("?take=lots")).status).toBe(404);
    session.userId = null;
    expect((await get("?take=lots")).status).toBe(401);
  });

  it("inGroup refuses a write from another origin before reading anything", async () => {
    session.userId = g.members.owner.userId;
    const req = new Request("http://localhost/api/x", { method: "POST", headers: { origin: "https://elsewhere.example", host: "localhost" } });
    await expect(inGroup(req, g.slug)).rejects.toMatchObject({ name: "ForbiddenError" });
  });
});
