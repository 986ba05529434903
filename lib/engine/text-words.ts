/**
 * Words of the text inputs (CONTRACT §4b: `faulting`, `plate`). A word typed without quotes is
 * read by mathjs as a name ("Undefined symbol thrust"); the engine's message then says to write
 * the word in double quotes.
 */
import { BLOCK_TYPES } from './registry';

let words: Set<string> | null = null;

/** Every word (and alias) a text input of some block type accepts, in lower case. */
export function textInputWords(): ReadonlySet<string> {
  if (!words) {
    words = new Set();
    for (const type of BLOCK_TYPES) {
      for (const input of type.inputs) {
        for (const word of input.choices ?? []) words.add(word);
        for (const alias of Object.keys(input.choiceAliases ?? {})) words.add(alias);
      }
    }
  }
  return words;
}

/** The advice added when a bare word may have been meant as text ("" when it is not a text word). */
export function quoteAdvice(symbol: string, textInput = false): string {
  if (!textInput && !textInputWords().has(symbol.toLowerCase())) return '';
  return `; write the word in double quotes, such as "${symbol}"`;
}

/** Adds the advice to a "can only be called as a function" refusal of a bare text word. */
export function withQuoteAdvice(message: string, textInput = false): string {
  const match = /^"([^"]+)" can only be called as a function/.exec(message);
  return match ? message + quoteAdvice(match[1]!, textInput) : message;
}
