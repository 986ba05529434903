/**
 * The dependency graph of a sheet: which blocks read which, an evaluation order with every
 * dependency first, and the cycles, each named by its blocks.
 */

export interface GraphNode {
  name: string;
  /** Names of the blocks this one reads (through name.output), existing blocks only. */
  dependencies: readonly string[];
}

export interface DependencyGraph {
  /** Every block name, dependencies before dependents, otherwise in document order. */
  order: string[];
  /** For blocks in a cycle: the cycle as a path, e.g. ["a", "b", "a"]. */
  cycles: Map<string, string[]>;
  dependencies: Map<string, readonly string[]>;
  /** Blocks that read each block. */
  dependents: Map<string, string[]>;
}

/**
 * Builds the graph with Tarjan's algorithm (iterative, so long chains cannot overflow the stack).
 * Strongly connected components come out dependencies first, which is the evaluation order.
 */
export function buildDependencyGraph(nodes: readonly GraphNode[]): DependencyGraph {
  const dependencies = new Map<string, readonly string[]>();
  const dependents = new Map<string, string[]>();
  for (const node of nodes) {
    dependencies.set(node.name, node.dependencies);
    dependents.set(node.name, []);
  }
  for (const node of nodes) {
    for (const dep of node.dependencies) dependents.get(dep)?.push(node.name);
  }

  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const order: string[] = [];
  const cycles = new Map<string, string[]>();
  let counter = 0;

  for (const root of nodes) {
    if (index.has(root.name)) continue;
    const work: Array<{ name: string; next: number }> = [{ name: root.name, next: 0 }];
    index.set(root.name, counter);
    low.set(root.name, counter++);
    stack.push(root.name);
    onStack.add(root.name);
    while (work.length > 0) {
      const frame = work[work.length - 1]!;
      const deps = dependencies.get(frame.name) ?? [];
      if (frame.next < deps.length) {
        const dep = deps[frame.next++]!;
        if (!dependencies.has(dep)) continue;
        if (!index.has(dep)) {
          index.set(dep, counter);
          low.set(dep, counter++);
          stack.push(dep);
          onStack.add(dep);
          work.push({ name: dep, next: 0 });
        } else if (onStack.has(dep)) {
          low.set(frame.name, Math.min(low.get(frame.name)!, index.get(dep)!));
        }
        continue;
      }
      work.pop();
      const parent = work[work.length - 1];
      if (parent) low.set(parent.name, Math.min(low.get(parent.name)!, low.get(frame.name)!));
      if (low.get(frame.name) === index.get(frame.name)) {
        const component: string[] = [];
        let member: string;
        do {
          member = stack.pop()!;
          onStack.delete(member);
          component.push(member);
        } while (member !== frame.name);
        const selfLoop = component.length === 1 && (dependencies.get(frame.name) ?? []).includes(frame.name);
        if (component.length > 1 || selfLoop) {
          for (const name of component) cycles.set(name, cyclePath(name, new Set(component), dependencies));
        }
        order.push(...component.reverse());
      }
    }
  }
  return { order, cycles, dependencies, dependents };
}

/** A path from a block back to itself inside its component, e.g. a → b → a. */
function cyclePath(start: string, component: Set<string>, dependencies: Map<string, readonly string[]>): string[] {
  // Breadth-first search for the shortest way back to the start.
  const previous = new Map<string, string>();
  const queue = [start];
  while (queue.length > 0) {
    const current = queue.shift()!;
    for (const dep of dependencies.get(current) ?? []) {
      if (!component.has(dep)) continue;
      if (dep === start) {
        const path = [start];
        for (let at = current; at !== start; at = previous.get(at)!) path.splice(1, 0, at);
        path.push(start);
        return path;
      }
      if (!previous.has(dep)) {
        previous.set(dep, current);
        queue.push(dep);
      }
    }
  }
  return [start, start];
}

/** Every block downstream of the given ones (not including them unless reachable). */
export function downstreamOf(graph: DependencyGraph, names: Iterable<string>): Set<string> {
  const seen = new Set<string>();
  const queue = [...names];
  while (queue.length > 0) {
    const name = queue.pop()!;
    for (const dependent of graph.dependents.get(name) ?? []) {
      if (!seen.has(dependent)) {
        seen.add(dependent);
        queue.push(dependent);
      }
    }
  }
  return seen;
}
