/**
 * The CSV forms of a report (CONTRACT §6, §6b): results.csv, one row per output, and series.csv, one
 * series as x, y with the units in the header. RFC 4180: comma, CRLF, double quotes where needed
 * (papaparse). Numbers are written in full (JavaScript's shortest round-trip form), never rounded.
 */
import Papa from 'papaparse';
import type { SheetDocument, SheetResults } from '@/lib/engine';

export const RESULTS_CSV_COLUMNS = ['block', 'output', 'value', 'unit', 'si', 'siUnit', 'status', 'message', 'p2_5', 'p50', 'p97_5'] as const;

const cell = (value: unknown): string => (value === undefined || value === null ? '' : String(value));

type Spread = { p2_5?: number; p50?: number; p97_5?: number };

/** Rows in sheet order; a block in error or blocked is one row with no output and its message. */
export function resultsCsv(document: SheetDocument, results: SheetResults): string {
  const rows: string[][] = [];
  for (const block of document.blocks) {
    const result = results.blocks[block.name];
    if (!result) continue;
    if (result.status !== 'ok') {
      rows.push([block.name, '', '', '', '', '', result.status, cell(result.error), '', '', '']);
      continue;
    }
    const message = result.warnings.join('; ');
    for (const [output, value] of Object.entries(result.outputs)) {
      const spread = (value as { spread?: Spread }).spread;
      rows.push([
        block.name,
        output,
        cell(value.value),
        value.unit,
        cell(value.si),
        value.siUnit,
        result.status,
        message,
        cell(spread?.p2_5),
        cell(spread?.p50),
        cell(spread?.p97_5),
      ]);
    }
  }
  return `${Papa.unparse({ fields: [...RESULTS_CSV_COLUMNS], data: rows }, { newline: '\r\n' })}\r\n`;
}

export type SeriesLookup =
  | { ok: true; csv: string }
  | { ok: false; field: 'block' | 'series'; message: string };

/** One series of one block as "<xLabel> [<xUnit>],<yLabel> [<yUnit>]" and its rows. */
export function seriesCsv(results: SheetResults, blockName: string, seriesName: string): SeriesLookup {
  const block = results.blocks[blockName];
  if (!block) return { ok: false, field: 'block', message: `there is no block "${blockName}" in the results` };
  const series = block.series?.[seriesName];
  if (!series) {
    const names = Object.keys(block.series ?? {});
    return { ok: false, field: 'series', message: `block "${blockName}" has no series "${seriesName}" (its series: ${names.join(', ') || 'none'})` };
  }
  const header = [`${series.xLabel} [${series.xUnit}]`, `${series.yLabel} [${series.yUnit}]`];
  const n = Math.min(series.x.length, series.y.length);
  const rows: string[][] = [];
  for (let i = 0; i < n; i += 1) rows.push([String(series.x[i]), String(series.y[i])]);
  return { ok: true, csv: `${Papa.unparse({ fields: header, data: rows }, { newline: '\r\n' })}\r\n` };
}
