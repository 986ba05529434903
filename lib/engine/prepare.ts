/**
 * The first step of an evaluation: every block's inputs checked (parse, allowed functions, data
 * inputs, distributions), its references resolved against the other blocks' outputs, and the
 * dependency graph built. The first fault of a block becomes its problem, reported when it runs.
 */
import { isNonQuantityInput } from './block-run';
import type { BlockTypeDefinition } from './block-type';
import { DATA_INPUT_RULE, parseDataInput } from './dataset-input';
import type { SheetBlock, SheetDocument } from './document';
import { EngineError, toSafeMessage } from './errors';
import { checkExpression, type CheckedExpression, type OutputReference } from './expression';
import { NESTED_DISTRIBUTION_MESSAGE } from './expression-language';
import { buildDependencyGraph, type DependencyGraph, type GraphNode } from './graph';
import { getBlockType } from './registry';
import { quoteAdvice, withQuoteAdvice } from './text-words';

interface PreparedInput {
  name: string;
  text: string;
  checked: CheckedExpression;
}

export interface PreparedBlock {
  block: SheetBlock;
  type: BlockTypeDefinition;
  inputs: Map<string, PreparedInput>;
  /** Data inputs by name: the sha256 each refers to. */
  data: Map<string, string>;
  references: OutputReference[];
  dependencies: string[];
  /** A fault found before evaluation (parse, refused function, unknown reference). */
  problem?: string;
}

export interface Prepared {
  blocks: Map<string, PreparedBlock>;
  graph: DependencyGraph;
}

/** Output names of each fixed-output type, computed once. */
const fixedOutputNames = new WeakMap<BlockTypeDefinition, readonly string[]>();

/** Output names a block offers to others. */
function outputNames(block: SheetBlock, type: BlockTypeDefinition): readonly string[] {
  if (type.freeInputs) return Object.keys(block.inputs);
  let names = fixedOutputNames.get(type);
  if (!names) {
    names = type.outputs.map((output) => output.name);
    fixedOutputNames.set(type, names);
  }
  return names;
}

function hasOutput(block: SheetBlock, type: BlockTypeDefinition, output: string): boolean {
  if (type.freeInputs) return Object.prototype.hasOwnProperty.call(block.inputs, output);
  return outputNames(block, type).includes(output);
}

export function blockMessage(name: string, message: string): string {
  return `block "${name}", ${message}`;
}

/** Whether an input is left empty (only white space), as text.trim() === '' says. */
const BLANK = /^\s*$/;

export function prepare(document: SheetDocument): Prepared {
  const byName = new Map<string, { block: SheetBlock; type: BlockTypeDefinition }>();
  const notes = new Set<string>();
  for (const block of document.blocks) {
    const type = getBlockType(block.type);
    if (!type) throw new EngineError(`unknown block type "${block.type}"`);
    if (type.id === 'note') notes.add(block.name);
    else byName.set(block.name, { block, type });
  }

  const blocks = new Map<string, PreparedBlock>();
  const nodes: GraphNode[] = [];
  for (const { block, type } of byName.values()) {
    const prepared: PreparedBlock = { block, type, inputs: new Map(), data: new Map(), references: [], dependencies: [] };
    // The first fault found is the block's problem (inputs in document order).
    let problem: string | undefined;
    for (const input of Object.keys(block.inputs)) {
      const text = block.inputs[input]!;
      if (BLANK.test(text)) continue;
      const spec = type.inputs.find((candidate) => candidate.name === input);
      if (spec?.dimension === 'dataset') {
        // A data input is one call with one string literal, never an expression (§7.6).
        const sha256 = parseDataInput(text);
        if (sha256 === null) problem ??= blockMessage(block.name, `${input}: ${DATA_INPUT_RULE}`);
        else prepared.data.set(input, sha256);
        continue;
      }
      let checked: CheckedExpression;
      try {
        checked = checkExpression(text);
      } catch (error) {
        problem ??= blockMessage(block.name, `${input}: ${withQuoteAdvice(toSafeMessage(error), spec?.dimension === 'text')}`);
        continue;
      }
      prepared.inputs.set(input, { name: input, text, checked });
      if (problem === undefined && checked.nestedDistribution) {
        problem = blockMessage(block.name, `${input}: ${NESTED_DISTRIBUTION_MESSAGE}; derive quantities from it in a later block (formula, or another block's input referring to it)`);
      }
      if (problem === undefined && checked.distribution && spec && (spec.certain || isNonQuantityInput(spec))) {
        problem = blockMessage(block.name, `${input}: must be certain; a distribution is not allowed in this input`);
      }
      if (problem === undefined && checked.freeSymbols.length > 0) {
        const symbol = checked.freeSymbols[0]!;
        const message = spec?.dimension === 'text' && !byName.has(symbol)
          ? `write the word in double quotes, such as "${quoteAdvice(symbol) ? symbol : (spec.choices?.[0] ?? symbol)}" (a bare ${symbol} is read as a name)`
          : byName.has(symbol) || notes.has(symbol)
          ? `"${symbol}" is a block; refer to one of its outputs as ${symbol}.<output>`
          : `unknown name "${symbol}" (not a block, unit, constant or function)${quoteAdvice(symbol)}`;
        problem = blockMessage(block.name, `${input}: ${message}`);
      }
      for (const reference of checked.references) {
        const target = byName.get(reference.block);
        if (problem === undefined) {
          const label = `${reference.block}.${reference.output}`;
          if (notes.has(reference.block)) {
            problem = blockMessage(block.name, `${input}: refers to ${label}, but "${reference.block}" is a note and has no outputs`);
          } else if (!target) {
            problem = blockMessage(block.name, `${input}: refers to ${label}, but there is no block named "${reference.block}"`);
          } else if (!hasOutput(target.block, target.type, reference.output)) {
            const names = outputNames(target.block, target.type);
            problem = blockMessage(
              block.name,
              `${input}: refers to ${label}, but block "${reference.block}" has no output "${reference.output}" (its outputs: ${names.join(', ') || 'none'})`,
            );
          }
        }
        if (target) {
          prepared.references.push(reference);
          if (!prepared.dependencies.includes(reference.block)) prepared.dependencies.push(reference.block);
        }
      }
    }
    if (problem !== undefined) prepared.problem = problem;
    blocks.set(block.name, prepared);
    nodes.push({ name: block.name, dependencies: prepared.dependencies });
  }
  return { blocks, graph: buildDependencyGraph(nodes) };
}
