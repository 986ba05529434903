'use client';

import * as Plot from '@observablehq/plot';
import { useEffect, useRef } from 'react';
import { datasetPlot, type DatasetPlotInput } from '@/lib/plot/dataset-plot';

/** The small profile figure of a dataset (rendered in an effect, removed on cleanup). */
export default function DatasetPlot({ dataset, name }: { dataset: DatasetPlotInput; name: string }) {
  const holder = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const element = holder.current;
    if (!element) return;
    const width = Math.max(260, Math.min(element.clientWidth || 480, 720));
    const spec = datasetPlot(dataset, width);
    const figure = Plot.plot(spec.options);
    figure.setAttribute('role', 'img');
    figure.setAttribute('aria-label', `${name}: ${spec.description}`);
    element.replaceChildren(figure);
    return () => figure.remove();
  }, [dataset, name]);
  return <div ref={holder} className="w-full text-basalt" data-testid="dataset-plot" />;
}
