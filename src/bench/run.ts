/**
 * `npm run bench` / `inkroute bench`: speed figures of the engine, medians and
 * percentiles over repeated runs after warm-up, printed with the machine's details.
 * Not a test: the machines are shared and noisy, so nothing here passes or fails;
 * settled states and states per second are printed beside times so that progress can
 * be judged despite noise.
 */
import { execFileSync } from 'node:child_process';
import os from 'node:os';
import { fileURLToPath } from 'node:url';
import { inkEvidence } from '../ink/index.ts';
import { followStroke, prepareInk, startPreview, type FollowResult } from '../trace/index.ts';
import { buildLiftedProblem, LiftedWorkspace, solveLifted, type LiftedProblem } from '../trace/lifted.ts';
import { boxDomain } from '../trace/domain.ts';
import { DEFAULT_CHORD, DEFAULT_WEIGHTS } from '../trace/energy.ts';
import { createRandom } from '../util/random.ts';
import { exampleExportBench, exportBench } from './exportBench.ts';
import { longStroke } from './fixtures.ts';
import { fmt, median, percentile, timeRuns } from './stats.ts';

export interface BenchOptions {
  /** Fewer runs and no ngraph comparison (a quick look). */
  quick?: boolean;
  log?: (line: string) => void;
}

export async function runBench(options: BenchOptions = {}): Promise<void> {
  const log = options.log ?? ((l: string) => console.log(l));
  const quick = options.quick ?? false;
  const runs = quick ? 5 : 11;
  const cpus = os.cpus();
  log(`inkroute bench — ${new Date().toISOString()}`);
  log(`machine: ${cpus[0]?.model ?? 'unknown cpu'}, ${cpus.length} cores, ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB, ` +
    `node ${process.version}, ${os.platform()} ${os.arch()}`);
  log(`runs: ${runs} timed after warm-up (solves: ${quick ? 9 : 30}, over 3 strokes per length); times in ms (p50 = median)`);
  log('');

  // 1. Per-image precomputation on 1024 × 1024.
  {
    const fx = longStroke(600, 1024, 1);
    const { ms } = timeRuns(() => prepareInk(inkEvidence(fx.image)), quick ? 3 : 7, 1);
    log(`precompute 1024×1024 (ink evidence + solver preparation): p50 ${fmt(median(ms))}  p95 ${fmt(percentile(ms, 95))}`);
  }

  // 2. Exact solves by stroke length (precomputation excluded: done once per image).
  log('');
  log('exact solve (first path + lifted A* + refinement), per stroke length:');
  log('  length   p50     p95     settled   states/s   tube cells   (phases p50: first / build / search / refine)');
  for (const L of [100, 300, 600]) {
    const ms: number[] = [];
    const phase = { first: [] as number[], build: [] as number[], search: [] as number[], refine: [] as number[] };
    const settled: number[] = [];
    const rate: number[] = [];
    let cells = 0;
    for (let seed = 1; seed <= 3; seed++) {
      const fx = longStroke(L, 1024, seed);
      const prep = prepareInk(inkEvidence(fx.image), fx.image);
      const req = { anchors: [fx.start, fx.end] };
      const { ms: m, last } = timeRuns((): FollowResult => followStroke(prep, req), quick ? 3 : 10, 2);
      ms.push(...m);
      const s = last.stats;
      settled.push(s.settled);
      rate.push(s.settled / (s.ms.search / 1000));
      phase.first.push(s.ms.first);
      phase.build.push(s.ms.build);
      phase.search.push(s.ms.search);
      phase.refine.push(s.ms.refine);
      cells = s.cells;
    }
    log(`  ${String(L).padStart(4)} px  ${fmt(median(ms)).padStart(6)}  ${fmt(percentile(ms, 95)).padStart(6)}  ` +
      `${String(Math.round(median(settled))).padStart(8)}  ${(median(rate) / 1e6).toFixed(2).padStart(6)} M/s  ${String(cells).padStart(8)}` +
      `     (${fmt(median(phase.first))} / ${fmt(median(phase.build))} / ${fmt(median(phase.search))} / ${fmt(median(phase.refine))})`);
  }

  // 3. Live preview.
  log('');
  {
    const fx = longStroke(600, 1024, 2);
    const prep = prepareInk(inkEvidence(fx.image));
    const start = { x: 512, y: 512 };
    const grow: number[] = [];
    let tree = startPreview(prep, start);
    for (let i = 0; i < (quick ? 3 : 5) + 1; i++) {
      const t = performance.now();
      tree = startPreview(prep, start);
      let slices = 0;
      while (!tree.grow(16)) slices++;
      if (i > 0) grow.push(performance.now() - t);
    }
    const rnd = createRandom(3);
    const read: number[] = [];
    for (let i = 0; i < 50; i++) tree.pathTo(312 + rnd.next() * 399, 312 + rnd.next() * 399); // warm-up
    for (let i = 0; i < 300; i++) {
      const x = 312 + rnd.next() * 399;
      const y = 312 + rnd.next() * 399;
      const t = performance.now();
      tree.pathTo(x, y);
      read.push(performance.now() - t);
    }
    log(`live preview: tree over 400×400 px (${tree.total} states) grown in 16 ms slices: p50 ${fmt(median(grow))}  max ${fmt(Math.max(...grow))}`);
    log(`              path read-off to a covered cursor: p50 ${fmt(median(read), 3)}  p95 ${fmt(percentile(read, 95), 3)}  max ${fmt(Math.max(...read), 3)}`);
  }

  // 4a. Export: the SVG facsimile of 5,000 strokes.
  log('');
  exportBench(log, quick);
  await exampleExportBench(log, quick);

  // 4. Against a general-purpose graph library on the same lifted graph.
  if (!quick) {
    log('');
    await compareWithReference(log);
  }

  // 5. Peak memory of the precomputation for 24 megapixels, in its own process.
  log('');
  {
    const script = fileURLToPath(new URL('./memory.ts', import.meta.url));
    const out = execFileSync(process.execPath, ['--import', 'tsx', script], { encoding: 'utf8', maxBuffer: 1 << 20 });
    const m = JSON.parse(out.trim().split('\n').pop()!);
    const mb = (b: number) => (b / 2 ** 20).toFixed(0);
    log(`precompute 24 MP (${m.width}×${m.height}): ${fmt(m.ms, 0)} ms; peak RSS ${mb(m.peakRss)} MiB ` +
      `(input image ${mb(m.imageBytes)} MiB, kept per image ${mb(m.keptBytes)} MiB, process before ${mb(m.baselineRss)} MiB)`);
  }
}

async function compareWithReference(log: (l: string) => void): Promise<void> {
  let ref: typeof import('../../test/helpers/lifted-reference.ts');
  try {
    ref = await import('../../test/helpers/lifted-reference.ts');
  } catch {
    log('ngraph comparison skipped: the test helpers or ngraph are not installed (npm ci installs them).');
    return;
  }
  const size = 56;
  const fx = longStroke(70, size, 4);
  const ink = inkEvidence(fx.image);
  const ax = [Math.floor(fx.start.x), Math.floor(fx.end.x)];
  const ay = [Math.floor(fx.start.y), Math.floor(fx.end.y)];
  const dom = boxDomain(size, size, 0, 0, size - 1, size - 1);
  const opts = { radiusMin: 1.5, radiusMax: 4, radiusStep: 0.5, maxTurn: 2, weights: DEFAULT_WEIGHTS, chord: DEFAULT_CHORD };
  const ws = new LiftedWorkspace();
  let problem: LiftedProblem = buildLiftedProblem(ink, [dom], ax, ay, opts);
  const ours = timeRuns(() => {
    problem = buildLiftedProblem(ink, [dom], ax, ay, opts);
    return solveLifted(problem, ws)!;
  }, 7, 2);
  const t0 = performance.now();
  const r = ref.referenceShortestPath(problem);
  const refMs = performance.now() - t0;
  const rel = Math.abs(r.cost - ours.last.cost.total) / r.cost;
  log(`against ngraph.path (Dijkstra) on the same lifted graph, ${size}×${size} px domain, ${problem.radii.length} radii:`);
  log(`  ngraph: ${r.nodes} nodes, ${r.links} links, build + solve ${fmt(refMs, 0)} ms, cost ${r.cost.toFixed(6)}`);
  log(`  inkroute: table + heuristic + A* p50 ${fmt(median(ours.ms))} ms, settled ${ours.last.settled}, cost ${ours.last.cost.total.toFixed(6)}`);
  log(`  equal cost: ${rel < 1e-9 ? 'yes' : 'NO'} (relative difference ${rel.toExponential(2)}); speed ratio ${fmt(refMs / median(ours.ms), 0)}×`);
}

const invoked = process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1];
if (invoked) await runBench({ quick: process.argv.includes('--quick') });
