import 'server-only';
import { createHash } from 'node:crypto';
import { STANDING_CAUTION } from '@/lib/engine/block-type';
import { blockCatalog } from '@/lib/engine';
import { COMMON_FUNCTIONS, COMMON_UNITS } from './vocabulary';
import type { BlockCatalogData, CatalogType } from './types';

let cached: BlockCatalogData | null = null;
let published: { version: string; body: string } | null = null;

/** The engine's block catalog reshaped for the client (plain JSON, no engine code). */
export function clientCatalog(): BlockCatalogData {
  if (cached) return cached;
  const types: CatalogType[] = blockCatalog().map((type) => ({
    id: type.id,
    title: type.title,
    purpose: type.purpose,
    formula: type.formula.text,
    sources: type.sources,
    inputs: type.inputs.map((input) => ({
      name: input.name,
      label: input.label,
      ...(input.symbol ? { symbol: input.symbol } : {}),
      dimension: input.dimension.key,
      dimensionSymbol: input.dimension.symbol,
      ...(input.default !== undefined ? { default: input.default } : {}),
      ...(input.optional ? { optional: true } : {}),
      ...(input.range ? { range: input.range.text } : {}),
      ...(input.unitHint ? { unitHint: input.unitHint } : {}),
      ...(input.typical ? { typical: `${input.typical.text} (${input.typical.source})` } : {}),
      ...(input.choices ? { choices: [...input.choices] } : {}),
      ...(input.datasetKind ? { datasetKind: input.datasetKind } : {}),
      help: input.help,
    })),
    freeInputs: type.freeInputs,
    outputs: type.outputs.map((o) => ({ name: o.name, label: o.label, unit: o.unit, kind: o.kind, description: o.description })),
    series: type.series.map((s) => ({ name: s.name, label: s.label, xLabel: s.xLabel, yLabel: s.yLabel, xUnit: s.xUnit, yUnit: s.yUnit })),
    validity: type.validity,
    cautions: type.cautions,
    warnings: type.warnings,
    example: type.example
      ? { inputs: type.example.inputs, output: type.example.output, expected: { value: type.example.expected.value, unit: type.example.expected.unit }, source: type.example.source }
      : null,
    expressionFunction: type.expressionFunction !== null,
  }));
  cached = {
    types,
    units: [...COMMON_UNITS],
    functions: [...COMMON_FUNCTIONS, ...types.filter((t) => t.expressionFunction).map((t) => t.id)],
    standingCaution: STANDING_CAUTION,
  };
  return cached;
}

/**
 * The catalog as the client downloads it (`GET /api/catalog`): its JSON text and a version (a hash of
 * that text), so a page can name the exact catalog it was rendered with and the browser can keep it for
 * good. The catalog is ~100 kB; it used to travel inside every sheet page's React payload. Also published
 * on globalThis for the server-side render of the sheet workspace (components/sheet/use-block-catalog.ts),
 * which runs in this same process and needs the same data without it passing through the payload.
 */
export function publishedCatalog(): { version: string; body: string } {
  if (published) return published;
  const catalog = clientCatalog();
  const body = JSON.stringify(catalog);
  const version = createHash('sha256').update(body).digest('hex').slice(0, 16);
  published = { version, body };
  (globalThis as Record<symbol, unknown>)[Symbol.for('denudata.blockCatalog')] = { version, catalog };
  return published;
}
