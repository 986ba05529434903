// A read-only rendering of a stored revision: each block with its inputs and its stored outputs.
type Output = { value: number | string; unit: string; si: number | string; siUnit: string };
type BlockResult = { status: string; error?: string; warnings?: string[]; outputs?: Record<string, Output> };
type Block = { id: string; name: string; type: string; inputs: Record<string, string>; note?: string };

const STATUS_MARK: Record<string, { mark: string; word: string; tone: string }> = {
  ok: { mark: '✓', word: 'ok', tone: 'text-moss' },
  error: { mark: '✕', word: 'error', tone: 'text-oxide' },
  blocked: { mark: '⊘', word: 'blocked', tone: 'text-clay' },
};

function formatNumber(value: number | string): string {
  if (typeof value !== 'number') return value;
  const abs = Math.abs(value);
  return abs !== 0 && (abs < 1e-3 || abs >= 1e6) ? value.toExponential(4) : String(Number(value.toPrecision(6)));
}

export function RevisionBlocks({
  blocks,
  results,
  openCounts = {},
}: {
  blocks: Block[];
  results: { blocks?: Record<string, BlockResult> };
  openCounts?: Record<string, number>;
}) {
  return (
    <ol className="flex flex-col gap-3">
      {blocks.map((block) => {
        const result = results.blocks?.[block.name];
        const status = result ? STATUS_MARK[result.status] ?? STATUS_MARK.error : null;
        return (
          <li key={block.id} id={`block-${block.id}`} className="rounded-[4px] border border-rule bg-chalk p-3" data-block-id={block.id}>
            <div className="flex flex-wrap items-center gap-2 text-[13px]">
              <span className="num font-semibold">{block.name}</span>
              <span className="text-slate">{block.type.replace(/_/g, ' ')}</span>
              {status ? (
                <span className={`${status.tone} text-[12px]`}>
                  <span aria-hidden="true">{status.mark} </span>
                  {status.word}
                </span>
              ) : null}
              {openCounts[block.id] ? (
                <span className="ml-auto text-[12px] text-ochre">
                  <span aria-hidden="true">◆ </span>
                  {openCounts[block.id]} open {openCounts[block.id] === 1 ? 'comment' : 'comments'}
                </span>
              ) : null}
            </div>
            {block.type === 'note' ? (
              <p className="mt-2 whitespace-pre-wrap text-[14px]">{block.note}</p>
            ) : (
              <>
                <dl className="mt-2 grid grid-cols-[max-content_1fr] gap-x-3 gap-y-0.5 text-[13px]">
                  {Object.entries(block.inputs).map(([name, expr]) => (
                    <div key={name} className="contents">
                      <dt className="text-slate">{name}</dt>
                      <dd className="num">{expr}</dd>
                    </div>
                  ))}
                </dl>
                {result?.error ? <p className="mt-2 text-[13px] text-oxide">{result.error}</p> : null}
                {result?.warnings?.length ? (
                  <ul className="mt-2 text-[12px] text-clay">
                    {result.warnings.map((w) => (
                      <li key={w}>
                        <span aria-hidden="true">⚠ </span>
                        {w}
                      </li>
                    ))}
                  </ul>
                ) : null}
                {result?.outputs && Object.keys(result.outputs).length ? (
                  <table className="mt-2 text-[13px]">
                    <thead className="sr-only">
                      <tr>
                        <th>Output</th>
                        <th>Value</th>
                        <th>SI</th>
                      </tr>
                    </thead>
                    <tbody>
                      {Object.entries(result.outputs).map(([name, out]) => (
                        <tr key={name}>
                          <th scope="row" className="pr-3 text-left font-normal text-slate">
                            {name}
                          </th>
                          <td className="num pr-3">
                            {formatNumber(out.value)} <span className="text-slate">{out.unit}</span>
                          </td>
                          <td className="num text-[12px] text-slate">
                            {formatNumber(out.si)} {out.siUnit}
                          </td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                ) : null}
              </>
            )}
            {block.type !== 'note' && block.note ? <p className="mt-2 text-[12px] text-slate">{block.note}</p> : null}
          </li>
        );
      })}
    </ol>
  );
}

export function ResultCautions() {
  return (
    <p className="rounded-[4px] border border-rule bg-wash px-3 py-2 text-[12px] text-slate" role="note">
      <span aria-hidden="true">⚠ </span>
      Results are estimates from published relations under their stated assumptions and validity limits. Check them against site data, and
      defer to local codes and licensed professional practice before using them in hazard or design decisions.
    </p>
  );
}
