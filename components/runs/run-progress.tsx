'use client';

import { Button } from '@/components/ui/button';
import { useEffect, useEffectEvent, useState } from 'react';
import type { SheetResults } from '@/lib/sheet/types';
import { ApiError, apiFetch, failureOf } from '@/lib/api-client';

/** How a long run looks to the page (CONTRACT §6b). */
export interface RunState {
  id: string;
  status: 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
  progress: number;
  error?: string;
}

/** Polls the run twice a second (the server writes progress at least every second). */
const POLL_MS = 500;

const WORDS: Record<RunState['status'], string> = {
  queued: 'Waiting for a free worker',
  running: 'Calculating',
  done: 'Finished',
  failed: 'Stopped',
  cancelled: 'Cancelled',
};

/**
 * A long run of the sheet: a progress bar updated at least every second and a cancel button.
 * Calls onDone with the results when the run finishes, onEnded when it fails or is cancelled
 * (the page keeps the previous results, marked stale).
 */
export function RunProgress({
  runId,
  onDone,
  onEnded,
}: {
  runId: string;
  onDone: (results: SheetResults) => void;
  onEnded: (run: RunState) => void;
}) {
  const [run, setRun] = useState<RunState>({ id: runId, status: 'queued', progress: 0 });
  const [cancelling, setCancelling] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  // The parent's latest callbacks, called from the polling effect without restarting it.
  const done = useEffectEvent(onDone);
  const ended = useEffectEvent(onEnded);

  useEffect(() => {
    let stopped = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const poll = async () => {
      try {
        const body = await apiFetch<{ run?: RunState; results?: SheetResults } | null>(`/api/runs/${runId}`);
        if (stopped) return;
        if (!body?.run) {
          setProblem('The run could not be read (200).');
        } else {
          setProblem(null);
          setRun(body.run);
          if (body.run.status === 'done' && body.results) {
            done(body.results);
            return;
          }
          if (body.run.status === 'failed' || body.run.status === 'cancelled') {
            ended(body.run);
            return;
          }
        }
      } catch (failure) {
        if (!stopped) {
          setProblem(
            failure instanceof ApiError && failure.status > 0
              ? failureOf(failure, `The run could not be read (${failure.status}).`).message
              : 'The server did not answer; trying again.',
          );
        }
      }
      if (!stopped) timer = setTimeout(poll, POLL_MS);
    };
    void poll();
    return () => {
      stopped = true;
      if (timer) clearTimeout(timer);
    };
  }, [runId]);

  const cancel = async () => {
    setCancelling(true);
    try {
      await apiFetch(`/api/runs/${runId}`, { method: 'DELETE' });
    } catch (failure) {
      setProblem(failureOf(failure, `The run could not be cancelled (${failure instanceof ApiError ? failure.status : 0}).`).message);
    } finally {
      setCancelling(false);
    }
  };

  const percent = Math.round(run.progress * 100);
  const active = run.status === 'queued' || run.status === 'running';
  return (
    <div className="flex flex-wrap items-center gap-3 border-b border-rule bg-wash px-4 py-2 text-[13px]" role="status" aria-live="polite" data-run-status={run.status}>
      <span>
        {WORDS[run.status]}
        {run.status === 'running' ? ` · ${percent} %` : null}
      </span>
      <div
        className="h-2 w-48 overflow-hidden rounded-[2px] border border-rule bg-chalk"
        role="progressbar"
        aria-label="Progress of the calculation"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
      >
        <div className="h-full bg-river transition-[width] duration-300" style={{ width: `${percent}%` }} />
      </div>
      {active ? (
        <Button size="bare" onClick={() => void cancel()} disabled={cancelling} className="h-7 rounded-[3px] px-3 text-[13px]">
          {cancelling ? 'Cancelling…' : 'Cancel'}
        </Button>
      ) : null}
      {run.error ? <span className="text-oxide">{run.error}</span> : null}
      {problem ? <span className="text-oxide">{problem}</span> : null}
    </div>
  );
}
