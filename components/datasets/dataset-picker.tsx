'use client';

import { useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { useParams } from 'next/navigation';
import { useId } from 'react';
import { apiFetch } from '@/lib/api-client';

type DatasetItem = { sha256: string; name: string; kind: string; rowCount: number; columns: { name: string; unit: string }[] };

const DATA_INPUT = /^\s*dataset\(\s*"([0-9a-f]{64})"\s*\)\s*$/;

function getJson<T>(url: string): Promise<T> {
  return apiFetch<T>(url);
}

/**
 * Beside a data input of the sheet page: a picker of the sheet's team's datasets of the input's kind, which
 * writes `dataset("<sha256>")`, and the name and first 12 hex digits of the dataset the input refers to.
 */
export function DatasetPicker({
  kind,
  value,
  readOnly,
  labelId,
  onPick,
}: {
  kind: string | undefined;
  value: string;
  readOnly: boolean;
  labelId: string;
  onPick: (text: string) => void;
}) {
  const descriptionId = useId();
  const params = useParams<{ sheetId?: string }>();
  const sheetId = typeof params?.sheetId === 'string' ? params.sheetId : undefined;
  // The sheet's team resolves its data inputs, which need not be the user's current team.
  const sheet = useQuery({
    queryKey: ['sheet-team', sheetId],
    queryFn: () => getJson<{ sheet: { teamId: string } }>(`/api/sheets/${sheetId}`),
    enabled: Boolean(sheetId),
    staleTime: 5 * 60_000,
  });
  const teamId = sheet.data?.sheet.teamId;
  const datasets = useQuery({
    queryKey: ['datasets', teamId, kind],
    queryFn: () => getJson<{ items: DatasetItem[] }>(`/api/datasets?team=${teamId}${kind ? `&kind=${kind}` : ''}&sort=name`),
    enabled: Boolean(teamId),
  });
  const current = DATA_INPUT.exec(value)?.[1] ?? null;
  const items = datasets.data?.items ?? [];
  const chosen = current ? items.find((d) => d.sha256 === current) : undefined;

  return (
    <div className="mt-1 flex flex-wrap items-center gap-2 text-[12px]" data-testid="dataset-picker">
      {!readOnly ? (
        <>
          <span id={descriptionId} className="sr-only">
            Choose a dataset of the team
          </span>
          <select
            aria-labelledby={labelId}
            aria-describedby={descriptionId}
            value={chosen ? chosen.sha256 : ''}
            onChange={(event) => {
              if (event.target.value) onPick(`dataset("${event.target.value}")`);
            }}
            className="h-7 max-w-full rounded-[3px] border border-rule bg-chalk px-1.5 text-[12px]"
          >
            <option value="">{datasets.isLoading || sheet.isLoading ? 'Loading datasets…' : items.length ? 'Choose a dataset…' : 'No datasets of this kind yet'}</option>
            {items.map((d) => (
              <option key={d.sha256} value={d.sha256}>
                {d.name} · {d.rowCount} rows · {d.sha256.slice(0, 12)}
              </option>
            ))}
          </select>
        </>
      ) : null}
      {current ? (
        chosen ? (
          <span className="text-slate" data-testid="dataset-chosen">
            <Link href={`/datasets?sha=${chosen.sha256}`} className="font-medium text-basalt hover:underline">
              {chosen.name}
            </Link>{' '}
            <span className="num">{chosen.sha256.slice(0, 12)}</span>
          </span>
        ) : datasets.isSuccess ? (
          <span className="text-clay" data-testid="dataset-chosen">
            <span aria-hidden="true">△ </span>
            <span className="num">{current.slice(0, 12)}</span> is not a {kind ? kind.replace('_', ' ') : 'dataset'} of this team
          </span>
        ) : null
      ) : null}
      <Link href="/datasets" className="text-river hover:underline">
        Upload…
      </Link>
    </div>
  );
}
