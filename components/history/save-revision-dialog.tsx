'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { compareSheets, type SheetComparison } from '@/lib/sheet/compare';
import { mergeSheets, type MergeClash } from '@/lib/sheet/merge';
import { ErrorText } from '@/components/ui/error-text';
import { ApiError, apiFetch } from '@/lib/api-client';

type Doc = { format: string; title: string; site?: { name: string; latitude?: number; longitude?: number; notes?: string }; blocks: { id: string; name: string; type: string; inputs: Record<string, string>; note?: string }[] };

type Conflict = { current: number; latest: Doc; merged: Doc; clashes: MergeClash[]; theirChanges: SheetComparison };

async function fetchRevision(sheetId: string, number: number): Promise<Doc> {
  try {
    return (await apiFetch<{ document: Doc }>(`/api/sheets/${sheetId}/revisions/${number}`)).document;
  } catch {
    throw new Error('The newest revision could not be loaded.');
  }
}

/**
 * Saves the working document as a new revision with a message. When someone saved meanwhile (409),
 * it shows what they changed, re-applies this person's edits onto the newest revision (block by block),
 * lists any clash, and lets them save the result; nothing they typed is lost.
 */
export function SaveRevisionDialog({
  open,
  onClose,
  sheetId,
  baseRevision,
  document,
  onSaved,
}: {
  open: boolean;
  onClose: () => void;
  sheetId: string;
  baseRevision: number;
  document: Doc;
  /** `evaluating`: saved over the cost limit; a long run stores the results (CONTRACT §6b). */
  onSaved: (saved: { number: number; hash: string; evaluating?: boolean }, savedDocument: Doc) => void;
}) {
  const [message, setMessage] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const [conflict, setConflict] = useState<Conflict | null>(null);

  async function save(doc: Doc, base: number) {
    setPending(true);
    setError(null);
    let saved: { number: number; hash: string; evaluation?: 'evaluating' };
    try {
      saved = await apiFetch<{ number: number; hash: string; evaluation?: 'evaluating' }>(`/api/sheets/${sheetId}/revisions`, { body: { baseRevision: base, document: doc, message } });
    } catch (failure) {
      setPending(false);
      const current = failure instanceof ApiError && failure.status === 409 ? (failure.body as { current?: { number: number } } | null)?.current : undefined;
      if (current) {
        try {
          const [latest, original] = await Promise.all([fetchRevision(sheetId, current.number), base > 0 ? fetchRevision(sheetId, base) : Promise.resolve({ ...doc, blocks: [] })]);
          const { document: merged, clashes } = mergeSheets(original, doc, latest);
          setConflict({ current: current.number, latest, merged, clashes, theirChanges: compareSheets({ document: original }, { document: latest }) });
        } catch (e) {
          setError(e instanceof Error ? e.message : 'The newest revision could not be loaded.');
        }
        return;
      }
      setError(failure instanceof ApiError && failure.code !== 'error' ? failure.message : 'The revision could not be saved. Try again.');
      return;
    }
    setPending(false);
    setConflict(null);
    setMessage('');
    onSaved({ number: saved.number, hash: saved.hash, ...(saved.evaluation === 'evaluating' ? { evaluating: true } : {}) }, doc);
    onClose();
  }

  return (
    <Dialog open={open} onClose={onClose} title={conflict ? `Revision ${conflict.current} was saved meanwhile` : 'Save a revision'}>
      {conflict ? (
        <div className="flex flex-col gap-2 text-[13px]" data-testid="revision-conflict">
          <p>Someone saved revision {conflict.current} after you started from revision {baseRevision}. Their changes:</p>
          <ul className="list-disc pl-5">
            {conflict.theirChanges.added.map((b) => <li key={`a-${b.id}`}>added <span className="num">{b.name}</span></li>)}
            {conflict.theirChanges.removed.map((b) => <li key={`r-${b.id}`}>removed <span className="num">{b.name}</span></li>)}
            {conflict.theirChanges.changed.map((b) => (
              <li key={`c-${b.id}`}>
                changed <span className="num">{b.nameAfter}</span>
                {b.inputs.length ? `: ${b.inputs.map((i) => `${i.input} ${i.before ?? '—'} → ${i.after ?? '—'}`).join('; ')}` : ''}
              </li>
            ))}
          </ul>
          <p>Your edits have been re-applied on revision {conflict.current}.</p>
          {conflict.clashes.length ? (
            <div role="alert" className="text-clay">
              <span aria-hidden="true">⚠ </span>Both of you changed these; your version is kept:
              <ul className="list-disc pl-5">
                {conflict.clashes.map((c) => (
                  <li key={`${c.blockId}-${c.field}`}>
                    <span className="num">{c.blockName}</span> {c.field}: yours {c.mine ?? '—'}, theirs {c.theirs ?? '—'}
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
          <div className="flex justify-end gap-2">
            <Button onClick={onClose}>Cancel (keep my draft)</Button>
            <Button variant="primary" disabled={pending} onClick={() => save(conflict.merged, conflict.current)}>
              {pending ? 'Saving…' : `Save on revision ${conflict.current}`}
            </Button>
          </div>
        </div>
      ) : (
        <form
          className="flex flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            void save(document, baseRevision);
          }}
        >
          <label className="flex flex-col gap-1 text-[13px]">
            <span className="font-medium">What changed (message)</span>
            <textarea value={message} onChange={(e) => setMessage(e.target.value)} maxLength={2000} rows={3} className="rounded-[3px] border border-rule bg-chalk px-2 py-1 text-[14px]" />
          </label>
          <p className="text-[12px] text-slate">
            The sheet is evaluated and stored as revision {baseRevision + 1} with its results and hash (a sheet too costly to
            evaluate at once is stored now and its results when its long run finishes). A new revision starts unsigned.
          </p>
          {error ? (
            <ErrorText>{error}</ErrorText>
          ) : null}
          <div className="flex justify-end gap-2">
            <Button onClick={onClose}>Cancel</Button>
            <Button type="submit" variant="primary" disabled={pending}>
              {pending ? 'Saving…' : 'Save revision'}
            </Button>
          </div>
        </form>
      )}
    </Dialog>
  );
}
