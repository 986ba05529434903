/**
 * The sheet document, `denudata-sheet@1`: its zod schema (structural faults only), parsing
 * with the first fault and its path, block-name checks and the document hash.
 */
import { createHash } from 'node:crypto';
import { z } from 'zod';
import { canonicalJson, canonicalString } from './canonical-json';
import { reservedNameReason } from './expression';
import { BLOCK_TYPE_IDS, getBlockType } from './registry';
import { safeText, TEXT_LIMITS } from './text';

export const SHEET_FORMAT = 'denudata-sheet@1';
export const BLOCK_NAME_PATTERN = /^[a-z][a-z0-9_]{0,39}$/;
export const QUANTITY_NAME_PATTERN = /^[A-Za-z][A-Za-z0-9_]{0,39}$/;

/** Why a block name cannot be used, or null when it is fine. */
export function checkBlockName(name: string): string | null {
  const cached = nameChecks.get(name);
  if (cached !== undefined) return cached;
  const problem = findNameProblem(name);
  if (nameChecks.size > 10_000) nameChecks.clear();
  nameChecks.set(name, problem);
  return problem;
}

const nameChecks = new Map<string, string | null>();

/** How many block names' answers are kept now (tests: the cache stays bounded). */
export function blockNameCheckCacheSize(): number {
  return nameChecks.size;
}

function findNameProblem(name: string): string | null {
  if (!BLOCK_NAME_PATTERN.test(name)) {
    return `"${name}" is not a valid block name: use 1–40 characters, lower-case letters, digits and _, starting with a letter`;
  }
  if (getBlockType(name)?.expressionFunction) {
    return `"${name}" cannot be a block name: it is a block type's function in expressions`;
  }
  const reason = reservedNameReason(name);
  return reason ? `"${name}" cannot be a block name: ${reason}` : null;
}

/** Names that would reach JavaScript object internals when used as name.parameter. */
const OBJECT_PROPERTY_NAMES = new Set(Object.getOwnPropertyNames(Object.prototype));

function checkInputKeys(block: { type: string; inputs: Record<string, string> }, ctx: z.RefinementCtx): void {
  const type = getBlockType(block.type);
  if (!type) return;
  const keys = Object.keys(block.inputs);
  if (type.id === 'note') {
    if (keys.length > 0) ctx.addIssue({ code: 'custom', path: ['inputs', keys[0]!], message: 'a note block takes no inputs; use {}' });
    return;
  }
  for (const key of keys) {
    if (type.freeInputs) {
      if (!QUANTITY_NAME_PATTERN.test(key)) {
        ctx.addIssue({ code: 'custom', path: ['inputs', key], message: `"${key}" is not a valid parameter name: use 1–40 letters, digits and _, starting with a letter` });
        return;
      }
      if (OBJECT_PROPERTY_NAMES.has(key)) {
        ctx.addIssue({ code: 'custom', path: ['inputs', key], message: `"${key}" is reserved; choose another parameter name` });
        return;
      }
    } else if (!type.inputs.some((spec) => spec.name === key)) {
      const known = type.inputs.map((spec) => spec.name).join(', ');
      ctx.addIssue({ code: 'custom', path: ['inputs', key], message: `unknown input "${key}" for a ${type.id} block (its inputs: ${known})` });
      return;
    }
  }
}

function checkDisplayKeys(block: { type: string; inputs: Record<string, string>; display?: Record<string, string> }, ctx: z.RefinementCtx): void {
  const type = getBlockType(block.type);
  if (!type || !block.display) return;
  const outputs = type.freeInputs ? Object.keys(block.inputs) : type.outputs.map((o) => o.name);
  for (const key of Object.keys(block.display)) {
    if (!outputs.includes(key)) {
      ctx.addIssue({
        code: 'custom',
        path: ['display', key],
        message: outputs.length > 0 ? `unknown output "${key}" (outputs: ${outputs.join(', ')})` : `a ${type.id} block has no outputs to display`,
      });
      return;
    }
  }
}

/** A key of inputs or display (`__proto__`, which zod's record would drop, is refused in checkSheetDocument). */
const inputKeySchema = z.string();

const blockSchema = z
  .strictObject({
    id: safeText({ error: 'id must be a string' }).min(1, 'id must not be empty').max(64, 'id must be at most 64 characters'),
    name: z.string({ error: 'name must be a string' }).superRefine((name, ctx) => {
      const problem = checkBlockName(name);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
    type: z.string({ error: 'type must be a string' }).superRefine((type, ctx) => {
      if (!getBlockType(type)) {
        ctx.addIssue({ code: 'custom', message: `unknown block type "${type}" (known: ${BLOCK_TYPE_IDS.join(', ')})` });
      }
    }),
    inputs: z.record(
      inputKeySchema,
      safeText({ multiline: true, error: 'each input must be an expression (a string)' }).max(TEXT_LIMITS.expression, `an expression has at most ${TEXT_LIMITS.expression} characters`),
      { error: 'inputs must be an object of expressions' },
    ),
    note: safeText({ multiline: true, error: 'note must be a string (markdown)' }).max(TEXT_LIMITS.blockNote, `a note has at most ${TEXT_LIMITS.blockNote} characters`).optional(),
    display: z.record(inputKeySchema, safeText({ error: 'each display unit must be a string' }).max(TEXT_LIMITS.displayUnit)).optional(),
  })
  .superRefine((block, ctx) => {
    checkInputKeys(block, ctx);
    checkDisplayKeys(block, ctx);
  });

const siteSchema = z.strictObject({
  name: safeText({ error: 'site.name must be a string' }).min(1, 'site name must not be empty').max(TEXT_LIMITS.siteName),
  latitude: z.number().min(-90).max(90).optional(),
  longitude: z.number().min(-180).max(180).optional(),
  notes: safeText({ multiline: true }).max(TEXT_LIMITS.siteNotes, `site notes have at most ${TEXT_LIMITS.siteNotes} characters`).optional(),
});

/** The document's uncertainty settings (CONTRACT §8.2); defaults are filled in by the engine. */
export const UNCERTAINTY_METHODS = ['monte_carlo', 'linear'] as const;
export const MIN_SAMPLES = 100;
export const MAX_SAMPLES = 100_000;
export const MAX_SEED = 4_294_967_295;
const SAMPLES_RULE = `samples must be an integer from ${MIN_SAMPLES} to ${MAX_SAMPLES}`;
const SEED_RULE = `seed must be an integer from 0 to ${MAX_SEED}`;
const uncertaintySchema = z.strictObject(
  {
    method: z.enum(UNCERTAINTY_METHODS, { error: 'method must be "monte_carlo" or "linear"' }).optional(),
    samples: z.number({ error: SAMPLES_RULE }).int(SAMPLES_RULE).min(MIN_SAMPLES, SAMPLES_RULE).max(MAX_SAMPLES, SAMPLES_RULE).optional(),
    seed: z.number({ error: SEED_RULE }).int(SEED_RULE).min(0, SEED_RULE).max(MAX_SEED, SEED_RULE).optional(),
  },
  { error: 'uncertainty must be an object {method, samples, seed}' },
);

/** The strict schema of a `denudata-sheet@1` document (structural faults only). */
export const sheetDocumentSchema = z
  .strictObject({
    format: z.literal(SHEET_FORMAT, { error: `format must be "${SHEET_FORMAT}"` }),
    title: safeText({ error: 'title must be a string' }).min(1, 'title must not be empty').max(TEXT_LIMITS.title, `title must be at most ${TEXT_LIMITS.title} characters`),
    site: siteSchema.optional(),
    blocks: z.array(blockSchema, { error: 'blocks must be a list' }),
    uncertainty: uncertaintySchema.optional(),
  })
  .superRefine((doc, ctx) => {
    const names = new Map<string, number>();
    const ids = new Map<string, number>();
    doc.blocks.forEach((block, i) => {
      if (ids.has(block.id)) {
        ctx.addIssue({ code: 'custom', path: ['blocks', i, 'id'], message: `duplicate id "${block.id}" (also blocks[${ids.get(block.id)}])` });
      } else ids.set(block.id, i);
      if (names.has(block.name)) {
        ctx.addIssue({ code: 'custom', path: ['blocks', i, 'name'], message: `duplicate name "${block.name}" (also blocks[${names.get(block.name)}])` });
      } else names.set(block.name, i);
    });
  });

export type SheetDocument = z.infer<typeof sheetDocumentSchema>;
export type SheetBlock = SheetDocument['blocks'][number];

function formatPath(path: readonly PropertyKey[]): string {
  let text = '';
  for (const part of path) {
    if (typeof part === 'number') text += `[${part}]`;
    else if (typeof part === 'string' && /^[A-Za-z_][A-Za-z0-9_]*$/.test(part)) text += text === '' ? part : `.${part}`;
    else text += `[${JSON.stringify(String(part))}]`;
  }
  return text;
}

export type ParseSheetResult = { ok: true; document: SheetDocument } | { ok: false; message: string; path: string };

/* ------------------------------------------------------------ canonical text */
// The canonical JSON of a validated document, written for its known shape: the same text as
// canonicalJson (tests/engine/canonical-json.test.ts compares them), in half the time, since
// the keys of the fixed objects are written in their sorted order instead of being sorted.
// Anything outside that shape (a key the schema does not know, a value of another type) is
// handed to canonicalJson, so the text stays exact even if the schema grows.

function countKeys(object: object): number {
  return Object.keys(object).length;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && typeof (value as { toJSON?: unknown }).toJSON !== 'function';
}

function canonicalRecord(record: Record<string, unknown>): string {
  const keys = Object.keys(record);
  if (keys.length > 1) keys.sort();
  let text = '{';
  let first = true;
  for (const key of keys) {
    const value = record[key];
    if (value === undefined || typeof value === 'symbol') continue;
    if (!first) text += ',';
    first = false;
    text += `${canonicalString(key)}:${typeof value === 'string' ? canonicalString(value) : canonicalJson(value)}`;
  }
  return `${text}}`;
}

function canonicalBlock(block: SheetBlock): string {
  const { id, name, type, inputs, note, display } = block;
  const known = 4 + (note !== undefined ? 1 : 0) + (display !== undefined ? 1 : 0);
  if (
    typeof id !== 'string' || typeof name !== 'string' || typeof type !== 'string' || !isRecord(inputs) ||
    (note !== undefined && typeof note !== 'string') || (display !== undefined && !isRecord(display)) ||
    countKeys(block) !== known
  ) {
    return canonicalJson(block);
  }
  // Sorted keys: display, id, inputs, name, note, type.
  let text = '{';
  if (display !== undefined) text += `"display":${canonicalRecord(display)},`;
  text += `"id":${canonicalString(id)},"inputs":${canonicalRecord(inputs)},"name":${canonicalString(name)}`;
  if (note !== undefined) text += `,"note":${canonicalString(note)}`;
  return `${text},"type":${canonicalString(type)}}`;
}

/** Canonical JSON text of a document that passed the schema (RFC 8785, as canonicalJson). */
export function canonicalSheetJson(document: SheetDocument): string {
  const { format, title, site, blocks, uncertainty } = document;
  const known = 3 + (site !== undefined ? 1 : 0) + (uncertainty !== undefined ? 1 : 0);
  if (typeof format !== 'string' || typeof title !== 'string' || !Array.isArray(blocks) || countKeys(document) !== known) {
    return canonicalJson(document);
  }
  // Sorted keys: blocks, format, site, title, uncertainty.
  let text = '{"blocks":[';
  for (let i = 0; i < blocks.length; i++) {
    const block = blocks[i];
    if (i > 0) text += ',';
    text += block !== null && typeof block === 'object' && !Array.isArray(block) ? canonicalBlock(block) : canonicalJson(block);
  }
  text += `],"format":${canonicalString(format)}`;
  if (site !== undefined) text += `,"site":${canonicalJson(site)}`;
  text += `,"title":${canonicalString(title)}`;
  if (uncertainty !== undefined) text += `,"uncertainty":${canonicalJson(uncertainty)}`;
  return `${text}}`;
}

/** Where a block's inputs or display hold an own `__proto__` key (JSON.parse makes one; zod would drop it). */
function findPrototypeKey(input: unknown): string | null {
  if (!isRecord(input) || !Array.isArray(input.blocks)) return null;
  for (let i = 0; i < input.blocks.length; i++) {
    const block: unknown = input.blocks[i];
    if (!isRecord(block)) continue;
    for (const part of ['inputs', 'display'] as const) {
      const record = block[part];
      if (isRecord(record) && Object.prototype.hasOwnProperty.call(record, '__proto__')) return `blocks[${i}].${part}["__proto__"]`;
    }
  }
  return null;
}

/** A validated document with its canonical JSON text (computed once, for the hash). */
export type CheckedSheetResult =
  | { ok: true; document: SheetDocument; canonical: string }
  | { ok: false; message: string; path: string };

/**
 * Validates a document and returns its canonical JSON text as well: the lone-surrogate check
 * needs that text anyway, and the hash of the results is computed from it, so an evaluation
 * serialises the document once.
 */
export function checkSheetDocument(input: unknown): CheckedSheetResult {
  const protoPath = findPrototypeKey(input);
  if (protoPath) return { ok: false, message: '"__proto__" is not allowed as a key', path: protoPath };
  const parsed = sheetDocumentSchema.safeParse(input);
  if (parsed.success) {
    let canonical: string;
    try {
      canonical = canonicalSheetJson(parsed.data);
    } catch {
      return { ok: false, message: 'the document holds text that is not valid Unicode (an unpaired surrogate)', path: '' };
    }
    return { ok: true, document: parsed.data, canonical };
  }
  const issue = parsed.error.issues[0]!;
  const path = formatPath(issue.path);
  let message = issue.message;
  if (issue.code === 'unrecognized_keys') message = `unknown key${issue.keys.length > 1 ? 's' : ''}: ${issue.keys.join(', ')}`;
  return { ok: false, message, path };
}

/** Validates a document; on failure reports the first fault and where it is, e.g. blocks[2].name. */
export function parseSheetDocument(input: unknown): ParseSheetResult {
  const checked = checkSheetDocument(input);
  return checked.ok ? { ok: true, document: checked.document } : checked;
}

/** Lowercase hex SHA-256 of a document's canonical JSON text. */
export function hashCanonicalText(canonical: string): string {
  return createHash('sha256').update(canonical, 'utf8').digest('hex');
}

/** Lowercase hex SHA-256 of the document's RFC 8785 canonical JSON (as the canonicalize package). */
export function hashSheetDocument(document: SheetDocument): string {
  return hashCanonicalText(canonicalJson(document));
}
