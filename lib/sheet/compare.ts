// Compares two sheet states (document + results) block by block, matched by block id. Pure: no I/O,
// usable on the server and in client components. The results are keyed by block name, so each side's
// outputs are looked up through that side's own names (a renamed block still matches by id).

import type { OutputValue } from './types';

export type { OutputValue };

type BlockLike = { id: string; name: string; type: string; inputs?: Record<string, string>; note?: string; display?: Record<string, string> };
type DocumentLike = { title?: string; site?: { name?: string }; blocks: BlockLike[] };
type BlockResultLike = { status?: string; error?: string; outputs?: Record<string, OutputValue> };
type ResultsLike = { blocks?: Record<string, BlockResultLike> } | null | undefined;

export type CompareSide = { document: DocumentLike; results?: ResultsLike };

export type BlockSummary = { id: string; name: string; type: string; status: string | null };

export type InputChange = { input: string; before: string | null; after: string | null };

export type OutputChange = {
  output: string;
  before: OutputValue | null;
  after: OutputValue | null;
  /** (after − before) / |before| on the SI values; null when either is missing, text, or before is 0. */
  relativeChange: number | null;
  changed: boolean;
};

export type BlockChange = {
  id: string;
  nameBefore: string;
  nameAfter: string;
  typeBefore: string;
  typeAfter: string;
  statusBefore: string | null;
  statusAfter: string | null;
  inputs: InputChange[];
  outputs: OutputChange[];
  noteChanged: boolean;
  displayChanged: boolean;
  moved: boolean;
};

export type SheetComparison = {
  titleBefore: string | null;
  titleAfter: string | null;
  siteBefore: string | null;
  siteAfter: string | null;
  added: BlockSummary[];
  removed: BlockSummary[];
  changed: BlockChange[];
  unchanged: number;
};

function resultOf(side: CompareSide, block: BlockLike): BlockResultLike | undefined {
  return side.results?.blocks?.[block.name];
}

function summary(side: CompareSide, block: BlockLike): BlockSummary {
  return { id: block.id, name: block.name, type: block.type, status: resultOf(side, block)?.status ?? null };
}

/** The relative change between two SI values, or null when it is not meaningful. */
export function relativeChange(before: number | string | undefined, after: number | string | undefined): number | null {
  if (typeof before !== 'number' || typeof after !== 'number') return null;
  if (!Number.isFinite(before) || !Number.isFinite(after) || before === 0) return null;
  return (after - before) / Math.abs(before);
}

const sameValue = (a: OutputValue | null, b: OutputValue | null) =>
  a === b || (a !== null && b !== null && a.si === b.si && a.siUnit === b.siUnit && a.value === b.value && a.unit === b.unit);

const sameRecord = (a: Record<string, string> | undefined, b: Record<string, string> | undefined) => {
  const ka = Object.keys(a ?? {}).sort();
  const kb = Object.keys(b ?? {}).sort();
  return ka.length === kb.length && ka.every((k, i) => k === kb[i] && a![k] === b![k]);
};

export function compareSheets(from: CompareSide, to: CompareSide): SheetComparison {
  const beforeBlocks = from.document.blocks ?? [];
  const afterBlocks = to.document.blocks ?? [];
  const beforeById = new Map(beforeBlocks.map((b, i) => [b.id, { block: b, index: i }]));
  const afterIds = new Set(afterBlocks.map((b) => b.id));

  const added = afterBlocks.filter((b) => !beforeById.has(b.id)).map((b) => summary(to, b));
  const removed = beforeBlocks.filter((b) => !afterIds.has(b.id)).map((b) => summary(from, b));
  const keptBefore = beforeBlocks.filter((b) => afterIds.has(b.id)).map((b) => b.id);
  const keptAfter = afterBlocks.filter((b) => beforeById.has(b.id)).map((b) => b.id);

  const changed: BlockChange[] = [];
  let unchanged = 0;
  for (const after of afterBlocks) {
    const entry = beforeById.get(after.id);
    if (!entry) continue;
    const before = entry.block;
    const inputNames = [...new Set([...Object.keys(before.inputs ?? {}), ...Object.keys(after.inputs ?? {})])];
    const inputs: InputChange[] = inputNames
      .map((input) => ({ input, before: before.inputs?.[input] ?? null, after: after.inputs?.[input] ?? null }))
      .filter((c) => c.before !== c.after);
    const rb = resultOf(from, before);
    const ra = resultOf(to, after);
    const outputNames = [...new Set([...Object.keys(rb?.outputs ?? {}), ...Object.keys(ra?.outputs ?? {})])];
    const outputs: OutputChange[] = outputNames.map((output) => {
      const b = rb?.outputs?.[output] ?? null;
      const a = ra?.outputs?.[output] ?? null;
      return { output, before: b, after: a, relativeChange: relativeChange(b?.si, a?.si), changed: !sameValue(b, a) };
    });
    const noteChanged = (before.note ?? '') !== (after.note ?? '');
    const displayChanged = !sameRecord(before.display, after.display);
    const moved = keptBefore.indexOf(after.id) !== keptAfter.indexOf(after.id);
    const statusBefore = rb?.status ?? null;
    const statusAfter = ra?.status ?? null;
    const isChanged =
      inputs.length > 0 ||
      outputs.some((o) => o.changed) ||
      noteChanged ||
      displayChanged ||
      moved ||
      before.name !== after.name ||
      before.type !== after.type ||
      statusBefore !== statusAfter ||
      (rb?.error ?? null) !== (ra?.error ?? null);
    if (!isChanged) {
      unchanged += 1;
      continue;
    }
    changed.push({
      id: after.id,
      nameBefore: before.name,
      nameAfter: after.name,
      typeBefore: before.type,
      typeAfter: after.type,
      statusBefore,
      statusAfter,
      inputs,
      outputs,
      noteChanged,
      displayChanged,
      moved,
    });
  }
  return {
    titleBefore: from.document.title ?? null,
    titleAfter: to.document.title ?? null,
    siteBefore: from.document.site?.name ?? null,
    siteAfter: to.document.site?.name ?? null,
    added,
    removed,
    changed,
    unchanged,
  };
}
