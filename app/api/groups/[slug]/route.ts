import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { listMembers, updateGroupSettings } from "@/lib/server/groups";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

const settingsSchema = z.object({ name: z.string().optional(), allowSelfApproval: z.boolean().optional() });

export const GET = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  return NextResponse.json({ group: member.group, role: member.role, members: await listMembers(db, member) });
});

export const PATCH = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  authoriseAny(member, ["group.manage"]); // before the body: a role that may not write hears 403
  await updateGroupSettings(db, member, parseInput(settingsSchema, await jsonBody(req)));
  return NextResponse.json({ ok: true });
});
