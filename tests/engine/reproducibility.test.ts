import { describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import {
  evaluateQuick,
  evaluateSheet,
  evaluateSheetIncremental,
  type SheetBlock,
  type SheetDocument,
  type SheetResults,
} from '@/lib/engine';
import { RESULT_UNIT_RULE } from '@/lib/engine/block-type';
import { math } from '@/lib/engine/expression';
import { BLOCK_TYPES } from '@/lib/engine/registry';
import { expectClose } from '../support/approx';
import { sheet } from '../support/engine-sheets';

// Results of a stored revision must come out the same whatever the process evaluated before.
// mathjs (15.2) shows a product or quotient of quantities through Unit.simplify(), which takes
// its units from the current unit system; its default "auto" system is rewritten by every
// Unit.parse(), so the unit shown used to follow the last unit name parsed anywhere in the
// worker. The engine fixes the SI system (lib/engine/expression.ts). These checks evaluate,
// run unrelated calculations in assorted units, evaluate again and require the same bytes.

/** Unrelated quick calculations, each parsing units of many kinds (power, energy, pressure, ...). */
const QUICK_BATCH = [
  '1 hp', '1 W', '3 BTU', '2 psi', '1 acre', '12 ft', '3 mi', '1 lbf', '760 mmHg', '1 kWh', '2 Wh', '1 gallon', '3 L',
  '50 degF', '1 hr', '2 day', '1 week', '4 inch', '1 yd', '1 lb', '1 ton', '1 erg', '1 dyn', '1 bar', '1 atm',
  '1 torr', '1 hectare', '50 Hz', '1 kip', '1 cc', '1 um', '1 g', '1 kN', '2 MPa', '1 kJ', '1 eV', '1 mm', '1 kyr',
  '1 Ma', '1 km', '1 cm', '3 BTU/hr', '2 psi * 3 acre', '1 hp * 1 hr', '1 lbf * 1 ft', '1 kip / (1 inch^2)',
  '5 mi / (1 hr)', '1 acre * 1 ft', '1 kWh / (1 day)', '1 hp + 1 W', '2 ft * 3 ft', '(1 mm/yr) * (1 kyr)',
];

function runQuickBatch(order: 'forward' | 'reverse'): string {
  const batch = order === 'forward' ? QUICK_BATCH : [...QUICK_BATCH].reverse();
  const answers = batch.map((expr) => [expr, evaluateQuick(expr)] as const);
  if (order === 'reverse') answers.reverse();
  return JSON.stringify(answers);
}

/**
 * Formulas whose unit mathjs chooses (no display unit): powers, pressures, forces, areas,
 * volumes and lengths built from products and quotients, including of other blocks' outputs.
 */
const probe: SheetDocument = sheet([
  { id: 'pump', name: 'pump', type: 'quantities', inputs: { p: '1 hp', head: '12 ft', area: '1 acre', K: '1.2 m^2/kyr', t: '3 kyr' } },
  { id: 'heat', name: 'heat', type: 'formula', inputs: { expr: '(2 J) / (1 s)' } },
  { id: 'force', name: 'force', type: 'formula', inputs: { expr: '(2 kg) * (9.81 m/s^2)' } },
  { id: 'stress', name: 'stress', type: 'formula', inputs: { expr: 'force.value / (2 m^2)' } },
  { id: 'plot', name: 'plot', type: 'formula', inputs: { expr: 'pump.head * pump.head' } },
  { id: 'fill', name: 'fill', type: 'formula', inputs: { expr: 'pump.area * pump.head' } },
  { id: 'spread', name: 'spread', type: 'formula', inputs: { expr: 'sqrt(pump.K * pump.t)' } },
  { id: 'ktp', name: 'k_times_t', type: 'formula', inputs: { expr: 'pump.K * pump.t' } },
  { id: 'work', name: 'work', type: 'formula', inputs: { expr: 'pump.p * (2 hr)' } },
  { id: 'rate', name: 'rate', type: 'formula', inputs: { expr: 'pump.p / (3 m)' } },
]);

/** Each type's worked example as a one-block sheet (as tests/engine/registry.test.ts runs it). */
const exampleSheets: Array<{ key: string; document: SheetDocument }> = BLOCK_TYPES.filter((type) => type.example).map((type) => ({
  key: `example:${type.id}`,
  document: sheet([{ id: 'ex', name: 'example', type: type.id, inputs: type.example!.inputs }]),
}));

const ALL_SHEETS: Array<{ key: string; document: SheetDocument }> = [
  ...DEMO_SHEETS.map((demo) => ({ key: demo.key, document: demo.document })),
  ...exampleSheets,
  { key: 'probe', document: probe },
];

function evaluateAll(order: 'forward' | 'reverse'): string {
  const list = order === 'forward' ? ALL_SHEETS : [...ALL_SHEETS].reverse();
  const results = new Map(list.map(({ key, document }) => [key, evaluateSheet(document)]));
  return JSON.stringify(ALL_SHEETS.map(({ key }) => [key, results.get(key)]));
}

/** The same document with one block's non-empty inputs wrapped in parentheses (same values). */
function touch(document: SheetDocument, id: string): SheetDocument {
  const edited = structuredClone(document);
  const block = edited.blocks.find((b) => b.id === id)!;
  for (const name of Object.keys(block.inputs)) {
    // A data input is exactly dataset("<sha256>") (CONTRACT §7.6), so it cannot be wrapped.
    if (block.inputs[name]!.trim() !== '' && !/^\s*dataset\(/.test(block.inputs[name]!)) block.inputs[name] = `(${block.inputs[name]})`;
  }
  return edited;
}

function outputsOf(results: SheetResults): string {
  return JSON.stringify(results.blocks);
}

describe('reproducibility of results across evaluation history', () => {
  it('should fix the unit system to SI and refuse to change it', () => {
    runQuickBatch('forward');
    expect(math.Unit.getUnitSystem()).toBe('si');
    expect(() => math.Unit.setUnitSystem('us')).toThrow(/fixed/);
    expect(math.Unit.getUnitSystem()).toBe('si');
  });

  it('should show the same unit in incremental and full evaluation after a quick calculation in another unit (the reported case)', () => {
    const doc = sheet([
      { id: 'pump', name: 'pump', type: 'quantities', inputs: { p: '1 hp' } },
      { id: 'heat', name: 'heat', type: 'formula', inputs: { expr: '(2 J) / (1 s)' } },
    ]);
    const previous = evaluateSheet(doc);
    // SI Brochure (BIPM, 9th ed. 2019, Table 4): W = J/s.
    expect(previous.blocks.heat!.outputs.value).toEqual({ value: 2, unit: 'W', si: 2, siUnit: '(kg m^2) / s^3' });
    evaluateQuick('1 W');
    const edited = structuredClone(doc);
    edited.blocks[1]!.inputs.expr = '(4 J) / (2 s)';
    const incremental = evaluateSheetIncremental(edited, previous, ['heat']);
    expect(incremental.evaluatedBlockIds).toEqual(['heat']);
    const full = evaluateSheet(edited);
    expect(JSON.stringify(incremental.results)).toBe(JSON.stringify(full));
    expect(full.blocks.heat!.outputs.value!.unit).toBe('W');
    // The other way round: a quick calculation in hp must not turn the next power into hp.
    evaluateQuick('1 hp');
    const again = evaluateSheetIncremental(doc, full, ['heat']);
    expect(JSON.stringify(again.results.blocks)).toBe(JSON.stringify(previous.blocks));
    expect(JSON.stringify(evaluateSheet(doc))).toBe(JSON.stringify(previous));
  });

  it('should give byte-identical results for every demo sheet and worked example before and after unrelated calculations', () => {
    const first = evaluateAll('forward');
    const quickFirst = runQuickBatch('forward');
    const second = evaluateAll('reverse');
    const quickSecond = runQuickBatch('reverse');
    const third = evaluateAll('forward');
    expect(second).toBe(first);
    expect(third).toBe(first);
    expect(quickSecond).toBe(quickFirst);
    // Each sheet alone, right after a quick calculation in a unit of a kind it shows, gives the same bytes too.
    const before = JSON.parse(first) as Array<[string, SheetResults]>;
    for (const [index, { key, document }] of ALL_SHEETS.entries()) {
      evaluateQuick(QUICK_BATCH[index % QUICK_BATCH.length]!);
      evaluateQuick('1 ft * 1 psi');
      expect(JSON.stringify(evaluateSheet(document)), key).toBe(JSON.stringify(before[index]![1]));
    }
  });

  it('should show derived results of the probe sheet in SI units, whatever ran before', () => {
    for (const warmUp of ['1 BTU/hr', '1 hp', '1 psi', '1 acre', '1 ft', '1 mm', '1 dyn', '1 erg', '1 kyr', '1 hr']) {
      evaluateQuick(warmUp);
      const results = evaluateSheet(probe).blocks;
      const shown = Object.fromEntries(Object.entries(results).map(([name, r]) => [name, r.outputs.value?.unit]));
      expect(shown, `after ${warmUp}`).toEqual({
        pump: undefined,
        heat: 'W', // J/s (SI Brochure, BIPM 9th ed. 2019, Table 4)
        force: 'N', // kg m/s^2 (SI Brochure Table 4)
        stress: 'Pa', // N/m^2 (SI Brochure Table 4)
        plot: 'm^2', // ft^2: no named unit for an area, so SI base units
        fill: 'm^3',
        spread: 'm',
        k_times_t: 'm^2',
        work: 'J', // W s
        rate: 'hp / m', // W/m has no named unit and three base units (kg m s^-3) are not fewer than two
      });
      // 12 ft = 3.6576 m exactly (international foot, 0.3048 m; NIST SP 811, Appendix B).
      expectClose(results.plot!.outputs.value!.value, 3.6576 ** 2, 1e-12);
      expectClose(results.k_times_t!.outputs.value!.value, 3.6, 1e-12); // 1.2 m^2/kyr × 3 kyr
      expectClose(results.stress!.outputs.value!.value, 9.81, 1e-12); // 2 kg × 9.81 m/s^2 / 2 m^2
    }
  });

  it('should hold to the examples the help gives for the unit of a result without a display unit', () => {
    // The rule as RESULT_UNIT_RULE states it (mathjs 15.2 Unit.simplify with its SI unit system).
    // Foot 0.3048 m exactly (NIST SP 811, Appendix B); W = J/s (SI Brochure Table 4); yr = 365.25 d.
    const cases: Array<{ expr: string; value: number; unit: string; quoted: string }> = [
      { expr: '1 hp', value: 1, unit: 'hp', quoted: '1 hp' },
      { expr: '3 ft * 2', value: 6, unit: 'ft', quoted: '3 ft * 2 gives 6 ft' },
      { expr: '(2 J) / (1 s)', value: 2, unit: 'W', quoted: '(2 J) / (1 s) gives 2 W' },
      { expr: '2 ft * 3 ft', value: 6 * 0.3048 ** 2, unit: 'm^2', quoted: '2 ft * 3 ft gives about 0.557 m^2' },
      { expr: '3 m / (2 yr)', value: 1.5, unit: 'm / yr', quoted: '3 m / (2 yr) gives 1.5 m / yr' },
      { expr: '2 ft * 3 ft to ft^2', value: 6, unit: 'ft^2', quoted: 'a conversion with to keeps its target unit' },
      // mathjs 15.2 defines hp as 745.6998715386 W (NIST SP 811: 745.699 87 W).
      { expr: '1 hp + 1 W', value: 1 + 1 / 745.6998715386, unit: 'hp', quoted: 'a sum takes the unit of its first term' },
    ];
    for (const warmUp of ['1 W', '1 hp', '1 m', '1 ft', '1 yr', '1 s', '1 acre']) {
      evaluateQuick(warmUp);
      for (const { expr, value, unit, quoted } of cases) {
        expect(RESULT_UNIT_RULE).toContain(quoted);
        const result = evaluateQuick(expr);
        expect(result.unit, `${expr} after ${warmUp}`).toBe(unit);
        expectClose(result.value, value, 1e-12);
      }
    }
  });

  it('should give incremental results equal to a full evaluation, byte for byte, with unrelated calculations in between', () => {
    for (const { key, document } of ALL_SHEETS) {
      const previous = evaluateSheet(document);
      for (const block of document.blocks.filter((b: SheetBlock) => b.type !== 'note')) {
        runQuickBatch('forward');
        // The inputs keep their values, so the results keep their bytes (only the hash changes).
        const edited = touch(document, block.id);
        const incremental = evaluateSheetIncremental(edited, previous, [block.id]);
        expect(incremental.evaluatedBlockIds, `${key}/${block.name}`).toContain(block.id);
        runQuickBatch('reverse');
        const full = evaluateSheet(edited);
        expect(JSON.stringify(incremental.results), `${key}/${block.name}`).toBe(JSON.stringify(full));
        expect(outputsOf(full), `${key}/${block.name}`).toBe(outputsOf(previous));
      }
    }
  });
});
