'use client';

import dynamic from 'next/dynamic';
import { intervalText, methodLabel, significant } from '@/lib/plot/uncertainty-plot';
import { isTextSpread, type BlockResult } from '@/lib/sheet/types';

const SpreadFigures = dynamic(() => import('./spread-figures'), {
  ssr: false,
  loading: () => <p className="text-[12px] text-slate">Drawing the distribution…</p>,
});

/**
 * The spreads of a block's outputs (CONTRACT §8.5): the nominal value first, then the 95 %
 * interval and the method label (never an interval without its label), the histogram of the
 * samples and which inputs matter most.
 */
export function OutputSpreads({ blockName, result, labelOf }: { blockName: string; result: BlockResult | undefined; labelOf: (output: string) => string }) {
  if (!result || result.status !== 'ok') return null;
  const uncertain = Object.entries(result.outputs).filter(([, output]) => output.spread);
  if (uncertain.length === 0) return null;
  return (
    <div className="mt-2 flex flex-col gap-2" data-testid="spreads">
      {uncertain.map(([name, output]) => {
        const spread = output.spread!;
        const unit = output.unit;
        const nominal = typeof output.value === 'number' ? `${significant(output.value, 6)}${unit ? ` ${unit}` : ''}` : String(output.value);
        const counts = isTextSpread(spread) ? spread.counts : null;
        const numeric = isTextSpread(spread) ? null : spread;
        const interval = numeric ? intervalText(numeric, unit) : null;
        return (
          <section key={name} className="rounded-[3px] border border-rule p-2 text-[13px]" data-spread={name} aria-label={`Uncertainty of ${blockName}.${name}`}>
            <p>
              <span className="num">{name}</span>
              {labelOf(name) !== name ? <span className="text-slate"> · {labelOf(name)}</span> : null}
              {': '}
              <span className="num font-semibold" data-testid="spread-nominal">{nominal}</span>
              <span className="text-slate"> nominal (inputs at their medians)</span>
            </p>
            {counts ? (
              <p data-testid="spread-counts">
                {Object.entries(counts).map(([label, count]) => `${label}: ${count}`).join(' · ')}
              </p>
            ) : interval ? (
              <p>
                <span className="num" data-testid="spread-interval">{interval}</span>
                {numeric && numeric.mean !== undefined && numeric.sd !== undefined ? (
                  <span className="text-slate num"> · mean {significant(numeric.mean)} · sd {significant(numeric.sd)}</span>
                ) : null}
              </p>
            ) : null}
            <p className="text-[12px] text-slate" data-testid="spread-method">
              <span aria-hidden="true">≈ </span>
              {methodLabel(spread)}
              {spread.method === 'linear' ? ' — blind to skew and curvature; compare with Monte Carlo before relying on the interval.' : ''}
            </p>
            {!numeric ? null : (
              <SpreadFigures label={`${blockName}.${name}`} spread={numeric} nominal={typeof output.value === 'number' ? output.value : 0} histogram={result.series?.[`hist_${name}`]} />
            )}
          </section>
        );
      })}
    </div>
  );
}
