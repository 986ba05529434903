'use client';

import { useState } from 'react';
import { formatSlope, formatValue } from '@/lib/sheet/format';
import { DISPLAY_UNIT_CHOICES } from '@/lib/sheet/vocabulary';
import type { BlockResult, CatalogType, SheetBlock } from '@/lib/sheet/types';

/** A block's outputs: value, display unit (editable), and the SI value beside it. */
export function OutputsTable({
  block,
  type,
  result,
  stale,
  canEdit,
  displayError,
  onDisplay,
  significantFigures,
  siFolded = false,
}: {
  /** The sheet's preference (CONTRACT §6b); display only. */
  significantFigures?: number;
  siFolded?: boolean;
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
          {siFolded ? null : (
            <th scope="col" className="py-1 font-medium">
              SI
            </th>
          )}
        </tr>
      </thead>
      <tbody>
        {names.map((name) => {
          const output = result?.outputs[name];
          const isText = output ? typeof output.value === 'string' : type?.outputs.find((o) => o.name === name)?.kind === 'text';
          // A dimensionless slope output (max_slope, slope) reads as a gradient and an angle.
          const isSlope = Boolean(output && typeof output.value === 'number' && output.unit === '' && /(^|_)slope$/.test(name));
          return (
            <tr key={name} className="border-b border-rule/60 last:border-0" data-output={name}>
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                <span className="num">{name}</span>
                {labelOf(name) !== name ? <span className="text-slate"> · {labelOf(name)}</span> : null}
              </th>
              <td className={`num py-1 pr-2 text-right ${stale ? 'italic' : 'font-semibold'}`} data-testid="output-value">
                {output ? (isSlope ? formatSlope(output.value as number, significantFigures) : formatValue(output.value, significantFigures)) : <span className="text-slate">—</span>}
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
              {siFolded ? null : (
                <td className="num py-1 text-slate">
                  {output && !isText && output.siUnit !== output.unit ? `${formatValue(output.si, significantFigures)}${output.siUnit ? ` ${output.siUnit}` : ''}` : output && !isText ? 'same' : ''}
                </td>
              )}
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
  // A new stored or current unit from outside (undo, a merge, another display setting) replaces the text
  // (set while rendering, not in an effect).
  const [shown, setShown] = useState({ stored, current });
  if (stored !== shown.stored || current !== shown.current) {
    setShown({ stored, current });
    setValue(stored || current);
  }
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
