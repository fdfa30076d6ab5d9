"use client";
/**
 * A comment box that completes @mentions from the group's member handles: typing "@ro" lists the
 * members whose handle or name starts with "ro"; ↑/↓ choose, Enter or Tab completes, Escape
 * closes. Below the box, a mention that matches no member is named before anything is posted.
 */
import { useMemo, useState, type KeyboardEvent, type RefObject } from "react";

import { mentionAt, unknownMentions, type Mentionable } from "@/app/_lib/mentions";
export type { Mentionable };

export function MentionBox({ id, value, onChange, members, rows, placeholder, boxRef, testId }: {
  id: string;
  value: string;
  onChange: (v: string) => void;
  members: readonly Mentionable[];
  rows: number;
  placeholder: string;
  boxRef?: RefObject<HTMLTextAreaElement | null>;
  testId?: string;
}) {
  const [caret, setCaret] = useState(0);
  const [pick, setPick] = useState(0);
  const [closed, setClosed] = useState(false);
  const at = mentionAt(value, caret);
  const options = useMemo(() => {
    if (!at) return [];
    return members.filter((m) => m.handle.toLowerCase().startsWith(at.query) || m.name.toLowerCase().startsWith(at.query)).slice(0, 6);
  }, [at?.query, at?.start, members]); // eslint-disable-line react-hooks/exhaustive-deps
  const open = !closed && options.length > 0;
  // The handle being typed is not flagged while completions for it are still offered.
  const unknown = unknownMentions(value, members).filter((h) => !(at && at.query === h && options.length > 0));

  function complete(m: Mentionable) {
    if (!at) return;
    const next = `${value.slice(0, at.start)}@${m.handle} ${value.slice(caret)}`;
    onChange(next);
    const pos = at.start + m.handle.length + 2;
    setCaret(pos);
    requestAnimationFrame(() => boxRef?.current?.setSelectionRange(pos, pos));
  }

  function onKey(e: KeyboardEvent<HTMLTextAreaElement>) {
    if (!open) return;
    if (e.key === "ArrowDown" || e.key === "ArrowUp") {
      e.preventDefault();
      setPick((p) => (p + (e.key === "ArrowDown" ? 1 : options.length - 1)) % options.length);
    } else if (e.key === "Enter" || e.key === "Tab") {
      e.preventDefault();
      complete(options[Math.min(pick, options.length - 1)]!);
    } else if (e.key === "Escape") setClosed(true);
  }

  const listId = `${id}-mentions`;
  return (
    <div className="mention-box">
      <textarea
        id={id} ref={boxRef} rows={rows} value={value} placeholder={placeholder} data-testid={testId}
        role="combobox" aria-expanded={open} aria-controls={listId} aria-autocomplete="list"
        onChange={(e) => { onChange(e.target.value); setCaret(e.target.selectionStart); setPick(0); setClosed(false); }}
        onSelect={(e) => setCaret(e.currentTarget.selectionStart)}
        onKeyDown={onKey}
      />
      {open && (
        <ul className="mention-list" id={listId} role="listbox" data-testid="mention-list">
          {options.map((m, i) => (
            <li key={m.handle} role="option" aria-selected={i === pick} className={i === pick ? "active" : undefined}
              onMouseDown={(e) => { e.preventDefault(); complete(m); }}>
              <strong>@{m.handle}</strong> <span className="muted">{m.name}</span>
            </li>
          ))}
        </ul>
      )}
      {unknown.length > 0 && (
        <p className="field-error" data-testid="mention-unknown">
          {unknown.map((h) => `@${h}`).join(", ")} {unknown.length === 1 ? "matches" : "match"} no member of the group and will notify nobody.
        </p>
      )}
    </div>
  );
}
