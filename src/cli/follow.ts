/** `inkroute follow IMAGE --from X,Y --to X,Y`: solves one stroke on an image file. */
import { decodeImage, ImageFormatError } from '../image/codec.ts';
import type { Stroke } from '../trace/types.ts';
import { checkPlanInside, parseFollowArgs, type FollowArgs } from './args.ts';
import { UsageError } from './errors.ts';
import { readInput } from './files.ts';

export interface FollowCliArgs extends FollowArgs {
  json?: boolean;
}

/** Length of the centreline, px. */
export function strokeLength(stroke: Pick<Stroke, 'samples'>): number {
  let s = 0;
  const p = stroke.samples;
  for (let i = 1; i < p.length; i++) s += Math.hypot(p[i].x - p[i - 1].x, p[i].y - p[i - 1].y);
  return s;
}

/** Share of samples that lie in a restored span, 0..1. */
export function restoredShare(stroke: Pick<Stroke, 'samples' | 'restoredSpans'>): number {
  const n = stroke.samples.length;
  if (n === 0) return 0;
  const marked = new Uint8Array(n);
  for (const s of stroke.restoredSpans) for (let i = Math.max(0, s.from); i <= s.to && i < n; i++) marked[i] = 1;
  let c = 0;
  for (let i = 0; i < n; i++) c += marked[i];
  return c / n;
}

/** The one-line summary printed without --json. */
export function formatFollowLine(stroke: Stroke, ms: number): string {
  const n = stroke.samples.length;
  const meanR = n ? stroke.samples.reduce((a, s) => a + s.r, 0) / n : NaN;
  return (
    `follow: ${n} samples, length ${strokeLength(stroke).toFixed(1)} px, mean radius ${meanR.toFixed(2)} px, ` +
    `restored ${(restoredShare(stroke) * 100).toFixed(0)} %, cost ${stroke.cost.total.toFixed(1)}, ${ms.toFixed(0)} ms`
  );
}

export async function runFollow(imagePath: string, args: FollowCliArgs): Promise<void> {
  const plan = parseFollowArgs(args);
  const bytes = readInput(imagePath);
  let decoded;
  try {
    decoded = decodeImage(bytes);
  } catch (e) {
    if (e instanceof ImageFormatError) throw new UsageError(`${imagePath}: ${e.message}`);
    throw e;
  }
  const band = decoded.bands[0];
  checkPlanInside(plan, band.width, band.height);

  // Loaded only now: a bad request should fail fast, without loading the solver.
  const { inkEvidence } = await import('../ink/index.ts');
  const { prepareInk, followStroke, validateRequest, FollowError } = await import('../trace/index.ts');
  const request = { anchors: [plan.from, ...plan.via, plan.to], radius: plan.radius, weights: plan.weights };
  let stroke;
  const t0 = performance.now();
  try {
    // The solver's own checks (anchors on one pixel, say) also run before the heavy work.
    validateRequest(band.width, band.height, request);
    stroke = followStroke(prepareInk(inkEvidence(band, { polarity: plan.polarity }), band, plan.polarity), request);
  } catch (e) {
    if (e instanceof FollowError) throw new UsageError(e.message.replace(/\.$/, ''));
    throw e;
  }
  const ms = performance.now() - t0;
  if (args.json) {
    const { samples, restoredSpans, cost } = stroke;
    process.stdout.write(JSON.stringify({ samples, restoredSpans, cost }) + '\n');
  } else {
    process.stdout.write(formatFollowLine(stroke, ms) + '\n');
  }
}
