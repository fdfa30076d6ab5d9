import type { Metadata } from "next";
import Link from "next/link";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { diffRevisions, reviewStatus } from "@/lib/server/review";
import { STATE_LABEL } from "@/app/components/review/labels";
import type { RevisionState } from "@/lib/server/review";
import { valueText } from "@/app/components/review/units";
import { Sym } from "@/app/components/Sym";
import { configPathLabel, formatNumber, modelLabel, plainSymbol, stepKindLabel, stepRefLabel, symbolOf, term } from "@/lib/display";
import "@/app/components/review/review.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "What changed" };

/** A configuration value as people read it: numbers by the display rule, yes/no, model names in words. */
function show(v: unknown, path: string): string {
  if (v === null || v === undefined) return "—";
  if (typeof v === "number") return formatNumber(v, 6);
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "string") return /(^|\.)model$|^compare\[/.test(path) ? plainSymbol(modelLabel(v)) : v;
  if (Array.isArray(v)) return v.map((x) => show(x, path)).join(", ") || "none";
  return Object.entries(v as Record<string, unknown>).map(([k, x]) => `${plainSymbol(configPathLabel(k))}: ${show(x, k)}`).join("; ") || "—";
}

function valued(v: { value: number; stdError: number | null } | null, unit: string): string {
  return v ? valueText(v.value, v.stdError, unit) : "—";
}

/** The difference between two revisions (?a=older&b=newer; default: the previous and the newest). Config changes per step and how each result moved. */
export default async function DiffPage({ params, searchParams }: { params: Promise<{ slug: string; id: string }>; searchParams: Promise<{ a?: string; b?: string }> }) {
  const { slug, id } = await params;
  const sp = await searchParams;
  const base = `/g/${encodeURIComponent(slug)}/analyses/${id}`;
  const { db, member } = await pageMember(slug, `${base}/diff`);
  const status = await orNotFound(() => reviewStatus(db, member, id));
  const revs = status.revisions; // newest first
  const b = sp.b ?? revs[0]?.id;
  const a = sp.a ?? revs.find((r) => r.id !== b && (revs.find((x) => x.id === b)?.number ?? Infinity) > r.number)?.id;
  const pick = (name: string, value: string | undefined) => (
    <select name={name} defaultValue={value} aria-label={name === "a" ? "Older revision" : "Newer revision"}>
      {revs.map((r) => <option key={r.id} value={r.id}>Revision {r.number} — {STATE_LABEL[r.state as RevisionState]}</option>)}
    </select>
  );
  const chooser = (
    <form className="inline-form" method="get" action={`${base}/diff`}>
      <label className="field"><span className="label">From</span>{pick("a", a)}</label>
      <label className="field"><span className="label">To</span>{pick("b", b)}</label>
      <button type="submit" className="quiet">Compare</button>
    </form>
  );
  if (!a || !b || a === b) {
    return (<><div className="crumbs"><Link href={base}>{status.title}</Link></div><h1>What changed</h1>{chooser}<p className="notice-info">Choose two different revisions{revs.length < 2 ? ": this analysis has only one so far" : ""}.</p></>);
  }
  const d = await orNotFound(() => diffRevisions(db, member, a, b, id));
  const changed = d.steps.filter((s) => s.status !== "unchanged");
  return (
    <>
      <div className="crumbs"><Link href={base}>{status.title}</Link> / what changed</div>
      <h1>Revision {d.a.number} → revision {d.b.number}</h1>
      <p className="lede">{STATE_LABEL[d.a.state as RevisionState]} → {STATE_LABEL[d.b.state as RevisionState]}. Steps are paired by kind and order; defaults are filled in, so an omitted default is not a change.</p>
      {chooser}
      <section className="sheet" aria-labelledby="cfg"><h2 id="cfg">Inputs and configuration</h2>
        {changed.length === 0 ? <p className="muted" data-testid="diff-no-changes">No step was added, removed or configured differently.</p> : (
          <table data-testid="diff-steps">
            <thead><tr><th>Step</th><th>What</th><th>Field</th><th>Revision {d.a.number}</th><th>Revision {d.b.number}</th></tr></thead>
            <tbody>
              {changed.flatMap((s) => {
                const name = `${stepKindLabel(s.kind)}${s.occurrence > 1 ? ` ${s.occurrence}` : ""}`;
                const pos = `${s.positionA !== null ? s.positionA + 1 : "—"} → ${s.positionB !== null ? s.positionB + 1 : "—"}`;
                if (s.status !== "changed") return [<tr key={`${s.kind}${s.occurrence}`}><td>{pos}</td><td>{name}</td><td colSpan={3}><em>{s.status === "added" ? "added" : "removed"}</em></td></tr>];
                return s.changes.map((c, i) => (
                  <tr key={`${s.kind}${s.occurrence}${c.path}`}>
                    <td>{i === 0 ? pos : ""}</td><td>{i === 0 ? name : ""}</td><td><Sym m={configPathLabel(c.path)} /></td><td className="mono">{show(c.from, c.path)}</td><td className="mono rv-moved">{show(c.to, c.path)}</td>
                  </tr>
                ));
              })}
            </tbody>
          </table>
        )}
      </section>
      <section className="sheet" aria-labelledby="res"><h2 id="res">How the results moved</h2>
        <p className="small muted">Value(σ) with the standard error in the last digits. “Shift” is the change over both standard errors combined in quadrature; more than 2 is marked (common practice).</p>
        <table data-testid="diff-results">
          <thead><tr><th>Result</th><th>Revision {d.a.number}</th><th>Revision {d.b.number}</th><th className="num">Change</th><th className="num">Shift (σ)</th></tr></thead>
          <tbody>
            {d.results.map((m) => (
              <tr key={m.key}>
                <td><Sym m={symbolOf(m.name.split("#")[0]!)} />{m.name.includes("#") ? ` of measurement ${m.name.split("#")[1]}` : ""} <span className="small muted">{term(m.name.split("#")[0]!).label}, {stepRefLabel(m.key.split(":")[0]!)}</span></td>
                <td className="mono">{valued(m.from, m.unit)}</td>
                <td className="mono">{valued(m.to, m.unit)}</td>
                <td className="num mono">{m.change === null ? "—" : valueText(m.change, null, m.unit)}</td>
                <td className={`num${m.changeInSigmas !== null && Math.abs(m.changeInSigmas) > 2 ? " rv-big" : ""}`}>{m.changeInSigmas === null ? "—" : formatNumber(m.changeInSigmas, 3)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </>
  );
}
