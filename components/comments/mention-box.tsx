'use client';

import { useId, useRef, useState, type KeyboardEvent } from 'react';
import { handleFor, mentionAtCaret, mentionCandidates, mentionSegments } from '@/lib/comments/mentions';
import type { PublicUser as Person } from '@/lib/db/users';

/**
 * A comment box with a picker of team members: typing `@` and a few letters lists the members that
 * fit; ↑/↓ choose, Enter or Tab writes a handle that reaches exactly that person, Escape closes the
 * list. A combobox in ARIA terms (the list is a listbox owned by the box).
 */
export function MentionBox({
  name,
  label,
  placeholder,
  members,
  multiline,
  value,
  onValueChange,
  className,
}: {
  name: string;
  label: string;
  placeholder?: string;
  members: Person[];
  multiline?: boolean;
  value: string;
  onValueChange: (value: string) => void;
  className?: string;
}) {
  const listId = useId();
  const field = useRef<HTMLTextAreaElement & HTMLInputElement>(null);
  const [at, setAt] = useState<{ from: number; query: string } | null>(null);
  const [active, setActive] = useState(0);
  const candidates = at ? mentionCandidates(at.query, members) : [];
  const open = candidates.length > 0;

  const track = (text: string, caret: number | null) => {
    const next = caret === null ? null : mentionAtCaret(text, caret);
    setAt(next);
    setActive(0);
  };

  const choose = (person: Person) => {
    if (!at) return;
    const handle = handleFor(person, members);
    const before = value.slice(0, at.from);
    const after = value.slice(at.from + 1 + at.query.length);
    const inserted = `@${handle} `;
    const next = `${before}${inserted}${after.replace(/^ /, '')}`;
    onValueChange(next);
    setAt(null);
    const caret = before.length + inserted.length;
    requestAnimationFrame(() => {
      field.current?.focus();
      field.current?.setSelectionRange(caret, caret);
    });
  };

  const onKeyDown = (event: KeyboardEvent<HTMLTextAreaElement | HTMLInputElement>) => {
    if (!open) return;
    if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
      event.preventDefault();
      const delta = event.key === 'ArrowDown' ? 1 : -1;
      setActive((i) => (i + delta + candidates.length) % candidates.length);
    } else if (event.key === 'Enter' || event.key === 'Tab') {
      event.preventDefault();
      choose(candidates[active]!);
    } else if (event.key === 'Escape') {
      event.preventDefault();
      event.stopPropagation();
      setAt(null);
    }
  };

  const shared = {
    ref: field,
    name,
    'aria-label': label,
    placeholder,
    value,
    maxLength: 10000,
    role: 'combobox',
    'aria-autocomplete': 'list' as const,
    'aria-expanded': open,
    'aria-controls': listId,
    'aria-activedescendant': open ? `${listId}-${active}` : undefined,
    onChange: (e: { target: { value: string; selectionStart: number | null } }) => {
      onValueChange(e.target.value);
      track(e.target.value, e.target.selectionStart);
    },
    onKeyDown,
    onBlur: () => setAt(null),
    onClick: (e: { currentTarget: { value: string; selectionStart: number | null } }) => track(e.currentTarget.value, e.currentTarget.selectionStart),
  };

  return (
    <div className="relative flex min-w-0 flex-1 flex-col">
      {multiline ? (
        <textarea {...shared} rows={3} className={className} />
      ) : (
        <input {...shared} className={className} />
      )}
      <ul
        id={listId}
        role="listbox"
        aria-label="Team members to mention"
        hidden={!open}
        className="absolute left-0 right-0 top-full z-20 mt-1 max-h-56 overflow-auto rounded-[3px] border border-rule bg-chalk py-1 shadow-md"
        data-mention-list
      >
        {candidates.map((person, i) => (
          <li
            key={person.id}
            id={`${listId}-${i}`}
            role="option"
            aria-selected={i === active}
            className={`cursor-pointer px-2 py-1 text-[13px] ${i === active ? 'bg-wash' : ''}`}
            // mousedown, not click: the field keeps focus, so its blur does not close the list first.
            onMouseDown={(e) => {
              e.preventDefault();
              choose(person);
            }}
          >
            <span className="font-medium">{person.name}</span> <span className="text-slate">@{handleFor(person, members)}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** A comment body with its mentions marked: whom each reaches, or that it reaches nobody. */
export function MentionText({ body, members }: { body: string; members: Person[] }) {
  return (
    <>
      {mentionSegments(body, members).map((segment, i) =>
        segment.mention ? (
          segment.person ? (
            <mark key={i} className="rounded-[2px] bg-wash px-0.5 font-medium text-river" title={`Mentions ${segment.person.name}`} data-mention={segment.person.id}>
              {segment.text}
            </mark>
          ) : (
            <span key={i} className="text-slate underline decoration-dotted" title="Matches nobody in the team: no one was notified" data-mention-unknown>
              {segment.text}
            </span>
          )
        ) : (
          <span key={i}>{segment.text}</span>
        ),
      )}
    </>
  );
}
