'use client';

import dynamic from 'next/dynamic';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import type { PublicUser as Person } from '@/lib/db/users';

// The mention picker loads with the comments panel's first use, not with the sheet page.
const MentionBox = dynamic(() => import('./mention-box').then((m) => m.MentionBox), {
  ssr: false,
  loading: () => <div className="h-8 flex-1 rounded-[3px] border border-rule bg-wash" aria-hidden="true" />,
});

/** The warning shown before a comment whose mentions reach nobody is sent. */
async function mentionWarning(body: string, members: Person[]): Promise<string | null> {
  const { unresolvedMentions } = await import('@/lib/comments/mentions');
  const unknown = unresolvedMentions(body, members);
  if (unknown.length === 0) return null;
  const words = unknown.map((u) => `@${u.handle} ${u.reason === 'nobody' ? 'matches nobody in the team' : 'matches more than one person'}`);
  return `${words.join('; ')}, so no one will be notified for it. Pick a name from the list after typing @, or send anyway.`;
}

/** A comment form (new comment or reply): the mention box, the warning about unknown mentions, and the send button. */
export function CommentForm({
  members,
  label,
  placeholder,
  multiline,
  submitLabel,
  busy,
  onSend,
}: {
  members: Person[];
  label: string;
  placeholder: string;
  multiline?: boolean;
  submitLabel: string;
  busy: boolean;
  onSend: (body: string) => Promise<boolean>;
}) {
  const [text, setText] = useState('');
  const [warned, setWarned] = useState<{ body: string; warning: string } | null>(null);
  const submit = async (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const body = text.trim();
    if (!body) return;
    // The first send of a body whose mentions reach nobody only warns; sending it again ("Send anyway") posts it.
    if (warned?.body !== body) {
      const warning = await mentionWarning(body, members);
      if (warning) {
        setWarned({ body, warning });
        return;
      }
    }
    if (await onSend(body)) {
      setText('');
      setWarned(null);
    }
  };
  const warning = warned !== null && warned.body === text.trim() ? warned.warning : null;
  return (
    <form onSubmit={(e) => void submit(e)} className="flex flex-col gap-1">
      <div className={multiline ? 'flex flex-col gap-1' : 'flex gap-1'}>
        <MentionBox
          name="body"
          label={label}
          placeholder={placeholder}
          members={members}
          multiline={multiline}
          value={text}
          onValueChange={setText}
          className={multiline ? 'rounded-[3px] border border-rule bg-chalk px-2 py-1' : 'h-8 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]'}
        />
        {!warning ? (
          <Button type="submit" variant={multiline ? 'primary' : undefined} disabled={busy} className={multiline ? 'self-end' : undefined}>
            {submitLabel}
          </Button>
        ) : null}
      </div>
      {warning ? (
        <div role="alert" className="flex flex-col gap-1 rounded-[3px] border border-clay/60 bg-chalk px-2 py-1 text-[12px]" data-mention-warning>
          <p>
            <span aria-hidden="true">⚠ </span>
            {warning}
          </p>
          <div className="flex gap-2">
            <Button type="submit" disabled={busy}>Send anyway</Button>
          </div>
        </div>
      ) : null}
    </form>
  );
}
