/**
 * Mentions in comments (`@handle`), shared by the server (who is notified) and the comment box (the
 * picker, the highlighting and the warning about a mention that reaches nobody). Pure.
 */
import type { PublicUser as Person } from '@/lib/db/users';

const HANDLE = /(?:^|[^\w@.])@([A-Za-z0-9][A-Za-z0-9._-]{0,63})/g;

/** The @handles in a comment body, lower-cased, in order, without repeats. */
export function extractMentionHandles(body: string): string[] {
  const handles = [...body.matchAll(HANDLE)].map((m) => (m[1] ?? '').replace(/[._-]+$/, '').toLowerCase());
  return [...new Set(handles)];
}

/** Every handle by which a member can be mentioned: the e-mail's local part and forms of the name. */
export function handlesOf(person: Person): string[] {
  const local = (person.email.split('@')[0] ?? '').toLowerCase();
  const words = person.name.toLowerCase().normalize('NFD').replace(/[\u0300-\u036f]/g, '').split(/[^a-z0-9]+/).filter(Boolean);
  return [...new Set([local, words.join('.'), words.join('_'), words.join('-'), words.join('')].filter(Boolean))];
}

/** The members one handle reaches (exactly one person when it resolves). */
function matchesOf<P extends Person>(handle: string, members: P[]): P[] {
  const matches = members.filter((m) => handlesOf(m).includes(handle));
  if (matches.length > 0) return matches;
  // A first name alone is enough when only one member has it.
  return members.filter((m) => m.name.toLowerCase().split(/\s+/)[0] === handle);
}

/** Resolves handles to team members; a handle that fits nobody, or more than one person, is left out. */
export function resolveMentions<P extends Person>(handles: string[], members: P[]): P[] {
  const found = new Map<string, P>();
  for (const handle of handles) {
    const matches = matchesOf(handle, members);
    const [only] = matches;
    if (only && matches.length === 1) found.set(only.id, only);
  }
  return [...found.values()];
}

/** The handles of a body that notify nobody: no member fits, or more than one does. */
export function unresolvedMentions(body: string, members: Person[]): { handle: string; reason: 'nobody' | 'several' }[] {
  return extractMentionHandles(body)
    .map((handle) => ({ handle, count: matchesOf(handle, members).length }))
    .filter((h) => h.count !== 1)
    .map((h) => ({ handle: h.handle, reason: h.count === 0 ? ('nobody' as const) : ('several' as const) }));
}

/** The handle the picker writes for a member: the first of their handles that reaches only them. */
export function handleFor(person: Person, members: Person[]): string {
  const unique = handlesOf(person).find((h) => matchesOf(h, members).length === 1);
  return unique ?? handlesOf(person)[0] ?? person.email;
}

/** The mention being typed at the caret (`@to|`): where its `@` is and what follows it. */
export function mentionAtCaret(text: string, caret: number): { from: number; query: string } | null {
  const before = text.slice(0, caret);
  const match = /(?:^|[^\w@.])@([A-Za-z0-9._-]{0,64})$/.exec(before);
  if (!match) return null;
  const query = match[1] ?? '';
  return { from: caret - query.length - 1, query };
}

/** Members whose name or e-mail fits a partly typed handle, best first (at most `limit`). */
export function mentionCandidates<P extends Person>(query: string, members: P[], limit = 6): P[] {
  const q = query.toLowerCase();
  const scored = members
    .map((m) => {
      const handles = handlesOf(m);
      const words = m.name.toLowerCase().split(/\s+/);
      const score = handles.some((h) => h.startsWith(q)) ? 0 : words.some((w) => w.startsWith(q)) ? 1 : m.email.toLowerCase().includes(q) || m.name.toLowerCase().includes(q) ? 2 : -1;
      return { m, score };
    })
    .filter((s) => s.score >= 0)
    .sort((a, b) => a.score - b.score || a.m.name.localeCompare(b.m.name));
  return scored.slice(0, limit).map((s) => s.m);
}

/** A body cut into plain text and mentions, each mention marked with whom it reaches (or nobody). */
export function mentionSegments(body: string, members: Person[]): { text: string; person?: Person; mention?: boolean }[] {
  const segments: { text: string; person?: Person; mention?: boolean }[] = [];
  let last = 0;
  for (const match of body.matchAll(HANDLE)) {
    const raw = match[1] ?? '';
    const handle = raw.replace(/[._-]+$/, '');
    const at = (match.index ?? 0) + match[0].length - raw.length - 1;
    if (at > last) segments.push({ text: body.slice(last, at) });
    const matches = matchesOf(handle.toLowerCase(), members);
    segments.push({ text: `@${handle}`, mention: true, ...(matches.length === 1 ? { person: matches[0] } : {}) });
    last = at + 1 + handle.length;
  }
  if (last < body.length) segments.push({ text: body.slice(last) });
  return segments;
}
