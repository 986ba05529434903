import { all, create, isMatrix, matrix, type FactoryFunctionMap } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { engineError } from '../support/engine-error';
import { EngineError } from '@/lib/engine/errors';
import '@/lib/engine';
import { checkExpression, defineExpressionFunction, isExpressionFunction, math, parseUnitText, reservedNameReason } from '@/lib/engine/expression';
import { checkNesting, MAX_NESTING_DEPTH } from '@/lib/engine/expression-language';
import { explainParseError, rewriteNaturalInput } from '@/lib/engine/natural-input';
import { findControlCharacter, safeText } from '@/lib/engine/text';
import { quoteAdvice, textInputWords, withQuoteAdvice } from '@/lib/engine/text-words';
import {
  assertElementCount,
  checkValueSize,
  countElements,
  flattenSizes,
  MAX_MATRIX_ELEMENTS,
  MAX_STRING_LENGTH,
  numericArgument,
  sizeChecked,
} from '@/lib/engine/value-size';

// The expression language's plumbing on its own, small and fast (no sheet is evaluated). Code points:
// the Unicode Standard (U+0000–U+001F C0 controls, U+007F DEL, U+0009 tab, U+000A line feed); the caps
// are CONTRACT §3's; element counts of broadcasts and matrix products follow mathjs's documented
// semantics (mathjs 15, "Matrices": broadcasting, multiply) and are checked here by counting.

describe('text a user writes (text.ts)', () => {
  it('should name the first control character as U+XXXX (the Unicode Standard)', () => {
    expect(findControlCharacter('plain text')).toBeNull();
    expect(findControlCharacter('a\u0000b')).toBe('U+0000');
    expect(findControlCharacter('tab\there')).toBe('U+0009');
    expect(findControlCharacter('x\u001fy\u0001')).toBe('U+001F');
    expect(findControlCharacter('del\u007f')).toBe('U+007F');
    expect(findControlCharacter('é ü – °')).toBeNull();
  });

  it('should keep tab and line feed in text that may span lines, and nothing else', () => {
    expect(findControlCharacter('one\ttwo\nthree', true)).toBeNull();
    expect(findControlCharacter('one\r\ntwo', true)).toBe('U+000D');
    expect(findControlCharacter('a\u000bb', true)).toBe('U+000B');
    expect(findControlCharacter('a\u0008b', true)).toBe('U+0008');
    expect(findControlCharacter('a\u007fb', true)).toBe('U+007F');
    expect(findControlCharacter('line\n', false)).toBe('U+000A');
  });

  it('should refuse control characters in the zod schema, with the field’s rules chained after it', () => {
    const title = safeText().trim().min(1).max(20);
    expect(title.parse('  Ridge A  ')).toBe('Ridge A');
    const single = title.safeParse('a\nb');
    expect(single.success).toBe(false);
    expect(single.error!.issues[0]!.message).toBe('must not contain control characters (found U+000A)');
    const note = safeText({ multiline: true });
    expect(note.parse('first\n\tsecond')).toBe('first\n\tsecond');
    const multi = note.safeParse('bell\u0007');
    expect(multi.error!.issues[0]!.message).toBe('must not contain control characters (found U+0007; only tab and line feed are allowed)');
    expect(safeText().safeParse(3).error!.issues[0]!.message).toBe('must be text');
    expect(safeText({ error: 'a title is text' }).safeParse(null).error!.issues[0]!.message).toBe('a title is text');
  });
});

describe('words of the text inputs (text-words.ts)', () => {
  it('should collect the choices and aliases of every text input, once', () => {
    const words = textInputWords();
    for (const word of ['thrust', 'strike_slip', 'normal', 'reverse', 'strike-slip', 'continuous', 'broken', 'fixed', 'zero_flux']) {
      expect(words.has(word), word).toBe(true);
    }
    expect(words.has('granite')).toBe(false);
    expect(textInputWords()).toBe(words);
  });

  it('should advise quotes only for a text word (any case) or in a text input', () => {
    expect(quoteAdvice('thrust')).toBe('; write the word in double quotes, such as "thrust"');
    expect(quoteAdvice('Thrust')).toBe('; write the word in double quotes, such as "Thrust"');
    expect(quoteAdvice('granite')).toBe('');
    expect(quoteAdvice('granite', true)).toBe('; write the word in double quotes, such as "granite"');
  });

  it('should add the advice to a refusal of a bare word called as a function, and to nothing else', () => {
    expect(withQuoteAdvice('"broken" can only be called as a function')).toBe(
      '"broken" can only be called as a function; write the word in double quotes, such as "broken"',
    );
    expect(withQuoteAdvice('"granite" can only be called as a function')).toBe('"granite" can only be called as a function');
    expect(withQuoteAdvice('"granite" can only be called as a function', true)).toBe(
      '"granite" can only be called as a function; write the word in double quotes, such as "granite"',
    );
    expect(withQuoteAdvice('x "broken" can only be called as a function')).toBe('x "broken" can only be called as a function');
    expect(withQuoteAdvice('unknown name')).toBe('unknown name');
  });
});

describe('nesting (checkNesting)', () => {
  const nested = (depth: number, open = '(', close = ')') => `${open.repeat(depth)}1${close.repeat(depth)}`;

  it('should allow 40 levels of brackets of any kind and refuse 41', () => {
    expect(MAX_NESTING_DEPTH).toBe(40);
    expect(() => checkNesting(nested(40))).not.toThrow();
    expect(engineError(() => checkNesting(nested(41))).message).toBe('the expression is nested more than 40 levels deep');
    expect(() => checkNesting(nested(41, '[', ']'))).toThrow(EngineError);
    expect(() => checkNesting(nested(41, '{', '}'))).toThrow(EngineError);
    expect(() => checkNesting(`${nested(20, '(', ')')}+${nested(20, '[', ']')}+${nested(40, '{', '}')}`)).not.toThrow();
    // Closing brackets of every kind bring the depth down again.
    expect(() => checkNesting(`${nested(30)} ${nested(30, '[', ']')} ${nested(30, '{', '}')}`)).not.toThrow();
    expect(() => checkNesting(`${'('.repeat(21)}${']'.repeat(21)}${'('.repeat(21)}`)).not.toThrow();
    expect(() => checkNesting(`${'('.repeat(21)}${'}'.repeat(21)}${'['.repeat(21)}`)).not.toThrow();
  });

  it('should count only brackets, whatever stands between them', () => {
    const spaced = (depth: number) => `${'(1 + '.repeat(depth)}1${')'.repeat(depth)}`;
    expect(() => checkNesting(spaced(40))).not.toThrow();
    expect(engineError(() => checkNesting(spaced(41))).message).toBe('the expression is nested more than 40 levels deep');
    expect(() => checkNesting(`${'[a, '.repeat(41)}1${']'.repeat(41)}`)).toThrow(EngineError);
  });

  it('should not count brackets inside quoted text, either quote, with escaped quotes', () => {
    expect(() => checkNesting(`"${'('.repeat(50)}"`)).not.toThrow();
    expect(() => checkNesting(`'${'['.repeat(50)}'`)).not.toThrow();
    expect(() => checkNesting(`"a\\"${'('.repeat(50)}"`)).not.toThrow();
    expect(() => checkNesting(`"a'"${'('.repeat(41)}`)).toThrow(EngineError);
    expect(() => checkNesting(`'a"'${'('.repeat(41)}`)).toThrow(EngineError);
    expect(() => checkNesting(`"x"${'('.repeat(41)}`)).toThrow(EngineError);
  });
});

describe('natural input (rewriteNaturalInput)', () => {
  it('should rewrite degrees, powers and "1/unit" after a number, keeping each character’s origin', () => {
    expect(rewriteNaturalInput('21°')).toEqual({ text: '21 deg', origin: [0, 1, 2, 2, 2, 2] });
    expect(rewriteNaturalInput('5°C')).toEqual({ text: '5 degC', origin: [0, 1, 1, 1, 1, 1] });
    expect(rewriteNaturalInput('5°F')).toEqual({ text: '5 degF', origin: [0, 1, 1, 1, 1, 1] });
    expect(rewriteNaturalInput('m²')).toEqual({ text: 'm^2', origin: [0, 1, 1] });
    expect(rewriteNaturalInput('m³')).toEqual({ text: 'm^3', origin: [0, 1, 1] });
    expect(rewriteNaturalInput('2 1/m')).toEqual({ text: '2 /m', origin: [0, 1, 3, 4] });
    expect(rewriteNaturalInput('2.5e-3  1/ km').text).toBe('2.5e-3  / km');
    expect(rewriteNaturalInput('.5 1/s').text).toBe('.5 /s');
  });

  it('should leave "1/" alone where it is not a unit after a number', () => {
    for (const text of ['1/m', 'x 1/m', 'v2 1/m', '2 1/2', '2 1/(m)', '2 1/', 'a.b 1/m', '21/m', '25 deg', '2 abc', '2 1km']) expect(rewriteNaturalInput(text).text, text).toBe(text);
    // Only the 60 characters before the 1 are read.
    expect(rewriteNaturalInput(`2${' '.repeat(60)}1/m`).text).toBe(`2${' '.repeat(60)}1/m`);
    expect(rewriteNaturalInput(`2${' '.repeat(58)}1/m`).text).toBe(`2${' '.repeat(58)}/m`);
  });

  it('should leave quoted text alone, either quote, with escapes', () => {
    expect(rewriteNaturalInput('"21° m² 2 1/m"').text).toBe('"21° m² 2 1/m"');
    expect(rewriteNaturalInput("'5°C' 5°C").text).toBe("'5°C' 5 degC");
    expect(rewriteNaturalInput('"a\\"²" m²')).toEqual({ text: '"a\\"²" m^2', origin: [0, 1, 2, 3, 4, 5, 6, 7, 8, 8] });
    expect(rewriteNaturalInput('"a\'b" m²').text).toBe('"a\'b" m^2');
    expect(rewriteNaturalInput('"x\\').text).toBe('"x\\');
  });

  it('should refuse ± and +- at their position, and keep + and - apart', () => {
    expect(engineError(() => rewriteNaturalInput('3 ± 1')).position).toBe(2);
    const plusMinus = engineError(() => rewriteNaturalInput('3 m +- 1 m'));
    expect(plusMinus.position).toBe(4);
    expect(plusMinus.message).toBe(
      'an uncertainty is not written with ± or +-: make the whole input a distribution, such as normal(1.1 m^2/kyr, 0.3 m^2/kyr) or lognormal(1.1 m^2/kyr, 1.5)',
    );
    expect(rewriteNaturalInput('3 + -1').text).toBe('3 + -1');
    expect(rewriteNaturalInput('3 -+ 1').text).toBe('3 -+ 1');
    expect(rewriteNaturalInput('"3 +- 1"').text).toBe('"3 +- 1"');
  });
});

describe('parser messages in plain words (explainParseError)', () => {
  const explain = (raw: string, source: string) => explainParseError(new Error(raw), source, rewriteNaturalInput(source));

  it('should put each known parser message in words, with the position in the text as typed', () => {
    const cases: Array<[string, string, string, number | undefined]> = [
      ['Unexpected end of expression (char 4)', '3 + ', 'the expression ends too early: a value or a closing parenthesis is missing (at character 4)', 3],
      ['Parenthesis ) expected (char 3)', '(3 ', 'a closing parenthesis ")" is missing (at character 3)', 2],
      ['Parenthesis ] expected (char 3)', '[3 ', 'a closing bracket "]" is missing (at character 3)', 2],
      ['Value expected (char 3)', '3 *', 'a value is missing here (at character 3)', 2],
      ['Unexpected operator * (char 1)', '* 3', 'the operator "*" has no value on one side (at character 1)', 0],
      ['Unexpected part "x" (char 3)', '3 x', '"x" cannot follow what comes before it (a value and its unit go together as 2 m; put an operator between two values) (at character 3)', 2],
      ['Syntax error in part "@" (char 5)', '3 m @ 2', '"@" is not part of the expression language (at character 5)', 4],
      ['Unterminated string (char 1)', '"abc', 'a text in double quotes is not closed (at character 1)', 0],
      ['Invalid number (char 1)', '1e', 'invalid number (char 1) (at character 1)', 0],
      ['Something new (char 2)\nsecond line', 'ab', 'Something new (at character 2)', 1],
      ['No position given', 'ab', 'No position given', undefined],
    ];
    for (const [raw, source, words, position] of cases) {
      const error = explain(raw, source);
      expect(error.message, raw).toBe(`the expression does not parse: ${words}`);
      expect(error.position, raw).toBe(position);
    }
  });

  it('should map positions back through rewrites, and past the end to the end of the text', () => {
    // "21° @" is read as "21 deg @": the @ at index 7 of the rewritten text is index 4 as typed.
    expect(explain('Syntax error in part "@" (char 8)', '21° @').position).toBe(4);
    expect(explain('Unexpected end of expression (char 40)', '21°').position).toBe(3);
    expect(explain('Value expected (char 0)', '3 *').position).toBe(0);
    expect(explainParseError('Value expected (char 2)', '3*', rewriteNaturalInput('3*')).message).toBe(
      'the expression does not parse: a value is missing here (at character 2)',
    );
  });

  it('should explain a decimal comma, quoting the number as typed', () => {
    const comma = explain('Unexpected operator , (char 2)', '2,4 m');
    expect(comma.message).toBe(
      'the expression does not parse: decimal comma in "2,4": use a decimal point (2.4); a comma only separates the inputs of a function',
    );
    expect(comma.position).toBe(1);
    const long = explain('Unexpected part "5" (char 8)', 'x + 12.3,5 m');
    expect(long.message).toContain('decimal comma in "12.3,5": use a decimal point (12.3.5)');
    expect(long.position).toBe(8);
    expect(explain('Parenthesis ) expected (char 9)', 'f(1,2').message).toContain('decimal comma in "1,2"');
    expect(explain('Value expected (char 4)', '3,5 +').message).toContain('decimal comma');
    expect(explain('Unexpected end of expression (char 4)', '3,5 +').message).toContain('decimal comma');
    // A comma between numbers with another parser fault is not taken for a decimal comma.
    expect(explain('Unterminated string (char 5)', 'f(1,2, "').message).toBe('the expression does not parse: a text in double quotes is not closed (at character 5)');
    expect(explain('Unexpected part "x" (char 3)', '1, x').message).not.toContain('decimal comma');
  });
});

describe('size caps (value-size.ts, CONTRACT §3)', () => {
  it('should read sizes as plain numbers (true is 1, false 0), skipping a storage format', () => {
    expect(numericArgument('ones', 3)).toBe(3);
    expect(numericArgument('ones', true)).toBe(1);
    expect(numericArgument('ones', false)).toBe(0);
    expect(engineError(() => numericArgument('zeros', '3')).message).toBe('zeros: expects plain numbers for sizes');
    expect(flattenSizes('ones', [2, [3, [4]], 'dense', matrix([5, 6]), true])).toEqual([2, 3, 4, 5, 6, 1]);
    expect(engineError(() => flattenSizes('ones', [[2, 'x']])).message).toBe('ones: expects plain numbers for sizes');
    expect(engineError(() => flattenSizes('ones', [matrix([[1]]), {}])).message).toBe('ones: expects plain numbers for sizes');
  });

  it('should allow 100 000 elements and refuse more, or a count that is not finite', () => {
    expect(MAX_MATRIX_ELEMENTS).toBe(100_000);
    expect(() => assertElementCount('ones', 100_000)).not.toThrow();
    expect(engineError(() => assertElementCount('ones', 100_001)).message).toBe('ones: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(engineError(() => assertElementCount('zeros', Infinity)).message).toBe('zeros: a matrix may hold at most 100000 elements (asked for too many)');
    expect(engineError(() => assertElementCount('zeros', NaN)).message).toBe('zeros: a matrix may hold at most 100000 elements (asked for too many)');
  });

  it('should check a value’s string length and element count', () => {
    expect(MAX_STRING_LENGTH).toBe(1000);
    expect(() => checkValueSize('concat', 'x'.repeat(1000))).not.toThrow();
    expect(engineError(() => checkValueSize('concat', 'x'.repeat(1001))).message).toBe(
      'concat: the text would be 1001 characters long, over the limit of 1000 characters in a string value',
    );
    expect(() => checkValueSize('ones', new Array(100_000).fill(0))).not.toThrow();
    expect(engineError(() => checkValueSize('ones', new Array(100_001).fill(0))).message).toBe(
      'ones: the result would hold 100001 elements, over the limit of 100000 elements in a matrix value',
    );
    // Nested arrays are counted element by element (ragged ones too).
    expect(engineError(() => checkValueSize('x', [new Array(60_000).fill(0), [new Array(40_001).fill(1)]])).message).toContain('100001 elements');
    expect(() => checkValueSize('x', [new Array(60_000).fill(0), [new Array(40_000).fill(1)]])).not.toThrow();
    expect(engineError(() => checkValueSize('x', matrix(new Array(100_001).fill(0)))).message).toContain('100001 elements');
    expect(() => checkValueSize('x', 5)).not.toThrow();
  });

  it('should count elements of arrays and matrices', () => {
    expect(countElements([[1, 2], [3, [4, 5]]])).toBe(5);
    expect(countElements(matrix([[1, 2, 3], [4, 5, 6]]))).toBe(6);
    expect(countElements(7)).toBe(1);
    expect(countElements([])).toBe(0);
  });

  const counting = () => {
    const calls: unknown[][] = [];
    const fn = (...args: unknown[]) => {
      calls.push(args);
      return 'done';
    };
    return { calls, fn };
  };
  const shape = (rows: number, columns?: number) => ({ size: () => (columns === undefined ? [rows] : [rows, columns]) });
  // shapeOf reads mathjs matrices (isMatrix) and nested arrays; a stand-in with size() is not a matrix.
  const ones = (rows: number, columns?: number) => matrix(columns === undefined ? new Array(rows).fill(1) : new Array(rows).fill(0).map(() => new Array(columns).fill(1)));

  it('should refuse before the call a product or broadcast whose element count is over the cap', () => {
    expect(isMatrix(shape(2))).toBe(false);
    const refusals: Array<[string, unknown[], number]> = [
      ['multiply', [ones(400, 1), ones(1, 400)], 160_000],
      ['multiply', [2, ones(400, 1), ones(1, 400)], 160_000],
      ['multiply', [ones(400, 1), 3, ones(1, 400)], 160_000],
      ['add', [ones(400, 1), ones(1, 400)], 160_000],
      ['add', [ones(400, 1), [[1, 1, 1, 1]].map(() => new Array(400).fill(1))], 160_000],
      // Shapes of different rank line up at their last dimension: [300, 1] and [400] broadcast to [300, 400].
      ['add', [ones(300, 1), ones(400)], 120_000],
      ['add', [ones(400), ones(300, 1)], 120_000],
      ['dotMultiply', [ones(1, 400), ones(400, 1), 5], 160_000],
      ['concat', [ones(60_000), ones(40_001)], 100_001],
      ['concat', [new Array(60_000).fill(1), ones(40_001)], 100_001],
    ];
    for (const [name, args, count] of refusals) {
      const { calls, fn } = counting();
      const error = engineError(() => sizeChecked(name, fn)(...args));
      expect(error.message, name).toBe(`${name}: the result would hold ${count} elements, over the limit of 100000 elements in a matrix value`);
      expect(calls, name).toHaveLength(0);
    }
  });

  it('should call through when the predicted count is within the cap or cannot be predicted', () => {
    const allowed: Array<[string, unknown[]]> = [
      ['multiply', [ones(300, 1), ones(1, 300)]],
      ['multiply', [ones(1000), ones(1000)]],
      ['multiply', [ones(1, 1000), ones(1000, 1)]],
      ['multiply', [ones(400, 2), ones(2)]],
      ['multiply', [ones(2), ones(2, 400)]],
      // Shapes mathjs refuses itself (a 3-D operand) are left to mathjs.
      ['multiply', [ones(400, 1), [[[1]]], ones(1, 400)]],
      ['multiply', [2, 3]],
      ['add', [ones(400, 1), 1]],
      ['add', [ones(300, 1), ones(1, 300)]],
      ['concat', [ones(50_000), ones(50_000)]],
      ['concat', ['x', 'y']],
    ];
    for (const [name, args] of allowed) {
      const { calls, fn } = counting();
      expect(sizeChecked(name, fn)(...args), name).toBe('done');
      expect(calls, name).toHaveLength(1);
    }
  });

  it('should check every result after the call, and only the result of a lazily evaluated operator', () => {
    const long = sizeChecked('concat', () => 'x'.repeat(1001));
    expect(engineError(() => long()).message).toBe('concat: the text would be 1001 characters long, over the limit of 1000 characters in a string value');
    const big = sizeChecked('range', () => new Array(100_001).fill(0));
    expect(engineError(() => big()).message).toContain('range: the result would hold 100001 elements');
    const seen: unknown[][] = [];
    const lazy = Object.assign((...args: unknown[]) => {
      seen.push(args);
      return args.length;
    }, { rawArgs: true });
    const checkedLazy = sizeChecked('or', lazy);
    expect(checkedLazy.rawArgs).toBe(true);
    // Arguments of a lazy operator are parse nodes: never measured before the call.
    expect(checkedLazy(ones(400, 1), ones(1, 400))).toBe(2);
    expect(seen).toHaveLength(1);
    const lazyLong = sizeChecked('or', Object.assign(() => 'y'.repeat(1001), { rawArgs: true }));
    expect(engineError(() => lazyLong()).message).toContain('or: the text would be 1001 characters long');
    expect(sizeChecked('add', (a: unknown) => a).rawArgs).toBeUndefined();
  });
});

describe('the locked instance and the expression checks (expression.ts)', () => {
  /** The size of what an expression evaluates to, or its value. */
  const run = (text: string): unknown => {
    const value = checkExpression(text).evaluate(new Map());
    return math.isMatrix(value) ? (value as { size(): number[] }).size() : value;
  };
  const refusal = (text: string): string => engineError(() => run(text)).message;

  it('should bound the constructors before they allocate, at exactly 100 000 elements (CONTRACT §3)', () => {
    expect(run('ones(100000)')).toEqual([100_000]);
    expect(refusal('ones(100001)')).toBe('ones: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(run('zeros(400, 250)')).toEqual([400, 250]);
    expect(refusal('zeros(400, 251)')).toBe('zeros: a matrix may hold at most 100000 elements (asked for 100400)');
    expect(refusal('ones([400, 251])')).toBe('ones: a matrix may hold at most 100000 elements (asked for 100400)');
    expect(run('identity(316)')).toEqual([316, 316]);
    expect(refusal('identity(317)')).toBe('identity: a matrix may hold at most 100000 elements (asked for 100489)');
    expect(run('identity(2, 3)')).toEqual([2, 3]);
    expect(refusal('identity(100, 1001)')).toBe('identity: a matrix may hold at most 100000 elements (asked for 100100)');
    // A negative size counts as none (mathjs then refuses it in its own words).
    expect(() => run('ones(-400, -400)')).toThrow(/positive integers/);
    expect(() => run('zeros(-400, -400)')).toThrow(/positive integers/);
    expect(() => run('identity(-400, -400)')).toThrow(/positive integers/);
    expect(run('matrix([[1, 2], [3, 4]])')).toEqual([2, 2]);
    // A size with a unit, or a list holding text, is refused in the constructor's own name.
    expect(refusal('ones(2 m)')).toBe('ones: expects plain numbers for sizes');
    expect(refusal('zeros(2, 2 m)')).toBe('zeros: expects plain numbers for sizes');
    expect(refusal('identity(2 m)')).toBe('identity: expects plain numbers for sizes');
    expect(refusal('ones([2, "x"])')).toBe('ones: expects plain numbers for sizes');
  });

  it('should bound ranges by their count, refusing a zero step and anything but plain numbers', () => {
    // In expressions a range includes its end (mathjs 15, "Expression syntax", Ranges: `1:4` and range(1, 4)
    // are [1, 2, 3, 4]); a last `false` leaves the end out. 0 … 99 999 is exactly the cap of 100 000.
    expect(run('range(0, 99999)')).toEqual([100_000]);
    expect(run('range(0, 99999, 1)')).toEqual([100_000]);
    expect(run('0:99999')).toEqual([100_000]);
    expect(run('range(0, 100000, false)')).toEqual([100_000]);
    expect(run('range(0, 100000, 1, false)')).toEqual([100_000]);
    expect(refusal('range(0, 100000)')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(refusal('0:100000')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(refusal('range(0, 100001, false)')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(refusal('range(100000, 0, -1)')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(refusal('range(0, 20, 0.0002)')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(run('range(0, 1, 0.0001)')).toEqual([10_001]);
    expect(run('range(5, 0, -1)')).toEqual([6]);
    expect(run('range(true, 3)')).toEqual([3]);
    expect(run('range(1, 0)')).toEqual([0]);
    expect(refusal('range(0, 10, 0)')).toBe('range: the step must not be zero');
    expect(refusal('range("1", 5)')).toBe('range: expects plain numbers, as range(start, end) or range(start, end, step)');
    expect(refusal('range(1, 5 m)')).toBe('range: expects plain numbers, as range(start, end) or range(start, end, step)');
  });

  it('should give the ranges mathjs gives in expressions, end included (reference: an unlocked mathjs instance)', () => {
    const reference = create(all as FactoryFunctionMap);
    for (const text of ['1:4', 'range(1, 4)', 'range(1, 4, 2)', 'range(1, 4, false)', 'range(1, 4, 1, false)', 'range(4, 1, -1)', 'range(true, 3)', 'range(0, 1, 0.25)', '2:-1:-2', 'range(1, 1)', 'range(1, 0)', 'range(0, 0.3, 0.1)']) {
      const ours = checkExpression(text).evaluate(new Map()) as { toArray(): number[] };
      const theirs = reference.evaluate(text) as { toArray(): number[] };
      expect(ours.toArray(), text).toEqual(theirs.toArray());
    }
    // The namespace function (not reached by expressions) keeps mathjs's end-exclusive form.
    expect((math.range(1, 4) as unknown as { toArray(): number[] }).toArray()).toEqual([1, 2, 3]);
  });

  it('should say why a name is reserved, in order: words, units, engine functions, distributions, built-ins', () => {
    expect(reservedNameReason('to')).toBe('"to" is a word of the expression language');
    expect(reservedNameReason('true')).toBe('"true" is a word of the expression language');
    expect(reservedNameReason('km')).toBe('"km" is a unit the engine knows, so km.x would be ambiguous');
    expect(reservedNameReason('dataset')).toBe('"dataset" is a block type\'s function in expressions');
    expect(reservedNameReason('lognormal')).toBe('"lognormal" is a distribution the engine knows, such as lognormal(…) in an input');
    expect(reservedNameReason('sqrt')).toBe('"sqrt" is a function the engine knows');
    expect(reservedNameReason('pi')).toBe('"pi" is a constant the engine knows');
    expect(reservedNameReason('gravity')).toBe('"gravity" is a constant the engine knows');
    expect(reservedNameReason('hill')).toBeNull();
  });

  it('should list references once each, free names once each, and leave units and constants out', () => {
    const checked = checkExpression('a.b + a.b * c.d + foo + bar2 * foo + km + pi');
    expect(checked.references).toEqual([{ block: 'a', output: 'b' }, { block: 'c', output: 'd' }]);
    expect(checked.freeSymbols).toEqual(['foo', 'bar2']);
    expect(checked.distribution).toBeNull();
    expect(checked.nestedDistribution).toBe(false);
    expect(checked.text).toBe('a.b + a.b * c.d + foo + bar2 * foo + km + pi');
    expect(checkExpression('x[1]').freeSymbols).toEqual(['x']);
    // The words null and undefined are constants without a length: checked like numbers, never measured as text.
    expect(checkExpression('null').freeSymbols).toEqual([]);
    expect(run('null')).toBeNull();
    expect(run('undefined')).toBeUndefined();
    expect(run('[true, false, null]')).toEqual([3]);
    expect(checkExpression('(f)(2)').freeSymbols).toEqual(['f']);
  });

  it('should recognise a distribution as the whole expression (through parentheses) and flag one nested anywhere', () => {
    const whole = checkExpression('(normal(1 m, 0.2 m))');
    expect(whole.distribution!.name).toBe('normal');
    expect(whole.distribution!.args.map((arg) => String(arg.evaluate(new Map())))).toEqual(['1 m', '0.2 m']);
    expect(whole.nestedDistribution).toBe(false);
    for (const text of ['normal(1, 2) + 1', '2 * uniform(1, 2)', 'sqrt(triangular(1, 2, 3))']) {
      const nested = checkExpression(text);
      expect(nested.distribution, text).toBeNull();
      expect(nested.nestedDistribution, text).toBe(true);
    }
    const inner = checkExpression('normal(normal(1, 1), 1)');
    expect(inner.distribution!.name).toBe('normal');
    expect(inner.nestedDistribution).toBe(true);
    expect(checkExpression('sqrt(4)').distribution).toBeNull();
    expect(refusal('normal(1, 2) + 1')).toBe('a distribution must be the whole expression of an input');
  });

  it('should refuse each kind of statement and call the language does not have, in words', () => {
    const cases: Array<[string, string]> = [
      ['x = 1', 'assignments (=) are not allowed: each input is a single expression'],
      ['f(x) = 1', 'defining functions is not allowed in expressions'],
      ['1; 2', 'only one expression per input: ";" and line breaks separating statements are not allowed'],
      ['{a: 1}', 'objects ({...}) are not allowed in expressions'],
      ['a.b(2)', 'only named functions can be called, such as sqrt(x)'],
      ['f(2)', 'the function "f" is not available in Denudata expressions'],
      ['sqrt', '"sqrt" can only be called as a function, such as sqrt(x)'],
      ['normal + 1', '"normal" can only be called as a function, such as normal(x)'],
      ['dataset * 2', '"dataset" can only be called as a function, such as dataset(x)'],
      ['version', '"version" can only be called as a function, such as version(x)'],
      ['foo.bar.baz', 'a dot may only follow a block name, as in name.output'],
      ['', 'the expression is empty'],
      [' \t ', 'the expression is empty'],
      [`"${'x'.repeat(1001)}"`, 'a text in quotes may be at most 1000 characters long (this one has 1001)'],
      [`1${' '.repeat(2000)}`, 'the expression is longer than 2000 characters'],
      [`${'-'.repeat(161)}1`, 'the expression is nested too deeply'],
      ['3 +', 'the expression does not parse: the expression ends too early: a value or a closing parenthesis is missing (at character 4)'],
      ['dataset("abc")', 'dataset(…) can only be the whole input of a data input (data of scarp_fit, profile_evolution or channel_march)'],
    ];
    for (const [text, message] of cases) expect(refusal(text), text.slice(0, 20)).toBe(message);
    // Just inside each cap.
    expect(run(`"${'x'.repeat(1000)}"`)).toHaveLength(1000);
    expect(run(`1${' '.repeat(1999)}`)).toBe(1);
    expect(run(`${'-'.repeat(158)}1`)).toBe(1);
    expect(run(Array.from({ length: 150 }, () => '1').join('+'))).toBe(150);
    expect(run('pi * e')).toBeCloseTo(Math.PI * Math.E, 14);
  });

  it('should refuse more than 1000 parts, counting a reference as three', () => {
    // A list of n references [a.b, a.b, …] is 1 + 3n parts (one array, and a.b is a name, a dot and a key).
    const refs = (n: number) => `[${Array.from({ length: n }, () => 'a.b').join(',')}]`;
    expect(checkExpression(refs(333)).references).toEqual([{ block: 'a', output: 'b' }]);
    expect(engineError(() => checkExpression(refs(334))).message).toBe('the expression has more than 1000 parts');
    // 999 numbers in a list are 1000 parts.
    expect(run(`[${Array.from({ length: 999 }, () => '1').join(',')}]`)).toEqual([999]);
  });

  it('should check and compile each text once', () => {
    const first = checkExpression('2 * 21');
    expect(checkExpression('2 * 21')).toBe(first);
    expect(first.evaluate(new Map())).toBe(42);
  });

  it('should check and keep more than one text at a time', () => {
    const first = checkExpression('2 * 21');
    const other = checkExpression('3 * 7');
    expect(checkExpression('2 * 21')).toBe(first);
    expect(checkExpression('3 * 7')).toBe(other);
    expect(other.evaluate(new Map())).toBe(21);
  });

  it('should refuse nesting deeper than 160 parts (four times the bracket depth), counting every level', () => {
    // 160 unary minus signs are 161 levels of parts (the number is the 161st): an even count gives back 1.
    expect(run(`${'-'.repeat(160)}1`)).toBe(1);
    expect(run(`${'-'.repeat(159)}1`)).toBe(-1);
    expect(refusal(`${'-'.repeat(161)}1`)).toBe('the expression is nested too deeply');
    expect(refusal(`${'-'.repeat(1999)}1`)).toBe('the expression is nested too deeply');
    expect(refusal(`2${'^2'.repeat(999)}`)).toBe('the expression is nested too deeply');
    // A function call's arguments are one level deeper too: 10 calls around 149 or 150 minus signs.
    const calls = (minus: number) => `${'abs('.repeat(10)}${'-'.repeat(minus)}2${')'.repeat(10)}`;
    expect(run(calls(150))).toBe(2);
    expect(refusal(calls(151))).toBe('the expression is nested too deeply');
  });

  it('should count a range by its span and step, rounding down (mathjs 15 range)', () => {
    // range(0, 99998.5) holds 0, 1, …, 99998 with its end included: 99 999 elements; the half-step is never reached.
    expect(run('range(0, 99998.5)')).toEqual([99_999]);
    expect(run('range(0, 99999.5)')).toEqual([100_000]);
    expect(run('range(0.5, 100000)')).toEqual([100_000]);
    expect(run('range(0, 99999.5, false)')).toEqual([100_000]);
    expect(refusal('range(0, 100000.5)')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(refusal('range(0, 100000.5, false)')).toBe('range: a matrix may hold at most 100000 elements (asked for 100001)');
  });

  it('should bound the locked instance itself, not only what expressions reach (CONTRACT §3)', () => {
    const locked = math as unknown as Record<string, (...args: unknown[]) => unknown>;
    expect(engineError(() => locked.matrix!(new Array(100_001).fill(0))).message).toBe('matrix: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(locked.size!(locked.matrix!(new Array(100_000).fill(0)))).toEqual([100_000]);
    expect(engineError(() => locked.ones!(100_001)).message).toBe('ones: a matrix may hold at most 100000 elements (asked for 100001)');
    expect(engineError(() => locked.zeros!([400, 251])).message).toBe('zeros: a matrix may hold at most 100000 elements (asked for 100400)');
    expect(engineError(() => locked.identity!(317)).message).toBe('identity: a matrix may hold at most 100000 elements (asked for 100489)');
    expect(engineError(() => locked.parse!('1 + 1')).message).toBe('the function "parse" is not available in Denudata expressions');
    expect(engineError(() => locked.normal!(1, 2)).message).toBe('a distribution must be the whole expression of an input');
  });

  it('should say which names are engine functions, and define each once (the first definition stays)', () => {
    expect(isExpressionFunction('dataset')).toBe(true);
    expect(isExpressionFunction('peclet_number')).toBe(true);
    expect(isExpressionFunction('sqrt')).toBe(false);
    expect(isExpressionFunction('normal')).toBe(false);
    expect(isExpressionFunction('hill')).toBe(false);
    defineExpressionFunction('dataset', () => 42);
    expect(refusal('dataset("abc")')).toBe('dataset(…) can only be the whole input of a data input (data of scarp_fit, profile_evolution or channel_march)');
    // A new engine function is reserved, callable and size-checked like every other.
    defineExpressionFunction('plumbing_probe', (n: unknown) => 'x'.repeat(n as number));
    defineExpressionFunction('plumbing_probe', () => 'second');
    expect(isExpressionFunction('plumbing_probe')).toBe(true);
    expect(reservedNameReason('plumbing_probe')).toBe('"plumbing_probe" is a block type\'s function in expressions');
    expect(run('plumbing_probe(3)')).toBe('xxx');
    expect(refusal('plumbing_probe(1001)')).toBe('plumbing_probe: the text would be 1001 characters long, over the limit of 1000 characters in a string value');
    expect(refusal('plumbing_probe + 1')).toBe('"plumbing_probe" can only be called as a function, such as plumbing_probe(x)');
  });

  it('should read a unit text as a unit, or give null for anything else and for texts over 200 characters', () => {
    const rate = parseUnitText('mm/yr')!;
    expect(rate.value).toBeNull();
    // 1 mm/yr = 1e-3 m / 31 557 600 s (the Julian year, CONTRACT §3).
    expect(parseUnitText('1 mm/yr')!.toNumber('m/s') / (1e-3 / 31_557_600)).toBeCloseTo(1, 14);
    expect(rate.equalBase(math.unit('m/s'))).toBe(true);
    expect(parseUnitText('furlongs')).toBeNull();
    expect(parseUnitText('m/')).toBeNull();
    // mathjs reads an empty text as the empty unit (no parts, no value); dataset-units.ts refuses a blank text first.
    expect(parseUnitText('')!.equalBase(math.unit('m/m'))).toBe(true);
    expect(parseUnitText('m'.padEnd(200, ' '))!.equalBase(math.unit('m'))).toBe(true);
    expect(parseUnitText('m'.padEnd(201, ' '))).toBeNull();
    // A quantity is read too (dataset-units.ts refuses it by its value).
    expect(parseUnitText('3 m')!.value).toBe(3);
  });
});
