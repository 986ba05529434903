// A Stryker ignorer for the block types' documentation: the words a block type shows (title, purpose,
// formula text, sources, labels, help, validity, cautions, the list of warnings in words, range texts)
// are data for people, checked by review rather than by a calculation; a mutant there changes no number.
// Only module-level ("static") declarations are left out: warnings and messages built while a block
// evaluates are still mutated, and so are units, dimensions, defaults, ranges and worked examples.
import { PluginKind, declareValuePlugin } from '@stryker-mutator/api/plugin';

const DOCUMENTATION_KEYS = new Set([
  'title', 'purpose', 'formula', 'tex', 'sources', 'source', 'label', 'symbol', 'help', 'description',
  'validity', 'cautions', 'warnings', 'xLabel', 'yLabel', 'mismatchHint', 'numberAlternative', 'plainNumberOnly',
]);
// Module-level constants that hold only words (shared sources, cautions, validity, help).
const DOCUMENTATION_CONSTANT = /(SOURCES|CAUTIONS?|VALIDITY|_HELP)$/;

function keyName(node) {
  if (!node) return undefined;
  if (node.type === 'Identifier') return node.name;
  if (node.type === 'StringLiteral') return node.value;
  return undefined;
}

function insideFunction(path) {
  return Boolean(path.findParent((parent) => parent.isFunction()));
}

export const documentationIgnorer = {
  shouldIgnore(path) {
    if (insideFunction(path)) return undefined;
    let current = path;
    while (current) {
      const node = current.node;
      if (node?.type === 'ObjectProperty' && DOCUMENTATION_KEYS.has(keyName(node.key))) return 'documentation text of a block type (words, not a calculation)';
      // `text` of a range or a formula (module level): the limit in words.
      if (node?.type === 'ObjectProperty' && keyName(node.key) === 'text') return 'documentation text of a block type (words, not a calculation)';
      if (node?.type === 'VariableDeclarator' && node.id?.type === 'Identifier' && DOCUMENTATION_CONSTANT.test(node.id.name)) return 'documentation constant (words, not a calculation)';
      current = current.parentPath;
    }
    return undefined;
  },
};

export const strykerPlugins = [declareValuePlugin(PluginKind.Ignore, 'denudata-documentation', documentationIgnorer)];
