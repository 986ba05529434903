'use client';

import { useId, useMemo, useState, type ReactNode } from 'react';
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

/**
 * Wraps an input field: while the pointer is over it or focus is inside it, the sketch of its declared
 * distribution shows beside it, and the distribution in words is announced through aria-describedby. The
 * wrapper is always the same element, so the field inside is never re-mounted while the user types.
 */
export function UncertainInputHint({
  distribution,
  parameters,
  label,
  children,
}: {
  distribution: string | null;
  parameters: Record<string, EchoParameter> | null;
  label: string;
  children: ReactNode;
}) {
  const [shown, setShown] = useState(false);
  const id = useId();
  const sketch = useMemo(() => (distribution && parameters ? densitySketch(distribution, parameters) : null), [distribution, parameters]);
  return (
    <div
      role={sketch ? 'group' : undefined}
      aria-describedby={sketch ? id : undefined}
      className="relative"
      onMouseEnter={() => setShown(true)}
      onMouseLeave={() => setShown(false)}
      onFocus={() => setShown(true)}
      onBlur={(event) => {
        if (!event.currentTarget.contains(event.relatedTarget as Node | null)) setShown(false);
      }}
    >
      {children}
      {sketch ? (
        // The words are always in the page for assistive technology; the drawing appears on hover or focus.
        <span id={id} className="sr-only">
          {sketch.description}
        </span>
      ) : null}
      {sketch && shown && distribution && parameters ? (
        <div className="absolute left-0 top-full z-20 mt-1 rounded-[3px] border border-rule bg-paper p-2 shadow-sm" data-testid="distribution-hint">
          <DistributionSketch distribution={distribution} parameters={parameters} label={label} />
        </div>
      ) : null}
    </div>
  );
}
