import type { CatalogType, SheetBlock } from '@/lib/sheet/types';

/** Help for the selected block's type: formula, inputs, validity limits, cautions and sources. */
export function HelpPanel({ block, type, standingCaution }: { block: SheetBlock | null; type: CatalogType | null; standingCaution: string }) {
  if (!block || !type) {
    return <p className="text-[13px] text-slate">Select a block to see its formula, inputs, validity limits and sources.</p>;
  }
  return (
    <div className="flex flex-col gap-3 text-[13px]" data-testid="help-panel">
      <div>
        <h2 className="text-[15px] font-semibold">{type.title}</h2>
        <p className="text-slate">
          Block <span className="num text-basalt">{block.name}</span>
        </p>
        <p className="mt-1">{type.purpose}</p>
      </div>
      {type.formula ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Formula</h3>
          <p className="num mt-1 rounded-[3px] bg-wash px-2 py-1.5 text-[12px]">{type.formula}</p>
        </section>
      ) : null}
      {type.inputs.length ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Inputs</h3>
          <dl className="mt-1 flex flex-col gap-2">
            {type.inputs.map((input) => (
              <div key={input.name}>
                <dt className="font-medium">
                  {input.label} <span className="num text-slate">({input.name})</span>
                </dt>
                <dd className="text-slate">
                  <span className="num">
                    {input.dimensionSymbol ?? input.dimension}
                    {input.unitHint ? `, e.g. ${input.unitHint}` : ''}
                    {input.default !== undefined ? `; default ${input.default}` : ''}
                    {input.range ? `; valid ${input.range}` : ''}
                    {input.optional ? '; optional' : ''}
                  </span>
                  <br />
                  {input.help}
                  {input.typical ? (
                    <>
                      <br />
                      <span>Typical: {input.typical}</span>
                    </>
                  ) : null}
                </dd>
              </div>
            ))}
          </dl>
        </section>
      ) : null}
      {type.outputs.length ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Outputs</h3>
          <ul className="mt-1 flex flex-col gap-1">
            {type.outputs.map((o) => (
              <li key={o.name}>
                <span className="num">{block.name}.{o.name}</span> — {o.description}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {type.validity.length ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Validity limits</h3>
          <ul className="mt-1 list-disc pl-4">
            {type.validity.map((v) => (
              <li key={v}>{v}</li>
            ))}
          </ul>
        </section>
      ) : null}
      {type.warnings.length ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Warnings it can raise</h3>
          <ul className="mt-1 list-disc pl-4">
            {type.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </section>
      ) : null}
      {type.id !== 'note' ? (
        <section className="rounded-[3px] border border-clay/50 p-2">
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-clay">
            <span aria-hidden="true">△ </span>Cautions
          </h3>
          <ul className="mt-1 list-disc pl-4">
            {[...new Set([...type.cautions, standingCaution])].map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </section>
      ) : null}
      {type.sources.length ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Sources</h3>
          <ul className="mt-1 list-disc pl-4">
            {type.sources.map((s) => (
              <li key={s}>{s}</li>
            ))}
          </ul>
        </section>
      ) : null}
      {type.example ? (
        <section>
          <h3 className="text-[12px] font-semibold uppercase tracking-wide text-slate">Worked example</h3>
          <p className="num mt-1 text-[12px]">
            {Object.entries(type.example.inputs)
              .map(([k, v]) => `${k} = ${v}`)
              .join('; ')}
            {' → '}
            {type.example.output} = {type.example.expected.value} {type.example.expected.unit}
          </p>
          <p className="text-[12px] text-slate">{type.example.source}</p>
        </section>
      ) : null}
    </div>
  );
}
