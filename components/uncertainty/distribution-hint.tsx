'use client';

import { useEffect, useMemo } from 'react';
import { densitySketch, parseDistributionText } from '@/lib/plot/distribution-density';
import { DistributionSketch } from './distribution-sketch';

/**
 * The part of an input's hint that needs the distribution code (loaded by ./input-hint-from-text.tsx only
 * for a field that declares a distribution): it tells the wrapper the distribution in words, and draws the
 * sketch while the wrapper is hovered or focused.
 */
export default function DistributionHint({
  text,
  label,
  shown,
  onDescription,
}: {
  text: string;
  label: string;
  shown: boolean;
  onDescription: (description: string | null) => void;
}) {
  const parsed = useMemo(() => parseDistributionText(text), [text]);
  const sketch = useMemo(() => (parsed ? densitySketch(parsed.kind, parsed.parameters) : null), [parsed]);
  const description = sketch?.description ?? null;
  useEffect(() => {
    onDescription(description);
  }, [description, onDescription]);
  useEffect(() => () => onDescription(null), [onDescription]);
  if (!parsed || !sketch || !shown) return null;
  return (
    <div className="absolute left-0 top-full z-20 mt-1 rounded-[3px] border border-rule bg-paper p-2 shadow-sm" data-testid="distribution-hint">
      <DistributionSketch distribution={parsed.kind} parameters={parsed.parameters} label={label} />
    </div>
  );
}
