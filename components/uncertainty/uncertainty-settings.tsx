'use client';

import { useState } from 'react';
import type { SheetDocument, UncertaintySettingsData } from '@/lib/sheet/types';

export const DEFAULT_SETTINGS = { method: 'monte_carlo', samples: 10000, seed: 1 } as const;
const DISTRIBUTION_CALL = /\b(?:normal|lognormal|uniform|triangular)\s*\(/;

/** Whether a document declares a distribution anywhere (so the settings matter). */
export function hasDistributions(doc: SheetDocument): boolean {
  return doc.blocks.some((block) => Object.values(block.inputs).some((text) => DISTRIBUTION_CALL.test(text)));
}

/** The document with new uncertainty settings (part of the document, so of its hash). */
export function withUncertainty(doc: SheetDocument, settings: UncertaintySettingsData): SheetDocument {
  return { ...doc, uncertainty: { ...DEFAULT_SETTINGS, ...doc.uncertainty, ...settings } };
}

/** A fresh seed for a re-seed (a document change: a new revision once saved). */
export function freshSeed(): number {
  const word = new Uint32Array(1);
  crypto.getRandomValues(word);
  return word[0]!;
}

/** The sheet's uncertainty setting: method, samples and seed (CONTRACT §8.2). */
export function UncertaintySettings({ doc, canEdit, onChange }: { doc: SheetDocument; canEdit: boolean; onChange: (settings: UncertaintySettingsData) => void }) {
  const current = { ...DEFAULT_SETTINGS, ...doc.uncertainty };
  const [samples, setSamples] = useState(String(current.samples));
  const [seed, setSeed] = useState(String(current.seed));
  const [error, setError] = useState<string | null>(null);
  // When the document changes (undo, a palette re-seed), the fields follow it.
  const [shown, setShown] = useState({ samples: current.samples, seed: current.seed });
  if (shown.samples !== current.samples || shown.seed !== current.seed) {
    setShown({ samples: current.samples, seed: current.seed });
    setSamples(String(current.samples));
    setSeed(String(current.seed));
  }
  if (!hasDistributions(doc) && doc.uncertainty === undefined) return null;

  const commit = () => {
    const n = Number(samples);
    const s = Number(seed);
    if (!Number.isInteger(n) || n < 100 || n > 100000) return setError('Samples: a whole number from 100 to 100 000.');
    if (!Number.isInteger(s) || s < 0 || s > 4294967295) return setError('Seed: a whole number from 0 to 4294967295.');
    setError(null);
    if (n !== current.samples || s !== current.seed) onChange({ samples: n, seed: s });
  };
  const field = 'num h-7 w-24 rounded-[3px] border border-rule bg-chalk px-1 text-[13px] disabled:opacity-70';
  return (
    <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-1 text-[13px]" data-testid="uncertainty-settings">
      <legend className="sr-only">Uncertainty</legend>
      <span className="font-medium">Uncertainty</span>
      <label className="flex items-center gap-1">
        Method
        <select
          aria-label="Uncertainty method"
          className="h-7 rounded-[3px] border border-rule bg-chalk px-1 text-[13px]"
          value={current.method}
          disabled={!canEdit}
          onChange={(e) => onChange({ method: e.target.value as 'monte_carlo' | 'linear' })}
        >
          <option value="monte_carlo">Monte Carlo</option>
          <option value="linear">linear (first order)</option>
        </select>
      </label>
      <label className="flex items-center gap-1">
        Samples
        <input aria-label="Samples" className={field} inputMode="numeric" value={samples} disabled={!canEdit || current.method === 'linear'} onChange={(e) => setSamples(e.target.value)} onBlur={commit} onKeyDown={(e) => e.key === 'Enter' && commit()} />
      </label>
      <label className="flex items-center gap-1">
        Seed
        <input aria-label="Seed" className={field} inputMode="numeric" value={seed} disabled={!canEdit || current.method === 'linear'} onChange={(e) => setSeed(e.target.value)} onBlur={commit} onKeyDown={(e) => e.key === 'Enter' && commit()} />
      </label>
      {error ? (
        <span className="text-[12px] text-oxide" role="alert">
          <span aria-hidden="true">✕ </span>
          {error}
        </span>
      ) : null}
    </fieldset>
  );
}
