'use client';

import * as Plot from '@observablehq/plot';
import { useEffect, useRef, useState } from 'react';
import { histogramPlot, sensitivityPlot } from '@/lib/plot/uncertainty-plot';
import type { NumericSpreadData, SeriesData } from '@/lib/sheet/types';

/** The histogram and the sensitivity bars of one uncertain output (Observable Plot, drawn in an effect). */
export default function SpreadFigures({
  label,
  spread,
  nominal,
  histogram,
}: {
  label: string;
  spread: NumericSpreadData;
  nominal: number;
  histogram: SeriesData | undefined;
}) {
  const holder = useRef<HTMLDivElement>(null);
  const bars = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(520);

  useEffect(() => {
    const element = holder.current?.parentElement;
    if (!element) return;
    const observer = new ResizeObserver((entries) => {
      const next = Math.round(entries[0]?.contentRect.width ?? 520);
      if (next > 0) setWidth((w) => (Math.abs(w - next) > 8 ? next : w));
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, []);

  useEffect(() => {
    const figures: Element[] = [];
    const draw = (target: HTMLDivElement | null, spec: ReturnType<typeof histogramPlot>) => {
      if (!target) return;
      const figure = Plot.plot(spec.options);
      figure.querySelectorAll('[aria-label], [aria-description]').forEach((node) => {
        node.removeAttribute('aria-label');
        node.removeAttribute('aria-description');
      });
      figure.setAttribute('role', 'img');
      figure.setAttribute('aria-label', `${spec.title} of ${label}: ${spec.description}`);
      target.append(figure);
      figures.push(figure);
    };
    const size = { width: Math.max(260, Math.min(width, 720)) };
    if (histogram) draw(holder.current, histogramPlot(histogram, spread, nominal, size));
    if (Object.keys(spread.sensitivity ?? spread.contributions ?? {}).length > 0) draw(bars.current, sensitivityPlot(spread, size));
    return () => figures.forEach((figure) => figure.remove());
  }, [label, spread, nominal, histogram, width]);

  return (
    <div className="mt-1 flex flex-col gap-1">
      <div ref={holder} className="plot-figure" data-testid="spread-histogram" />
      <div ref={bars} className="plot-figure" data-testid="spread-sensitivity" />
    </div>
  );
}
