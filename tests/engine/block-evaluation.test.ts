import { describe, expect, it } from 'vitest';
import { evaluateSheet, type SheetBlock, type SheetDocument } from '@/lib/engine';
import { BARE_HILLSLOPE_LIMIT } from '@/lib/engine/typical-ranges';

// One block's evaluation inside a sheet (lib/engine/block-evaluation.ts, block-run.ts): cycle messages, empty and
// mis-displayed free inputs, warnings of block-type functions called in an input (each once, after the block's
// own), series only where a type draws one, and the "did you mean degrees" rule for bare slope numbers.
// References: CONTRACT §3 (results document: error text, warnings, series), §6b (warnings travel with the
// value that raised them); the plausibility rule's limits are the engine's own (typical-ranges.ts); the Péclet
// number of case P12 is from Turcotte & Schubert (2002), 0.9506.

const run = (...blocks: Partial<SheetBlock>[]) => {
  const document = { format: 'denudata-sheet@1', title: 'blocks', blocks: blocks.map((b, i) => ({ id: `b${i}`, inputs: {}, ...b })) } as unknown as SheetDocument;
  return Object.values(evaluateSheet(document).blocks);
};
const first = (...blocks: Partial<SheetBlock>[]) => run(...blocks)[0]!;

describe('one block’s evaluation', () => {
  it('should say a block refers to itself, and name the whole path of a longer cycle', () => {
    expect(first({ name: 'q', type: 'quantities', inputs: { x: 'q.x + 1' } }).error).toBe('block "q" refers to itself');
    const [p, r] = run({ name: 'p', type: 'quantities', inputs: { x: 'r.x' } }, { name: 'r', type: 'quantities', inputs: { x: 'p.x' } });
    expect(p!.error).toBe('part of a dependency cycle: p → r → p');
    expect(r!.error).toBe('part of a dependency cycle: r → p → r');
  });

  it('should refuse an empty quantity and a display unit that does not fit, naming the input', () => {
    expect(first({ name: 'q', type: 'quantities', inputs: { x: '  ', y: '1' } }).error).toBe('block "q", x: the expression is empty');
    expect(first({ name: 'q', type: 'quantities', inputs: { x: '1 m' }, display: { x: 's' } }).error).toBe('block "q", x: the display unit s does not fit the result 1 m');
  });

  it('should keep each warning of a function called in an input once, after the block’s own warnings', () => {
    const twice = first({ name: 'f', type: 'formula', inputs: { expr: 'scarp_age(2 m, 0, 25, 1 m^2/kyr) + scarp_age(2 m, 0, 25, 1 m^2/kyr)' } });
    expect(twice.status).toBe('ok');
    expect(twice.warnings).toHaveLength(3);
    expect(twice.warnings[0]).toBe(
      'expr: scarp_age(…): max_slope = 25 is a gradient of 25 (88°), far steeper than a soil-mantled slope or scarp face: did you mean degrees? Write 25 deg',
    );
    expect(new Set(twice.warnings).size).toBe(3);
    const mixed = first({
      name: 'sa',
      type: 'scarp_age',
      inputs: { vertical_offset: '2 m', max_slope: '40 deg', diffusivity: '1 m^2/kyr * (1 + 0 * scarp_age(2 m, 0, 25, 1 m^2/kyr) / 1 kyr)' },
    });
    expect(mixed.status).toBe('ok');
    expect(mixed.warnings[0]).toMatch(/^Age below 1 kyr/);
    expect(mixed.warnings[1]).toMatch(/^Maximum slope 0\.839 ≥ 0\.6/);
    expect(mixed.warnings.slice(2).every((w) => w.startsWith('diffusivity: scarp_age(…): '))).toBe(true);
    expect(mixed.warnings).toHaveLength(5);
  });

  it('should attach a series only for a type that draws one', () => {
    const pe = first({ name: 'pe', type: 'peclet_number', inputs: { velocity: '1 mm/yr', length: '30 km', diffusivity: '1e-6 m^2/s' } });
    expect(pe.outputs.Pe!.value).toBeCloseTo(0.9506, 4);
    expect('series' in pe).toBe(false);
    const forward = first({ name: 'sf', type: 'scarp_forward', inputs: { vertical_offset: '2 m', diffusivity: '1 m^2/kyr', age: '5 kyr' } });
    expect(forward.status).toBe('ok');
    expect(forward.series!.profile!.x).toHaveLength(201);
  });

  it('should ask about degrees only for a bare number steeper than the limit, with the slope’s own words', () => {
    const inputs = { vertical_offset: '2 m', diffusivity: '1 m^2/kyr' };
    const degrees = /did you mean degrees/;
    // 70° written with its unit: no question, though its gradient (tan 70° = 2.7) is over the bare-number limit.
    const steep = first({ name: 'sa', type: 'scarp_age', inputs: { ...inputs, max_slope: '70 deg' } });
    expect(steep.status).toBe('ok');
    expect(Math.tan((70 * Math.PI) / 180)).toBeGreaterThan(BARE_HILLSLOPE_LIMIT);
    expect(steep.warnings.some((w) => degrees.test(w))).toBe(false);
    // Exactly at the bare-number limit: no question; just above it: the question.
    expect(first({ name: 'sa', type: 'scarp_age', inputs: { ...inputs, max_slope: String(BARE_HILLSLOPE_LIMIT) } }).warnings.some((w) => degrees.test(w))).toBe(false);
    expect(first({ name: 'sa', type: 'scarp_age', inputs: { ...inputs, max_slope: String(BARE_HILLSLOPE_LIMIT * 1.01) } }).warnings.some((w) => degrees.test(w))).toBe(true);
    const river = first({ name: 'sp', type: 'stream_power', inputs: { coefficient: '1e-5 m^0.0/yr', drainage_area: '1 km^2', slope: '30', m: '0.5', n: '1' } });
    expect(river.warnings[0]).toBe('slope = 30 is a gradient of 30 (88°), far steeper than a river: did you mean degrees? Write 30 deg');
  });
});
