/**
 * The one three-way merge of sheet documents, used by both conflict paths on the sheet page: a draft
 * save answered 409 (someone saved the draft meanwhile) and a revision save answered 409 (someone saved
 * a revision meanwhile). Pure; runs on the client and in tests.
 *
 * `base` is the document the person started from, `mine` their document, `theirs` the one saved
 * meanwhile. Blocks are matched by id and merged field by field; record fields (`inputs`, `display`)
 * key by key, so I can change `velocity` while a colleague changes `length` in the same block and both
 * survive. Where both sides changed the same thing differently, mine is kept and the clash is listed so
 * the person can look before saving. Equality is canonical JSON (RFC 8785 key order), so the key order
 * PostgreSQL's jsonb hands back never counts as a change.
 *
 * Renames: a block renamed on either side has every side's references to its old name rewritten before
 * the merge (unless another block carries the old name), so a rename never clashes with an edit. Names made ambiguous by two additions get a suffix on the block
 * whose name did not come from theirs.
 */
import { canonicalJson } from '@/lib/engine/canonical-json';
import { renameReferences } from './expression-tokens';

/** The parts of a block the merge needs; any further fields are merged as whole values. */
export interface MergeableBlock {
  id: string;
  name: string;
  inputs: Record<string, string>;
}
export interface MergeableDocument<B extends MergeableBlock = MergeableBlock> {
  blocks: B[];
}

export type MergeClash = { blockId: string; blockName: string; field: string; mine: string | null; theirs: string | null };
export type MergeResult<D> = {
  document: D;
  /** Things both sides changed differently; mine was kept. */
  clashes: MergeClash[];
  /** How many of my block-level changes (edits, additions, removals) were applied. */
  applied: number;
};

/** Canonical JSON text, or plain JSON for values RFC 8785 refuses (lone surrogates, non-finite numbers). */
function jsonText(value: unknown): string {
  if (value === undefined) return 'null';
  try {
    return canonicalJson(value);
  } catch {
    return JSON.stringify(value) ?? 'null';
  }
}

/** Order-independent equality of two JSON values (undefined equals null). */
export function sameJson(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  return jsonText(a) === jsonText(b);
}

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

const shown = (value: unknown): string | null => (value === undefined || value === null ? null : typeof value === 'string' ? value : jsonText(value));

type Pick3 = { value: unknown; clash: boolean };

/** Three-way pick of one value: theirs when I left it alone, mine when they did or we agree, else mine with a clash. */
function pick3(base: unknown, mine: unknown, theirs: unknown): Pick3 {
  if (sameJson(mine, base)) return { value: theirs, clash: false };
  if (sameJson(theirs, base) || sameJson(theirs, mine)) return { value: mine, clash: false };
  return { value: mine, clash: true };
}

type ClashSink = (field: string, mine: unknown, theirs: unknown) => void;

function mergeRecord(
  base: Record<string, unknown> | undefined,
  mine: Record<string, unknown> | undefined,
  theirs: Record<string, unknown> | undefined,
  field: string,
  onClash: ClashSink,
): Record<string, unknown> {
  const keys = new Set([...Object.keys(base ?? {}), ...Object.keys(mine ?? {}), ...Object.keys(theirs ?? {})]);
  const out: Record<string, unknown> = {};
  // Mine's key order first (what the person sees), then keys only theirs has.
  const ordered = [...Object.keys(mine ?? {}), ...Object.keys(theirs ?? {}), ...keys];
  for (const key of new Set(ordered)) {
    const picked = pick3(base?.[key], mine?.[key], theirs?.[key]);
    if (picked.clash) onClash(`${field}.${key}`, mine?.[key], theirs?.[key]);
    if (picked.value !== undefined) out[key] = picked.value;
  }
  return out;
}

/** Merges one block present in mine and theirs (base may be missing when both added the same id). */
function mergeBlock<B extends MergeableBlock>(base: B | undefined, mine: B, theirs: B, onClash: ClashSink): B {
  const b = (base ?? {}) as Record<string, unknown>;
  const m = mine as unknown as Record<string, unknown>;
  const t = theirs as unknown as Record<string, unknown>;
  const out: Record<string, unknown> = { id: mine.id };
  const keys = new Set([...Object.keys(m), ...Object.keys(t), ...Object.keys(b)]);
  keys.delete('id');
  for (const key of keys) {
    const bv = b[key];
    const mv = m[key];
    const tv = t[key];
    const recordLike = (bv === undefined || isRecord(bv)) && (mv === undefined || isRecord(mv)) && (tv === undefined || isRecord(tv));
    if (recordLike && (isRecord(mv) || isRecord(tv))) {
      const merged = mergeRecord(bv as Record<string, unknown> | undefined, mv as Record<string, unknown> | undefined, tv as Record<string, unknown> | undefined, key, onClash);
      if (Object.keys(merged).length > 0 || key === 'inputs') out[key] = merged;
      continue;
    }
    const picked = pick3(bv, mv, tv);
    if (picked.clash) onClash(key, mv, tv);
    if (picked.value !== undefined) out[key] = picked.value;
  }
  return out as unknown as B;
}

/** The merged order of block ids: mine when only I reordered, else theirs; my additions follow their local predecessor. */
function mergedOrder(base: MergeableDocument, mine: MergeableDocument, theirs: MergeableDocument): string[] {
  const inBase = new Set(base.blocks.map((b) => b.id));
  const inMine = new Set(mine.blocks.map((b) => b.id));
  const inTheirs = new Set(theirs.blocks.map((b) => b.id));
  const baseOrder = base.blocks.map((b) => b.id);
  const mineOrderOfBase = mine.blocks.map((b) => b.id).filter((id) => inBase.has(id));
  const theirsOrderOfBase = theirs.blocks.map((b) => b.id).filter((id) => inBase.has(id));
  const iReordered = !sameJson(mineOrderOfBase, baseOrder.filter((id) => inMine.has(id)));
  const theyReordered = !sameJson(theirsOrderOfBase, baseOrder.filter((id) => inTheirs.has(id)));
  const order = iReordered && !theyReordered ? [...mineOrderOfBase] : theirs.blocks.map((b) => b.id);
  for (const id of theirs.blocks.map((b) => b.id)) if (!order.includes(id)) order.push(id);
  // Base blocks theirs removed but I kept (a clash or my edit): at their base position.
  baseOrder.forEach((id, index) => {
    if (order.includes(id) || !inMine.has(id)) return;
    const previous = baseOrder.slice(0, index).reverse().find((p) => order.includes(p));
    order.splice(previous ? order.indexOf(previous) + 1 : 0, 0, id);
  });
  mine.blocks.forEach((block, index) => {
    if (inBase.has(block.id) || order.includes(block.id)) return;
    const previous = mine.blocks[index - 1]?.id;
    const at = previous ? order.indexOf(previous) : -1;
    order.splice(at + 1, 0, block.id);
  });
  return [...new Set(order)];
}

/** Re-applies my edits (base → mine) onto theirs; see the file comment. */
export function mergeSheets<B extends MergeableBlock, D extends MergeableDocument<B>>(baseIn: D, mineIn: D, theirsIn: D): MergeResult<D> {
  // A rename on one side rewrites references on every side first, so a reference rewritten by a rename
  // is not a change of its own (and new references to an old name follow the rename).
  const renames = renamesOf(baseIn, mineIn, theirsIn);
  const base = withRenames(baseIn, renames);
  const mine = withRenames(mineIn, renames);
  const theirs = withRenames(theirsIn, renames);
  const clashes: MergeClash[] = [];
  let applied = 0;
  const baseById = new Map(base.blocks.map((b) => [b.id, b]));
  const mineById = new Map(mine.blocks.map((b) => [b.id, b]));
  const theirsById = new Map(theirs.blocks.map((b) => [b.id, b]));
  const clashOf = (blockId: string, blockName: string): ClashSink => (field, m, t) =>
    clashes.push({ blockId, blockName, field, mine: shown(m), theirs: shown(t) });

  const merged = new Map<string, B>();
  for (const id of mergedOrder(base, mine, theirs)) {
    const b = baseById.get(id);
    const m = mineById.get(id);
    const t = theirsById.get(id);
    if (!m && !t) continue;
    if (!m && t) {
      if (!b) merged.set(id, t); // their addition
      else if (sameJson(b, t)) applied += 1; // my removal
      else {
        clashOf(id, t.name)('block', 'removed', 'changed');
        merged.set(id, t);
      }
      continue;
    }
    if (m && !t) {
      if (!b) {
        applied += 1; // my addition
        merged.set(id, m);
      } else if (!sameJson(b, m)) {
        applied += 1;
        clashOf(id, m.name)('block', 'changed', 'removed');
        merged.set(id, m);
      } // else their removal of a block I left alone
      continue;
    }
    if (!m || !t) continue;
    if (b && sameJson(b, m)) merged.set(id, t);
    else if (sameJson(m, t) || (b && sameJson(b, t))) {
      applied += 1;
      merged.set(id, m);
    } else {
      applied += 1;
      merged.set(id, mergeBlock(b, m, t, clashOf(id, m.name)));
    }
  }

  const blocks = uniqueNames([...merged.values()], theirsById);

  // Document fields other than the blocks (title, site, anything added later): three-way as whole values.
  const out: Record<string, unknown> = {};
  const b = base as unknown as Record<string, unknown>;
  const m = mine as unknown as Record<string, unknown>;
  const t = theirs as unknown as Record<string, unknown>;
  for (const key of new Set([...Object.keys(t), ...Object.keys(m), ...Object.keys(b)])) {
    if (key === 'blocks') {
      out.blocks = blocks;
      continue;
    }
    const picked = pick3(b[key], m[key], t[key]);
    if (picked.clash) clashes.push({ blockId: '', blockName: 'sheet', field: key, mine: shown(m[key]), theirs: shown(t[key]) });
    if (picked.value !== undefined) out[key] = picked.value;
  }
  return { document: out as unknown as D, clashes, applied };
}

/**
 * Renames made on either side, as old name → merged name (mine wins where both renamed one block).
 * A name that another block carries in the merged result is never rewritten (it still means that block).
 */
function renamesOf<B extends MergeableBlock>(base: MergeableDocument<B>, mine: MergeableDocument<B>, theirs: MergeableDocument<B>): Map<string, string> {
  const mineById = new Map(mine.blocks.map((b) => [b.id, b.name]));
  const theirsById = new Map(theirs.blocks.map((b) => [b.id, b.name]));
  const finalNames = new Map<string, string>(); // id → name after the merge
  for (const b of base.blocks) {
    const value = pick3(b.name, mineById.get(b.id) ?? b.name, theirsById.get(b.id) ?? b.name).value;
    finalNames.set(b.id, typeof value === 'string' ? value : b.name);
  }
  const renames = new Map<string, string>();
  for (const b of base.blocks) {
    const to = finalNames.get(b.id) ?? b.name;
    for (const from of [b.name, mineById.get(b.id), theirsById.get(b.id)]) {
      if (!from || from === to) continue;
      const meansAnother = [...finalNames].some(([id, name]) => id !== b.id && name === from);
      if (!meansAnother) renames.set(from, to);
    }
  }
  return renames;
}

/** The document with every reference to a renamed block written with the merged name (texts only). */
function withRenames<D extends MergeableDocument>(doc: D, renames: Map<string, string>): D {
  if (renames.size === 0) return doc;
  let changedAny = false;
  const blocks = doc.blocks.map((block) => {
    let changed = false;
    const inputs: Record<string, string> = {};
    for (const [key, text] of Object.entries(block.inputs)) {
      let next = text;
      for (const [from, to] of renames) next = renameReferences(next, from, to);
      if (next !== text) changed = true;
      inputs[key] = next;
    }
    if (!changed) return block;
    changedAny = true;
    return { ...block, inputs };
  });
  return changedAny ? { ...doc, blocks } : doc;
}

/** Two blocks with one name (both sides added one): the block whose name did not come from theirs gets a suffix. */
function uniqueNames<B extends MergeableBlock>(blocks: B[], theirsById: Map<string, B>): B[] {
  const counts = new Map<string, number>();
  for (const block of blocks) counts.set(block.name, (counts.get(block.name) ?? 0) + 1);
  if ([...counts.values()].every((n) => n === 1)) return blocks;
  const taken = new Set<string>();
  // Keepers first: for a shared name, the block that carries it in theirs (else the first one).
  const keeper = new Map<string, string>();
  for (const block of blocks) {
    if ((counts.get(block.name) ?? 0) < 2) continue;
    if (theirsById.get(block.id)?.name === block.name && !keeper.has(block.name)) keeper.set(block.name, block.id);
  }
  for (const block of blocks) if (!keeper.has(block.name)) keeper.set(block.name, block.id);
  for (const block of blocks) taken.add(block.name);
  return blocks.map((block) => {
    if (keeper.get(block.name) === block.id) return block;
    const stem = block.name.slice(0, 36);
    let n = 2;
    while (taken.has(`${stem}_${n}`)) n += 1;
    const name = `${stem}_${n}`;
    taken.add(name);
    return { ...block, name };
  });
}
