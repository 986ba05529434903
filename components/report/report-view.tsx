// The calculation report as a print-ready page, drawn from the same model as the PDF (lib/report).
// A server component: no client code, figures are inline SVG from the shared figure geometry.
import { NoteMarkdown } from '@/components/blocks/note-markdown';
import type { FigureModel } from '@/lib/report/figure';
import { reportTime } from '@/lib/report/time';
import type { ReportBlock, ReportModel } from '@/lib/report/types';

function Figure({ figure }: { figure: FigureModel }) {
  const { plot } = figure;
  return (
    <figure className="report-figure mt-3" data-figure={figure.name}>
      <figcaption className="text-[12px] font-semibold">Figure: {figure.title}</figcaption>
      <svg
        viewBox={`0 0 ${figure.width} ${figure.height}`}
        width={figure.width}
        height={figure.height}
        role="img"
        aria-label={`${figure.title}: ${figure.yAxisLabel} against ${figure.xAxisLabel}`}
        className="max-w-full text-basalt"
      >
        <rect x={plot.left} y={plot.top} width={plot.right - plot.left} height={plot.bottom - plot.top} fill="none" stroke="currentColor" strokeOpacity={0.3} />
        {figure.xTicks.map((t) => (
          <g key={`x${t.at}`}>
            <line x1={t.at} x2={t.at} y1={plot.bottom} y2={plot.bottom + 4} stroke="currentColor" />
            <text x={t.at} y={plot.bottom + 14} fontSize={9} textAnchor="middle" fill="currentColor">
              {t.label}
            </text>
          </g>
        ))}
        {figure.yTicks.map((t) => (
          <g key={`y${t.at}`}>
            <line x1={plot.left - 4} x2={plot.left} y1={t.at} y2={t.at} stroke="currentColor" />
            <text x={plot.left - 6} y={t.at + 3} fontSize={9} textAnchor="end" fill="currentColor">
              {t.label}
            </text>
          </g>
        ))}
        <polyline points={figure.points} fill="none" stroke="var(--river)" strokeWidth={1.5} />
        <text x={(plot.left + plot.right) / 2} y={figure.height - 6} fontSize={10} textAnchor="middle" fill="currentColor">
          {figure.xAxisLabel}
        </text>
        <text transform={`translate(12 ${(plot.top + plot.bottom) / 2}) rotate(-90)`} fontSize={10} textAnchor="middle" fill="currentColor">
          {figure.yAxisLabel}
          {figure.yDownward ? ' ↓' : ''}
        </text>
      </svg>
    </figure>
  );
}

function Block({ block, index }: { block: ReportBlock; index: number }) {
  return (
    <section className="report-block border-t border-rule pt-3" data-block={block.name} aria-label={`Block ${block.name}`}>
      <h3 className="text-[15px] font-semibold">
        {index}. <span className="num">{block.name}</span> <span className="font-normal text-slate">· {block.typeTitle}</span>
        {block.sources.length ? <span className="font-normal text-slate"> [{block.sources.join(', ')}]</span> : null}
      </h3>
      {block.note ? (
        <div className="prose-note mt-1 text-[14px]">
          <NoteMarkdown text={block.note} />
        </div>
      ) : null}
      {block.status === 'note' ? null : (
        <>
          {block.formula ? <p className="num mt-1 text-[13px]">{block.formula}</p> : null}
          {block.inputs.length ? (
            <table className="mt-2 w-full text-[13px]">
              <thead className="text-left text-[12px] text-slate">
                <tr>
                  <th className="pr-3 font-normal">Input</th>
                  <th className="pr-3 font-normal">As written</th>
                  <th className="font-normal">As evaluated</th>
                </tr>
              </thead>
              <tbody>
                {block.inputs.map((input) => (
                  <tr key={input.name} className="border-t border-rule/60">
                    <td className="pr-3">{input.label}</td>
                    <td className="num pr-3">{input.written}</td>
                    <td className="num">{input.evaluated}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : null}
          {block.outputs.length ? (
            <table className="mt-2 w-full text-[13px]">
              <thead className="text-left text-[12px] text-slate">
                <tr>
                  <th className="pr-3 font-normal">Output</th>
                  <th className="pr-3 font-normal">Value</th>
                  <th className="font-normal">SI</th>
                </tr>
              </thead>
              <tbody>
                {block.outputs.map((output) => (
                  <tr key={output.name} className="border-t border-rule/60" data-output={output.name}>
                    <td className="pr-3">{output.label}</td>
                    <td className="num pr-3">
                      {output.value}
                      {output.unit ? ` ${output.unit}` : ''}
                      {[output.spread, output.alternative].map((spread, k) =>
                        spread ? (
                          <span key={k} className="block text-[11px] text-slate" data-spread={spread.method}>
                            {k === 1 ? 'for comparison: ' : ''}
                            {spread.text} ({spread.label})
                            {spread.drivers ? `; ${spread.method === 'linear' ? 'shares of the variance' : 'rank correlations'}: ${spread.drivers}` : ''}
                          </span>
                        ) : null,
                      )}
                    </td>
                    <td className="num text-slate">
                      {output.si}
                      {output.siUnit ? ` ${output.siUnit}` : ''}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : null}
          <p className={`mt-1 text-[13px] ${block.status === 'ok' ? '' : 'text-oxide'}`}>
            Status: {block.status}
            {block.error ? `: ${block.error}` : ''}
          </p>
          {block.warnings.length ? (
            <ul className="text-[12px] text-clay">
              {block.warnings.map((w) => (
                <li key={w}>
                  <span aria-hidden="true">⚠ </span>Warning: {w}
                </li>
              ))}
            </ul>
          ) : null}
          {block.figures.map((figure) => (
            <Figure key={figure.name} figure={figure} />
          ))}
          <div className="mt-2 text-[12px] text-slate">
            {block.validity.length ? <p>Validity: {block.validity.join(' ')}</p> : null}
            {block.cautions.map((c) => (
              <p key={c} className="text-clay">
                Caution: {c}
              </p>
            ))}
            {block.verification ? <p>Method check: {block.verification}</p> : null}
          </div>
        </>
      )}
    </section>
  );
}

export function ReportView({ model }: { model: ReportModel }) {
  const site = model.site;
  return (
    <article className="report mx-auto flex max-w-[860px] flex-col gap-4 bg-paper" data-report-status={model.status}>
      {model.banner ? (
        <p className="report-banner rounded-[4px] border-2 border-oxide px-3 py-1 text-center text-[14px] font-semibold text-oxide" role="note">
          {model.banner}
        </p>
      ) : null}
      <header className="flex flex-col gap-1">
        <h1 className="text-[22px] font-semibold tracking-tight">{model.title}</h1>
        <p className="text-[13px] text-slate">Calculation report of revision {model.revision.number}</p>
        <dl className="mt-2 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-0.5 text-[13px]">
          <dt className="text-slate">Site</dt>
          <dd>
            {site ? site.name : '—'}
            {site?.latitude !== undefined && site?.longitude !== undefined ? ` · ${site.latitude}, ${site.longitude}` : ''}
          </dd>
          {site?.notes ? (
            <>
              <dt className="text-slate">Site notes</dt>
              <dd>{site.notes}</dd>
            </>
          ) : null}
          <dt className="text-slate">Team</dt>
          <dd>{model.team || '—'}</dd>
          <dt className="text-slate">Revision</dt>
          <dd>
            r{model.revision.number}, saved {reportTime(model.revision.createdAt)}
            {model.revision.message ? `: “${model.revision.message}”` : ''}
          </dd>
          <dt className="text-slate">SHA-256</dt>
          <dd className="num break-all" data-hash={model.revision.hash}>
            {model.revision.hash}
          </dd>
          <dt className="text-slate">Engine</dt>
          <dd className="num">{model.engine.changed ? `${model.engine.recorded} (recorded), ${model.engine.current} (current)` : model.engine.recorded}</dd>
          <dt className="text-slate">Report made</dt>
          <dd>{reportTime(model.generatedAt)}</dd>
          <dt className="text-slate">Review status</dt>
          <dd>{model.statusWords}</dd>
          {model.uncertainty ? (
            <>
              <dt className="text-slate">Uncertainty</dt>
              <dd data-uncertainty>
                {model.uncertainty.method}
                {model.uncertainty.inputs.map((line) => (
                  <span key={line} className="num block">
                    {line}
                  </span>
                ))}
                {model.uncertainty.note ? <span className="block text-[12px] text-slate">{model.uncertainty.note}</span> : null}
              </dd>
            </>
          ) : null}
        </dl>
      </header>

      <section aria-label="Sign-off" className="report-block">
        <h2 className="text-[16px] font-semibold">Sign-off</h2>
        <table className="mt-1 w-full text-[13px]">
          <thead className="text-left text-[12px] text-slate">
            <tr>
              <th className="pr-3 font-normal">Role</th>
              <th className="pr-3 font-normal">Name</th>
              <th className="pr-3 font-normal">Date</th>
              <th className="font-normal">Note</th>
            </tr>
          </thead>
          <tbody>
            {model.signOff.map((row) => (
              <tr key={row.role} className="border-t border-rule/60">
                <td className="pr-3">{row.role}</td>
                <td className="pr-3">{row.name ?? 'not yet'}</td>
                <td className="pr-3">{row.name ? reportTime(row.at) : '—'}</td>
                <td>{row.note || '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {model.trail.length ? (
          <ol className="mt-2 text-[12px] text-slate" aria-label="Review trail">
            {model.trail.map((entry, i) => (
              <li key={i}>
                {reportTime(entry.at)} · {entry.action} · {entry.by?.name ?? 'someone'}
                {entry.message ? `: ${entry.message}` : ''}
              </li>
            ))}
          </ol>
        ) : null}
      </section>

      {model.recomputeNotice ? (
        <section className="report-block rounded-[4px] border border-clay px-3 py-2 text-[13px]" aria-label="Recalculation">
          <p>{model.recomputeNotice}</p>
          {model.differences.length ? (
            <ul className="num mt-1 text-[12px]">
              {model.differences.slice(0, 40).map((d) => (
                <li key={`${d.block}.${d.output}`}>
                  {d.block}
                  {d.output ? `.${d.output}` : ''}: recorded {d.recorded}, now {d.computed}
                </li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}

      <p className="report-block rounded-[4px] border border-rule bg-wash px-3 py-2 text-[13px]" role="note">
        <strong>Caution. </strong>
        {model.generalCaution}
      </p>

      <h2 className="text-[16px] font-semibold">Calculation</h2>
      {model.blocks.map((block, i) => (
        <Block key={block.id} block={block} index={i + 1} />
      ))}

      <section aria-label="Sources" className="border-t border-rule pt-3">
        <h2 className="text-[16px] font-semibold">Sources</h2>
        <ol className="mt-1 text-[13px]">
          {model.sources.map((s) => (
            <li key={s.number} id={`source-${s.number}`}>
              [{s.number}] {s.text} <span className="text-slate">(used by: {s.usedBy.join('; ')})</span>
            </li>
          ))}
        </ol>
        <h3 className="mt-3 text-[14px] font-semibold">Method checks (engine {model.verification.engine})</h3>
        <ul className="text-[12px]">
          {model.verification.lines.map((line) => (
            <li key={line.typeTitle} className={line.pass ? 'text-slate' : 'text-oxide'}>
              {line.pass ? '✓ ' : '✕ '}
              {line.typeTitle}: {line.line}
            </li>
          ))}
        </ul>
      </section>
    </article>
  );
}
