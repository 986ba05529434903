'use client';

import { Button } from '@/components/ui/button';
import { browserOnly } from '@/components/ui/browser-only';
import { useState } from 'react';
import { DatasetPicker } from '@/components/datasets/dataset-picker';
// The density sketch of a declared distribution (and its quantile code) loads only for a field that declares one.
import InputHintFromText from '@/components/uncertainty/input-hint-from-text';
import type { CatalogInput, SheetBlock } from '@/lib/sheet/types';
import type { BlockCardActions } from './block-actions';
import type { CompletionData } from './expression-language';


// CodeMirror loads only on pages that show fields, in the browser (the server draws the placeholder).
const ExpressionField = browserOnly(
  () => import('./expression-field'),
  () => <div className="h-[30px] rounded-[3px] border border-rule bg-wash" aria-hidden="true" />,
);

/** A block's inputs, one labelled expression field each (free parameters with their names editable). */
export function InputsTable({
  block,
  inputs,
  free,
  canEdit,
  errorInput,
  errorText,
  warnings,
  units,
  functions,
  completion,
  actions,
  pending = new Set<string>(),
  onLeave,
}: {
  /** Empty required inputs of a new block the user has not left yet: shown as “needs input”, not an error. */
  pending?: ReadonlySet<string>;
  onLeave?: (input: string) => void;
  block: SheetBlock;
  inputs: CatalogInput[];
  free: boolean;
  canEdit: boolean;
  /** The input the block's error names, with its text. */
  errorInput: string | null;
  errorText: string;
  warnings: { input?: string | null; text: string }[];
  units: readonly string[];
  functions: readonly string[];
  completion: () => CompletionData;
  actions: BlockCardActions;
}) {
  return (
    <div className="mt-2 grid gap-2" data-inputs="">
      {inputs.map((input) => (
        <InputRow
          key={input.name}
          block={block}
          input={input}
          free={free}
          canEdit={canEdit}
          error={errorInput === input.name && !pending.has(input.name) ? errorText : null}
          needsInput={pending.has(input.name) && !(block.inputs[input.name] ?? '').trim() && !input.optional && input.default === undefined}
          onLeave={onLeave}
          warnings={warnings.filter((w) => w.input === input.name).map((w) => w.text)}
          units={units}
          functions={functions}
          completion={completion}
          actions={actions}
        />
      ))}
      {free && canEdit ? (
        <div>
          <Button variant="dashed" size="sm" onClick={() => actions.addParameter(block.id)}>
            + Add parameter
          </Button>
        </div>
      ) : null}
    </div>
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
  needsInput,
  onLeave,
}: {
  needsInput: boolean;
  onLeave?: (input: string) => void;
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
        {/* A declared distribution shows a small sketch of its density on hover or focus (CONTRACT §8.1). */}
        <InputHintFromText text={value} label={`${block.name}.${input.name}`}>
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
            onBlur={onLeave ? () => onLeave(input.name) : undefined}
          />
        </InputHintFromText>
        {input.dimension === 'dataset' ? (
          <DatasetPicker kind={input.datasetKind} value={value} readOnly={!canEdit} labelId={labelId} onPick={(next) => actions.setInput(block.id, input.name, next)} />
        ) : null}
        {needsInput && !error ? (
          <p className="mt-0.5 text-[12px] text-slate" data-testid="input-needs">
            <span aria-hidden="true">○ </span>
            needs input
          </p>
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
  // A new name from outside (undo, a merge) replaces the text (set while rendering, not in an effect).
  const [shownName, setShownName] = useState(name);
  if (name !== shownName) {
    setShownName(name);
    setValue(name);
  }
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
          <Button variant="tool" size="icon" aria-label={`Remove parameter ${name}`} onClick={() => actions.removeParameter(block.id, name)}>
            <span aria-hidden="true">−</span>
          </Button>
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
