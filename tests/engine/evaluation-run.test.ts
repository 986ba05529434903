import { describe, expect, it } from 'vitest';
import {
  blockCatalog,
  describeBlockType,
  DISTRIBUTIONS_NEED_A_SHEET,
  ENGINE_VERSION,
  EngineError,
  evaluateQuick,
  evaluateSheet,
  evaluateSheetIncremental,
  RESULTS_FORMAT,
  type SheetBlock,
  type SheetDocument,
} from '@/lib/engine';
import { BLOCK_TYPES } from '@/lib/engine/registry';
import { assemble, blockResultBytes, failed, type BlockResult } from '@/lib/engine/results-document';

// The evaluation's plumbing (evaluate.ts, prepare.ts, results-document.ts, index.ts), small and fast.
// References: RFC 3629 for the UTF-8 length of the results document (Node's Buffer.byteLength as the reference
// implementation); CONTRACT §3 for the results document (blocks in document order, error and blocked results
// with the block they wait on) and §6 for quick calculations; the incremental rule of evaluate.ts (the results
// equal a full evaluation; only changed blocks and those downstream are evaluated again).

const doc = (blocks: SheetBlock[], extra: Partial<SheetDocument> = {}): SheetDocument => ({ format: 'denudata-sheet@1', title: 'Run plumbing', blocks, ...extra });
const f = (name: string, expr: string, id = name): SheetBlock => ({ id, name, type: 'formula', inputs: { expr } });

function refusal(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(EngineError);
    return (error as Error).message;
  }
  throw new Error('expected a refusal');
}

describe('the results document (results-document.ts)', () => {
  it('should count the UTF-8 bytes of a block entry as Buffer.byteLength does (RFC 3629)', () => {
    const texts = ['plain', '\u007f', '\u0080', 'é', '\u07ff', '\u0800', '€', '\ud7ff', '\ue000', '\uffff', '😀', '\ud800\udc00', '\udbff\udfff', 'a😀b€c\u0080', '€€', 'é€é', '\u0800\u07ff\uffff\uffff'];
    for (const text of texts) {
      const result: BlockResult = { id: text, type: 'formula', status: 'ok', warnings: [text], outputs: {} };
      const expected = Buffer.byteLength(JSON.stringify(text), 'utf8') + Buffer.byteLength(JSON.stringify(result), 'utf8') + 2;
      expect(blockResultBytes(text, result), JSON.stringify(text)).toBe(expected);
    }
  });

  it('should make failed results with and without series, and assemble blocks in document order', () => {
    const block = f('a', '1');
    expect(failed(block, 'blocked', 'waiting')).toEqual({ id: 'a', type: 'formula', status: 'blocked', error: 'waiting', warnings: [], outputs: {} });
    const series = { s: { x: [0], y: [1], xLabel: 'x', yLabel: 'y', xUnit: 'm', yUnit: 'm' } };
    expect(failed(block, 'error', 'bad', series)).toEqual({ id: 'a', type: 'formula', status: 'error', error: 'bad', warnings: [], outputs: {}, series });
    expect('series' in failed(block, 'error', 'bad')).toBe(false);
    const document = doc([f('b', '1'), f('a', '2'), { id: 'n', name: 'n', type: 'note', inputs: {} }]);
    const results = new Map<string, BlockResult>([
      ['a', failed(document.blocks[1]!, 'error', 'x')],
      ['b', failed(document.blocks[0]!, 'error', 'y')],
    ]);
    const assembled = assemble(document, results, 'h');
    expect(Object.keys(assembled.blocks)).toEqual(['b', 'a']);
    expect(assembled).toMatchObject({ format: RESULTS_FORMAT, sheetHash: 'h', engine: ENGINE_VERSION });
    expect('uncertainty' in assembled).toBe(false);
  });
});

describe('a run (evaluate.ts)', () => {
  it('should list the results in document order whatever the evaluation order, without notes', () => {
    const results = evaluateSheet(doc([f('late', 'early.value * 2'), { id: 'n', name: 'n', type: 'note', inputs: {} }, f('early', '3 m')]));
    expect(Object.keys(results.blocks)).toEqual(['late', 'early']);
    expect(results.blocks.late!.outputs.value!.value).toBe(6);
    expect(results.format).toBe('denudata-results@1');
    expect(results.engine).toBe('1.1.0');
  });

  it('should report progress after each block, ending at 1', () => {
    const fractions: number[] = [];
    evaluateSheet(doc([f('aa', '1'), f('bb', 'aa.value + 1'), f('cc2', '2'), f('dd', '3')]), { onProgress: (fraction) => fractions.push(fraction) });
    expect(fractions).toEqual([0.25, 0.5, 0.75, 1]);
  });

  it('should report the nominal pass of an uncertain sheet as its first tenth', () => {
    const fractions: number[] = [];
    evaluateSheet(doc([f('aa', 'normal(1, 0.1)'), f('bb', 'aa.value * 2')], { uncertainty: { samples: 100, seed: 1 } }), { onProgress: (fraction) => fractions.push(fraction) });
    expect(fractions.slice(0, 2)).toEqual([0.05, 0.1]);
    expect(fractions.every((x) => x > 0 && x <= 1)).toBe(true);
  });

  describe('incremental evaluation', () => {
    const base = () => doc([f('aa', '1 m', 'ia'), f('bb', 'aa.value * 2', 'ib'), f('cc2', '5 s', 'ic')]);

    it('should reuse unchanged blocks and evaluate again the changed ones and their dependents', () => {
      const previous = evaluateSheet(base());
      expect(evaluateSheetIncremental(base(), previous, []).evaluatedBlockIds).toEqual([]);
      const edited = base();
      edited.blocks[0]!.inputs.expr = '2 m';
      const next = evaluateSheetIncremental(edited, previous, ['ia']);
      expect(next.evaluatedBlockIds).toEqual(['ia', 'ib']);
      expect(next.results).toEqual(evaluateSheet(edited));
    });

    it('should evaluate in full with results of another engine version or format, and for uncertain sheets', () => {
      const previous = evaluateSheet(base());
      const all = ['ia', 'ib', 'ic'];
      expect(evaluateSheetIncremental(base(), { ...previous, engine: '0.9.0' }, []).evaluatedBlockIds).toEqual(all);
      expect(evaluateSheetIncremental(base(), { ...previous, format: 'other@1' as never }, []).evaluatedBlockIds).toEqual(all);
      expect(evaluateSheetIncremental({ ...base(), uncertainty: { seed: 2 } }, previous, []).evaluatedBlockIds).toEqual(all);
      const withDistribution = base();
      withDistribution.blocks[2]!.inputs.expr = 'uniform(1 s, 2 s)';
      expect(evaluateSheetIncremental(withDistribution, previous, []).evaluatedBlockIds).toEqual(all);
    });

    it('should evaluate again a block whose id or type changed, and blocks with a problem or in a cycle', () => {
      const previous = evaluateSheet(doc([f('aa', '1 m', 'ia'), f('bb', 'aa.value * 2', 'ib'), f('cc2', 'zz', 'ic'), f('dd', 'dd.value', 'id')]));
      const newId = doc([f('aa', '1 m', 'ia2'), f('bb', 'aa.value * 2', 'ib'), f('cc2', 'zz', 'ic'), f('dd', 'dd.value', 'id')]);
      expect(evaluateSheetIncremental(newId, previous, []).evaluatedBlockIds).toEqual(['ia2', 'ib', 'ic', 'id']);
      const same = doc([f('aa', '1 m', 'ia'), f('bb', 'aa.value * 2', 'ib'), f('cc2', 'zz', 'ic'), f('dd', 'dd.value', 'id')]);
      expect(evaluateSheetIncremental(same, previous, []).evaluatedBlockIds).toEqual(['ic', 'id']);
      const retyped = doc([{ id: 'ia', name: 'aa', type: 'quantities', inputs: { value: '1 m' } }, f('bb', 'aa.value * 2', 'ib'), f('cc2', 'zz', 'ic'), f('dd', 'dd.value', 'id')]);
      const next = evaluateSheetIncremental(retyped, previous, []);
      expect(next.evaluatedBlockIds).toEqual(['ia', 'ib', 'ic', 'id']);
      expect(next.results).toEqual(evaluateSheet(retyped));
    });
  });
});

describe('prepare: faults found before a block runs (prepare.ts)', () => {
  const errorOf = (blocks: SheetBlock[], name: string) => {
    const result = evaluateSheet(doc(blocks)).blocks[name]!;
    expect(result.status).toBe('error');
    return result.error;
  };

  it('should name what is wrong with a reference', () => {
    const note: SheetBlock = { id: 'n', name: 'memo', type: 'note', inputs: {} };
    expect(errorOf([note, f('aa', 'memo.text')], 'aa')).toBe('block "aa", expr: refers to memo.text, but "memo" is a note and has no outputs');
    expect(errorOf([f('aa', 'ghost.value')], 'aa')).toBe('block "aa", expr: refers to ghost.value, but there is no block named "ghost"');
    expect(errorOf([f('aa', '1'), f('bb', 'aa.other')], 'bb')).toBe('block "bb", expr: refers to aa.other, but block "aa" has no output "other" (its outputs: value)');
    const q: SheetBlock = { id: 'q', name: 'q', type: 'quantities', inputs: { K: '1', L: '2' } };
    expect(errorOf([q, f('bb', 'q.M')], 'bb')).toBe('block "bb", expr: refers to q.M, but block "q" has no output "M" (its outputs: K, L)');
    expect(errorOf([{ id: 'e', name: 'e0', type: 'quantities', inputs: {} }, f('bb', 'e0.x')], 'bb')).toBe('block "bb", expr: refers to e0.x, but block "e0" has no output "x" (its outputs: none)');
    // An own property of objects is not an output of a quantities block.
    expect(errorOf([q, f('bb', 'q.constructor')], 'bb')).toBe('block "bb", expr: refers to q.constructor, but block "q" has no output "constructor" (its outputs: K, L)');
  });

  it('should name a block used without an output, an unknown name, and a bare word in a text input', () => {
    const note: SheetBlock = { id: 'n', name: 'memo', type: 'note', inputs: {} };
    expect(errorOf([f('aa', '1'), f('bb', 'aa * 2')], 'bb')).toBe('block "bb", expr: "aa" is a block; refer to one of its outputs as aa.<output>');
    expect(errorOf([note, f('bb', 'memo * 2')], 'bb')).toBe('block "bb", expr: "memo" is a block; refer to one of its outputs as memo.<output>');
    expect(errorOf([f('bb', 'wombat * 2')], 'bb')).toBe('block "bb", expr: unknown name "wombat" (not a block, unit, constant or function)');
    const flexure = (plate: string): SheetBlock => ({
      id: 'p',
      name: 'p',
      type: 'plate_flexure',
      inputs: { line_load: '1e12 N/m', elastic_thickness: '20 km', infill_density: '0 kg/m^3', mantle_density: '3300 kg/m^3', plate },
    });
    expect(errorOf([flexure('broken')], 'p')).toBe('block "p", plate: write the word in double quotes, such as "broken" (a bare broken is read as a name)');
    expect(errorOf([flexure('cracked')], 'p')).toBe('block "p", plate: write the word in double quotes, such as "continuous" (a bare cracked is read as a name)');
    // A block's name in a text input is still a block.
    expect(errorOf([f('cracked', '1'), flexure('cracked')], 'p')).toBe('block "p", plate: "cracked" is a block; refer to one of its outputs as cracked.<output>');
  });

  it('should refuse distributions where they cannot be, and report only the first fault of a block', () => {
    expect(errorOf([f('aa', '2 * normal(1, 0.1)')], 'aa')).toBe(
      'block "aa", expr: a distribution must be the whole expression of an input; derive quantities from it in a later block (formula, or another block\'s input referring to it)',
    );
    const profile = (steps: string): SheetBlock => ({ id: 'p', name: 'p', type: 'profile_evolution', inputs: { diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m', steps, dx: 'nothing_here' } });
    expect(errorOf([profile('uniform(10, 20)')], 'p')).toBe('block "p", steps: must be certain; a distribution is not allowed in this input');
    expect(errorOf([{ id: 'q', name: 'q', type: 'quantities', inputs: { a: '1 +', b: 'zzz' } }], 'q')).toBe('block "q", a: the expression does not parse: the expression ends too early: a value or a closing parenthesis is missing (at character 4)');
    expect(errorOf([{ id: 'm', name: 'march', type: 'channel_march', inputs: { data: '3', coefficient: 'zzz' } }], 'march')).toBe(
      'block "march", data: must be dataset("<sha256>") with the 64 lowercase hex digits of a dataset of the team',
    );
  });
});

describe('the public entry points (index.ts)', () => {
  it('should refuse an invalid document, naming where', () => {
    expect(refusal(() => evaluateSheet({ ...doc([]), extra: 1 } as never))).toBe('invalid document at the top level: unknown key: extra');
    expect(refusal(() => evaluateSheet(doc([f('A', '1')])))).toMatch(/^invalid document at blocks\[0\]\.name: "A" is not a valid block name/);
    expect(refusal(() => evaluateSheetIncremental(doc([f('A', '1')]), null, []))).toMatch(/^invalid document at blocks\[0\]\.name: /);
  });

  it('should refuse in a quick calculation what needs a sheet, with a message that says why', () => {
    expect(refusal(() => evaluateQuick(3 as never))).toBe('the expression must be text');
    expect(DISTRIBUTIONS_NEED_A_SHEET).toBe('distributions need a sheet');
    expect(refusal(() => evaluateQuick('normal(1, 0.1)'))).toBe('distributions need a sheet');
    expect(refusal(() => evaluateQuick('2 * normal(1, 0.1)'))).toBe('distributions need a sheet');
    expect(refusal(() => evaluateQuick('a.b + c.d'))).toBe('a quick calculation cannot refer to a block (a.b)');
    expect(refusal(() => evaluateQuick('wombat + koala'))).toBe('unknown name "wombat" (not a unit, constant or function)');
    expect(refusal(() => evaluateQuick('1 m + 1 s'))).toMatch(/^Units do not match/);
  });

  it("should return a quick result with the warnings of a block type's function", () => {
    const quiet = evaluateQuick('2 m * 3');
    expect(quiet).toMatchObject({ value: 6, unit: 'm', si: 6, siUnit: 'm', warnings: [] });
    // 30 as a channel slope (a gradient of 30, about 88°) is probably meant in degrees.
    const slipped = evaluateQuick('stream_power(1e-5 m^0.0/yr, 1 km^2, 30, 0.5, 1)');
    expect(slipped.warnings.length).toBeGreaterThan(0);
    expect(slipped.warnings[0]).toMatch(/^stream_power\(…\): slope = 30 is a gradient of 30 \(88°\)/);
  });

  it('should describe every block type as plain data, a fresh copy each time', () => {
    // Built anew here (blockCatalog keeps what it built once per process, where a changed describer would go
    // unseen by every test after the first); the catalog itself must give the same.
    const catalog = BLOCK_TYPES.map(describeBlockType);
    expect(blockCatalog()).toEqual(catalog);
    const pe = catalog.find((t) => t.id === 'peclet_number')!;
    expect(pe.freeInputs).toBe(false);
    expect(pe.series).toEqual([]);
    expect(pe.expressionFunction).toEqual({ name: 'peclet_number', signature: 'peclet_number(velocity, length, diffusivity)' });
    expect(pe.inputs[0]!.dimension).toMatchObject({ key: 'velocity' });
    expect(pe.inputs[0]!.typical).toEqual({ text: '0.01 to 20 mm/yr', source: 'Reiners & Brandon 2006; common practice' });
    const quantities = catalog.find((t) => t.id === 'quantities')!;
    expect(quantities.freeInputs).toBe(true);
    expect(quantities.expressionFunction).toBeNull();
    const flexure = catalog.find((t) => t.id === 'plate_flexure')!;
    expect(flexure.expressionFunction!.signature).toMatch(/^plate_flexure\(line_load, elastic_thickness, .*\[poisson_ratio\], \[plate\], \[distance\]/);
    expect(flexure.inputs.find((i) => i.name === 'plate')!.typical).toBeNull();
    // An input with a default (far_field_slope) or optional without one (slope) is shown in brackets.
    expect(catalog.find((t) => t.id === 'scarp_age')!.expressionFunction!.signature).toBe('scarp_age(vertical_offset, [far_field_slope], max_slope, diffusivity)');
    expect(catalog.find((t) => t.id === 'hillslope_diffusion')!.expressionFunction!.signature).toBe('hillslope_diffusion(diffusivity, curvature, [slope])');
    const forward = catalog.find((t) => t.id === 'scarp_forward')!;
    expect(forward.outputs.map((o) => o.name)).toEqual(['max_slope', 'kt']);
    expect(forward.series).toEqual([expect.objectContaining({ name: 'profile', points: 201, xUnit: 'm', yUnit: 'm' })]);
    // Every type's lists and formula are copied whole from its definition.
    for (const type of BLOCK_TYPES) {
      const info = catalog.find((t) => t.id === type.id)!;
      expect(info.formula).toEqual(type.formula);
      expect(info.sources).toEqual(type.sources);
      expect(info.validity).toEqual(type.validity);
      expect(info.cautions).toEqual(type.cautions);
      expect(info.warnings).toEqual(type.warnings);
      expect(info.outputs).toEqual(JSON.parse(JSON.stringify(type.outputs)));
      expect(info.inputs.map((i) => i.name)).toEqual(type.inputs.map((i) => i.name));
      expect(info.inputs.map((i) => [i.optional, i.default, i.dimension.key])).toEqual(type.inputs.map((i) => [i.optional, i.default, i.dimension]));
    }
    expect(BLOCK_TYPES.some((t) => t.validity.length && t.cautions.length && t.warnings.length && t.sources.length)).toBe(true);
    pe.title = 'changed';
    pe.inputs.length = 0;
    const again = blockCatalog().find((t) => t.id === 'peclet_number')!;
    expect(again.title).not.toBe('changed');
    expect(again.inputs.length).toBe(3);
  });
});
