/**
 * The report's sentences, shared by the print page and the PDF so both say the same thing:
 * the subtitle, the sample line, the fit line (window, points, weighting, fit quality) and the
 * review lines (each event once, in order, times as "2026-12-04 14:52 UTC").
 */
import type { RevisionReport } from "./report";
import { formatCount, formatNumber, formatRange, formatTime, stateLabel } from "../../display";

const DECISION: Record<string, string> = { approved: "approved and sealed", returned: "asked for changes" };

/** "1.2 KiB" */
export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${formatNumber(n / 1024, 3)} KiB`;
  return `${formatNumber(n / 1024 / 1024, 3)} MiB`;
}

/** A piece of a sentence: plain text, or symbol markup to typeset. */
export type TextPiece = string | { sym: string };

export function reportSentences(r: RevisionReport) {
  const sample = r.sample;
  return {
    subtitle: `${r.group.name} · revision ${r.revision.number} · ${r.revision.state === "sealed" ? stateLabel("sealed") : `${stateLabel("replaced")} by a newer sealed revision`} · sealed ${formatTime(r.review.sealedAt)} by ${r.review.sealedBy ?? "a former member"}`,
    sample: [
      `${sample.label}: ${sample.formula}`,
      `M = ${formatNumber(sample.molarMassGPerMol, 6)} g mol⁻¹ per formula unit`,
      `${formatCount(sample.atomsPerFormulaUnit, "atom")} per formula unit`,
      sample.massMg !== null ? `mass ${formatNumber(sample.massMg, 6)} mg` : "no mass recorded",
      ...(sample.densityGPerCm3 !== null ? [`density ${formatNumber(sample.densityGPerCm3, 5)} g cm⁻³`] : []),
    ].join(", ") + ".",
    field: (t: number) => `${formatNumber(t, 4)} T`,
    points: (n: number) => formatCount(n, "point"),
    range: (lo: number, hi: number) => formatRange(lo, hi, "K"),
    fitLine(f: RevisionReport["fits"][number]): TextPiece[] {
      const head = `Window ${formatRange(f.tMinK, f.tMaxK, "K")}, ${formatCount(f.nPoints, "point")}, ${f.basis === "atom" ? "per mole of atoms" : "per mole formula unit"}, `;
      if (f.weighted) return [head + "weighted by 1/σ²; ", { sym: "χ²_red" }, ` = ${formatNumber(f.reducedChiSquare, 3)}.`];
      return [head + "unweighted (the data carry no σ)" + (f.residualStdMJ !== null ? `; residual standard deviation ${formatNumber(f.residualStdMJ, 2)} mJ mol⁻¹ K⁻¹.` : ".")];
    },
    review: [
      `Submitted by ${r.review.submittedBy ?? "a former member"}${r.review.submittedAt ? ` on ${formatTime(r.review.submittedAt)}` : ""}.`,
      ...(r.review.decisions.length
        ? r.review.decisions.map((d) => `${formatTime(d.at)}: ${DECISION[d.decision] ?? d.decision} by ${d.reviewer ?? "a former member"}${d.comment ? ` — “${d.comment}”` : ""}.`)
        : [`${formatTime(r.review.sealedAt)}: approved and sealed by ${r.review.sealedBy ?? "a former member"}.`]),
    ],
  };
}
