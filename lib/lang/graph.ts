/**
 * Depth-first search without recursion, so that long chains of
 * intermediates (up to the statement limit) cannot exhaust the call stack.
 */
export interface GraphVisitor {
  /** A back edge closes this cycle (first element repeated at the end by the caller if wanted). */
  onCycle?(cycle: string[]): void;
  /** Called once per node after all its successors: a topological order, leaves first. */
  onFinish?(node: string): void;
}

export function depthFirst(roots: Iterable<string>, next: (node: string) => Iterable<string>, visitor: GraphVisitor): void {
  const state = new Map<string, 1 | 2>();
  for (const root of roots) {
    if (state.has(root)) continue;
    const path: string[] = [root];
    const iters: Iterator<string>[] = [next(root)[Symbol.iterator]()];
    state.set(root, 1);
    while (iters.length > 0) {
      const step = iters[iters.length - 1]!.next();
      if (step.done) {
        iters.pop();
        const node = path.pop()!;
        state.set(node, 2);
        visitor.onFinish?.(node);
        continue;
      }
      const dep = step.value;
      const st = state.get(dep);
      if (st === 1) {
        visitor.onCycle?.(path.slice(path.indexOf(dep)));
      } else if (st === undefined) {
        state.set(dep, 1);
        path.push(dep);
        iters.push(next(dep)[Symbol.iterator]());
      }
    }
  }
}
