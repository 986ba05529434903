import { describe, expect, it } from 'vitest';
import { EngineError, evaluateQuick } from '@/lib/engine';
import { isValuelessUnitByMathjs, math } from '@/lib/engine/expression';
import { expectClose } from '../support/approx';

/** Runs a quick calculation and returns the message it is refused with, and how long it took. */
function refusal(expr: string): { message: string; ms: number } {
  const started = performance.now();
  try {
    evaluateQuick(expr);
  } catch (error) {
    expect(error).toBeInstanceOf(EngineError);
    return { message: (error as Error).message, ms: performance.now() - started };
  }
  throw new Error(`expected "${expr.slice(0, 40)}" to be refused`);
}

describe('expression', () => {
  describe('time units', () => {
    it('should define yr as the Julian year of 365.25 d (common practice; FORMULAS.md §0)', () => {
      expect(evaluateQuick('1 yr to s').value).toBe(31557600);
      expect(evaluateQuick('2 yrs to yr').value).toBe(2);
    });

    it('should define kyr, Myr and Gyr with ka, Ma and Ga as aliases (Holden et al. 2011)', () => {
      expectClose(evaluateQuick('1 ka to yr').value, 1000, 1e-12);
      expectClose(evaluateQuick('3 Ma to kyr').value, 3000, 1e-12);
      expectClose(evaluateQuick('1 Ga to Myr').value, 1000, 1e-12);
      expectClose(evaluateQuick('1 mm/yr to km/Myr').value, 1, 1e-12);
    });

    it('should read ha as the hectare, 10^4 m^2, with no prefixes (SI Brochure, 9th ed., 2019, Table 8)', () => {
      expect(evaluateQuick('1 ha to m^2').value).toBe(10_000);
      expect(evaluateQuick('250 ha to km^2').value).toBe(2.5);
      expect(evaluateQuick('3 ha').unit).toBe('ha');
      // Not hecto-annus (a is the annus, unprefixed), and no kilo-hectare.
      expect(refusal('1 kha').message).toContain('unknown name "kha"');
      expect(evaluateQuick('1 ha + 1 hectare to m^2').value).toBe(20_000);
    });
  });

  describe('quick results', () => {
    it('should report value, unit, SI value and SI unit as mathjs formats them', () => {
      const result = evaluateQuick('1 mm/yr');
      expect(result.unit).toBe('mm / yr');
      expect(result.siUnit).toBe('m / s');
      expectClose(result.si, 1e-3 / 31557600, 1e-12);
    });

    it('should give temperatures in K as their SI form', () => {
      expect(evaluateQuick('10 degC')).toMatchObject({ value: 10, unit: 'degC', siUnit: 'K' });
      expectClose(evaluateQuick('10 degC').si, 283.15, 1e-12);
    });

    it('should refuse names it does not know and references to blocks', () => {
      expect(refusal('foo * 2').message).toContain('unknown name "foo"');
      expect(refusal('hill.dz_dt * 2').message).toContain('cannot refer to a block');
    });
  });

  describe('hostile expressions', () => {
    const hostile: Array<[string, string, RegExp]> = [
      ['import', 'import({x: 1}, {override: true})', /not available|objects/],
      ['createUnit', 'createUnit("zz")', /createUnit/],
      ['evaluate', 'evaluate("1 + 1")', /evaluate/],
      ['parse', 'parse("1 + 1")', /parse/],
      ['compile', 'compile("1 + 1")', /compile/],
      ['simplify', 'simplify("x + x")', /simplify/],
      ['derivative', 'derivative("x^2", "x")', /derivative/],
      ['resolve', 'resolve("x")', /resolve/],
      ['config', 'config({number: "BigNumber"})', /config/],
      ['random', 'random()', /random/],
      ['randomInt', 'randomInt(1, 10)', /randomInt/],
      ['pickRandom', 'pickRandom([1, 2, 3])', /pickRandom/],
      ['huge ones', 'ones(30000, 30000)', /at most 100000 elements/],
      ['huge zeros', 'zeros([100000, 100000])', /at most 100000 elements/],
      ['huge range', 'range(0, 1e12)', /at most 100000 elements/],
      ['huge range syntax', 'sum(1:1e9)', /at most 100000 elements/],
      ['huge identity', 'identity(100000)', /at most 100000 elements/],
      ['huge matrix', `matrix([${Array.from({ length: 1001 }, () => '1').join(',')}])`, /at most 100000|longer than 2000 characters/],
      ['deep nesting', `${'('.repeat(500)}1${')'.repeat(500)}`, /nested/],
      ['long expression', `1${' + 1'.repeat(600)}`, /longer than 2000 characters/],
      ['many parts', Array.from({ length: 700 }, () => '1').join('+'), /more than 1000 parts|nested too deeply/],
      ['function definition', 'f(x) = x^2', /defining functions/],
      ['assignment', 'x = 3', /assignments/],
      ['statement separator', '1 + 1; 2 + 2', /one expression/],
      ['function as value', 'sqrt', /can only be called/],
      ['property of a value', '(1 m).constructor', /dot may only follow a block name/],
    ];

    for (const [label, expr, pattern] of hostile) {
      it(`should refuse ${label} by a check, well before the 5 s time limit`, () => {
        const { message, ms } = refusal(expr);
        expect(message).toMatch(pattern);
        // Refused by the parser's checks, not by running out of time: far under the limit even on a busy machine.
        expect(ms).toBeLessThan(2000);
      });
    }

    it('should have locked the instance itself (direct calls throw)', () => {
      expect(() => (math as unknown as { evaluate: (s: string) => unknown }).evaluate('1+1')).toThrow(/not available/);
      expect(() => (math as unknown as { import: (o: object) => unknown }).import({})).toThrow(/not available/);
      expect(() => (math as unknown as { createUnit: (s: string) => unknown }).createUnit('zz')).toThrow(/not available/);
    });

    it('should still allow small matrices and statistics', () => {
      expect(evaluateQuick('sum(ones(10) * 2)').value).toBe(20);
      expect(evaluateQuick('mean([1, 2, 3] m)').unit).toBe('m');
    });
  });
  describe('unit names', () => {
    // Reference library: mathjs 15.2.0, Unit.isValuelessUnit (its memoised scan of the unit table),
    // kept as isValuelessUnitByMathjs; the engine answers the same question by suffix look-up.
    const table = math.Unit.UNITS as unknown as Record<string, { prefixes: Record<string, unknown> }>;
    const names = new Set<string>(['', 'mm', 'kyr', 'ka', 'Ma', 'Myrs', 'Gyr', 'kkm', 'dam', 'hh', 'K', 'C', 'b', 'e', 'h', 'rate']);
    for (const unit of Object.keys(table)) {
      names.add(unit);
      for (const prefix of Object.keys(table[unit]!.prefixes)) {
        names.add(`${prefix}${unit}`);
        names.add(`x${prefix}${unit}`);
        names.add(`${prefix}${unit}s`);
      }
    }
    for (let i = 0; i < 500; i++) names.add(`v${i}`);
    for (const odd of ['constructor', '__proto__', 'toString', 'hasOwnProperty', 'valueOf']) names.add(odd);
    names.add(`${'a'.repeat(1990)}m`);
    names.add(`${'k'.repeat(1999)}`);

    it('should answer "is this a unit?" exactly as mathjs does, for every unit, prefixed unit and others', () => {
      const differences = [...names].filter((name) => math.Unit.isValuelessUnit(name) !== isValuelessUnitByMathjs(name));
      expect(differences).toEqual([]);
      // Ask twice: the remembered answers are the same answers.
      expect([...names].filter((name) => math.Unit.isValuelessUnit(name) !== isValuelessUnitByMathjs(name))).toEqual([]);
    });

    it('should know the prefixed forms and refuse ordinary block names', () => {
      expect(math.Unit.isValuelessUnit('km')).toBe(true);
      expect(math.Unit.isValuelessUnit('kyr')).toBe(true);
      expect(math.Unit.isValuelessUnit('Ma')).toBe(true);
      expect(math.Unit.isValuelessUnit('v123')).toBe(false);
      expect(math.Unit.isValuelessUnit('hill_crest')).toBe(false);
    });
  });
});
