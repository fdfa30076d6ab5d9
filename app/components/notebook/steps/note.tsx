"use client";
/** Note step: Markdown text for the group (engine: lib/engine/notebook/steps/note.ts). */
import type { FormProps, StepUi, ViewProps } from "./ui";

function NoteForm(p: FormProps<"note">) {
  return (
    <div className="field wide">
      <label htmlFor={`note-${p.step.id}`}>Text (Markdown: **bold**, *italic*, lists, tables, links)</label>
      <textarea id={`note-${p.step.id}`} rows={6} value={String(p.draft.markdown ?? "")} onChange={(e) => p.set({ markdown: e.target.value })} />
    </div>
  );
}

function NoteView({ noteHtml }: ViewProps<"note">) {
  if (noteHtml === null) return null;
  return <div className="nb-note" dangerouslySetInnerHTML={{ __html: noteHtml /* sanitised on the server: lib/server/markdown.ts */ }} />;
}

export const noteUi: StepUi<"note"> = {
  hint: "text for the group (Markdown)",
  Form: NoteForm,
  View: NoteView,
  summary: (r) => {
    const text = r.markdown.replace(/[#*_`>]/g, "").trim().split("\n")[0] ?? "";
    return text.length > 110 ? `${text.slice(0, 109)}…` : text || null;
  },
  typesetSummary: false,
};
