/**
 * The sample form's text state and its conversion to the JSON the server's sample schema reads
 * (lib/server/samples.ts). Only syntax is checked here (is it a number, is "El=z" well formed);
 * everything else — formula parsing, ranges, valences naming elements — is the server's job.
 */

export interface SampleDraft {
  label: string;
  formula: string;
  massMg: string;
  densityGPerCm3: string;
  compositionVariable: string;
  compositionValue: string;
  seriesLabel: string;
  valences: string;
  tags: string;
  notes: string;
}

export interface SampleLike {
  label: string;
  formula: string;
  massMg: number | null;
  densityGPerCm3: number | null;
  compositionVariable: string | null;
  compositionValue: number | null;
  seriesLabel: string | null;
  valences: Record<string, number>;
  tags: string[];
  notes: string;
}

export const EMPTY_DRAFT: SampleDraft = {
  label: "", formula: "", massMg: "", densityGPerCm3: "", compositionVariable: "", compositionValue: "", seriesLabel: "", valences: "", tags: "", notes: "",
};

const str = (n: number | null) => (n === null ? "" : String(n));

export function draftOf(s: SampleLike): SampleDraft {
  return {
    label: s.label, formula: s.formula, massMg: str(s.massMg), densityGPerCm3: str(s.densityGPerCm3),
    compositionVariable: s.compositionVariable ?? "", compositionValue: str(s.compositionValue), seriesLabel: s.seriesLabel ?? "",
    valences: Object.entries(s.valences).map(([el, z]) => `${el}=${z}`).join(", "), tags: s.tags.join(", "), notes: s.notes,
  };
}

export class DraftError extends Error {
  constructor(readonly field: string, message: string) {
    super(message);
  }
}

/** "" → null; "1,5" or "1.5" → 1.5; anything else that is not a finite number → DraftError naming the field. */
function numberOrNull(field: string, text: string): number | null {
  const t = text.trim();
  if (!t) return null;
  const n = Number(/^[-+]?\d+,\d+$/.test(t) ? t.replace(",", ".") : t);
  if (!Number.isFinite(n)) throw new DraftError(field, `not a number: "${t}"`);
  return n;
}

/** "Cu=1, Zn=2" (commas, semicolons or spaces between pairs) → {Cu: 1, Zn: 2}. */
export function parseValences(text: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const pair of text.split(/[,;\s]+/).filter(Boolean)) {
    const m = /^([A-Z][a-z]?)=([-+]?\d*\.?\d+)$/.exec(pair);
    if (!m) throw new DraftError("valences", `write valences as El=z pairs, e.g. "Cu=1, Zn=2" (could not read "${pair}")`);
    if (m[1]! in out) throw new DraftError("valences", `valence of ${m[1]} given twice`);
    out[m[1]!] = Number(m[2]);
  }
  return out;
}

/** The JSON payload for POST (create) or PATCH (edit, add `version`). */
export function payloadOf(d: SampleDraft) {
  return {
    label: d.label,
    formula: d.formula,
    massMg: numberOrNull("massMg", d.massMg),
    densityGPerCm3: numberOrNull("densityGPerCm3", d.densityGPerCm3),
    compositionVariable: d.compositionVariable.trim() || null,
    compositionValue: numberOrNull("compositionValue", d.compositionValue),
    seriesLabel: d.seriesLabel.trim() || null,
    valences: parseValences(d.valences),
    tags: d.tags.split(",").map((t) => t.trim()).filter(Boolean),
    notes: d.notes,
  };
}
