'use client';

import { useRouter } from 'next/navigation';
import { useCallback, useState } from 'react';
import { RunProgress } from '@/components/runs/run-progress';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';
import { ApiError, apiFetch, failureOf } from '@/lib/api-client';

export type RevisionEvaluationState = {
  status: 'done' | 'evaluating' | 'failed';
  run: { id: string; status: 'queued' | 'running' | 'done' | 'failed' | 'cancelled'; progress: number; error?: string } | null;
};

/**
 * A revision saved over the synchronous cost limit (CONTRACT §6b): its results are stored when its long
 * run finishes. While it runs: "Evaluating" with the run's progress bar and cancel; when the run failed
 * or was cancelled: why, and a button that starts a new run. The page reloads when the results are stored.
 */
export function RevisionEvaluation({ sheetId, revision, evaluation }: { sheetId: string; revision: number; evaluation: RevisionEvaluationState }) {
  const router = useRouter();
  const active = evaluation.status === 'evaluating' && evaluation.run ? evaluation.run.id : null;
  const [runId, setRunId] = useState<string | null>(active);
  const [ended, setEnded] = useState<string | null>(evaluation.status === 'failed' ? evaluation.run?.error ?? (evaluation.run?.status === 'cancelled' ? 'The run was cancelled.' : 'The run did not finish.') : null);
  const [problem, setProblem] = useState<string | null>(null);
  const [starting, setStarting] = useState(false);
  const onDone = useCallback(() => router.refresh(), [router]);
  const onEnded = useCallback((run: { status: string; error?: string }) => {
    setRunId(null);
    setEnded(run.error ?? (run.status === 'cancelled' ? 'The run was cancelled.' : 'The run did not finish.'));
  }, []);
  const start = async () => {
    setStarting(true);
    setProblem(null);
    try {
      let body: { run?: { id: string; status: string } } | null;
      try {
        body = await apiFetch<{ run?: { id: string; status: string } } | null>(`/api/sheets/${sheetId}/runs`, { body: { revision } });
      } catch (failure) {
        setProblem(failureOf(failure, `The run could not be started (${failure instanceof ApiError ? failure.status : 0}).`).message);
        return;
      }
      if (!body?.run) {
        setProblem('The run could not be started (200).');
        return;
      }
      setEnded(null);
      if (body.run.status === 'done') router.refresh();
      else setRunId(body.run.id);
    } finally {
      setStarting(false);
    }
  };
  if (evaluation.status === 'done') return null;
  return (
    <section className="flex flex-col gap-2 rounded-[4px] border border-rule bg-chalk p-3 text-[13px]" data-testid="revision-evaluation" data-evaluation={runId ? 'evaluating' : 'failed'}>
      <p>
        <span className="font-medium">{runId ? 'Evaluating' : 'Not evaluated'}</span>
        {' · '}
        r{revision} is saved with its document and hash; it was too costly to evaluate within the request, so a long run
        stores its results when it finishes. A check can be asked for once the results are stored.
      </p>
      {runId ? <RunProgress key={runId} runId={runId} onDone={onDone} onEnded={onEnded} /> : null}
      {!runId ? (
        <div className="flex flex-wrap items-center gap-3">
          {ended ? <span className="text-oxide">{ended}</span> : null}
          <Button onClick={() => void start()} disabled={starting}>
            {starting ? 'Starting…' : 'Evaluate again'}
          </Button>
        </div>
      ) : null}
      {problem ? <ErrorText>{problem}</ErrorText> : null}
    </section>
  );
}
