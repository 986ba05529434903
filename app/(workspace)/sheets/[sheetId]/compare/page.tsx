import type { Metadata } from 'next';
import Link from 'next/link';
import { readRevision } from '@/lib/db/revisions';
import { getSheetDraft } from '@/lib/db/sheets';
import { runEvaluate } from '@/lib/evaluation/pool';
import { parseSheetDocument } from '@/lib/engine';
import { findSheetRecord } from '@/lib/db/sheets';
import { compareSheets, type OutputValue } from '@/lib/sheet/compare';
import { requireSheetPage } from '@/lib/sheet/page-access';

export const metadata: Metadata = { title: 'Compare revisions' };

type Search = Record<string, string | string[] | undefined>;

/** "3" (this sheet) or "{sheetId}:3" (any sheet the user can read, e.g. a fork's source). */
function side(value: string | string[] | undefined, sheetId: string): { sheetId: string; number: number } | null {
  const text = typeof value === 'string' ? value : '';
  const match = text.match(/^(?:([0-9a-f-]{36}):)?([1-9][0-9]{0,8})$/i);
  return match ? { sheetId: (match[1] ?? sheetId).toLowerCase(), number: Number(match[2]) } : null;
}

const show = (o: OutputValue | null) => (o ? `${typeof o.value === 'number' ? Number(o.value.toPrecision(6)) : o.value} ${o.unit}`.trim() : '—');
const percent = (r: number | null) => (r === null ? '' : `${r > 0 ? '+' : ''}${(r * 100).toPrecision(3)} %`);

export default async function ComparePage({ params, searchParams }: { params: Promise<{ sheetId: string }>; searchParams: Promise<Search> }) {
  const { sheetId } = await params;
  const query = await searchParams;
  const { sheet, visibleTeamIds } = await requireSheetPage(sheetId);
  const from = side(query.from, sheetId);
  // `to=draft`: the sheet's stored draft, evaluated now (the draft is not a revision and has no hash).
  const toDraft = query.to === 'draft';
  const to = toDraft ? { sheetId, number: 0 } : side(query.to, sheetId);
  const problem = !from || !to ? 'Choose two revisions to compare.' : null;
  let body: React.ReactNode = null;
  if (from && to) {
    const readable = async (s: { sheetId: string; number: number }) => {
      const record = await findSheetRecord({ sheetId: s.sheetId });
      if (!record || !visibleTeamIds.includes(record.teamId)) return null;
      return readRevision(s).catch(() => null);
    };
    const draftSide = async () => {
      const draft = await getSheetDraft({ sheetId });
      const parsed = parseSheetDocument(draft.document);
      if (!parsed.ok) return null;
      const results = await runEvaluate(parsed.document).catch(() => null);
      return results ? { number: 0, hash: 'draft', document: parsed.document, results } : null;
    };
    const [before, after] = await Promise.all([readable(from), toDraft ? draftSide() : readable(to)]);
    if (!before || !after) {
      body = <p className="text-[13px] text-oxide">One of those revisions does not exist or is not visible to you.</p>;
    } else {
      const c = compareSheets(before, after);
      body = (
        <div className="flex flex-col gap-4">
          <p className="text-[13px] text-slate" data-compare-sides="">
            <span className="font-medium text-basalt">{c.titleBefore}</span>
            {c.siteBefore ? <> at {c.siteBefore}</> : null}, r{before.number} <span className="num">{before.hash.slice(0, 10)}</span>
            {' → '}
            <span className="font-medium text-basalt">{c.titleAfter}</span>
            {c.siteAfter ? <> at {c.siteAfter}</> : null}, {after.number === 0 ? 'the draft' : <>r{after.number} <span className="num">{after.hash.slice(0, 10)}</span></>}
          </p>
          {c.added.length + c.removed.length + c.changed.length === 0 ? <p className="text-[14px]">No differences: the two revisions hold the same calculation.</p> : null}
          {c.added.length ? (
            <section aria-labelledby="added-heading">
              <h2 id="added-heading" className="text-[15px] font-semibold">Added</h2>
              <ul className="text-[13px]">{c.added.map((b) => <li key={b.id}><span aria-hidden="true">+ </span><span className="num">{b.name}</span> <span className="text-slate">{b.type}</span></li>)}</ul>
            </section>
          ) : null}
          {c.removed.length ? (
            <section aria-labelledby="removed-heading">
              <h2 id="removed-heading" className="text-[15px] font-semibold">Removed</h2>
              <ul className="text-[13px]">{c.removed.map((b) => <li key={b.id}><span aria-hidden="true">− </span><span className="num">{b.name}</span> <span className="text-slate">{b.type}</span></li>)}</ul>
            </section>
          ) : null}
          {c.changed.length ? (
            <section aria-labelledby="changed-heading" className="flex flex-col gap-3">
              <h2 id="changed-heading" className="text-[15px] font-semibold">Changed</h2>
              {c.changed.map((b) => (
                <article key={b.id} className="rounded-[4px] border border-rule bg-chalk p-3 text-[13px]" data-changed-block={b.id}>
                  <h3 className="num font-semibold">
                    {b.nameBefore === b.nameAfter ? b.nameAfter : `${b.nameBefore} → ${b.nameAfter}`}
                    {b.statusBefore !== b.statusAfter ? <span className="ml-2 font-normal text-slate">{b.statusBefore ?? '—'} → {b.statusAfter ?? '—'}</span> : null}
                    {b.moved ? <span className="ml-2 font-normal text-slate">moved</span> : null}
                    {b.noteChanged ? <span className="ml-2 font-normal text-slate">note edited</span> : null}
                  </h3>
                  {b.inputs.length ? (
                    <table className="mt-2 w-full">
                      <thead><tr className="text-left text-[12px] text-slate"><th className="font-medium">Input</th><th className="font-medium">Before</th><th className="font-medium">After</th></tr></thead>
                      <tbody>{b.inputs.map((i) => <tr key={i.input}><td className="text-slate">{i.input}</td><td className="num">{i.before ?? '—'}</td><td className="num">{i.after ?? '—'}</td></tr>)}</tbody>
                    </table>
                  ) : null}
                  {b.outputs.some((o) => o.changed) ? (
                    <table className="mt-2 w-full">
                      <thead><tr className="text-left text-[12px] text-slate"><th className="font-medium">Output</th><th className="font-medium">Before</th><th className="font-medium">After</th><th className="font-medium">Change</th></tr></thead>
                      <tbody>{b.outputs.filter((o) => o.changed).map((o) => <tr key={o.output}><td className="text-slate">{o.output}</td><td className="num">{show(o.before)}</td><td className="num">{show(o.after)}</td><td className="num">{percent(o.relativeChange)}</td></tr>)}</tbody>
                    </table>
                  ) : null}
                </article>
              ))}
            </section>
          ) : null}
          {c.unchanged ? <p className="text-[12px] text-slate">{c.unchanged} {c.unchanged === 1 ? 'block' : 'blocks'} unchanged.</p> : null}
        </div>
      );
    }
  }
  return (
    <div className="flex max-w-[900px] flex-col gap-4">
      <nav aria-label="Breadcrumb" className="text-[13px] text-slate">
        <Link href="/sheets" className="hover:text-basalt">Sheets</Link> /{' '}
        <Link href={`/sheets/${sheetId}`} className="hover:text-basalt">{sheet.title}</Link> /{' '}
        <Link href={`/sheets/${sheetId}/revisions`} className="hover:text-basalt">Revisions</Link> / Compare
      </nav>
      <h1 className="text-[20px] font-semibold tracking-tight">Compare revisions</h1>
      {problem ? <p className="text-[13px] text-slate">{problem}</p> : body}
    </div>
  );
}
