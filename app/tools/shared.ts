/** Small helpers the tools share: where an image or stroke lives, solve errors, distances. */
import type { SolveResult } from '../engine/bridge.ts';
import type { Anchor, ImageRef, Project, SpanOverride, StrokeDoc, Surface } from '../../src/doc/model.ts';
import type { SampleSpan, StrokeSample } from '../../src/trace/types.ts';

export function surfaceOfImage(p: Project, imageId: string): { surface: Surface; image: ImageRef } | undefined {
  for (const surface of p.surfaces) {
    const image = surface.images.find((im) => im.id === imageId);
    if (image) return { surface, image };
  }
  return undefined;
}

/** The image a stroke is solved on: its surface's first band (as ToolContext.imageId). */
export function imageOfStroke(p: Project, stroke: StrokeDoc): string | undefined {
  return p.surfaces.find((s) => s.id === stroke.surfaceId)?.images[0]?.id;
}

/** The bridge rejects an outdated solve with an error named 'Superseded'; that is no failure. */
export function isSuperseded(err: unknown): boolean {
  return err instanceof Error && err.name === 'Superseded';
}

export function errorText(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

/**
 * Two points in the same pixel make a zero-length span, which the solver refuses;
 * within `tolerance` px they are the same click.
 */
export function samePoint(a: { x: number; y: number }, b: { x: number; y: number }, tolerance: number): boolean {
  if (Math.floor(a.x) === Math.floor(b.x) && Math.floor(a.y) === Math.floor(b.y)) return true;
  return Math.hypot(a.x - b.x, a.y - b.y) <= tolerance;
}

/**
 * Sample index of each anchor along the stroke. The solver puts every anchor exactly on
 * a sample, so the nearest sample after the previous anchor's is the one.
 */
export function anchorSampleIndices(anchors: readonly Anchor[], samples: readonly StrokeSample[]): number[] {
  const out: number[] = [0];
  let from = 0;
  for (let a = 1; a < anchors.length - 1; a++) {
    let best = from;
    let bestD = Infinity;
    for (let i = from; i < samples.length; i++) {
      const d = Math.hypot(samples[i].x - anchors[a].x, samples[i].y - anchors[a].y);
      if (d < bestD) {
        bestD = d;
        best = i;
      }
      // The first exact hit: a stroke that loops back near an anchor must not jump ahead.
      if (d < 1e-3) break;
    }
    out.push(best);
    from = best;
  }
  if (anchors.length > 1) out.push(samples.length - 1);
  return out;
}

function nearestSample(samples: readonly StrokeSample[], x: number, y: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let i = 0; i < samples.length; i++) {
    const d = (samples[i].x - x) ** 2 + (samples[i].y - y) ** 2;
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  return best;
}

/**
 * Hand-marked spans index samples, which a re-solve renumbers: each end moves to the new
 * sample nearest to where it was, so a mark stays on the same part of the stroke.
 */
export function remapOverrides(
  overrides: readonly SpanOverride[], before: readonly StrokeSample[], after: readonly StrokeSample[],
): SpanOverride[] {
  if (overrides.length === 0 || after.length === 0) return [];
  const out: SpanOverride[] = [];
  for (const o of overrides) {
    const a = before[Math.min(before.length - 1, o.from)];
    const b = before[Math.min(before.length - 1, o.to)];
    if (!a || !b) continue;
    const from = nearestSample(after, a.x, a.y);
    const to = nearestSample(after, b.x, b.y);
    out.push({ from: Math.min(from, to), to: Math.max(from, to), kind: o.kind });
  }
  return out;
}

/** The fields of a stroke a solve replaces; the overrides follow the new samples. */
export function solvedPatch(
  old: Pick<StrokeDoc, 'samples' | 'overrides'>, result: SolveResult,
): Pick<StrokeDoc, 'samples' | 'restoredSpans' | 'cost' | 'overrides'> {
  const { samples, restoredSpans, cost } = result.stroke;
  return { samples, restoredSpans: restoredSpans.map((s: SampleSpan) => ({ ...s })), cost, overrides: remapOverrides(old.overrides, old.samples, samples) };
}
