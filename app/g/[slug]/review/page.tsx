import type { Metadata } from "next";
import Link from "next/link";
import { pageMember } from "@/app/_server/guard";
import { awaitingMyReview, queueFigures, sentBackToMe, type QueueFigures } from "@/lib/server/review";
import { can } from "@/lib/server/permissions";
import { when } from "@/app/components/review/labels";
import "@/app/components/review/review.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Review" };

/** My review queues in this group: revisions waiting for my review, and mine sent back with changes requested. */
export default async function ReviewQueuesPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const { db, user, member } = await pageMember(slug, `/g/${encodeURIComponent(slug)}/review`);
  const [awaiting, back] = await Promise.all([awaitingMyReview(db, user.id, member.group.id), sentBackToMe(db, user.id, member.group.id)]);
  const reviews = can(member.role, "analysis.review");
  const figures = await queueFigures(db, [...awaiting, ...back]);
  return (
    <>
      <h1>Review</h1>
      <p className="lede">Approving seals a revision: its data, steps and results are locked and carry a content hash. Asking for changes sends it back to its author with your comment.</p>
      <div className="columns">
        <section className="sheet" aria-labelledby="awaiting">
          <h2 id="awaiting">Waiting for my review ({awaiting.length})</h2>
          {!reviews ? <p className="muted small">Your role ({member.role}) does not review; owners and reviewers do.</p>
            : awaiting.length === 0 ? <p className="muted">Nothing is waiting for you.</p> : (
            <ul className="rv-queue" data-testid="queue-awaiting">
              {awaiting.map((q) => (
                <li key={q.revisionId}>
                  <Link href={q.link}><strong>{q.title}</strong></Link> <span className="small muted">revision {q.number} · {q.sampleLabel}</span>
                  <div className="small">sent by {q.submittedBy ?? "—"}, {when(q.submittedAt)}</div>
                  <Figures f={figures.get(q.revisionId)} />
                </li>
              ))}
            </ul>
          )}
        </section>
        <section className="sheet" aria-labelledby="sent-back">
          <h2 id="sent-back">Sent back to me ({back.length})</h2>
          {back.length === 0 ? <p className="muted">No changes requested on your submissions.</p> : (
            <ul className="rv-queue" data-testid="queue-sent-back">
              {back.map((q) => (
                <li key={q.revisionId}>
                  <Link href={q.link}><strong>{q.title}</strong></Link> <span className="small muted">revision {q.number} · {q.sampleLabel}</span>
                  <div className="small">{q.returnedBy ?? "a reviewer"} asked for changes, {when(q.returnedAt)}</div>
                  <Figures f={figures.get(q.revisionId)} />
                  {q.comment && <blockquote>{q.comment}</blockquote>}
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </>
  );
}

/** The revision's key numbers and its open threads, as a reviewer wants them before opening it. */
function Figures({ f }: { f: QueueFigures | undefined }) {
  if (!f) return null;
  return (
    <dl className="rv-figures small" data-testid="queue-figures">
      {f.gamma && <><dt>γ</dt><dd>{f.gamma}</dd></>}
      {f.beta && <><dt>β</dt><dd>{f.beta}</dd></>}
      {f.thetaD && <><dt>Θ<sub>D</sub></dt><dd>{f.thetaD}</dd></>}
      {f.model && <><dt>model</dt><dd>{f.model}</dd></>}
      {f.window && <><dt>window</dt><dd>{f.window}</dd></>}
      <dt>discussion</dt><dd>{f.openThreads === 0 ? "no open threads" : `${f.openThreads} open thread${f.openThreads === 1 ? "" : "s"}`}</dd>
    </dl>
  );
}
