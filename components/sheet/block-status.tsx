export type BlockState = 'stale' | 'running' | 'ok' | 'warning' | 'error' | 'blocked' | 'needs-input';

// Each state has its own mark and word: colour is never the only signal.
export const BLOCK_STATES: Record<BlockState, { mark: string; word: string; tone: string }> = {
  stale: { mark: '◌', word: 'Stale', tone: 'text-slate' },
  running: { mark: '◐', word: 'Running', tone: 'text-river' },
  ok: { mark: '✓', word: 'OK', tone: 'text-moss' },
  warning: { mark: '△', word: 'Warning', tone: 'text-clay' },
  error: { mark: '✕', word: 'Error', tone: 'text-oxide' },
  blocked: { mark: '⊘', word: 'Blocked', tone: 'text-slate' },
  // A new block whose required inputs are still empty: not an error until the user leaves the field or saves.
  'needs-input': { mark: '○', word: 'Needs input', tone: 'text-slate' },
};

export function BlockStatusBadge({ state }: { state: BlockState }) {
  const s = BLOCK_STATES[state];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap text-[12px] font-medium ${s.tone}`} data-state={state}>
      <span aria-hidden="true" className={state === 'running' ? 'inline-block animate-spin' : undefined}>
        {s.mark}
      </span>
      {s.word}
    </span>
  );
}
