import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { hashDataset } from '@/lib/engine/dataset';
import { checkUnitDimension } from '@/lib/engine';
import { canonicalCsv, checkCanonicalDataset } from '@/lib/datasets/canonical';
import { parseDatasetFile, parseDatasetText } from '@/lib/datasets/parse';
import { DATASET_REASONS, type DatasetReason } from '@/lib/datasets/problems';
import cases from '../fixtures/datasets/cases.json';

// Validation rules: CONTRACT §7.2–§7.4 (the product's binding format). The canonical form and hash are
// checked against the public reference case P40 (source: RFC 4180, RFC 8785, FIPS 180-4; copied into
// tests/fixtures/datasets with its two files).
const fixture = (name: string) => readFileSync(path.join(__dirname, '../fixtures/datasets', name));
const p40 = cases.cases.find((c) => c.id === 'P40')!;
const p40Expected = p40.expected as Record<string, { value: unknown }>;

type Row = { line: number; column: number | null; reason: DatasetReason };
function problems(text: string | Uint8Array, kind: 'slope_profile' | 'long_profile' = 'slope_profile'): Row[] {
  const result = typeof text === 'string' ? parseDatasetText(text, kind) : parseDatasetFile(text, kind);
  if (result.ok) throw new Error('expected the file to be refused');
  return result.problems.map(({ line, column, reason }) => ({ line, column, reason }));
}

const GOOD = 'distance [m],elevation [m]\n0,10\n1,10.5\n2,11\n';

describe('parseDatasetFile: the reference case P40 (RFC 4180, RFC 8785, FIPS 180-4)', () => {
  it('should give the exact canonical JSON, hash, canonical CSV and row count for file a', () => {
    const result = parseDatasetFile(fixture('p40-hollin-moor-a.csv'), 'slope_profile');
    if (!result.ok) throw new Error(result.message);
    expect(result.canonicalJson).toBe(p40Expected['dataset.canonical_json']!.value);
    expect(result.sha256).toBe(p40Expected['dataset.sha256']!.value);
    expect(result.rowCount).toBe(p40Expected['dataset.rowCount']!.value);
    expect(canonicalCsv(result.dataset)).toBe(p40Expected['dataset.canonical_csv']!.value);
    expect(hashDataset(result.dataset)).toBe(result.sha256);
  });

  it('should give the same hash for file b (BOM, CRLF, semicolons, quoted and reordered header, blank line, other number spellings)', () => {
    const result = parseDatasetFile(fixture('p40-hollin-moor-b.csv'), 'slope_profile');
    if (!result.ok) throw new Error(result.message);
    expect(result.sha256).toBe(p40Expected['dataset.sha256']!.value);
    expect(result.canonicalJson).toBe(p40Expected['dataset.canonical_json']!.value);
  });

  it('should re-read its canonical CSV to the same hash', () => {
    const first = parseDatasetFile(fixture('p40-hollin-moor-b.csv'), 'slope_profile');
    if (!first.ok) throw new Error(first.message);
    const again = parseDatasetText(canonicalCsv(first.dataset), 'slope_profile');
    expect(again.ok && again.sha256).toBe(first.sha256);
  });

  it('should give a different hash for a different declared unit or kind (P40 note: the unit is inside the hash)', () => {
    const metres = parseDatasetText(GOOD, 'slope_profile');
    const km = parseDatasetText(GOOD.replace('distance [m]', 'distance [km]'), 'slope_profile');
    const feet = parseDatasetText(GOOD.replace('elevation [m]', 'elevation [ft]'), 'slope_profile');
    expect(metres.ok && km.ok && feet.ok).toBe(true);
    if (!metres.ok || !km.ok || !feet.ok) return;
    expect(new Set([metres.sha256, km.sha256, feet.sha256]).size).toBe(3);
    expect(km.dataset.columns[0]).toEqual({ name: 'distance', unit: 'km' });
  });

  it('should collapse runs of spaces inside the unit and accept the reference hashes of P41, P46 and P47 files', () => {
    const spaced = parseDatasetText('distance [ m ],discharge [ m^2 /  yr ],elevation[m]\n0,1,2\n1,1,2\n2,1,2\n', 'long_profile');
    expect(spaced.ok && spaced.dataset.columns).toEqual([
      { name: 'distance', unit: 'm' },
      { name: 'elevation', unit: 'm' },
      { name: 'discharge', unit: 'm^2 / yr' },
    ]);
    for (const [id, file, kind] of [
      ['P41', 'p41-p06-profile.csv', 'slope_profile'],
      ['P46', 'p46-p10-long-profile.csv', 'long_profile'],
      ['P47', 'p47-tarrow-creek.csv', 'long_profile'],
    ] as const) {
      const c = cases.cases.find((x) => x.id === id)!;
      const expectedHash = Object.keys(c.datasets as Record<string, unknown>)[0];
      const result = parseDatasetFile(fixture(file), kind);
      expect(result.ok && result.sha256, id).toBe(expectedHash);
    }
  });
});

describe('parseDatasetFile: every reason of CONTRACT §7.3 with its line and column', () => {
  it('should know exactly the reasons of the contract', () => {
    expect(DATASET_REASONS).toHaveLength(22);
  });

  it('encoding: invalid UTF-8 on line 3, and a NUL byte on line 2', () => {
    const bytes = Buffer.concat([Buffer.from('distance [m],elevation [m]\n0,1\n1,'), Buffer.from([0xff]), Buffer.from('2\n2,3\n')]);
    expect(problems(bytes)).toEqual([{ line: 3, column: null, reason: 'encoding' }]);
    const nul = Buffer.from('distance [m],elevation [m]\n0,\u00001\n1,2\n2,3\n');
    expect(problems(nul)).toEqual([{ line: 2, column: null, reason: 'encoding' }]);
    // An overlong form (C0 80) and a lone surrogate (ED A0 80) are not UTF-8 either.
    expect(problems(Buffer.from([0x64, 0xc0, 0x80]))).toEqual([{ line: 1, column: null, reason: 'encoding' }]);
    expect(problems(Buffer.concat([Buffer.from('a\nb\n'), Buffer.from([0xed, 0xa0, 0x80])]))).toEqual([{ line: 3, column: null, reason: 'encoding' }]);
  });

  it('line_ending: a CR inside line 3 (CRLF elsewhere is fine)', () => {
    expect(problems('distance [m],elevation [m]\r\n0,1\r\n1,2\r3\r\n2,3\r\n4,5\r\n')).toEqual([{ line: 3, column: null, reason: 'line_ending' }]);
  });

  it('empty: nothing but blank lines', () => {
    expect(problems('')).toEqual([{ line: 1, column: null, reason: 'empty' }]);
    expect(problems('\n  \t\n\n')).toEqual([{ line: 1, column: null, reason: 'empty' }]);
  });

  it('delimiter: neither or both in the header (after two blank lines, so line 3)', () => {
    expect(problems('\n\ndistance [m] elevation [m]\n0 1\n')).toEqual([{ line: 3, column: null, reason: 'delimiter' }]);
    expect(problems('distance [m],elevation [m];elevation_sd [m]\n')).toEqual([{ line: 1, column: null, reason: 'delimiter' }]);
  });

  it('quote: unterminated, inside an unquoted field, text after a closing quote (with the field\'s column)', () => {
    expect(problems('distance [m],elevation [m]\n0,1\n1,"2\n2,3\n3,4\n')).toEqual([{ line: 3, column: 2, reason: 'quote' }]);
    expect(problems('distance [m],elevation [m]\n0,1\n1,2\n2,3"\n3,4\n')).toEqual([{ line: 4, column: 2, reason: 'quote' }]);
    expect(problems('distance [m],elevation [m]\n"0"x,1\n1,2\n2,3\n')).toEqual([{ line: 2, column: 1, reason: 'quote' }]);
    // A quote error in the header stops validation before the rows.
    expect(problems('"distance [m],elevation [m]\n0,1\n')).toEqual([{ line: 1, column: 1, reason: 'quote' }]);
    expect(problems('distance [m],"elevation [m]"x\n0,1\n')).toEqual([{ line: 1, column: 2, reason: 'quote' }]);
  });

  it('header_format: a cell not of the form name [unit]', () => {
    expect(problems('distance [m],elevation\n0,1\n1,2\n2,3\n')).toEqual([{ line: 1, column: 2, reason: 'header_format' }, { line: 1, column: null, reason: 'missing_column' }]);
    expect(problems('distance [m],[m]\n0,1\n')).toEqual([{ line: 1, column: 2, reason: 'header_format' }, { line: 1, column: null, reason: 'missing_column' }]);
  });

  it('unknown_column and duplicate_column: a misspelt elevation_sd is an error, never dropped', () => {
    expect(problems('distance [m],elevation [m],elevaton_sd [m]\n0,1,1\n1,2,1\n2,3,1\n')).toEqual([{ line: 1, column: 3, reason: 'unknown_column' }]);
    expect(problems('distance [m],elevation [m],Distance [km]\n0,1,1\n')).toEqual([{ line: 1, column: 3, reason: 'duplicate_column' }]);
    // discharge is a long_profile column only.
    expect(problems('distance [m],elevation [m],discharge [m^2/s]\n0,1,1\n')).toEqual([{ line: 1, column: 3, reason: 'unknown_column' }]);
  });

  it('unknown_unit and wrong_dimension: units the engine parses, of the column\'s dimension', () => {
    expect(problems('distance [mtr],elevation [m]\n0,1\n')).toEqual([{ line: 1, column: 1, reason: 'unknown_unit' }]);
    expect(problems('distance [m],elevation []\n0,1\n')).toEqual([{ line: 1, column: 2, reason: 'unknown_unit' }]);
    expect(problems('distance [m],elevation [s]\n0,1\n')).toEqual([{ line: 1, column: 2, reason: 'wrong_dimension' }]);
    expect(problems('distance [m],elevation [m],drainage_area [km]\n0,1,1\n', 'long_profile')).toEqual([{ line: 1, column: 3, reason: 'wrong_dimension' }]);
    expect(problems('distance [m],elevation [m],discharge [m^3/s]\n0,1,1\n', 'long_profile')).toEqual([{ line: 1, column: 3, reason: 'wrong_dimension' }]);
  });

  it('missing_column: a required column is absent (column null)', () => {
    expect(problems('distance [m];elevation_sd [m]\n0;1\n')).toEqual([{ line: 1, column: null, reason: 'missing_column' }]);
    expect(problems('distance [m],elevation [m]\n0,1\n1,2\n2,3\n', 'long_profile')).toEqual([{ line: 1, column: null, reason: 'missing_column' }]);
  });

  it('conflicting_columns: both drainage_area and discharge, on the second', () => {
    expect(problems('discharge [m^2/yr],distance [m],elevation [m],drainage_area [km^2]\n1,0,1,1\n', 'long_profile')).toEqual([
      { line: 1, column: 4, reason: 'conflicting_columns' },
    ]);
  });

  it('field_count: more or fewer fields than the header (column null, row not checked further)', () => {
    expect(problems('distance [m],elevation [m]\n0,1\n1,2,3\nx\n3,4\n')).toEqual([
      { line: 3, column: null, reason: 'field_count' },
      { line: 4, column: null, reason: 'field_count' },
    ]);
  });

  it('missing_value, not_a_number and decimal_comma', () => {
    expect(problems('distance [m],elevation [m]\n0,1\n1, \n2,3\n')).toEqual([{ line: 3, column: 2, reason: 'missing_value' }]);
    expect(problems('distance [m],elevation [m]\n0,NaN\nInf,2\n2,0x10\n3,1 000\n')).toEqual([
      { line: 2, column: 2, reason: 'not_a_number' },
      { line: 3, column: 1, reason: 'not_a_number' },
      { line: 4, column: 2, reason: 'not_a_number' },
      { line: 5, column: 2, reason: 'not_a_number' },
    ]);
    expect(problems('distance [m];elevation [m]\n0;1\n1;2\n2;3\n3;4\n4;5\n5;6\n6;12,5\n')).toEqual([{ line: 8, column: 2, reason: 'decimal_comma' }]);
  });

  it('should say "3 problems; the first: line 7, column 2 (elevation): decimal comma in \'12,5\' …" as the contract shows', () => {
    const result = parseDatasetText('distance [m];elevation [m]\n0;1\n1;2\n2;3\n3;4\n4;5\n6;12,5\n7;x\n8;\n', 'slope_profile');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.message).toBe("3 problems; the first: line 7, column 2 (elevation): decimal comma in '12,5' (use a decimal point)");
    expect(result.problems[0]).toMatchObject({ line: 7, column: 2, name: 'elevation', reason: 'decimal_comma' });
  });

  it('out_of_range: above 1e300, or overflow', () => {
    expect(problems('distance [m],elevation [m]\n0,1\n1,1e999\n2,-2e300\n3,1e300\n')).toEqual([
      { line: 3, column: 2, reason: 'out_of_range' },
      { line: 4, column: 2, reason: 'out_of_range' },
    ]);
  });

  it('not_positive and negative: elevation_sd or drainage_area ≤ 0, discharge < 0', () => {
    expect(problems('distance [m],elevation [m],elevation_sd [m]\n0,1,0.1\n1,2,0\n2,3,-0.1\n')).toEqual([
      { line: 3, column: 3, reason: 'not_positive' },
      { line: 4, column: 3, reason: 'not_positive' },
    ]);
    expect(problems('distance [m],elevation [m],drainage_area [km^2]\n0,1,0\n1,2,1\n2,3,1\n', 'long_profile')).toEqual([{ line: 2, column: 3, reason: 'not_positive' }]);
    expect(problems('distance [m],elevation [m],discharge [m^2/yr]\n0,1,0\n1,2,-1\n2,3,1\n', 'long_profile')).toEqual([{ line: 3, column: 3, reason: 'negative' }]);
  });

  it('not_increasing: compared with the previous row\'s valid distance', () => {
    expect(problems('elevation [m],distance [m]\n1,0\n2,5\n3,5\n4,4\n5,6\n')).toEqual([
      { line: 4, column: 2, reason: 'not_increasing' },
      { line: 5, column: 2, reason: 'not_increasing' },
    ]);
  });

  it('too_few_rows: fewer than 3 data rows, on the line of the last row', () => {
    expect(problems('distance [m],elevation [m]\n0,1\n\n1,2\n\n')).toEqual([{ line: 4, column: null, reason: 'too_few_rows' }]);
    expect(problems('distance [m],elevation [m]\n')).toEqual([{ line: 1, column: null, reason: 'too_few_rows' }]);
  });

  it('too_many_rows: more than 20,000 rows, on the first excess row, and validation stops', () => {
    const lines = ['distance [m],elevation [m]'];
    for (let i = 0; i < 20_005; i++) lines.push(i === 20_003 ? 'x,1' : `${i},1`);
    expect(problems(`${lines.join('\n')}\n`)).toEqual([{ line: 20_002, column: null, reason: 'too_many_rows' }]);
    const exact = parseDatasetText(`${lines.slice(0, 20_001).join('\n')}\n`, 'slope_profile');
    expect(exact.ok && exact.rowCount).toBe(20_000);
  });

  it('should sort rows by line then column (null last), report at most 100 and say when more exist', () => {
    const lines = ['distance [m],elevation [m]'];
    for (let i = 0; i < 150; i++) lines.push('a,b');
    const result = parseDatasetText(`${lines.join('\n')}\n`, 'slope_profile');
    if (result.ok) throw new Error('expected a refusal');
    expect(result.total).toBe(300);
    expect(result.problems).toHaveLength(100);
    expect(result.truncated).toBe(true);
    expect(result.problems.slice(0, 3).map((p) => [p.line, p.column])).toEqual([[2, 1], [2, 2], [3, 1]]);
    const few = parseDatasetText('distance [m],elevation [m]\n0,1\n1,2,3\n', 'slope_profile');
    expect(!few.ok && few.problems.map((p) => [p.line, p.column, p.reason])).toEqual([
      [3, null, 'field_count'],
      [3, null, 'too_few_rows'],
    ]);
    expect(!few.ok && few.truncated).toBe(false);
  });
});

describe('checkCanonicalDataset: canonical forms from bundles and folders', () => {
  const good = parseDatasetFile(fixture('p40-hollin-moor-a.csv'), 'slope_profile');
  if (!good.ok) throw new Error('fixture');

  it('should accept the canonical form as an object or text and recompute its hash', () => {
    expect(checkCanonicalDataset(good.dataset, good.sha256)).toMatchObject({ ok: true, sha256: good.sha256 });
    expect(checkCanonicalDataset(good.canonicalJson)).toMatchObject({ ok: true, sha256: good.sha256 });
  });

  it('should refuse a wrong hash, a non-canonical column order, and data that would fail an upload', () => {
    expect(checkCanonicalDataset(good.dataset, '0'.repeat(64)).ok).toBe(false);
    const reordered = { ...good.dataset, columns: [good.dataset.columns[1], good.dataset.columns[0], good.dataset.columns[2]] };
    expect(checkCanonicalDataset(reordered).ok).toBe(false);
    const decreasing = { ...good.dataset, rows: [...good.dataset.rows].reverse() };
    expect(checkCanonicalDataset(decreasing)).toMatchObject({ ok: false });
    expect(checkCanonicalDataset({ ...good.dataset, extra: 1 }).ok).toBe(false);
  });
});

describe('checkUnitDimension (engine)', () => {
  it('should compare by dimension and give the factor to SI', () => {
    expect(checkUnitDimension('km', 'length')).toEqual({ ok: true, toSI: 1000 });
    expect(checkUnitDimension('ft', 'length')).toMatchObject({ ok: true, toSI: 0.3048 }); // international foot, exact (common practice)
    expect(checkUnitDimension('km^2', 'area')).toEqual({ ok: true, toSI: 1e6 });
    // The hectare by its symbol and its name: 1 ha = 10^4 m^2 (SI Brochure, 9th ed., 2019, Table 8).
    expect(checkUnitDimension('ha', 'area')).toEqual({ ok: true, toSI: 1e4 });
    expect(checkUnitDimension('hectare', 'area')).toEqual({ ok: true, toSI: 1e4 });
    expect(checkUnitDimension('ha', 'length')).toMatchObject({ ok: false, reason: 'wrong_dimension' });
    expect(checkUnitDimension('m^2/yr', 'area_per_time')).toMatchObject({ ok: true, toSI: 1 / 31_557_600 });
    expect(checkUnitDimension('m^3/s/m', 'area_per_time')).toMatchObject({ ok: true, toSI: 1 });
    expect(checkUnitDimension('2 m', 'length')).toMatchObject({ ok: false, reason: 'unknown_unit' });
    expect(checkUnitDimension('m', 'area')).toMatchObject({ ok: false, reason: 'wrong_dimension' });
  });
});
