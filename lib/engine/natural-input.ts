/**
 * Natural input: what practitioners type that the expression language does not read as they
 * mean it. Before an expression is parsed its text is rewritten (outside quoted text only):
 *   21°  → 21 deg      21°C → 21 degC      m² → m^2     m³ → m^3
 *   -0.02 1/m → -0.02 /m   (a unit written after a number as 1/m means "per metre")
 * and refused with a message that says what to write instead:
 *   ± and +-   (an uncertainty is a distribution: the whole input is normal(…), lognormal(…), …)
 * Parser errors are rewritten in plain words with the position (0-based, in the text as typed)
 * of the fault, and a decimal comma (2,4) is recognised and explained.
 */
import { EngineError } from './errors';

/** The rewritten text, and for each of its characters the index in the text as typed. */
export interface RewrittenText {
  text: string;
  origin: number[];
}

const UNCERTAINTY_HINT =
  'an uncertainty is not written with ± or +-: make the whole input a distribution, such as normal(1.1 m^2/kyr, 0.3 m^2/kyr) or lognormal(1.1 m^2/kyr, 1.5)';

/** Rewrites the natural forms; throws an EngineError (with position) for ± and +-. */
export function rewriteNaturalInput(source: string): RewrittenText {
  let text = '';
  const origin: number[] = [];
  const emit = (piece: string, at: number) => {
    text += piece;
    for (let k = 0; k < piece.length; k++) origin.push(at);
  };
  let quote: string | null = null;
  for (let i = 0; i < source.length; i++) {
    const c = source[i]!;
    if (quote) {
      emit(c, i);
      if (c === '\\' && i + 1 < source.length) {
        i++;
        emit(source[i]!, i);
      } else if (c === quote) quote = null;
      continue;
    }
    if (c === '"' || c === "'") {
      quote = c;
      emit(c, i);
      continue;
    }
    if (c === '±' || (c === '+' && source[i + 1] === '-')) {
      throw new EngineError(UNCERTAINTY_HINT, { position: i });
    }
    if (c === '°') {
      const next = source[i + 1];
      if (next === 'C' || next === 'F') {
        emit(` deg${next}`, i);
        i++;
      } else emit(' deg', i);
      continue;
    }
    if (c === '²') {
      emit('^2', i);
      continue;
    }
    if (c === '³') {
      emit('^3', i);
      continue;
    }
    // "<number> 1/<unit>": drop the 1, so that the unit divides the number.
    if (c === '1' && source[i + 1] === '/' && NUMBER_BEFORE.test(source.slice(Math.max(0, i - 60), i))) {
      const rest = source.slice(i + 2);
      if (/^\s*[A-Za-z]/.test(rest)) {
        emit('/', i + 1);
        i++;
        continue;
      }
    }
    emit(c, i);
  }
  return { text, origin };
}

/** A numeric literal (not part of a name) followed by white space, at the end of the text. */
const NUMBER_BEFORE = /(^|[^A-Za-z0-9_.])(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s+$/;

interface ParserMessage {
  pattern: RegExp;
  explain: (match: RegExpMatchArray) => string;
}

const PARSER_MESSAGES: ParserMessage[] = [
  { pattern: /^Unexpected end of expression/, explain: () => 'the expression ends too early: a value or a closing parenthesis is missing' },
  { pattern: /^Parenthesis \) expected/, explain: () => 'a closing parenthesis ")" is missing' },
  { pattern: /^Parenthesis \] expected/, explain: () => 'a closing bracket "]" is missing' },
  { pattern: /^Value expected/, explain: () => 'a value is missing here' },
  { pattern: /^Unexpected operator (\S+)/, explain: (m) => `the operator "${m[1]}" has no value on one side` },
  { pattern: /^Unexpected part "(.*)"/, explain: (m) => `"${m[1]}" cannot follow what comes before it (a value and its unit go together as 2 m; put an operator between two values)` },
  { pattern: /^Syntax error in part "(.*)"/, explain: (m) => `"${m[1]}" is not part of the expression language` },
  { pattern: /^Unterminated string/, explain: () => 'a text in double quotes is not closed' },
  { pattern: /^Invalid (.*)/, explain: (m) => `invalid ${m[1]}` },
];

/** The 0-based position a mathjs parser message names ("(char 7)" is 1-based), or null. */
function parserPosition(message: string): number | null {
  const match = /\(char (\d+)\)/.exec(message);
  return match ? Math.max(0, Number(match[1]) - 1) : null;
}

const DECIMAL_COMMA = /(\d),(\d)/;

/**
 * Turns a mathjs parse error on the rewritten text into an EngineError in plain words, with the
 * position in the text as typed.
 */
export function explainParseError(error: unknown, source: string, rewritten: RewrittenText): EngineError {
  const raw = error instanceof Error ? error.message : String(error);
  const at = parserPosition(raw);
  const position = at === null ? undefined : at >= rewritten.origin.length ? source.length : rewritten.origin[at];
  const comma = DECIMAL_COMMA.exec(source);
  if (comma && /Unexpected operator ,|Unexpected part|Parenthesis|Value expected|end of expression/.test(raw)) {
    const index = comma.index + 1;
    const number = /[0-9.]*,[0-9]*/.exec(source.slice(Math.max(0, comma.index - 20)))?.[0] ?? comma[0];
    return new EngineError(
      `the expression does not parse: decimal comma in "${number}": use a decimal point (${number.replace(',', '.')}); a comma only separates the inputs of a function`,
      { position: index },
    );
  }
  const known = PARSER_MESSAGES.find((entry) => entry.pattern.test(raw));
  const words = known ? known.explain(raw.match(known.pattern)!) : raw.split('\n')[0]!.replace(/\s*\(char \d+\)/, '');
  const where = position === undefined ? '' : ` (at character ${position + 1})`;
  return new EngineError(`the expression does not parse: ${words}${where}`, position === undefined ? {} : { position });
}
