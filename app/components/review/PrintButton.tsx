"use client";
/** Opens the browser's print dialog (the report's print stylesheet hides the page frame). */
export function PrintButton() {
  return <button type="button" className="quiet small" onClick={() => window.print()}>Print</button>;
}
