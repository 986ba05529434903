'use client';

import { useCallback, useMemo, useState, type RefObject } from 'react';
import type { CompletionData } from '@/components/blocks/expression-language';
import { sameJson } from '@/lib/sheet/merge';
import type { BlockCatalogData, BlockResult, CatalogType, SheetDocument, SheetResults } from '@/lib/sheet/types';
import type { BlockState } from './block-status';

/**
 * Each block's result by id. A block's result keeps its identity while its content is unchanged, so an
 * evaluation re-renders only the cards whose results changed (the server sends every result afresh).
 */
export function useBlockResults({ results, stale, evaluating }: { results: SheetResults | null; stale: Set<string>; evaluating: boolean }) {
  const [resultsById, setResultsById] = useState(() => new Map<string, BlockResult>());
  const [resultsSeen, setResultsSeen] = useState(results);
  if (resultsSeen !== results) {
    setResultsSeen(results);
    const next = new Map<string, BlockResult>();
    for (const r of Object.values(results?.blocks ?? {})) {
      const previous = resultsById.get(r.id);
      next.set(r.id, previous && sameJson(previous, r) ? previous : r);
    }
    setResultsById(next);
  }

  /** The state a block card shows (null for notes, which are never evaluated). */
  const stateOf = (blockId: string, type: string): BlockState | null => {
    if (type === 'note') return null;
    const r = resultsById.get(blockId);
    if (stale.has(blockId) || !r) return evaluating ? 'running' : 'stale';
    if (r.status === 'ok') return r.warnings.length ? 'warning' : 'ok';
    return r.status;
  };

  return { resultsById, stateOf };
}

/**
 * One completion source per block id for the expression fields (other blocks' names and outputs, units,
 * functions). It reads the current document when asked, so edits never replace it.
 */
export function useCompletions({
  doc,
  docRef,
  catalog,
  types,
}: {
  doc: SheetDocument;
  docRef: RefObject<SheetDocument>;
  catalog: BlockCatalogData;
  types: Map<string, CatalogType>;
}): Map<string, () => CompletionData> {
  const completionFor = useCallback(
    (blockId: string) => (): CompletionData => ({
      blocks: docRef.current.blocks
        .filter((b) => b.id !== blockId && b.type !== 'note')
        .map((b) => {
          const type = types.get(b.type);
          const outputs = type?.freeInputs
            ? Object.keys(b.inputs).map((k) => ({ name: k, detail: 'parameter' }))
            : (type?.outputs ?? []).map((o) => ({ name: o.name, detail: o.unit ? `${o.label} (${o.unit})` : o.label }));
          return { name: b.name, title: type?.title ?? b.type, outputs };
        }),
      units: catalog.units,
      functions: catalog.functions,
    }),
    [catalog, docRef, types],
  );
  const blockIds = doc.blocks.map((b) => b.id).join(' ');
  return useMemo(() => new Map(blockIds.split(' ').map((id) => [id, completionFor(id)])), [blockIds, completionFor]);
}
