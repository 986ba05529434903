import { describe, expect, it } from 'vitest';
import type { BlockOutcome, BlockTypeDefinition, InputSpec, OutputSpec } from '@/lib/engine/block-type';
import { checkOutcome, coerceBlockInput, coerceBlockInputs, collectCallWarnings, describeChoices, formatBlockOutput, isNonQuantityInput, runBlockType } from '@/lib/engine/block-run';
import { checkExpression, math } from '@/lib/engine/expression';
import { getBlockType } from '@/lib/engine/registry';
import { engineError } from '../support/engine-error';

// Running a block type on evaluated values (block-run.ts), with hand-made input declarations: the range rules
// (an inclusive limit admits the limit itself, an exclusive one does not: the usual meaning of ≤ and <, common
// practice), the words of text inputs, defaults, required inputs, finite outputs (CONTRACT §3: a result is a
// finite number) and display units (NIST SP 811 factors: 1 km = 1000 m, 1 mm = 1e-3 m).

const spec = (extra: Partial<InputSpec>): InputSpec => ({ name: 'x', label: 'x', dimension: 'length', help: '', ...extra });
const metres = (v: number) => math.unit(v, 'm');

const refusal = engineError;

describe('input ranges (coerceBlockInput)', () => {
  it('should admit an inclusive limit and refuse an exclusive one, on both sides', () => {
    const inclusive = spec({ range: { min: 1, max: 3, text: '1 m ≤ x ≤ 3 m' } });
    for (const v of [1, 2, 3]) expect(coerceBlockInput(inclusive, metres(v)).si).toBe(v);
    for (const v of [0.999, 3.001]) {
      const error = refusal(() => coerceBlockInput(inclusive, metres(v)));
      expect(error.message).toBe(`x: must be 1 m ≤ x ≤ 3 m, got ${v} m`);
      expect([error.input, error.expected, error.given]).toEqual(['x', '1 m ≤ x ≤ 3 m', `${v} m`]);
    }
    const exclusive = spec({ range: { min: 1, max: 3, minExclusive: true, maxExclusive: true, text: '1 m < x < 3 m' } });
    expect(coerceBlockInput(exclusive, metres(2)).si).toBe(2);
    expect(refusal(() => coerceBlockInput(exclusive, metres(1))).message).toBe('x: must be 1 m < x < 3 m, got 1 m');
    expect(refusal(() => coerceBlockInput(exclusive, metres(3))).message).toBe('x: must be 1 m < x < 3 m, got 3 m');
    // One-sided ranges.
    expect(coerceBlockInput(spec({ range: { min: 0, text: '≥ 0' } }), metres(1e9)).si).toBe(1e9);
    expect(coerceBlockInput(spec({ range: { max: 0, text: '≤ 0' } }), metres(-1e9)).si).toBe(-1e9);
    expect(refusal(() => coerceBlockInput(spec({ range: { max: 0, text: '≤ 0' } }), metres(1))).message).toBe('x: must be ≤ 0, got 1 m');
    expect(coerceBlockInput(spec({}), metres(-5)).si).toBe(-5);
  });

  it('should refuse a quantity where only a plain number is allowed, and add the input\'s hint to a wrong dimension', () => {
    const plain = spec({ dimension: 'dimensionless', plainNumberOnly: 'give A as a plain number' });
    expect(coerceBlockInput(plain, 2).si).toBe(2);
    const error = refusal(() => coerceBlockInput(plain, metres(2)));
    expect(error.message).toBe('x: give A as a plain number; got 2 m');
    expect([error.input, error.given]).toEqual(['x', '2 m']);
    const hinted = spec({ mismatchHint: 'Write metres.' });
    const wrong = refusal(() => coerceBlockInput(hinted, math.unit(2, 's')));
    expect(wrong.message).toBe('x: expected a length (L), got 2 s. Write metres.');
    expect([wrong.input, wrong.expected, wrong.given]).toEqual(['x', 'a length (L)', '2 s']);
    // Without a hint the engine's own message is kept.
    expect(refusal(() => coerceBlockInput(spec({}), math.unit(2, 's'))).message).toBe('x: expected a length (L), got 2 s');
  });
});

describe('text, boolean and data inputs', () => {
  const faulting = getBlockType('strength_envelope')!.inputs.find((i) => i.name === 'faulting')!;

  it('should list the words of a text input with their other spellings', () => {
    expect(describeChoices(faulting)).toBe('"thrust" (or "reverse") or "strike_slip" (or "strike-slip") or "normal" or the factor β as a positive number');
    expect(describeChoices(spec({ dimension: 'text', choices: ['fixed', 'zero_flux'] }))).toBe('"fixed" or "zero_flux"');
    expect(describeChoices(spec({ dimension: 'text' }))).toBe('');
    expect(isNonQuantityInput(faulting)).toBe(true);
    expect(isNonQuantityInput(spec({ dimension: 'boolean' }))).toBe(true);
    expect(isNonQuantityInput(spec({ dimension: 'dataset' }))).toBe(true);
    expect(isNonQuantityInput(spec({}))).toBe(false);
  });

  it('should read a word in any case with white space around it, its aliases, and refuse others', () => {
    const type: BlockTypeDefinition = {
      id: 'probe',
      title: '',
      purpose: '',
      formula: { text: '' },
      sources: [],
      inputs: [
        spec({ name: 'mode', dimension: 'text', choices: ['fixed', 'zero_flux'], choiceAliases: { closed: 'zero_flux' } }),
        spec({ name: 'flag', dimension: 'boolean', optional: true }),
        spec({ name: 'len', default: '2 km' }),
        spec({ name: 'opt', optional: true }),
      ],
      outputs: [],
      validity: [],
      cautions: [],
      warnings: [],
      example: null,
      expressionFunction: false,
    };
    const run = (values: Record<string, unknown>) => coerceBlockInputs(type, values);
    expect(run({ mode: '  Fixed ' }).other.text.mode).toBe('fixed');
    expect(run({ mode: 'CLOSED' }).other.text.mode).toBe('zero_flux');
    expect(refusal(() => run({ mode: 'open' })).message).toBe('mode must be "fixed" or "zero_flux" (or "closed"), got "open"');
    expect(refusal(() => run({ mode: 3 })).message).toBe('mode: expected a word in double quotes ("fixed" or "zero_flux" (or "closed")), got 3');
    expect(run({ mode: 'fixed', flag: false }).other.flags.flag).toBe(false);
    expect(refusal(() => run({ mode: 'fixed', flag: 'yes' })).message).toBe('flag: expected true or false, got "yes"');
    const filled = run({ mode: 'fixed' });
    // A default fills an input left out, and is not "given"; an optional input left out stays out.
    expect(filled.coerced.len!.si).toBe(2000);
    expect([...filled.other.given!]).toEqual(['mode']);
    expect('opt' in filled.coerced).toBe(false);
    expect(run({ mode: 'fixed', opt: metres(4) }).coerced.opt!.si).toBe(4);
    expect(refusal(() => run({})).message).toBe('mode: this input is required');
  });

  it('should refuse a data input that is not dataset(…)', () => {
    const march = getBlockType('channel_march')!;
    expect(refusal(() => coerceBlockInputs(march, { data: 3, coefficient: 0.01, length_scale: metres(2000) })).message).toBe('data: must be dataset("<sha256>")');
  });
});

describe('outcomes and their outputs', () => {
  const series = (x: number[], y: number[]) => ({ s: { x, y, xLabel: '', yLabel: '', xUnit: 'm', yUnit: 'm' } });

  it('should refuse an output or a series value that is not finite, naming it', () => {
    const ok: BlockOutcome = { outputs: { a: { si: 1 }, t: { text: 'word' } }, series: series([0, 1], [2, 3]), warnings: [] };
    expect(checkOutcome(ok)).toBe(ok);
    expect(refusal(() => checkOutcome({ outputs: { a: { si: Infinity } }, warnings: [] })).message).toBe('a: the result is not finite (Infinity); check the inputs');
    expect(refusal(() => checkOutcome({ outputs: { b: { si: NaN } }, warnings: [] })).message).toBe('b: the result is not finite (NaN); check the inputs');
    expect(refusal(() => checkOutcome({ outputs: {}, series: series([0, 1], [2, NaN]), warnings: [] })).message).toBe('s: the series has values that are not finite; check the inputs');
    expect(refusal(() => checkOutcome({ outputs: {}, series: series([0, -Infinity], [2, 3]), warnings: [] })).message).toBe('s: the series has values that are not finite; check the inputs');
  });

  it('should format an output in its natural unit, or a display unit of the same dimension', () => {
    const out = (unit: string | null): OutputSpec => ({ name: 'h', label: '', unit, kind: 'quantity', description: '' });
    const outcome: BlockOutcome = { outputs: { h: { si: 1500 }, w: { text: 'steep' }, r: { si: 2 } }, warnings: [] };
    expect(formatBlockOutput(out('km'), outcome, undefined)).toMatchObject({ value: 1.5, unit: 'km', si: 1500, siUnit: 'm' });
    expect(formatBlockOutput(out('km'), outcome, ' ')).toMatchObject({ value: 1.5, unit: 'km' });
    expect(formatBlockOutput(out('km'), outcome, 'km')).toMatchObject({ value: 1.5, unit: 'km' });
    expect(formatBlockOutput(out('km'), outcome, 'mm')).toMatchObject({ value: 1.5e6, unit: 'mm', si: 1500 });
    expect(formatBlockOutput(out(null), { outputs: { h: { si: 1500, unit: 'm' } }, warnings: [] }, undefined)).toMatchObject({ value: 1500, unit: 'm' });
    expect(formatBlockOutput(out('km'), { outputs: {}, warnings: [] }, undefined)).toBeNull();
    expect(formatBlockOutput({ ...out(''), name: 'w', kind: 'text' }, outcome, undefined)).toEqual({ value: 'steep', unit: '', si: 'steep', siUnit: '' });
    expect(refusal(() => formatBlockOutput(out('km'), outcome, 's')).message).toBe('display unit for h: s does not measure the same thing as km');
    expect(refusal(() => formatBlockOutput({ ...out(''), name: 'r' }, outcome, 'm')).message).toBe('display unit for r: the output is dimensionless, so m does not apply');
    expect(formatBlockOutput({ ...out(null), name: 'r' }, outcome, undefined)).toEqual({ value: 2, unit: '', si: 2, siUnit: '' });
  });

  it('should refuse to run a type that is not calculated, and put plausibility warnings first', () => {
    expect(refusal(() => runBlockType(getBlockType('formula')!, {})).message).toBe('formula blocks are not calculated');
    // 1 m^2/s is about 3.2e7 m^2/yr, far above 100 × 5e-2 m^2/yr (the typical range in typical-ranges.ts).
    const outcome = runBlockType(getBlockType('hillslope_diffusion')!, { diffusivity: math.unit(1, 'm^2/s'), curvature: math.unit(0.01, '1/m') });
    expect(outcome.warnings[0]).toMatch(/^diffusivity = 1 m\^2 \/ s is more than 100 times outside the typical range 1e-4 to 5e-2 m\^2\/yr/);
  });
});

describe('warnings of block-type functions in expressions', () => {
  const run = (text: string) => checkExpression(text).evaluate(new Map());

  it('should collect the warnings of calls, nested collectors keeping their own', () => {
    const outer = collectCallWarnings(() => {
      const inner = collectCallWarnings(() => run('stream_power(1e-5 m^0.0/yr, 1 km^2, 30, 0.5, 1)'));
      expect(inner.warnings).toHaveLength(1);
      expect(inner.warnings[0]).toMatch(/^stream_power\(…\): slope = 30 is a gradient of 30 \(88°\), far steeper than a river: did you mean degrees\? Write 30 deg$/);
      return 'done';
    });
    expect(outer).toEqual({ value: 'done', warnings: [] });
  });

  it('should refuse a call with too many arguments, naming the inputs', () => {
    expect(() => run('peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s, 4)')).toThrow('peclet_number: takes at most 3 inputs (velocity, length, diffusivity), got 4');
    expect(() => run('peclet_number(1 mm/yr, 30 km)')).toThrow('peclet_number: diffusivity: this input is required');
  });
});
