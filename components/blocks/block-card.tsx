'use client';

import dynamic from 'next/dynamic';
import { memo, useEffect, useRef, useState, type DragEvent } from 'react';
import { OpenCommentCount } from '@/components/comments/comments-panel';
import { BlockStatusBadge, type BlockState } from '@/components/sheet/block-status';
import { figureNames } from '@/lib/plot/data-block-plots';
import { formatValue, locateMessage } from '@/lib/sheet/format';
import { DISPLAY_UNIT_CHOICES } from '@/lib/sheet/vocabulary';
import type { BlockResult, CatalogInput, CatalogType, SheetBlock } from '@/lib/sheet/types';
import type { CompletionData } from './expression-language';
import { NoteMarkdown } from './note-markdown';
import { ErrorText } from '@/components/ui/error-text';
import { DatasetPicker } from '@/components/datasets/dataset-picker';
import { OutputSpreads } from '@/components/uncertainty/output-spreads';
import { countRender } from './render-probe';

// CodeMirror and Plot load only on pages that show fields and plots.
const ExpressionField = dynamic(() => import('./expression-field'), {
  ssr: false,
  loading: () => <div className="h-[30px] rounded-[3px] border border-rule bg-wash" aria-hidden="true" />,
});
const SeriesFigure = dynamic(() => import('@/components/plots/series-figure'), {
  ssr: false,
  loading: () => (
    <div className="mt-3 h-64 animate-pulse rounded-[3px] bg-wash" role="status">
      <span className="sr-only">Drawing the plot…</span>
    </div>
  ),
});

export interface BlockCardActions {
  select: (id: string) => void;
  setInput: (id: string, input: string, value: string) => void;
  setDisplay: (id: string, output: string, unit: string) => void;
  setNote: (id: string, note: string) => void;
  rename: (id: string, name: string) => Promise<string | null>;
  move: (id: string, delta: number) => void;
  dropOn: (draggedId: string, targetId: string) => void;
  duplicate: (id: string) => void;
  remove: (id: string) => void;
  addParameter: (id: string) => void;
  renameParameter: (id: string, from: string, to: string) => string | null;
  removeParameter: (id: string, key: string) => void;
  setRenaming: (id: string | null) => void;
  /** Opens the side rail's comments on this block. */
  showComments: (id: string) => void;
  /** Starts (id) or ends (null) editing a calculation block's caption. */
  setCaptionEditing: (id: string | null) => void;
}

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
}

const iconButton =
  'grid size-7 place-items-center rounded-[3px] text-slate hover:bg-wash hover:text-basalt disabled:opacity-40 disabled:hover:bg-transparent';

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
  const warnings = (result?.warnings ?? []).map((w) => locateMessage(w, inputNames));

  const onDragStart = (event: DragEvent) => {
    event.dataTransfer.setData('application/x-denudata-block', block.id);
    event.dataTransfer.effectAllowed = 'move';
  };
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
      <div className="flex flex-wrap items-center gap-x-2 gap-y-1">
        {canEdit ? (
          <button
            type="button"
            draggable
            onDragStart={onDragStart}
            aria-label={`Move ${block.name}: drag, or Alt+Up / Alt+Down`}
            title="Drag to reorder (Alt+↑ / Alt+↓)"
            className={`${iconButton} cursor-grab`}
            onKeyDown={(e) => {
              if (e.key === 'ArrowUp' || e.key === 'ArrowDown') {
                e.preventDefault();
                actions.move(block.id, e.key === 'ArrowUp' ? -1 : 1);
              }
            }}
          >
            <span aria-hidden="true">⠿</span>
          </button>
        ) : null}
        {props.renaming ? (
          <RenameForm block={block} onCancel={() => actions.setRenaming(null)} onRename={(name) => actions.rename(block.id, name)} />
        ) : (
          <h2 id={headingId} className="num text-[14px] font-semibold">
            {canEdit ? (
              <button type="button" onClick={() => actions.setRenaming(block.id)} className="rounded-[2px] hover:underline" title="Rename (F2)">
                {block.name}
                <span className="sr-only"> (rename)</span>
              </button>
            ) : (
              block.name
            )}
          </h2>
        )}
        <span className="text-[12px] text-slate">{type?.title ?? block.type}</span>
        <span className="ml-auto flex items-center gap-1">
          {props.commentsSheetId ? (
            <OpenCommentCount sheetId={props.commentsSheetId} blockId={block.id} blockName={block.name} onOpen={() => actions.showComments(block.id)} />
          ) : null}
          {state ? <BlockStatusBadge state={state} /> : null}
          {canEdit ? (
            <>
              {!isNote ? (
                <button
                  type="button"
                  className={iconButton}
                  aria-label={block.note ? `Edit the caption of ${block.name}` : `Add a caption to ${block.name}`}
                  title={block.note ? 'Edit the caption' : 'Add a caption'}
                  aria-pressed={props.editingCaption}
                  onClick={() => actions.setCaptionEditing(props.editingCaption ? null : block.id)}
                >
                  <span aria-hidden="true">¶</span>
                </button>
              ) : null}
              <button type="button" className={iconButton} aria-label={`Move ${block.name} up`} disabled={props.index === 0} onClick={() => actions.move(block.id, -1)}>
                <span aria-hidden="true">↑</span>
              </button>
              <button
                type="button"
                className={iconButton}
                aria-label={`Move ${block.name} down`}
                disabled={props.index === props.count - 1}
                onClick={() => actions.move(block.id, 1)}
              >
                <span aria-hidden="true">↓</span>
              </button>
              <button type="button" className={iconButton} aria-label={`Duplicate ${block.name}`} title="Duplicate (Shift+D)" onClick={() => actions.duplicate(block.id)}>
                <svg aria-hidden="true" width="14" height="14" viewBox="0 0 16 16" fill="none" stroke="currentColor" strokeWidth="1.5">
                  <rect x="5" y="5" width="9" height="9" rx="1" />
                  <path d="M11 5V3a1 1 0 0 0-1-1H3a1 1 0 0 0-1 1v7a1 1 0 0 0 1 1h2" />
                </svg>
              </button>
              <button type="button" className={`${iconButton} hover:text-oxide`} aria-label={`Delete ${block.name}`} title="Delete (Delete; undo with Ctrl+Z)" onClick={() => actions.remove(block.id)}>
                <span aria-hidden="true">✕</span>
              </button>
            </>
          ) : null}
        </span>
      </div>

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
          <div className="mt-2 grid gap-2">
            {inputSpecs.map((input) => (
              <InputRow
                key={input.name}
                block={block}
                input={input}
                free={Boolean(type?.freeInputs)}
                canEdit={canEdit}
                error={located?.input === input.name ? located.text : null}
                warnings={warnings.filter((w) => w.input === input.name).map((w) => w.text)}
                units={props.units}
                functions={props.functions}
                completion={props.completion}
                actions={actions}
              />
            ))}
            {type?.freeInputs && canEdit ? (
              <div>
                <button type="button" onClick={() => actions.addParameter(block.id)} className="h-7 rounded-[3px] border border-dashed border-rule px-2 text-[12px] text-slate hover:text-basalt">
                  + Add parameter
                </button>
              </div>
            ) : null}
          </div>

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

function RenameForm({ block, onCancel, onRename }: { block: SheetBlock; onCancel: () => void; onRename: (name: string) => Promise<string | null> }) {
  const [value, setValue] = useState(block.name);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    ref.current?.focus();
    ref.current?.select();
  }, []);
  const submit = async () => {
    if (value === block.name) return onCancel();
    setBusy(true);
    const message = await onRename(value.trim());
    setBusy(false);
    if (message) setError(message);
  };
  const errorId = `rename-${block.id}-error`;
  return (
    <form
      className="flex flex-wrap items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      <label htmlFor={`rename-${block.id}`} className="sr-only">
        New name for {block.name}
      </label>
      <input
        ref={ref}
        id={`rename-${block.id}`}
        value={value}
        onChange={(e) => {
          setValue(e.target.value);
          setError(null);
        }}
        onKeyDown={(e) => {
          if (e.key === 'Escape') {
            e.preventDefault();
            e.stopPropagation();
            onCancel();
          }
        }}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        className="num h-7 w-56 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]"
      />
      <button type="submit" disabled={busy} className="h-7 rounded-[3px] bg-river px-2 text-[12px] text-river-ink">
        Rename
      </button>
      <button type="button" onClick={onCancel} className="h-7 rounded-[3px] border border-rule px-2 text-[12px]">
        Cancel
      </button>
      {error ? (
        <ErrorText id={errorId} size="sm" className="w-full">
          {error}
        </ErrorText>
      ) : null}
    </form>
  );
}

function InputRow({
  block,
  input,
  free,
  canEdit,
  error,
  warnings,
  units,
  functions,
  completion,
  actions,
}: {
  block: SheetBlock;
  input: CatalogInput;
  free: boolean;
  canEdit: boolean;
  error: string | null;
  warnings: string[];
  units: readonly string[];
  functions: readonly string[];
  completion: () => CompletionData;
  actions: BlockCardActions;
}) {
  const labelId = `in-${block.id}-${input.name}-label`;
  const fieldId = `in-${block.id}-${input.name}`;
  const hintId = `in-${block.id}-${input.name}-hint`;
  const errorId = `in-${block.id}-${input.name}-error`;
  const describedBy = [free ? null : hintId, error ? errorId : null, warnings.length ? `${errorId}-w` : null].filter(Boolean).join(' ') || undefined;
  const value = block.inputs[input.name] ?? '';
  const hint = [
    input.dimensionSymbol && input.dimensionSymbol !== 'varies' ? input.dimensionSymbol : null,
    input.unitHint ? `e.g. ${input.unitHint}` : null,
    input.default !== undefined ? `default ${input.default}` : null,
    input.range ? `valid ${input.range}` : null,
    input.optional ? 'optional' : null,
  ]
    .filter(Boolean)
    .join(' · ');
  return (
    <div className="grid gap-x-3 gap-y-0.5 sm:grid-cols-[minmax(9rem,13rem)_1fr]">
      <div className="flex flex-col pt-1">
        {free ? (
          <ParameterName block={block} name={input.name} canEdit={canEdit} labelId={labelId} actions={actions} />
        ) : (
          <span id={labelId} className="text-[13px] font-medium" title={input.help}>
            {input.label}
          </span>
        )}
        {!free ? (
          <span id={hintId} className="num text-[11px] text-slate">
            {hint}
          </span>
        ) : null}
      </div>
      <div className="min-w-0">
        {input.choices?.length && canEdit ? <WordChoice block={block} input={input} value={value} actions={actions} /> : null}
        <ExpressionField
          id={fieldId}
          labelId={labelId}
          describedBy={describedBy}
          value={value}
          placeholder={input.default ?? (input.unitHint ? `a value in ${input.unitHint}` : 'an expression')}
          readOnly={!canEdit}
          invalid={Boolean(error)}
          completion={completion}
          units={units}
          functions={functions}
          onChange={(next) => actions.setInput(block.id, input.name, next)}
        />
        {input.dimension === 'dataset' ? (
          <DatasetPicker kind={input.datasetKind} value={value} readOnly={!canEdit} labelId={labelId} onPick={(next) => actions.setInput(block.id, input.name, next)} />
        ) : null}
        {error ? (
          <p id={errorId} className="mt-0.5 text-[12px] text-oxide" data-testid="input-error">
            <span aria-hidden="true">✕ </span>
            {error}
          </p>
        ) : null}
        {warnings.length ? (
          <p id={`${errorId}-w`} className="mt-0.5 text-[12px] text-clay">
            <span aria-hidden="true">△ </span>
            {warnings.join(' ')}
          </p>
        ) : null}
      </div>
    </div>
  );
}

/** A text input's words as a choice list that writes the quoted word into the expression. */
function WordChoice({ block, input, value, actions }: { block: SheetBlock; input: CatalogInput; value: string; actions: BlockCardActions }) {
  const quoted = /^\s*"([^"]*)"\s*$/.exec(value)?.[1]?.trim().toLowerCase();
  const current = quoted !== undefined && input.choices!.includes(quoted) ? quoted : '';
  return (
    <select
      aria-label={`${input.label} of ${block.name}: choose a word`}
      value={current}
      onChange={(e) => e.target.value && actions.setInput(block.id, input.name, `"${e.target.value}"`)}
      className="num mb-1 h-7 rounded-[3px] border border-rule bg-chalk px-1 text-[13px]"
      data-testid="word-choice"
    >
      <option value="">{current ? 'choose…' : value.trim() ? 'an expression' : input.default ? `default ${input.default}` : 'choose…'}</option>
      {input.choices!.map((word) => (
        <option key={word} value={word}>
          {word}
        </option>
      ))}
    </select>
  );
}

function ParameterName({ block, name, canEdit, labelId, actions }: { block: SheetBlock; name: string; canEdit: boolean; labelId: string; actions: BlockCardActions }) {
  const [value, setValue] = useState(name);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => setValue(name), [name]);
  const commit = () => {
    if (value === name) return;
    const message = actions.renameParameter(block.id, name, value.trim());
    if (message) setError(message);
    else setError(null);
  };
  return (
    <div className="flex items-center gap-1">
      <span id={labelId} className="sr-only">
        Parameter {name} of {block.name}
      </span>
      {canEdit ? (
        <>
          <input
            aria-label={`Name of parameter ${name}`}
            value={value}
            onChange={(e) => setValue(e.target.value)}
            onBlur={commit}
            onKeyDown={(e) => e.key === 'Enter' && commit()}
            aria-invalid={error ? true : undefined}
            title={error ?? undefined}
            className={`num h-7 w-full rounded-[3px] border bg-chalk px-2 text-[13px] ${error ? 'border-oxide' : 'border-rule'}`}
          />
          <button type="button" aria-label={`Remove parameter ${name}`} onClick={() => actions.removeParameter(block.id, name)} className={iconButton}>
            <span aria-hidden="true">−</span>
          </button>
        </>
      ) : (
        <span aria-hidden="true" className="num text-[13px] font-medium">
          {name}
        </span>
      )}
      {error ? <span className="sr-only">{error}</span> : null}
    </div>
  );
}

function CaptionEditor({ block, onChange, onDone }: { block: SheetBlock; onChange: (text: string) => void; onDone: () => void }) {
  const ref = useRef<HTMLTextAreaElement>(null);
  const [text, setText] = useState(block.note ?? '');
  useEffect(() => {
    ref.current?.focus();
  }, []);
  const id = `caption-${block.id}`;
  return (
    <div className="mt-1 flex flex-col gap-1">
      <label htmlFor={id} className="text-[12px] text-slate">
        Caption of {block.name} (markdown; shown above its inputs and kept in revisions)
      </label>
      <textarea
        ref={ref}
        id={id}
        value={text}
        rows={Math.min(8, Math.max(2, text.split('\n').length + 1))}
        onChange={(e) => {
          setText(e.target.value);
          onChange(e.target.value);
        }}
        onKeyDown={(e) => {
          if (e.key === 'Escape') {
            e.preventDefault();
            e.stopPropagation();
            onDone();
          }
        }}
        className="w-full rounded-[3px] border border-rule bg-chalk p-2 text-[13px]"
      />
      <div>
        <button type="button" onClick={onDone} className="h-7 rounded-[3px] border border-rule px-2 text-[12px]">
          Done
        </button>
      </div>
    </div>
  );
}

function NoteBody({ block, canEdit, onChange }: { block: SheetBlock; canEdit: boolean; onChange: (text: string) => void }) {
  const [editing, setEditing] = useState(false);
  const text = block.note ?? '';
  return (
    <div className="mt-1">
      {editing && canEdit ? (
        <div className="flex flex-col gap-1">
          <label htmlFor={`note-${block.id}`} className="text-[12px] text-slate">
            Note text (markdown: # heading, **bold**, *italic*, `code`, - lists, [link](https://…))
          </label>
          <textarea
            id={`note-${block.id}`}
            value={text}
            rows={Math.min(16, Math.max(4, text.split('\n').length + 1))}
            onChange={(e) => onChange(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Escape') {
                e.stopPropagation();
                setEditing(false);
              }
            }}
            className="w-full rounded-[3px] border border-rule bg-chalk p-2 text-[14px]"
          />
          <div>
            <button type="button" onClick={() => setEditing(false)} className="h-7 rounded-[3px] border border-rule px-2 text-[12px]">
              Done
            </button>
          </div>
        </div>
      ) : (
        <div className="prose-note">
          {text ? <NoteMarkdown text={text} /> : <p className="text-slate">An empty note.</p>}
          {canEdit ? (
            <button type="button" onClick={() => setEditing(true)} className="mt-1 h-7 rounded-[3px] border border-rule px-2 text-[12px] text-slate hover:text-basalt">
              Edit note
            </button>
          ) : null}
        </div>
      )}
    </div>
  );
}

function OutputsTable({
  block,
  type,
  result,
  stale,
  canEdit,
  displayError,
  onDisplay,
}: {
  block: SheetBlock;
  type: CatalogType | undefined;
  result: BlockResult | undefined;
  stale: boolean;
  canEdit: boolean;
  displayError: { output: string; text: string } | null;
  onDisplay: (output: string, unit: string) => void;
}) {
  const names = result && Object.keys(result.outputs).length ? Object.keys(result.outputs) : type?.freeInputs ? Object.keys(block.inputs) : (type?.outputs.map((o) => o.name) ?? []);
  if (names.length === 0) return null;
  const labelOf = (name: string) => type?.outputs.find((o) => o.name === name)?.label ?? name;
  return (
    <table className={`mt-2 w-full border-collapse text-[13px] ${stale ? 'text-slate' : ''}`} data-testid="outputs" data-stale={stale ? 'true' : undefined}>
      <caption className="sr-only">
        Outputs of {block.name}
        {stale ? ' (stale: from before the last edit)' : ''}
      </caption>
      <thead>
        <tr className="border-b border-rule text-left text-[11px] uppercase tracking-wide text-slate">
          <th scope="col" className="py-1 pr-2 font-medium">
            Output
          </th>
          <th scope="col" className="py-1 pr-2 text-right font-medium">
            Value
          </th>
          <th scope="col" className="py-1 pr-2 font-medium">
            Unit
          </th>
          <th scope="col" className="py-1 font-medium">
            SI
          </th>
        </tr>
      </thead>
      <tbody>
        {names.map((name) => {
          const output = result?.outputs[name];
          const isText = output ? typeof output.value === 'string' : type?.outputs.find((o) => o.name === name)?.kind === 'text';
          return (
            <tr key={name} className="border-b border-rule/60 last:border-0" data-output={name}>
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                <span className="num">{name}</span>
                {labelOf(name) !== name ? <span className="text-slate"> · {labelOf(name)}</span> : null}
              </th>
              <td className={`num py-1 pr-2 text-right ${stale ? 'italic' : 'font-semibold'}`} data-testid="output-value">
                {output ? formatValue(output.value) : <span className="text-slate">—</span>}
              </td>
              <td className="num py-1 pr-2 text-slate">
                {!isText && canEdit && (output ? output.siUnit !== '' : true) ? (
                  <DisplayUnitInput block={block} output={name} current={output?.unit ?? ''} siUnit={output?.siUnit ?? ''} onCommit={(u) => onDisplay(name, u)} />
                ) : (
                  <span data-testid="output-unit">{output?.unit ?? ''}</span>
                )}
                {displayError?.output === name ? (
                  <span className="block text-[12px] not-italic text-oxide">
                    <span aria-hidden="true">✕ </span>
                    {displayError.text}
                  </span>
                ) : null}
              </td>
              <td className="num py-1 text-slate">
                {output && !isText && output.siUnit !== output.unit ? `${formatValue(output.si)}${output.siUnit ? ` ${output.siUnit}` : ''}` : output && !isText ? 'same' : ''}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

function DisplayUnitInput({ block, output, current, siUnit, onCommit }: { block: SheetBlock; output: string; current: string; siUnit: string; onCommit: (unit: string) => void }) {
  const stored = block.display?.[output] ?? '';
  const [value, setValue] = useState(stored || current);
  useEffect(() => setValue(stored || current), [stored, current]);
  const listId = `units-${block.id}-${output}`;
  const choices = DISPLAY_UNIT_CHOICES[siUnit] ?? [];
  const commit = () => {
    const next = value.trim();
    if (next === (stored || current)) return;
    onCommit(next === current && !stored ? '' : next);
  };
  return (
    <>
      <input
        aria-label={`Display unit of ${block.name}.${output}`}
        value={value}
        list={choices.length ? listId : undefined}
        onChange={(e) => setValue(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === 'Enter') {
            e.preventDefault();
            commit();
          }
        }}
        placeholder="unit"
        size={Math.max(6, value.length + 1)}
        className="num h-6 rounded-[3px] border border-transparent bg-transparent px-1 text-[13px] text-slate hover:border-rule focus:border-rule"
        data-testid="output-unit"
      />
      {choices.length ? (
        <datalist id={listId}>
          {choices.map((c) => (
            <option key={c} value={c} />
          ))}
        </datalist>
      ) : null}
    </>
  );
}
