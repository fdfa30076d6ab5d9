"use client";
/** What the mapped columns hold, before storing: every refused row, repeated and decreasing temperatures, with their lines. */
import type { PreviewChecks } from "./ImportPanel";

function more(shown: number, total: number) {
  return total > shown ? <li>… and {total - shown} more</li> : null;
}

export function ImportChecks({ checks }: { checks: PreviewChecks }) {
  const t = checks.temperatures;
  if (checks.invalidCount === 0 && t.duplicateCount === 0 && t.decreasingCount === 0) {
    return <p className="notice-ok" data-testid="import-checks-ok">All {checks.validCount} rows of the chosen columns can be stored; temperatures increase from row to row.</p>;
  }
  return (
    <div className="stack" data-testid="import-checks">
      {checks.invalidCount > 0 && (
        <div className="form-error" role="alert">
          <strong>{checks.invalidCount} row{checks.invalidCount === 1 ? "" : "s"} would be refused at storing</strong> (nothing is stored while any remain; fix the file or the column choice):
          <ul className="issues" data-testid="import-invalid">
            {checks.invalid.map((i, k) => <li key={k}>line {i.line}, column {i.column}{i.field ? ` (${i.field})` : ""}: {i.message}</li>)}
            {more(checks.invalid.length, checks.invalidCount)}
          </ul>
        </div>
      )}
      {t.duplicateCount > 0 && (
        <div className="notice-info" data-testid="import-duplicates">
          <strong>{t.duplicateCount} repeated temperature{t.duplicateCount === 1 ? "" : "s"}</strong> (stored as they are; check that they are repeated measurements, not copied rows):
          <ul className="issues">
            {t.duplicates.map((d) => <li key={d.line}>line {d.line}: T = {d.value}, as on line {d.otherLine}</li>)}
            {more(t.duplicates.length, t.duplicateCount)}
          </ul>
        </div>
      )}
      {t.decreasingCount > 0 && (
        <div className="notice-info" data-testid="import-decreasing">
          <strong>{t.decreasingCount} temperature{t.decreasingCount === 1 ? "" : "s"} lower than the row before</strong> (a cool-down after a warm-up, or rows out of order; stored as they are):
          <ul className="issues">
            {t.decreasing.map((d) => <li key={d.line}>line {d.line}: T = {d.value}, below line {d.otherLine}</li>)}
            {more(t.decreasing.length, t.decreasingCount)}
          </ul>
        </div>
      )}
    </div>
  );
}
