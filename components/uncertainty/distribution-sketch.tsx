'use client';

import { useMemo } from 'react';
import { densitySketch, sketchPath, type EchoParameter } from '@/lib/plot/distribution-density';

const WIDTH = 168;
const HEIGHT = 44;

/**
 * A small density sketch of a declared input distribution (CONTRACT §8.1), drawn as SVG from the
 * parameters the results echo, with the median and the central 95 % marked, and the same said in words
 * (the SVG's accessible name and a caption under it).
 */
export function DistributionSketch({ distribution, parameters, label }: { distribution: string; parameters: Record<string, EchoParameter>; label: string }) {
  const sketch = useMemo(() => densitySketch(distribution, parameters), [distribution, parameters]);
  if (!sketch) return null;
  const { line, area, at } = sketchPath(sketch, WIDTH, HEIGHT);
  return (
    <figure className="m-0" data-testid="distribution-sketch" data-distribution={sketch.kind}>
      <svg width={WIDTH} height={HEIGHT} viewBox={`0 0 ${WIDTH} ${HEIGHT}`} role="img" aria-label={`${label}: ${sketch.description}`}>
        <rect x={at(sketch.lo95)} y={0} width={Math.max(0, at(sketch.hi95) - at(sketch.lo95))} height={HEIGHT} fill="var(--river)" fillOpacity={0.08} />
        <path d={area} fill="var(--river)" fillOpacity={0.22} />
        <path d={line} fill="none" stroke="var(--river)" strokeWidth={1.25} />
        <line x1={at(sketch.median)} x2={at(sketch.median)} y1={2} y2={HEIGHT - 2} stroke="var(--basalt)" strokeWidth={1} strokeDasharray="2 2" />
      </svg>
      <figcaption className="max-w-[16rem] text-[11px] leading-snug text-slate">{sketch.description}</figcaption>
    </figure>
  );
}
