import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

// Mutation testing switches a mutant on in a `beforeAll` hook, after a test file has been collected
// (@stryker-mutator/vitest-runner, stryker-setup.js): an engine call made in a `describe` body runs with no
// mutant active, so the assertions on its result can never kill one. Engine calls belong inside tests, hooks
// or functions they call (tests/support/per-test.ts computes a shared result once per test).
const TESTS = path.resolve(__dirname);
const ENGINE_CALL = /^(evaluate\w*|runBlock|runQuick\w*|propagate\w*)$/;
const HOOKS = /^(it|test|beforeAll|beforeEach|afterAll|afterEach)$/;

function testFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((entry) => {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) return testFiles(full);
    return entry.endsWith('.test.ts') ? [full] : [];
  });
}

/** The identifier a call chain starts from: `it.each(rows)(name, fn)` → it, `evaluateSheet(doc).blocks` → evaluateSheet. */
function rootName(expression: ts.Expression): string {
  let node: ts.Expression = expression;
  while (ts.isCallExpression(node) || ts.isPropertyAccessExpression(node)) node = node.expression;
  return ts.isIdentifier(node) ? node.text : '';
}

/** Engine calls made while the file is collected: outside tests, hooks and function bodies. */
export function collectionTimeCalls(source: string, fileName = 'file.test.ts'): string[] {
  const file = ts.createSourceFile(fileName, source, ts.ScriptTarget.Latest, true);
  const found: string[] = [];
  const visit = (node: ts.Node, deferred: boolean): void => {
    if (ts.isCallExpression(node)) {
      const root = rootName(node.expression);
      if (HOOKS.test(root)) {
        ts.forEachChild(node, (child) => visit(child, true));
        return;
      }
      if (!deferred && ENGINE_CALL.test(root)) {
        found.push(`${path.basename(fileName)}:${file.getLineAndCharacterOfPosition(node.getStart()).line + 1} ${root}`);
      }
    }
    const isDescribeBody =
      (ts.isArrowFunction(node) || ts.isFunctionExpression(node)) && ts.isCallExpression(node.parent) && rootName(node.parent.expression) === 'describe';
    const isFunction = ts.isFunctionDeclaration(node) || ts.isMethodDeclaration(node) || ((ts.isArrowFunction(node) || ts.isFunctionExpression(node)) && !isDescribeBody);
    ts.forEachChild(node, (child) => visit(child, deferred || isFunction));
  };
  visit(file, false);
  return found;
}

describe('engine tests call the engine inside their tests', () => {
  it('should find a describe-level call and accept calls in tests, hooks and helpers (the check itself)', () => {
    const source = [
      "describe('a', () => {",
      "  const early = evaluateSheet(doc);",
      "  const later = perTest(() => evaluateSheet(doc));",
      "  beforeAll(() => { runBlock('x', {}); });",
      "  it('b', () => { expect(evaluateQuick('1 m')).toBeDefined(); });",
      "  it.each([1])('c %s', () => { evaluateSheet(doc); });",
      "});",
      "function helper() { return evaluateSheet(doc); }",
      "const top = runBlock('y', {});",
    ].join('\n');
    expect(collectionTimeCalls(source)).toEqual(['file.test.ts:2 evaluateSheet', 'file.test.ts:9 runBlock']);
  });

  it('should find no engine call made while an engine test file is collected', () => {
    const files = testFiles(TESTS);
    expect(files.length).toBeGreaterThan(40);
    const offences = files.flatMap((file) => collectionTimeCalls(readFileSync(file, 'utf8'), file));
    expect(offences).toEqual([]);
  });
});
