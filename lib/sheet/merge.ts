// Re-applies a person's edits onto a newer revision (after a 409 on save). Pure; used by the client.
// Three-way, block by block (matched by id) and input by input: `base` is the revision the person
// started from, `mine` their document, `latest` the revision saved meanwhile. Where both changed the
// same thing differently, mine is kept and the clash is listed so the person can look before saving.

type Block = { id: string; name: string; type: string; inputs: Record<string, string>; note?: string; display?: Record<string, string> };
type Doc = { format: string; title: string; site?: unknown; blocks: Block[] };

export type MergeClash = { blockId: string; blockName: string; field: string; mine: string | null; theirs: string | null };
export type MergeResult<D> = { document: D; clashes: MergeClash[]; applied: number };

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

function mergeRecord(
  base: Record<string, string> | undefined,
  mine: Record<string, string> | undefined,
  theirs: Record<string, string> | undefined,
  onClash: (key: string, mine: string | null, theirs: string | null) => void,
): Record<string, string> | undefined {
  const keys = new Set([...Object.keys(base ?? {}), ...Object.keys(mine ?? {}), ...Object.keys(theirs ?? {})]);
  const out: Record<string, string> = {};
  for (const key of keys) {
    const b = base?.[key];
    const m = mine?.[key];
    const t = theirs?.[key];
    let value: string | undefined;
    if (m === b) value = t;
    else if (t === b || t === m) value = m;
    else {
      value = m;
      onClash(key, m ?? null, t ?? null);
    }
    if (value !== undefined) out[key] = value;
  }
  return Object.keys(out).length || theirs || mine ? out : undefined;
}

export function mergeEdits<D extends Doc>(base: D, mine: D, latest: D): MergeResult<D> {
  const clashes: MergeClash[] = [];
  let applied = 0;
  const baseById = new Map(base.blocks.map((b) => [b.id, b]));
  const mineById = new Map(mine.blocks.map((b) => [b.id, b]));
  const blocks: Block[] = [];
  for (const theirs of latest.blocks) {
    const b = baseById.get(theirs.id);
    const m = mineById.get(theirs.id);
    if (b && !m) {
      // I removed it: drop it unless they changed it meanwhile.
      if (same(b, theirs)) {
        applied += 1;
        continue;
      }
      clashes.push({ blockId: theirs.id, blockName: theirs.name, field: 'block', mine: 'removed', theirs: 'changed' });
      blocks.push(theirs);
      continue;
    }
    if (!b || !m || same(b, m)) {
      blocks.push(theirs);
      continue;
    }
    applied += 1;
    const clash = (field: string) => (mineValue: string | null, theirsValue: string | null) =>
      clashes.push({ blockId: theirs.id, blockName: m.name, field, mine: mineValue, theirs: theirsValue });
    const pick = (field: 'name' | 'type' | 'note') => {
      const bv = b[field];
      const mv = m[field];
      const tv = theirs[field];
      if (mv === bv) return tv;
      if (tv !== bv && tv !== mv) clash(field)(mv ?? null, tv ?? null);
      return mv;
    };
    const merged: Block = {
      id: theirs.id,
      name: pick('name') as string,
      type: pick('type') as string,
      inputs: mergeRecord(b.inputs, m.inputs, theirs.inputs, (key, mv, tv) => clash(`inputs.${key}`)(mv, tv)) ?? {},
    };
    const note = pick('note');
    if (note !== undefined) merged.note = note;
    const display = mergeRecord(b.display, m.display, theirs.display, (key, mv, tv) => clash(`display.${key}`)(mv, tv));
    if (display && Object.keys(display).length) merged.display = display;
    blocks.push(merged);
  }
  // Blocks I added go after the block that preceded them in my document (or at the end).
  mine.blocks.forEach((block, index) => {
    if (baseById.has(block.id) || blocks.some((b) => b.id === block.id)) return;
    applied += 1;
    const previous = mine.blocks[index - 1];
    const at = previous ? blocks.findIndex((b) => b.id === previous.id) : -1;
    blocks.splice(at === -1 ? (previous ? blocks.length : 0) : at + 1, 0, block);
  });
  const title = mine.title !== base.title ? mine.title : latest.title;
  const site = !same(mine.site, base.site) ? mine.site : latest.site;
  const document = { ...latest, title, blocks } as D;
  if (site === undefined) delete (document as { site?: unknown }).site;
  else (document as { site?: unknown }).site = site;
  return { document, clashes, applied };
}
