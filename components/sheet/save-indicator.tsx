import type { SaveState } from '@/lib/sheet/draft-state';

/** The draft's save state in words (with the evaluation state beside it), announced politely. */
export function SaveIndicator({ state, evaluating, evaluateError }: { state: SaveState; evaluating: boolean; evaluateError: string | null }) {
  const text =
    state.kind === 'read-only'
      ? 'Read-only for your role'
      : state.kind === 'saved'
        ? 'All edits saved'
        : state.kind === 'pending'
          ? 'Edits not yet saved'
          : state.kind === 'saving'
            ? 'Saving…'
            : state.kind === 'retrying'
              ? `Save failed (${state.message}); retrying in ${state.inSeconds} s`
              : state.kind === 'invalid'
                ? `Not saved: ${state.message}`
                : 'Not saved: someone else saved first';
  const tone = state.kind === 'invalid' || state.kind === 'conflict' ? 'text-oxide' : state.kind === 'retrying' ? 'text-clay' : 'text-slate';
  return (
    <p role="status" className={`text-[12px] ${tone}`} data-testid="save-state" data-kind={state.kind}>
      {text}
      {evaluating ? <span className="text-river"> · evaluating…</span> : null}
      {evaluateError ? <span className="text-oxide"> · {evaluateError}</span> : null}
    </p>
  );
}
