/**
 * The discrete solve is the exact minimum of the energy over the lifted states of its
 * search domain. Reference: ngraph.path (general-purpose shortest paths) on the same
 * graph built explicitly in ngraph.graph; equal optimal cost to 1e-9 relative.
 */
import { describe, expect, it } from 'vitest';
import { createGray } from '../src/image/gray.ts';
import { createRandom } from '../src/util/random.ts';
import { followStroke, prepareInk, type FollowRequest } from '../src/trace/index.ts';
import { decodeState, pathCost, type LiftedProblem, type LiftedSolution } from '../src/trace/lifted.ts';
import { referenceShortestPath } from './helpers/lifted-reference.ts';
import { renderCoverage, sampleCurve } from './helpers/render.ts';

function solveAndInspect(ink: ReturnType<typeof createGray>, req: FollowRequest) {
  let problem: LiftedProblem | undefined;
  let solution: LiftedSolution | undefined;
  followStroke(prepareInk(ink), req, { inspect: (p, s) => { problem = p; solution = s; } });
  return { problem: problem!, solution: solution! };
}

function noisy(ink: ReturnType<typeof createGray>, seed: number, amount: number) {
  const rnd = createRandom(seed);
  const d = ink.data;
  for (let i = 0; i < d.length; i++) d[i] = Math.min(1, Math.max(0, d[i] + amount * rnd.normal()));
  return ink;
}

describe('lifted solver optimality against ngraph.path (Dijkstra)', () => {
  it('a curved stroke with an abrasion gap, whole 36×36 box as domain', () => {
    const curve = sampleCurve((t) => ({ x: 5 + 26 * t, y: 8 + 20 * t * t, r: 1.8 + 0.8 * t }), 400);
    const ink = noisy(renderCoverage(36, 36, [curve.filter((p) => p.x < 14 || p.x > 20)]), 1, 0.05);
    const { problem, solution } = solveAndInspect(ink, {
      anchors: [{ x: 5.5, y: 8.5 }, { x: 31.2, y: 28.4 }], radius: [1.5, 3], domain: 'box', margin: 4,
    });
    const ref = referenceShortestPath(problem);
    expect(ref.links).toBeGreaterThan(100_000);
    expect(Math.abs(solution.cost.total - ref.cost) / ref.cost).toBeLessThan(1e-9);
    // The solver's own path really costs what it reports.
    expect(pathCost(problem, solution.states).total).toBe(solution.cost.total);
  });

  it('two stages through an intermediate anchor, pure noise evidence', () => {
    const rnd = createRandom(7);
    const data = new Float32Array(34 * 30);
    for (let i = 0; i < data.length; i++) data[i] = rnd.next();
    const { problem, solution } = solveAndInspect(createGray(34, 30, data), {
      anchors: [{ x: 3.5, y: 4.5 }, { x: 25.5, y: 9.5 }, { x: 10.5, y: 25.5 }], radius: [1.5, 2.5], domain: 'box', margin: 3,
    });
    expect(problem.stages.length).toBe(2);
    const ref = referenceShortestPath(problem);
    expect(Math.abs(solution.cost.total - ref.cost) / ref.cost).toBeLessThan(1e-9);
  });

  it('pinned radii at the anchors: still the exact optimum of the restricted graph', () => {
    const curve = sampleCurve((t) => ({ x: 5 + 30 * t, y: 6 + 24 * t, r: 2.5 }), 400);
    const ink = noisy(renderCoverage(40, 36, [curve]), 9, 0.05);
    const { problem, solution } = solveAndInspect(ink, {
      anchors: [{ x: 5.5, y: 6.5, r: 1.5 }, { x: 20.5, y: 18.5 }, { x: 35.2, y: 30.4, r: 3 }],
      radius: [1.5, 3], domain: 'box', margin: 3,
    });
    expect(Array.from(problem.pinned)).toEqual([0, -1, 3]);
    const ref = referenceShortestPath(problem);
    expect(Math.abs(solution.cost.total - ref.cost) / ref.cost).toBeLessThan(1e-9);
    const ks = Array.from(solution.states, (id) => decodeState(problem, id).k);
    expect(ks[0]).toBe(0);
    expect(ks[ks.length - 1]).toBe(3);
  });

  it('the tube domain solved by A* equals Dijkstra on the same tube', () => {
    const curve = sampleCurve((t) => ({ x: 6 + 40 * t, y: 20 + 12 * Math.sin(t * 4), r: 2.2 }), 500);
    const ink = noisy(renderCoverage(52, 40, [curve]), 3, 0.08);
    const { problem, solution } = solveAndInspect(ink, {
      anchors: [{ x: curve[0].x, y: curve[0].y }, { x: curve.at(-1)!.x, y: curve.at(-1)!.y }], radius: [1.5, 3.5],
    });
    const ref = referenceShortestPath(problem);
    expect(Math.abs(solution.cost.total - ref.cost) / ref.cost).toBeLessThan(1e-9);
    expect(solution.settled).toBeLessThan(ref.nodes); // A* settles only part of the graph
  });
});
