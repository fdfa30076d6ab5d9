"use client";
/** Small labelled inputs of the step forms. Numbers are typed as text and parsed here (syntax only). */
import { useEffect, useId, useState, type ReactNode } from "react";
import { useFault } from "./steps/ui";

/** The message under a field the server named as wrong (its configuration key is `name`). */
function Fault({ message }: { message: string | null }) {
  return message ? <p className="field-error" data-testid="field-fault">{message}</p> : null;
}

export function NumField({ label, value, onChange, unit, hint, required = false, testId, name }: { label: ReactNode; value: number | null | undefined; onChange: (v: number | null) => void; unit?: string; hint?: string; required?: boolean; testId?: string; name?: string }) {
  const id = useId();
  const fault = useFault(name);
  const [text, setText] = useState(value === null || value === undefined ? "" : String(value));
  const parsed = text.trim() === "" ? null : Number(text.replace(",", "."));
  const bad = (parsed !== null && !Number.isFinite(parsed)) || (required && parsed === null);
  useEffect(() => {
    // Follow the value when it changes from outside (a brushed window, "take the newer values").
    setText((t) => {
      const cur = t.trim() === "" ? null : Number(t.replace(",", "."));
      return cur === (value ?? null) ? t : value === null || value === undefined ? "" : String(value);
    });
  }, [value]);
  return (
    <div className={`field${fault ? " nb-fault" : ""}`}>
      <label htmlFor={id}>{label}{unit && <span className="muted"> ({unit})</span>}</label>
      <input id={id} type="text" inputMode="decimal" value={text} aria-invalid={bad || !!fault || undefined} data-testid={testId} name={name}
        onChange={(e) => {
          setText(e.target.value);
          const t = e.target.value.trim();
          const n = t === "" ? null : Number(t.replace(",", "."));
          if (n === null || Number.isFinite(n)) onChange(n);
        }} />
      {bad ? <p className="field-error">{required && parsed === null ? "a number is needed" : "not a number"}</p> : fault ? <Fault message={fault} /> : hint && <span className="hint">{hint}</span>}
    </div>
  );
}

export function SelectField<T extends string>({ label, value, options, onChange, hint, testId, name, wide }: { label: ReactNode; value: T; options: readonly { value: T; label: string }[]; onChange: (v: T) => void; hint?: string; testId?: string; name?: string; wide?: boolean }) {
  const id = useId();
  const fault = useFault(name);
  return (
    <div className={`field${wide ? " wide" : ""}${fault ? " nb-fault" : ""}`}>
      <label htmlFor={id}>{label}</label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value as T)} data-testid={testId} name={name} aria-invalid={!!fault || undefined}>
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
      {fault ? <Fault message={fault} /> : hint && <span className="hint">{hint}</span>}
    </div>
  );
}

export function CheckField({ label, checked, onChange, hint, name }: { label: ReactNode; checked: boolean; onChange: (v: boolean) => void; hint?: string; name?: string }) {
  const fault = useFault(name);
  return (
    <div className={`field${fault ? " nb-fault" : ""}`}>
      <label className="checkbox"><input type="checkbox" checked={checked} name={name} aria-invalid={!!fault || undefined} onChange={(e) => onChange(e.target.checked)} /> <span>{label}</span></label>
      {fault ? <Fault message={fault} /> : hint && <span className="hint">{hint}</span>}
    </div>
  );
}

export function TextField({ label, value, onChange, hint, wide, mono, testId, placeholder, name }: { label: string; value: string; onChange: (v: string) => void; hint?: string; wide?: boolean; mono?: boolean; testId?: string; placeholder?: string; name?: string }) {
  const id = useId();
  const fault = useFault(name);
  return (
    <div className={`field${wide ? " wide" : ""}${fault ? " nb-fault" : ""}`}>
      <label htmlFor={id}>{label}</label>
      <input id={id} type="text" value={value} onChange={(e) => onChange(e.target.value)} className={mono ? "mono" : undefined} data-testid={testId} placeholder={placeholder} name={name} aria-invalid={!!fault || undefined} />
      {fault ? <Fault message={fault} /> : hint && <span className="hint">{hint}</span>}
    </div>
  );
}

/** "Nb=5, Mo=6" ⇄ {Nb: 5, Mo: 6}; entries that do not parse are dropped by the reader. */
export function pairsText(record: Record<string, number> | null | undefined): string {
  return Object.entries(record ?? {}).map(([k, v]) => `${k}=${v}`).join(", ");
}

export function parsePairs(text: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const part of text.split(/[,;]/)) {
    const m = /^\s*([A-Za-z_][\w]*)\s*[=:]\s*(-?[\d.eE+-]+)\s*$/.exec(part);
    if (m && Number.isFinite(Number(m[2]))) out[m[1]!] = Number(m[2]);
  }
  return out;
}
