'use client';

import dynamic from 'next/dynamic';
import { memo, useEffect, useRef, useState, type DragEvent } from 'react';
import type { BlockState } from '@/components/sheet/block-status';
import { figureNames } from '@/lib/plot/data-block-plots';
import { locateMessage } from '@/lib/sheet/format';
import type { BlockResult, CatalogInput, CatalogType, SheetBlock } from '@/lib/sheet/types';
import { OutputSpreads } from '@/components/uncertainty/output-spreads';
import type { BlockCardActions } from './block-actions';
import { BlockHeader } from './block-header';
import type { CompletionData } from './expression-language';
import { InputsTable } from './inputs-table';
import { NoteMarkdown } from './note-markdown';
import { CaptionEditor, NoteBody } from './note-body';
import { OutputsTable } from './outputs-table';
import { countRender } from './render-probe';

export type { BlockCardActions } from './block-actions';

// Plot loads only on pages that show plots.
const SeriesFigure = dynamic(() => import('@/components/plots/series-figure'), {
  ssr: false,
  loading: () => (
    <div className="mt-3 h-64 animate-pulse rounded-[3px] bg-wash" role="status">
      <span className="sr-only">Drawing the plot…</span>
    </div>
  ),
});

export interface BlockCardProps {
  block: SheetBlock;
  type: CatalogType | undefined;
  result: BlockResult | undefined;
  state: BlockState | null;
  stale: boolean;
  selected: boolean;
  renaming: boolean;
  /** The caption (markdown `note` of a calculation block) is being edited. */
  editingCaption: boolean;
  canEdit: boolean;
  /** The sheet whose open-comment count is shown on the card. */
  commentsSheetId?: string;
  index: number;
  count: number;
  units: readonly string[];
  functions: readonly string[];
  completion: () => CompletionData;
  actions: BlockCardActions;
  /** Added in this visit and not yet saved as a revision: empty required inputs show “needs input”. */
  fresh?: boolean;
  significantFigures?: number;
  siFolded?: boolean;
}

function BlockCardInner(props: BlockCardProps) {
  const { block, type, result, state, stale, selected, canEdit, actions } = props;
  countRender(block.id);
  const sectionRef = useRef<HTMLElement>(null);
  const [dragOver, setDragOver] = useState(false);
  const isNote = block.type === 'note';
  const headingId = `block-${block.id}-name`;

  useEffect(() => {
    if (selected && sectionRef.current && !sectionRef.current.contains(document.activeElement)) {
      sectionRef.current.scrollIntoView({ block: 'nearest', behavior: 'smooth' });
    }
  }, [selected]);

  const inputSpecs: CatalogInput[] = type?.freeInputs
    ? Object.keys(block.inputs).map((name) => ({ name, label: name, dimension: 'variable', help: 'A parameter of this table.' }))
    : (type?.inputs ?? []);
  const inputNames = inputSpecs.map((i) => i.name);
  const located = result?.error ? locateMessage(result.error, inputNames) : null;
  // Inputs of a new block the user has left at least once (their errors show from then on).
  const [left, setLeft] = useState<ReadonlySet<string>>(() => new Set());
  const pending = new Set(props.fresh ? inputNames.filter((n) => !left.has(n) && !(block.inputs[n] ?? '').trim()) : []);
  const requiredMissing = Boolean(located?.input && pending.has(located.input) && /this input is required/.test(located.text));
  const shownState: BlockState | null = requiredMissing && state === 'error' ? 'needs-input' : state;
  const warnings = (result?.warnings ?? []).map((w) => locateMessage(w, inputNames));

  const onDrop = (event: DragEvent) => {
    event.preventDefault();
    setDragOver(false);
    const dragged = event.dataTransfer.getData('application/x-denudata-block');
    if (dragged && dragged !== block.id) actions.dropOn(dragged, block.id);
  };

  return (
    <section
      ref={sectionRef}
      aria-labelledby={headingId}
      data-block-id={block.id}
      data-block-name={block.name}
      data-state={state ?? 'note'}
      data-selected={selected ? 'true' : undefined}
      tabIndex={-1}
      onFocusCapture={() => !selected && actions.select(block.id)}
      onMouseDown={() => !selected && actions.select(block.id)}
      onDragOver={(e) => {
        if (!canEdit || !e.dataTransfer.types.includes('application/x-denudata-block')) return;
        e.preventDefault();
        setDragOver(true);
      }}
      onDragLeave={() => setDragOver(false)}
      onDrop={onDrop}
      className={`relative rounded-[4px] border bg-chalk px-3 py-2.5 outline-none transition-colors ${
        selected ? 'border-river shadow-[inset_3px_0_0_var(--ochre)]' : 'border-rule'
      } ${dragOver ? 'ring-2 ring-river/60' : ''} focus-visible:ring-2 focus-visible:ring-river`}
    >
      <BlockHeader
        block={block}
        type={type}
        state={shownState}
        headingId={headingId}
        renaming={props.renaming}
        editingCaption={props.editingCaption}
        canEdit={canEdit}
        commentsSheetId={props.commentsSheetId}
        index={props.index}
        count={props.count}
        actions={actions}
      />

      {isNote ? (
        <NoteBody block={block} canEdit={canEdit} onChange={(text) => actions.setNote(block.id, text)} />
      ) : (
        <>
          {props.editingCaption && canEdit ? (
            <CaptionEditor block={block} onChange={(text) => actions.setNote(block.id, text)} onDone={() => actions.setCaptionEditing(null)} />
          ) : block.note ? (
            <div className="prose-note mt-1 text-[13px] text-slate" data-testid="block-caption">
              <NoteMarkdown text={block.note} />
            </div>
          ) : null}
          <InputsTable
            block={block}
            inputs={inputSpecs}
            free={Boolean(type?.freeInputs)}
            canEdit={canEdit}
            errorInput={located?.input ?? null}
            errorText={located?.text ?? ''}
            warnings={warnings}
            units={props.units}
            functions={props.functions}
            completion={props.completion}
            actions={actions}
            pending={pending}
            onLeave={(name) => setLeft((s) => (s.has(name) ? s : new Set([...s, name])))}
          />

          {result?.error && !located?.input && !located?.output ? (
            <p className={`mt-2 text-[13px] ${result.status === 'blocked' ? 'text-slate' : 'text-oxide'}`} data-testid="block-error">
              <span aria-hidden="true">{result.status === 'blocked' ? '⊘ ' : '✕ '}</span>
              {located?.text}
            </p>
          ) : null}
          {warnings.filter((w) => !w.input).map((w) => (
            <p key={w.text} className="mt-1 text-[13px] text-clay">
              <span aria-hidden="true">△ </span>
              {w.text}
            </p>
          ))}

          <OutputsTable
            block={block}
            type={type}
            result={result}
            stale={stale}
            canEdit={canEdit}
            displayError={located?.output ? { output: located.output, text: located.text } : null}
            onDisplay={(output, unit) => actions.setDisplay(block.id, output, unit)}
            significantFigures={props.significantFigures}
            siFolded={props.siFolded}
          />
          <OutputSpreads blockName={block.name} result={result} labelOf={(name) => type?.outputs.find((o) => o.name === name)?.label ?? name} />
          {result?.series
            ? figureNames(block.type, result.series).filter((name) => !name.startsWith('hist_')).map((name) => (
                <div key={name} className={stale ? 'opacity-80' : undefined}>
                  <SeriesFigure blockName={block.name} blockType={block.type} seriesName={name} series={result.series!} outputs={result.outputs} />
                </div>
              ))
            : null}
          {type && result && Object.keys(result.outputs).length > 0 ? (
            <p className="mt-2 text-[12px] text-slate">
              <span aria-hidden="true">△ </span>
              Estimate{type.validity[0] ? `; assumes: ${type.validity[0].replace(/\.$/, '')}` : ''}. Defer to local codes and licensed professional practice.
            </p>
          ) : null}
        </>
      )}
    </section>
  );
}

export const BlockCard = memo(BlockCardInner);
