import type { Metadata } from "next";
import Link from "next/link";
import "@/app/components/notebook/notebook.css";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { listThreads, openNotebook } from "@/lib/server/notebook";
import { listMeasurements } from "@/lib/server/measurements";
import { listMembers } from "@/lib/server/groups";
import { can } from "@/lib/server/permissions";
import { renderMarkdown } from "@/lib/server/markdown";
import { MODELS } from "@/lib/engine/models";
import { JOINT_MODELS } from "@/lib/engine/fit/jointModels";
import { groupPaths } from "@/app/_lib/paths";
import { Notebook } from "@/app/components/notebook/Notebook";
import type { MeasurementChoice, ModelInfo, NotebookData, ThreadData } from "@/app/components/notebook/types";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Analysis" };

/** The model registry as the fit form shows it (names, formulas, display units of parameters). */
function modelCatalogue(): ModelInfo[] {
  return Object.values(MODELS).map((m) => ({
    name: m.name, title: m.title, formula: m.formula,
    parameters: m.parameters.map((p) => ({ name: p.name, displayUnit: p.displayUnit, displayFactor: p.displayFactor, description: p.description, symbol: p.symbol })),
  }));
}

function jointCatalogue(): ModelInfo[] {
  return Object.values(JOINT_MODELS).map((m) => ({
    name: m.name, title: m.title, formula: m.formula,
    parameters: m.parameters.map((p) => ({ name: p.name, displayUnit: p.displayUnit, displayFactor: p.displayFactor, description: p.description, symbol: p.symbol, defaultShared: p.defaultShared })),
  }));
}

export default async function AnalysisPage({ params, searchParams }: { params: Promise<{ slug: string; id: string }>; searchParams: Promise<{ revision?: string }> }) {
  const { slug, id } = await params;
  const { revision } = await searchParams;
  const p = groupPaths(slug);
  const { db, user, member } = await pageMember(slug, `/g/${encodeURIComponent(slug)}/analyses/${id}`);
  const nb = await orNotFound(() => openNotebook(db, member, id, revision));
  const [threads, measurements, members] = await Promise.all([listThreads(db, member, id), listMeasurements(db, member, { take: 500 }), listMembers(db, member)]);
  const choices: MeasurementChoice[] = measurements
    .filter((m) => m.sampleId === nb.analysis.sampleId || m.kind === "addenda")
    .map((m) => ({ id: m.id, label: m.label, kind: m.kind, fieldT: m.fieldT, basis: m.basis, pointCount: m.pointCount, tMinK: m.tMinK, tMaxK: m.tMaxK }));
  const notes = Object.fromEntries(nb.steps.filter((s) => s.kind === "note" && s.output?.ok).map((s) => [s.id, renderMarkdown(String((s.output!.result as { markdown?: string }).markdown ?? ""))]));
  return (
    <>
      <div className="crumbs"><Link href={`${p.home}/analyses`}>Analyses</Link> / <Link href={p.sample(nb.analysis.sampleId)}>{nb.analysis.sampleLabel}</Link></div>
      <h1 data-testid="analysis-title">{nb.analysis.title} {nb.analysis.archived && <span className="tag">archived</span>}</h1>
      <Notebook
        key={revision ?? "newest"}
        slug={slug}
        initial={nb as unknown as NotebookData}
        initialThreads={threads as ThreadData[]}
        initialNotes={notes}
        models={modelCatalogue()}
        jointModels={jointCatalogue()}
        measurements={choices}
        meId={user.id}
        members={Object.fromEntries(members.map((m) => [m.userId, m.name || m.email]))}
        mentionables={members.map((m) => ({ handle: m.handle, name: m.name || m.email }))}
        canComment={can(member.role, "comment.write")}
        revisionId={revision ?? null}
      />
    </>
  );
}
