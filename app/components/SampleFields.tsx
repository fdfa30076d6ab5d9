"use client";
/** The sample form's fields (create and edit share them). Errors appear under the field they name. */
import type { SampleDraft } from "@/app/_lib/sampleDraft";
import { FieldError, invalidProps } from "./FieldError";

interface FieldSpec {
  key: keyof SampleDraft;
  label: string;
  hint?: string;
  wide?: boolean;
  multiline?: boolean;
  numeric?: boolean;
  required?: boolean;
}

const FIELDS: FieldSpec[] = [
  { key: "label", label: "Label", required: true, hint: "Your name for this piece, e.g. \"CuZn-07 ingot B\"" },
  { key: "formula", label: "Formula", required: true, hint: "e.g. Cu0.7Zn0.3, Nb3Sn, CeCu6" },
  { key: "massMg", label: "Mass (mg)", numeric: true },
  { key: "densityGPerCm3", label: "Density (g/cm³)", numeric: true },
  { key: "compositionVariable", label: "Composition variable", hint: "e.g. x" },
  { key: "compositionValue", label: "Composition value", numeric: true },
  { key: "seriesLabel", label: "Series label", hint: "e.g. Cu1-xZnx, 2025 batch" },
  { key: "valences", label: "Valences (El=z)", hint: "Conduction electrons per atom, e.g. Cu=1, Zn=2" },
  { key: "tags", label: "Tags", hint: "Comma-separated", wide: true },
  { key: "notes", label: "Notes", multiline: true, wide: true, hint: "Provenance, preparation, anything a colleague should know" },
];

/** Whether a server-named field (e.g. "valences.Cu") has a place in this form. */
export function isSampleField(field: string | null): boolean {
  return !!field && FIELDS.some((f) => f.key === field.split(".")[0]);
}

export function SampleFields({ idPrefix, draft, onChange, errorOf }: {
  idPrefix: string;
  draft: SampleDraft;
  onChange: (next: SampleDraft) => void;
  errorOf: (field: string) => string | null;
}) {
  return (
    <div className="grid-form">
      {FIELDS.map((f) => {
        const id = `${idPrefix}-${f.key}`;
        const error = errorOf(f.key);
        const common = {
          id,
          name: f.key,
          value: draft[f.key],
          onChange: (e: { target: { value: string } }) => onChange({ ...draft, [f.key]: e.target.value }),
          ...(f.hint && !error ? { "aria-describedby": `${id}-hint` } : {}),
          ...invalidProps(id, error),
        };
        return (
          <div className={`field${f.wide ? " wide" : ""}`} key={f.key}>
            <label htmlFor={id}>{f.label}</label>
            {f.multiline ? (
              <textarea {...common} />
            ) : (
              <input {...common} type="text" inputMode={f.numeric ? "decimal" : undefined} required={f.required} autoComplete="off" />
            )}
            {f.hint && <span className="hint" id={`${id}-hint`}>{f.hint}</span>}
            <FieldError id={`${id}-error`} message={error} />
          </div>
        );
      })}
    </div>
  );
}
