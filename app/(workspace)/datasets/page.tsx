import type { Metadata } from 'next';
import Link from 'next/link';
import DatasetPlot from '@/components/datasets/dataset-plot';
import { DeleteDatasetButton } from '@/components/datasets/delete-dataset-button';
import { DatasetUploadForm } from '@/components/datasets/upload-form';
import { requirePageUser } from '@/lib/auth/page';
import { roleAllows } from '@/lib/auth/permissions';
import { SHA256_PATTERN } from '@/lib/engine/dataset';
import { getDatasetDetail, listDatasetsByTeam, type DatasetDetail } from '@/lib/db/datasets';
import { AppError } from '@/lib/errors';
import { formatDay, formatMinute } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Datasets' };

const KIND_LABELS: Record<string, string> = { slope_profile: 'Slope profile', long_profile: 'River long profile' };

const columnsText = (columns: { name: string; unit: string }[]) => columns.map((c) => `${c.name} [${c.unit}]`).join(', ');

/** The team's datasets: upload, list, and the selected one with its plot, users and downloads. */
export default async function DatasetsPage({ searchParams }: { searchParams: Promise<{ sha?: string | string[] }> }) {
  const { current } = await requirePageUser();
  if (!current) return <p className="text-slate">You are not a member of any team yet.</p>;
  const canEdit = roleAllows(current.role, 'edit');
  const list = await listDatasetsByTeam({ teamId: current.id });
  const requested = (await searchParams).sha;
  const wanted = typeof requested === 'string' && SHA256_PATTERN.test(requested) ? requested : list.items[0]?.sha256;
  let selected: DatasetDetail | null = null;
  if (wanted) {
    try {
      selected = await getDatasetDetail({ teamId: current.id, sha256: wanted });
    } catch (error) {
      if (!(error instanceof AppError && error.status === 404)) throw error;
    }
  }
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="flex min-w-0 flex-col gap-4">
        <div>
          <h1 className="text-[20px] font-semibold tracking-tight">Datasets</h1>
          <p className="text-[13px] text-slate">
            Measured profiles of {current.name}, each fixed by the SHA-256 of its canonical form; sheets refer to them as{' '}
            <span className="num">dataset(&quot;…&quot;)</span>. A dataset never changes: a corrected survey is a new upload.
          </p>
        </div>
        {canEdit ? <DatasetUploadForm teamId={current.id} /> : null}
        {list.items.length === 0 ? (
          <p className="text-[13px] text-slate">No datasets yet.{canEdit ? ' Upload a surveyed profile above.' : ''}</p>
        ) : (
          <div className="overflow-x-auto rounded-[4px] border border-rule bg-chalk">
            <table className="w-full text-left text-[13px]" aria-label="Datasets of the team">
              <thead className="bg-wash text-slate">
                <tr>
                  <th scope="col" className="px-2 py-1.5 font-medium">Name</th>
                  <th scope="col" className="px-2 py-1.5 font-medium">Kind</th>
                  <th scope="col" className="px-2 py-1.5 font-medium">Columns</th>
                  <th scope="col" className="px-2 py-1.5 text-right font-medium">Rows</th>
                  <th scope="col" className="px-2 py-1.5 font-medium">Uploaded by</th>
                  <th scope="col" className="px-2 py-1.5 text-right font-medium">Used by</th>
                  <th scope="col" className="px-2 py-1.5 font-medium">Hash</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-rule">
                {list.items.map((d) => (
                  <tr key={d.sha256} aria-current={d.sha256 === selected?.sha256 ? 'true' : undefined} className={d.sha256 === selected?.sha256 ? 'bg-wash' : undefined}>
                    <td className="px-2 py-1.5">
                      <Link href={`/datasets?sha=${d.sha256}`} className="font-medium text-river hover:underline">
                        {d.name}
                      </Link>
                    </td>
                    <td className="px-2 py-1.5">{KIND_LABELS[d.kind]}</td>
                    <td className="num px-2 py-1.5">{columnsText(d.columns)}</td>
                    <td className="num px-2 py-1.5 text-right">{d.rowCount.toLocaleString('en-US')}</td>
                    <td className="px-2 py-1.5">
                      {d.createdBy?.name ?? '—'}
                      <time dateTime={d.createdAt} className="num block text-[12px] text-slate">
                        {formatDay(d.createdAt)}
                      </time>
                    </td>
                    <td className="num px-2 py-1.5 text-right">{d.usedByCount === 1 ? '1 sheet' : `${d.usedByCount} sheets`}</td>
                    <td className="num px-2 py-1.5 text-slate">{d.sha256.slice(0, 12)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </div>
      {selected ? <DatasetPanel dataset={selected} canEdit={canEdit} teamId={current.id} /> : null}
    </div>
  );
}

function DatasetPanel({ dataset, canEdit, teamId }: { dataset: DatasetDetail; canEdit: boolean; teamId: string }) {
  const base = `/api/datasets/${dataset.sha256}?team=${teamId}`;
  return (
    <section aria-labelledby="dataset-heading" className="flex min-w-0 flex-col gap-3 rounded-[4px] border border-rule bg-chalk p-3">
      <div>
        <h2 id="dataset-heading" className="text-[16px] font-semibold">
          {dataset.name}
        </h2>
        <p className="text-[13px] text-slate">
          {KIND_LABELS[dataset.kind]} · {dataset.rowCount.toLocaleString('en-US')} rows · uploaded by {dataset.createdBy?.name ?? 'someone no longer in the team'} on{' '}
          {formatMinute(dataset.createdAt)} UTC
        </p>
      </div>
      {dataset.description ? <p className="whitespace-pre-line text-[13px]">{dataset.description}</p> : null}
      <DatasetPlot dataset={{ kind: dataset.kind, columns: dataset.columns, rows: dataset.rows }} name={dataset.name} />
      <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-1 text-[13px]">
        <dt className="text-slate">Columns</dt>
        <dd className="num">{columnsText(dataset.columns)}</dd>
        <dt className="text-slate">SHA-256</dt>
        <dd className="num break-all" data-testid="dataset-sha256">
          {dataset.sha256}
        </dd>
        <dt className="text-slate">Original file</dt>
        <dd className="num break-all">
          {dataset.byteSize.toLocaleString('en-US')} bytes, SHA-256 {dataset.originalSha256}
        </dd>
      </dl>
      <div className="flex flex-wrap gap-3 text-[13px]">
        <a href={`${base}&format=csv`} className="text-river underline">
          Canonical CSV
        </a>
        <a href={`${base}&format=canonical`} className="text-river underline">
          Canonical JSON (hashed)
        </a>
        <a href={`${base}&format=original`} className="text-river underline">
          Original file
        </a>
      </div>
      <div className="flex flex-col gap-1">
        <h3 className="text-[14px] font-semibold">Used by</h3>
        {dataset.usedBy.length === 0 ? (
          <p className="text-[13px] text-slate">No sheet refers to this dataset.</p>
        ) : (
          <ul className="flex flex-col gap-1 text-[13px]">
            {dataset.usedBy.map((use) => (
              <li key={use.sheetId}>
                <Link href={`/sheets/${use.sheetId}`} className="font-medium text-river hover:underline">
                  {use.title}
                </Link>
                {use.archived ? <span className="text-slate"> (archived)</span> : null}
                <span className="text-slate">
                  {' — '}
                  {[use.draft ? 'draft' : null, ...use.revisions.map((n) => `revision ${n}`)].filter(Boolean).join(', ')}
                </span>
              </li>
            ))}
          </ul>
        )}
      </div>
      {canEdit && dataset.usedBy.length === 0 ? <DeleteDatasetButton sha256={dataset.sha256} teamId={teamId} name={dataset.name} /> : null}
    </section>
  );
}
