'use client';

import dynamic from 'next/dynamic';
import { useId, useState, type ReactNode } from 'react';
import { mayDeclareDistribution } from '@/lib/plot/declares-distribution';


// The parse, the density and its quantile code (@stdlib) load only for a field whose text declares a
// distribution, so a sheet without one never downloads them.
const DistributionHint = dynamic(() => import('./distribution-hint'), { ssr: false });

/**
 * Wraps an input field: while the pointer is over it or focus is inside it, the sketch of the distribution its
 * text declares (if any) shows beside it, and the distribution in words is announced through aria-describedby.
 * The wrapper is always the same element, so the field inside is never re-mounted while the user types.
 */
export default function InputHintFromText({ text, label, children }: { text: string; label: string; children: ReactNode }) {
  const [shown, setShown] = useState(false);
  const [description, setDescription] = useState<string | null>(null);
  const id = useId();
  const declares = mayDeclareDistribution(text);
  if (!declares && description !== null) setDescription(null);
  const described = declares && description !== null;
  return (
    <div
      role={described ? 'group' : undefined}
      aria-describedby={described ? id : undefined}
      className="relative"
      onMouseEnter={() => setShown(true)}
      onMouseLeave={() => setShown(false)}
      onFocus={() => setShown(true)}
      onBlur={(event) => {
        if (!event.currentTarget.contains(event.relatedTarget as Node | null)) setShown(false);
      }}
    >
      {children}
      {described ? (
        // The words are always in the page for assistive technology; the drawing appears on hover or focus.
        <span id={id} className="sr-only">
          {description}
        </span>
      ) : null}
      {declares ? <DistributionHint text={text} label={label} shown={shown} onDescription={setDescription} /> : null}
    </div>
  );
}
