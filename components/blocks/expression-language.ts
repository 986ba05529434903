/**
 * CodeMirror support for sheet expressions: a small stream highlighter and completion of
 * `name.output` references, units and functions (all plain data from the page).
 */
import { autocompletion, type CompletionContext, type CompletionResult, type Completion } from '@codemirror/autocomplete';
import { HighlightStyle, StreamLanguage, syntaxHighlighting } from '@codemirror/language';
import { tags } from '@lezer/highlight';

export interface CompletionData {
  /** Other blocks and the outputs they offer, in sheet order. */
  blocks: { name: string; title: string; outputs: { name: string; detail: string }[] }[];
  units: readonly string[];
  functions: readonly string[];
}

const KEYWORDS = new Set(['to', 'in', 'and', 'or', 'not', 'xor', 'mod']);
const CONSTANTS = new Set(['pi', 'e', 'tau', 'true', 'false', 'Infinity', 'NaN', 'g']);

interface StreamState {
  afterDot: boolean;
}

export function expressionLanguage(units: ReadonlySet<string>, functions: ReadonlySet<string>) {
  return StreamLanguage.define<StreamState>({
    name: 'denudata-expression',
    startState: () => ({ afterDot: false }),
    token(stream, state) {
      if (stream.eatSpace()) return null;
      const wasAfterDot = state.afterDot;
      state.afterDot = false;
      if (stream.match(/^(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?/)) return 'number';
      if (stream.match(/^"(?:[^"\\]|\\.)*"?/)) return 'string';
      const word = stream.match(/^[A-Za-z_$][A-Za-z0-9_$]*/) as RegExpMatchArray | null;
      if (word) {
        const text = word[0];
        if (wasAfterDot) return 'propertyName';
        if (stream.peek() === '.' && /[A-Za-z_]/.test(stream.string.charAt(stream.pos + 1))) return 'variableName.special';
        if (KEYWORDS.has(text)) return 'keyword';
        if (stream.peek() === '(' || functions.has(text)) return 'function';
        if (CONSTANTS.has(text)) return 'atom';
        if (units.has(text)) return 'unit';
        return 'variableName';
      }
      if (stream.eat('.')) {
        state.afterDot = true;
        return 'punctuation';
      }
      stream.next();
      return 'operator';
    },
    tokenTable: {
      unit: tags.typeName,
      function: tags.function(tags.variableName),
    },
  });
}

export const expressionHighlight = syntaxHighlighting(
  HighlightStyle.define([
    { tag: tags.number, class: 'tok-number' },
    { tag: tags.string, class: 'tok-string' },
    { tag: tags.typeName, class: 'tok-unit' },
    { tag: tags.function(tags.variableName), class: 'tok-fn' },
    { tag: tags.special(tags.variableName), class: 'tok-ref' },
    { tag: tags.propertyName, class: 'tok-ref' },
    { tag: tags.keyword, class: 'tok-keyword' },
    { tag: tags.operator, class: 'tok-op' },
    { tag: tags.atom, class: 'tok-unit' },
  ]),
);

/** Completion: after `name.` the outputs of that block; otherwise block names, units and functions. */
export function expressionCompletion(getData: () => CompletionData) {
  return autocompletion({
    activateOnTyping: true,
    override: [
      (context: CompletionContext): CompletionResult | null => {
        // A list that would open after focus left (a fast Tab) would stay over the next fields.
        if (context.view && !context.view.hasFocus) return null;
        const data = getData();
        const member = context.matchBefore(/[A-Za-z_][A-Za-z0-9_]*\.[A-Za-z0-9_]*/);
        if (member) {
          const [blockName] = member.text.split('.');
          const block = data.blocks.find((b) => b.name === blockName);
          if (!block) return null;
          return {
            from: member.from + blockName!.length + 1,
            options: block.outputs.map((o) => ({ label: o.name, type: 'property', detail: o.detail })),
            validFor: /^[A-Za-z0-9_]*$/,
          };
        }
        const word = context.matchBefore(/[A-Za-z_][A-Za-z0-9_]*/);
        if (!word || (word.from === word.to && !context.explicit)) return null;
        const options: Completion[] = [
          ...data.blocks.map((b) => ({ label: b.name, type: 'variable', detail: b.title, boost: 2 })),
          ...data.functions.map((f) => ({ label: f, type: 'function', apply: `${f}(`, detail: 'function' })),
          ...data.units.map((u) => ({ label: u, type: 'constant', detail: 'unit' })),
        ];
        return { from: word.from, options, validFor: /^[A-Za-z0-9_]*$/ };
      },
    ],
  });
}
