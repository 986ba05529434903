import type { Metadata } from 'next';
import { requirePageUser } from '@/lib/auth/page';
import { getVerificationRun } from '@/lib/report/verification';
import { formatMinute } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Method checks' };

const show = (value: number) => String(Number(value.toPrecision(10)));

// Every block type's worked example run through this engine (once per engine version), with its source.
export default async function VerificationPage() {
  await requirePageUser();
  const run = getVerificationRun();
  return (
    <div className="mx-auto flex max-w-[1100px] flex-col gap-4">
      <header className="flex flex-col gap-1">
        <h1 className="text-[20px] font-semibold tracking-tight">Method checks</h1>
        <p className="text-[14px] text-slate">
          Each block type&apos;s published worked example, calculated by engine <span className="num">{run.engine}</span> on{' '}
          {formatMinute(run.ranAt)} UTC. The run is repeated whenever the engine version changes; reports quote this run.
        </p>
        <p className="text-[14px]" data-verification-summary="">
          <span className={run.failed ? 'text-oxide' : 'text-moss'}>
            {run.passed} of {run.cases.length} pass{run.failed ? `, ${run.failed} fail` : ''}
          </span>
        </p>
      </header>
      <table className="w-full text-[13px]">
        <thead className="text-left text-[12px] text-slate">
          <tr>
            <th className="pr-3 font-normal">Block type</th>
            <th className="pr-3 font-normal">Source</th>
            <th className="pr-3 font-normal">Inputs</th>
            <th className="pr-3 font-normal">Expected</th>
            <th className="pr-3 font-normal">Computed</th>
            <th className="pr-3 font-normal">Tolerance</th>
            <th className="font-normal">Result</th>
          </tr>
        </thead>
        <tbody>
          {run.cases.map((c) => (
            <tr key={c.type} className="border-t border-rule align-top" data-type={c.type} data-pass={c.pass ? 'yes' : 'no'}>
              <td className="py-1 pr-3">
                {c.typeTitle}
                <div className="num text-[11px] text-slate">{c.type}</div>
              </td>
              <td className="py-1 pr-3">{c.source}</td>
              <td className="num py-1 pr-3 text-[12px]">
                {Object.entries(c.inputs).map(([name, expr]) => (
                  <div key={name}>
                    {name} = {expr}
                  </div>
                ))}
              </td>
              <td className="num py-1 pr-3">
                {c.output} = {show(c.expected.value)} {c.expected.unit}
              </td>
              <td className="num py-1 pr-3">{c.computed ? `${show(c.computed.value)} ${c.computed.unit}` : c.error ?? '—'}</td>
              <td className="num py-1 pr-3">
                relative {c.expected.relTol.toExponential(0)}
                {c.relativeError !== null ? <div className="text-[11px] text-slate">off by {c.relativeError.toExponential(1)}</div> : null}
              </td>
              <td className={`py-1 ${c.pass ? 'text-moss' : 'text-oxide'}`}>
                <span aria-hidden="true">{c.pass ? '✓ ' : '✕ '}</span>
                {c.pass ? 'passes' : 'fails'}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {run.withoutExample.length ? (
        <p className="text-[13px] text-slate">
          Without a worked example here: {run.withoutExample.map((t) => t.typeTitle).join(', ')}.
        </p>
      ) : null}
    </div>
  );
}
