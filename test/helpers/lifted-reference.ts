/**
 * The reference for the solver's optimality: the same lifted graph built explicitly
 * in ngraph.graph (a general-purpose graph library) and solved with ngraph.path's A*
 * with a zero heuristic, i.e. Dijkstra's algorithm. Only for small domains: the
 * library keeps every node and link as an object.
 */
import createGraph from 'ngraph.graph';
import ngraphPath from 'ngraph.path';
import { forEachMove, isGoal, startStates, type LiftedProblem } from '../../src/trace/lifted.ts';

export interface ReferenceResult {
  cost: number;
  nodes: number;
  links: number;
  /** The path's states from start to goal (without the super source and sink). */
  states: number[];
}

const SOURCE = 'source';
const SINK = 'sink';

export function referenceShortestPath(problem: LiftedProblem): ReferenceResult {
  const graph = createGraph<unknown, number>();
  const seen = new Set<number>();
  const queue: number[] = [];
  for (const s of startStates(problem)) {
    graph.addLink(SOURCE, s, 0);
    seen.add(s);
    queue.push(s);
  }
  let links = 0;
  // Every state reachable from the starts, and every move between them.
  while (queue.length > 0) {
    const id = queue.pop()!;
    if (isGoal(problem, id)) {
      graph.addLink(id, SINK, 0);
      continue;
    }
    forEachMove(problem, id, (to, cost) => {
      graph.addLink(id, to, cost);
      links++;
      if (!seen.has(to)) {
        seen.add(to);
        queue.push(to);
      }
    });
  }
  const finder = ngraphPath.aStar(graph, { oriented: true, distance: (_a, _b, link) => link.data });
  const found = finder.find(SOURCE, SINK); // nodes from the sink back to the source
  const ids = found.map((n) => n.id).reverse();
  let cost = 0;
  for (let i = 1; i < ids.length; i++) {
    const link = graph.getLink(ids[i - 1], ids[i]);
    if (!link) throw new Error('reference path uses a missing link');
    cost += link.data;
  }
  return { cost, nodes: seen.size + 2, links, states: ids.slice(1, -1) as number[] };
}
