/**
 * Pure edits of a sheet document: every structural change the workspace makes goes through
 * here, so each one is unit-tested and undoable (the workspace keeps the documents).
 */
import { findReferences, renameOutputReferences, renameReferences } from './expression-tokens';
import { sameJson } from './merge';
import type { CatalogType, SheetBlock, SheetDocument } from './types';

/** The contract's pattern for block names (the server also refuses units, constants and functions). */
export const BLOCK_NAME_PATTERN = /^[a-z][a-z0-9_]{0,39}$/;

/** A first check of a new block name on the client; null when it passes. */
export function precheckBlockName(doc: SheetDocument, name: string, ownId?: string): string | null {
  if (!BLOCK_NAME_PATTERN.test(name)) {
    return 'A name starts with a lower-case letter and has at most 40 lower-case letters, digits or underscores.';
  }
  if (doc.blocks.some((b) => b.name === name && b.id !== ownId)) return `Another block is already named ${name}.`;
  return null;
}

/** Short stems for new block names; underscores keep them clear of unit and function names. */
const NAME_STEMS: Record<string, string> = {
  quantities: 'params',
  formula: 'calc',
  note: 'note',
  hillslope_diffusion: 'hillslope',
  hilltop_erosion: 'hilltop',
  scarp_forward: 'scarp_model',
  scarp_age: 'scarp',
  transport_capacity: 'capacity',
  net_change: 'bed_change',
  peclet_number: 'peclet',
  advective_geotherm: 'geotherm',
  stream_power: 'incision',
  steady_state_channel: 'channel',
  isostatic_response: 'isostasy',
  denudation_conversion: 'mass_flux',
};

export function suggestBlockName(doc: SheetDocument, typeId: string): string {
  const stem = (NAME_STEMS[typeId] ?? typeId.split('_')[0] ?? 'block').slice(0, 34);
  const taken = new Set(doc.blocks.map((b) => b.name));
  for (let n = 1; ; n++) {
    const name = `${stem}_${n}`;
    if (!taken.has(name)) return name;
  }
}

let idCounter = 0;
/** A new block id: unique in practice, 1–64 characters. */
export function newBlockId(): string {
  const random =
    typeof crypto !== 'undefined' && 'randomUUID' in crypto
      ? crypto.randomUUID().replace(/-/g, '').slice(0, 12)
      : Math.floor(Math.random() * 1e12).toString(36);
  idCounter = (idCounter + 1) % 1e6;
  return `b-${random}${idCounter.toString(36)}`;
}

/** A new block of a type with the catalog's defaults filled in for required inputs. */
export function createBlock(doc: SheetDocument, type: CatalogType | { id: 'note' }, init: { inputs?: Record<string, string>; note?: string; name?: string } = {}): SheetBlock {
  const inputs: Record<string, string> = {};
  if ('inputs' in type) {
    for (const input of type.inputs) {
      inputs[input.name] = init.inputs?.[input.name] ?? (input.optional ? '' : (input.default ?? ''));
    }
    if (type.freeInputs) Object.assign(inputs, init.inputs ?? {});
  }
  const block: SheetBlock = { id: newBlockId(), name: init.name ?? suggestBlockName(doc, type.id), type: type.id, inputs };
  if (type.id === 'note') block.note = init.note ?? '';
  else if (init.note) block.note = init.note;
  // Empty optional inputs are left out: the document stays minimal.
  for (const [k, v] of Object.entries(block.inputs)) if (v === '' && 'inputs' in type && type.inputs.find((i) => i.name === k)?.optional) delete block.inputs[k];
  return block;
}

export function insertBlock(doc: SheetDocument, block: SheetBlock, index = doc.blocks.length): SheetDocument {
  const blocks = [...doc.blocks];
  blocks.splice(Math.max(0, Math.min(index, blocks.length)), 0, block);
  return { ...doc, blocks };
}

export function removeBlock(doc: SheetDocument, id: string): SheetDocument {
  return { ...doc, blocks: doc.blocks.filter((b) => b.id !== id) };
}

export function duplicateBlock(doc: SheetDocument, id: string): { doc: SheetDocument; copy: SheetBlock | null } {
  const index = doc.blocks.findIndex((b) => b.id === id);
  if (index < 0) return { doc, copy: null };
  const original = doc.blocks[index]!;
  const taken = new Set(doc.blocks.map((b) => b.name));
  const base = original.name.replace(/_copy(_\d+)?$/, '').slice(0, 30);
  let name = `${base}_copy`;
  for (let n = 2; taken.has(name); n++) name = `${base}_copy_${n}`;
  const copy: SheetBlock = structuredCloneBlock({ ...original, id: newBlockId(), name });
  return { doc: insertBlock(doc, copy, index + 1), copy };
}

function structuredCloneBlock(block: SheetBlock): SheetBlock {
  return {
    ...block,
    inputs: { ...block.inputs },
    ...(block.display ? { display: { ...block.display } } : {}),
  };
}

/** Moves a block to a new index (clamped). */
export function moveBlock(doc: SheetDocument, id: string, toIndex: number): SheetDocument {
  const from = doc.blocks.findIndex((b) => b.id === id);
  if (from < 0) return doc;
  const target = Math.max(0, Math.min(toIndex, doc.blocks.length - 1));
  if (target === from) return doc;
  const blocks = [...doc.blocks];
  const [block] = blocks.splice(from, 1);
  blocks.splice(target, 0, block!);
  return { ...doc, blocks };
}

/** Renames a block and rewrites `old.output` references in every other block's inputs. */
export function renameBlock(doc: SheetDocument, id: string, name: string): SheetDocument {
  const block = doc.blocks.find((b) => b.id === id);
  if (!block || block.name === name) return doc;
  const old = block.name;
  return {
    ...doc,
    blocks: doc.blocks.map((b) => {
      if (b.id === id) return { ...b, name };
      let changed = false;
      const inputs: Record<string, string> = {};
      for (const [key, expr] of Object.entries(b.inputs)) {
        const next = renameReferences(expr, old, name);
        if (next !== expr) changed = true;
        inputs[key] = next;
      }
      return changed ? { ...b, inputs } : b;
    }),
  };
}

export function updateBlock(doc: SheetDocument, id: string, change: (block: SheetBlock) => SheetBlock): SheetDocument {
  return { ...doc, blocks: doc.blocks.map((b) => (b.id === id ? change(b) : b)) };
}

export function setInput(doc: SheetDocument, id: string, input: string, expr: string): SheetDocument {
  return updateBlock(doc, id, (b) => ({ ...b, inputs: { ...b.inputs, [input]: expr } }));
}

/** Sets or clears (empty unit) the display unit of one output. */
export function setDisplayUnit(doc: SheetDocument, id: string, output: string, unit: string): SheetDocument {
  return updateBlock(doc, id, (b) => {
    const display = { ...(b.display ?? {}) };
    if (unit.trim()) display[output] = unit.trim();
    else delete display[output];
    const next: SheetBlock = { ...b, display };
    if (Object.keys(display).length === 0) delete next.display;
    return next;
  });
}

export function setNote(doc: SheetDocument, id: string, note: string): SheetDocument {
  return updateBlock(doc, id, (b) => {
    const next: SheetBlock = { ...b, note };
    if (!note && b.type !== 'note') delete next.note;
    return next;
  });
}

/** Blocks whose inputs reference any of the given block names, transitively; includes the seeds. */
export function dependentsOf(doc: SheetDocument, seedIds: Iterable<string>): Set<string> {
  const result = new Set(seedIds);
  const names = new Map(doc.blocks.map((b) => [b.id, b.name]));
  let grew = true;
  while (grew) {
    grew = false;
    const namesInSet = new Set([...result].map((id) => names.get(id)).filter(Boolean) as string[]);
    for (const block of doc.blocks) {
      if (result.has(block.id)) continue;
      const uses = Object.values(block.inputs).some((expr) => findReferences(expr).some((r) => namesInSet.has(r.block)));
      if (uses) {
        result.add(block.id);
        grew = true;
      }
    }
  }
  return result;
}

/** Ids of blocks that differ between two documents (added, removed or changed). */
export function changedBlockIds(before: SheetDocument | null, after: SheetDocument): string[] {
  if (!before) return after.blocks.map((b) => b.id);
  const old = new Map(before.blocks.map((b) => [b.id, b]));
  const ids: string[] = [];
  for (const block of after.blocks) if (!sameJson(old.get(block.id), block)) ids.push(block.id);
  const now = new Set(after.blocks.map((b) => b.id));
  for (const block of before.blocks) if (!now.has(block.id)) ids.push(block.id);
  return ids;
}

/* The three-way merge of documents lives in ./merge.ts (mergeSheets). */

export const PARAMETER_NAME_PATTERN = /^[A-Za-z][A-Za-z0-9_]{0,39}$/;

/** Renames a parameter of a quantities block, keeping its place, and rewrites `block.old` references. */
export function renameParameter(doc: SheetDocument, id: string, from: string, to: string): { doc: SheetDocument; error: string | null } {
  const block = doc.blocks.find((b) => b.id === id);
  if (!block) return { doc, error: 'No such block.' };
  if (!PARAMETER_NAME_PATTERN.test(to)) return { doc, error: 'A parameter name starts with a letter and has at most 40 letters, digits or underscores.' };
  if (to !== from && to in block.inputs) return { doc, error: `${block.name} already has a parameter ${to}.` };
  const inputs: Record<string, string> = {};
  for (const [k, v] of Object.entries(block.inputs)) inputs[k === from ? to : k] = v;
  const display = block.display && from in block.display ? Object.fromEntries(Object.entries(block.display).map(([k, v]) => [k === from ? to : k, v])) : block.display;
  return {
    error: null,
    doc: {
      ...doc,
      blocks: doc.blocks.map((b) => {
        if (b.id === id) return { ...b, inputs, ...(display ? { display } : {}) };
        const next = Object.fromEntries(Object.entries(b.inputs).map(([k, v]) => [k, renameOutputReferences(v, block.name, from, to)]));
        return sameJson(next, b.inputs) ? b : { ...b, inputs: next };
      }),
    },
  };
}

export function addParameter(doc: SheetDocument, id: string): SheetDocument {
  return updateBlock(doc, id, (b) => {
    let n = Object.keys(b.inputs).length + 1;
    while (`p${n}` in b.inputs) n++;
    return { ...b, inputs: { ...b.inputs, [`p${n}`]: '' } };
  });
}

export function removeParameter(doc: SheetDocument, id: string, key: string): SheetDocument {
  return updateBlock(doc, id, (b) => {
    const inputs = { ...b.inputs };
    delete inputs[key];
    const next: SheetBlock = { ...b, inputs };
    if (b.display && key in b.display) {
      const display = { ...b.display };
      delete display[key];
      if (Object.keys(display).length) next.display = display;
      else delete next.display;
    }
    return next;
  });
}
