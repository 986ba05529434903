'use client';

import { useMemo, type ReactNode } from 'react';
import { parseDistributionText } from '@/lib/plot/distribution-density';
import { UncertainInputHint } from './distribution-sketch';

/**
 * An input's field with the density sketch of the distribution its text declares (if any). Loaded apart
 * from the sheet page's first download (with its quantile code), like the expression field itself.
 */
export default function InputHintFromText({ text, label, children }: { text: string; label: string; children: ReactNode }) {
  const distribution = useMemo(() => parseDistributionText(text), [text]);
  return (
    <UncertainInputHint distribution={distribution?.kind ?? null} parameters={distribution?.parameters ?? null} label={label}>
      {children}
    </UncertainInputHint>
  );
}
