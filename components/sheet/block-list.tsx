'use client';

import { BlockCard } from '@/components/blocks/block-card';
import type { BlockCardActions } from '@/components/blocks/block-actions';
import type { CompletionData } from '@/components/blocks/expression-language';
import type { BlockResult, CatalogType, SheetBlock } from '@/lib/sheet/types';
import type { BlockState } from './block-status';

/**
 * The sheet's blocks in order, with the standing caution below. Every card gets the same actions object and
 * its own completion source, so a card re-renders only when its own props change.
 */
export function BlockList({
  sheetId,
  blocks,
  types,
  resultsById,
  stateOf,
  stale,
  selectedId,
  renamingId,
  captionId,
  canEdit,
  units,
  functions,
  standingCaution,
  completions,
  actions,
  freshIds,
  significantFigures,
  siFolded,
}: {
  freshIds: ReadonlySet<string>;
  significantFigures: number;
  siFolded: boolean;
  sheetId: string;
  blocks: SheetBlock[];
  types: Map<string, CatalogType>;
  resultsById: Map<string, BlockResult>;
  stateOf: (blockId: string, type: string) => BlockState | null;
  stale: Set<string>;
  selectedId: string | null;
  renamingId: string | null;
  captionId: string | null;
  canEdit: boolean;
  units: readonly string[];
  functions: readonly string[];
  standingCaution: string;
  completions: Map<string, () => CompletionData>;
  actions: BlockCardActions;
}) {
  return (
    <div className="flex min-w-0 flex-col gap-3" aria-label="Blocks" role="region">
      {blocks.length === 0 ? (
        <div className="rounded-[4px] border border-dashed border-rule p-6 text-center text-slate">
          <p>This sheet has no blocks yet.</p>
          {canEdit ? <p className="mt-1">Press Alt+A or Ctrl+K and type what you want to compute (for example “Péclet”).</p> : null}
        </div>
      ) : null}
      {blocks.map((block, index) => (
        <BlockCard
          key={block.id}
          block={block}
          type={types.get(block.type)}
          result={resultsById.get(block.id)}
          state={stateOf(block.id, block.type)}
          stale={stale.has(block.id)}
          selected={block.id === selectedId}
          renaming={block.id === renamingId}
          editingCaption={block.id === captionId}
          canEdit={canEdit}
          commentsSheetId={sheetId}
          index={index}
          count={blocks.length}
          units={units}
          functions={functions}
          completion={completions.get(block.id)!}
          actions={actions}
          fresh={freshIds.has(block.id)}
          significantFigures={significantFigures}
          siFolded={siFolded}
        />
      ))}
      <p className="text-[12px] text-slate">
        <span aria-hidden="true">△ </span>
        {standingCaution}
      </p>
    </div>
  );
}
