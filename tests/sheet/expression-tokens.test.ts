import { describe, expect, it } from 'vitest';
import { findReferences, renameReferences, tokenize } from '@/lib/sheet/expression-tokens';

describe('tokenize', () => {
  it('should give the expression back when its tokens are joined', () => {
    const text = 'peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s) + hill.curvature * .5 to mm/yr';
    expect(tokenize(text).map((t) => t.text).join('')).toBe(text);
  });

  it('should read numbers with exponents and leading dots as one token', () => {
    const kinds = tokenize('1e-6 .5 2.5E+3').filter((t) => t.kind !== 'space');
    expect(kinds.map((t) => [t.kind, t.text])).toEqual([
      ['number', '1e-6'],
      ['number', '.5'],
      ['number', '2.5E+3'],
    ]);
  });

  it('should keep a string as one token, dots inside it included', () => {
    const tokens = tokenize('"hill.curvature" + 1');
    expect(tokens[0]).toMatchObject({ kind: 'string', text: '"hill.curvature"' });
  });
});

describe('findReferences', () => {
  it('should find name.output references with their offsets', () => {
    const refs = findReferences('hill.curvature * params.K');
    expect(refs).toEqual([
      { block: 'hill', output: 'curvature', from: 0, to: 14 },
      { block: 'params', output: 'K', from: 17, to: 25 },
    ]);
  });

  it('should not take a number such as 2.5 or a string for a reference', () => {
    expect(findReferences('2.5 m + "a.b"')).toEqual([]);
  });
});

describe('renameReferences', () => {
  it('should rewrite old.output into new.output', () => {
    expect(renameReferences('hill.curvature * 2 + hill.slope', 'hill', 'crest')).toBe('crest.curvature * 2 + crest.slope');
  });

  it('should leave names that merely contain the old name alone', () => {
    expect(renameReferences('hills.curvature + uphill.x + hill_2.y', 'hill', 'crest')).toBe('hills.curvature + uphill.x + hill_2.y');
  });

  it('should leave strings, bare names and properties of other references alone', () => {
    expect(renameReferences('"hill.x" + hill + a.hill.b', 'hill', 'crest')).toBe('"hill.x" + hill + a.hill.b');
  });
});

import { renameOutputReferences } from '@/lib/sheet/expression-tokens';
describe('renameOutputReferences', () => {
  it('should rewrite block.old into block.new and nothing else', () => {
    expect(renameOutputReferences('params.K * params.Kt + other.K', 'params', 'K', 'D')).toBe('params.D * params.Kt + other.K');
  });
});
