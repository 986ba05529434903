/**
 * A small tokenizer for sheet expressions (the mathjs-like syntax of the contract), shared by the
 * client's highlighting, reference detection and the rename rewrite. It never evaluates anything:
 * the engine on the server is the only judge of an expression.
 */

export type TokenKind = 'space' | 'number' | 'string' | 'identifier' | 'operator' | 'unknown';

export interface Token {
  kind: TokenKind;
  text: string;
  /** Offset of the first character in the expression. */
  from: number;
}

const IDENTIFIER_START = /[A-Za-z_$\u00C0-\u024F]/;
const IDENTIFIER_PART = /[A-Za-z0-9_$\u00C0-\u024F]/;
const TWO_CHAR_OPERATORS = new Set(['==', '!=', '<=', '>=', '<<', '>>', '.*', './', '.^', "'"]);

function readNumber(text: string, start: number): number {
  let i = start;
  const isDigit = (c: string | undefined) => c !== undefined && c >= '0' && c <= '9';
  if (text[i] === '0' && (text[i + 1] === 'x' || text[i + 1] === 'b' || text[i + 1] === 'o')) {
    i += 2;
    while (i < text.length && /[0-9a-fA-F]/.test(text[i]!)) i++;
    return i;
  }
  while (isDigit(text[i])) i++;
  if (text[i] === '.' && isDigit(text[i + 1])) {
    i++;
    while (isDigit(text[i])) i++;
  } else if (text[i] === '.' && i > start && !IDENTIFIER_START.test(text[i + 1] ?? '')) {
    i++; // "2." is a number in mathjs
  }
  if ((text[i] === 'e' || text[i] === 'E') && (isDigit(text[i + 1]) || ((text[i + 1] === '-' || text[i + 1] === '+') && isDigit(text[i + 2])))) {
    i += 2;
    while (isDigit(text[i])) i++;
  }
  return i;
}

/** Splits an expression into tokens; concatenating their texts gives the expression back. */
export function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  const previousSignificant = () => {
    for (let k = tokens.length - 1; k >= 0; k--) if (tokens[k]!.kind !== 'space') return tokens[k]!;
    return undefined;
  };
  while (i < text.length) {
    const c = text[i]!;
    const start = i;
    if (/\s/.test(c)) {
      while (i < text.length && /\s/.test(text[i]!)) i++;
      tokens.push({ kind: 'space', text: text.slice(start, i), from: start });
      continue;
    }
    if (c === '"' || (c === "'" && !endsOperand(previousSignificant()))) {
      i++;
      while (i < text.length && text[i] !== c) i += text[i] === '\\' ? 2 : 1;
      i = Math.min(text.length, i + 1);
      tokens.push({ kind: 'string', text: text.slice(start, i), from: start });
      continue;
    }
    const prior = previousSignificant();
    const digitAfterDot = c === '.' && /[0-9]/.test(text[i + 1] ?? '') && !(prior && (prior.kind === 'identifier' || prior.text === ')' || prior.text === ']'));
    if ((c >= '0' && c <= '9') || digitAfterDot) {
      i = digitAfterDot ? readNumber(text, i + 1) : readNumber(text, i);
      tokens.push({ kind: 'number', text: text.slice(start, i), from: start });
      continue;
    }
    if (IDENTIFIER_START.test(c)) {
      while (i < text.length && IDENTIFIER_PART.test(text[i]!)) i++;
      tokens.push({ kind: 'identifier', text: text.slice(start, i), from: start });
      continue;
    }
    const two = text.slice(i, i + 2);
    if (TWO_CHAR_OPERATORS.has(two) && two.length === 2 && !(two.startsWith('.') && IDENTIFIER_START.test(text[i + 1] ?? ''))) {
      i += 2;
      tokens.push({ kind: 'operator', text: two, from: start });
      continue;
    }
    i++;
    tokens.push({ kind: /[-+*/^%!=<>&|~?:,;()[\]{}.']/.test(c) ? 'operator' : 'unknown', text: c, from: start });
  }
  return tokens;
}

function endsOperand(token: Token | undefined): boolean {
  if (!token) return false;
  return token.kind === 'identifier' || token.kind === 'number' || token.kind === 'string' || token.text === ')' || token.text === ']';
}

export interface Reference {
  block: string;
  output: string;
  /** Offset of the block name. */
  from: number;
  /** Offset just after the output name. */
  to: number;
}

/** The `name.output` references in an expression (a name that is itself a property is not one). */
export function findReferences(text: string): Reference[] {
  const tokens = tokenize(text);
  const found: Reference[] = [];
  for (let k = 0; k + 2 < tokens.length; k++) {
    const [a, dot, b] = [tokens[k]!, tokens[k + 1]!, tokens[k + 2]!];
    if (a.kind !== 'identifier' || dot.text !== '.' || b.kind !== 'identifier') continue;
    const before = tokens[k - 1];
    if (before && before.text === '.') continue;
    found.push({ block: a.text, output: b.text, from: a.from, to: b.from + b.text.length });
  }
  return found;
}

/** Rewrites `from.output` into `to.output`, leaving strings, properties and other names alone. */
export function renameReferences(text: string, from: string, to: string): string {
  if (from === to) return text;
  const references = findReferences(text).filter((r) => r.block === from);
  if (references.length === 0) return text;
  let out = '';
  let cursor = 0;
  for (const reference of references) {
    out += text.slice(cursor, reference.from) + to;
    cursor = reference.from + from.length;
  }
  return out + text.slice(cursor);
}

/** Rewrites `block.from` into `block.to` (a renamed output such as a parameter of a table). */
export function renameOutputReferences(text: string, block: string, from: string, to: string): string {
  if (from === to) return text;
  const references = findReferences(text).filter((r) => r.block === block && r.output === from);
  if (references.length === 0) return text;
  let out = '';
  let cursor = 0;
  for (const reference of references) {
    const outputFrom = reference.to - from.length;
    out += text.slice(cursor, outputFrom) + to;
    cursor = reference.to;
  }
  return out + text.slice(cursor);
}
