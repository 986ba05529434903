'use client';

import { useRouter } from 'next/navigation';
import { useRef, useState, type DragEvent, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';
import { ApiError, apiResponse, failureOf } from '@/lib/api-client';

type Problem = { line: number; column: number | null; name: string | null; reason: string; message: string };
type UploadAnswer = {
  dataset?: { sha256: string; name: string };
  error?: { code: string; message: string; field?: string; rows?: Problem[]; truncated?: boolean };
};

const KINDS = [
  { value: 'slope_profile', label: 'Slope profile', help: 'a scarp, riser or hillslope transect: distance, elevation, optional elevation_sd' },
  { value: 'long_profile', label: 'River long profile', help: 'distance downstream, elevation, and drainage_area or discharge' },
] as const;

const MAX_FILE_BYTES = 2 * 1024 * 1024;

/**
 * The upload form of the datasets page: a file picked or dropped, its kind, name and description. A refused
 * file shows every row-level problem as a table (line, column, reason) and nothing is stored.
 */
export function DatasetUploadForm({ teamId }: { teamId: string }) {
  const router = useRouter();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [kind, setKind] = useState<(typeof KINDS)[number]['value']>('slope_profile');
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const [dragging, setDragging] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<UploadAnswer['error'] | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  function choose(next: File | null) {
    setFile(next);
    setError(null);
    setNotice(null);
  }

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    const dropped = event.dataTransfer.files?.[0];
    if (dropped) choose(dropped);
  }

  async function submit(event: FormEvent) {
    event.preventDefault();
    if (!file) {
      setError({ code: 'validation', message: 'Choose a CSV file first.', field: 'file' });
      return;
    }
    if (file.size > MAX_FILE_BYTES) {
      setError({ code: 'too_large', message: `The file is ${file.size.toLocaleString('en-US')} bytes; a dataset file may be at most 2 MiB.`, field: 'file' });
      return;
    }
    const body = new FormData();
    body.set('file', file, file.name);
    body.set('kind', kind);
    body.set('teamId', teamId);
    if (name.trim()) body.set('name', name.trim());
    if (description.trim()) body.set('description', description);
    setBusy(true);
    setError(null);
    setNotice(null);
    try {
      let answer: { status: number; body: UploadAnswer | null };
      try {
        answer = await apiResponse<UploadAnswer | null>('/api/datasets', { body });
      } catch (failure) {
        const problem = failure instanceof ApiError ? (failure.body as UploadAnswer | null)?.error : undefined;
        setError(problem ?? { code: 'internal', message: failure instanceof ApiError && failure.status > 0 ? `The upload failed (HTTP ${failure.status}).` : failureOf(failure, 'The upload failed.').message });
        return;
      }
      const dataset = answer.body?.dataset;
      if (!dataset) {
        setError({ code: 'internal', message: `The upload failed (HTTP ${answer.status}).` });
        return;
      }
      setNotice(answer.status === 201 ? `Stored “${dataset.name}”.` : `The team already holds this data as “${dataset.name}”.`);
      setFile(null);
      setName('');
      setDescription('');
      if (input.current) input.current.value = '';
      router.push(`/datasets?sha=${dataset.sha256}`);
      router.refresh();
    } finally {
      setBusy(false);
    }
  }

  const kindHelp = KINDS.find((k) => k.value === kind)!.help;
  return (
    <form onSubmit={submit} className="flex flex-col gap-3 rounded-[4px] border border-rule bg-chalk p-3" aria-labelledby="upload-heading">
      <h2 id="upload-heading" className="text-[15px] font-semibold">
        Upload a dataset
      </h2>
      <div
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`flex flex-col items-start gap-1 rounded-[3px] border border-dashed px-3 py-3 text-[13px] ${dragging ? 'border-river bg-wash' : 'border-rule'}`}
        data-testid="dataset-drop-zone"
      >
        <label htmlFor="dataset-file" className="font-medium">
          CSV file
        </label>
        <input
          ref={input}
          id="dataset-file"
          name="file"
          type="file"
          accept=".csv,.txt,text/csv,text/plain"
          onChange={(event) => choose(event.target.files?.[0] ?? null)}
          className="text-[13px]"
        />
        <p className="text-[12px] text-slate">
          {file ? `${file.name}, ${file.size.toLocaleString('en-US')} bytes` : 'or drop it here.'} UTF-8, a header of <span className="num">name [unit]</span> cells
          such as <span className="num">distance [m],elevation [m]</span>, comma or semicolon between cells, a decimal point; 3 to 20,000 rows, at most 2 MiB.
        </p>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <div className="flex flex-col gap-1">
          <label htmlFor="dataset-kind" className="text-[13px] font-medium">
            Kind
          </label>
          <select
            id="dataset-kind"
            value={kind}
            onChange={(event) => setKind(event.target.value as typeof kind)}
            className="h-9 rounded-[3px] border border-rule bg-chalk px-2 text-[14px]"
            aria-describedby="dataset-kind-hint"
          >
            {KINDS.map((k) => (
              <option key={k.value} value={k.value}>
                {k.label}
              </option>
            ))}
          </select>
          <p id="dataset-kind-hint" className="text-[12px] text-slate">
            {kindHelp}
          </p>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="dataset-name" className="text-[13px] font-medium">
            Name
          </label>
          <input
            id="dataset-name"
            value={name}
            maxLength={200}
            onChange={(event) => setName(event.target.value)}
            placeholder={file ? file.name.replace(/\.[^.]+$/, '') : 'the file name'}
            className="h-9 rounded-[3px] border border-rule bg-chalk px-2.5 text-[14px]"
          />
        </div>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="dataset-description" className="text-[13px] font-medium">
          Description <span className="font-normal text-slate">(provenance: instrument, date, datum, who surveyed)</span>
        </label>
        <textarea
          id="dataset-description"
          value={description}
          maxLength={2000}
          rows={2}
          onChange={(event) => setDescription(event.target.value)}
          className="rounded-[3px] border border-rule bg-chalk px-2.5 py-1.5 text-[14px]"
        />
      </div>
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={busy}>
          {busy ? 'Uploading…' : 'Upload'}
        </Button>
        {notice ? (
          <p role="status" className="text-[13px] text-moss">
            <span aria-hidden="true">✓ </span>
            {notice}
          </p>
        ) : null}
      </div>
      {error ? <UploadProblems error={error} /> : null}
    </form>
  );
}

function UploadProblems({ error }: { error: NonNullable<UploadAnswer['error']> }) {
  const rows = error.rows ?? [];
  return (
    <div className="flex flex-col gap-2" data-testid="upload-problems">
      <ErrorText>
        {error.message} {error.code === 'invalid_dataset' ? 'Nothing was stored: fix the file and upload it again.' : ''}
      </ErrorText>
      {rows.length ? (
        <div className="max-h-72 overflow-auto rounded-[3px] border border-rule">
          <table className="w-full text-left text-[13px]">
            <caption className="sr-only">Problems found in the file</caption>
            <thead className="sticky top-0 bg-wash text-slate">
              <tr>
                <th scope="col" className="px-2 py-1 font-medium">
                  Line
                </th>
                <th scope="col" className="px-2 py-1 font-medium">
                  Column
                </th>
                <th scope="col" className="px-2 py-1 font-medium">
                  Reason
                </th>
                <th scope="col" className="px-2 py-1 font-medium">
                  What is wrong
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {rows.map((row, index) => (
                <tr key={`${row.line}-${row.column}-${index}`}>
                  <td className="num px-2 py-1">{row.line}</td>
                  <td className="num px-2 py-1">
                    {row.column ?? '—'}
                    {row.name ? <span className="text-slate"> ({row.name})</span> : null}
                  </td>
                  <td className="num px-2 py-1">{row.reason}</td>
                  <td className="px-2 py-1">{row.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {error.truncated ? <p className="px-2 py-1 text-[12px] text-slate">Only the first 100 problems are listed.</p> : null}
        </div>
      ) : null}
    </div>
  );
}
