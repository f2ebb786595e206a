/**
 * Edits of one stroke's anchors and marks, as pure functions on plain data, so the Refine
 * tool, the Details panel's actions and the tests share one definition of each.
 */
import type { Anchor, SpanOverride, StrokeDoc } from '../../../src/doc/model.ts';
import { anchorSampleIndices, samePoint } from '../shared.ts';

/**
 * Anchors with a new one on the stroke at sample `sampleIndex`, placed between the
 * anchors it lies between along the stroke; undefined when an anchor is already there
 * (or so near one that the span between them would have no length).
 */
export function anchorsWithInserted(stroke: Pick<StrokeDoc, 'anchors' | 'samples'>, sampleIndex: number): { anchors: Anchor[]; index: number } | undefined {
  const at = anchorSampleIndices(stroke.anchors, stroke.samples);
  const k = at.findIndex((i) => i >= sampleIndex);
  if (k <= 0 || at[k] === sampleIndex) return undefined;
  const s = stroke.samples[sampleIndex];
  // The centreline point, not the raw click: the stroke already passes there, so the
  // re-solve changes only what the new anchor holds in place.
  const anchor: Anchor = { x: s.x, y: s.y };
  if (samePoint(anchor, stroke.anchors[k - 1], 1) || samePoint(anchor, stroke.anchors[k], 1)) return undefined;
  const anchors = stroke.anchors.slice();
  anchors.splice(k, 0, anchor);
  return { anchors, index: k };
}

/** Anchors without the one at `index`; undefined for the start and the end, which stay. */
export function anchorsWithout(stroke: Pick<StrokeDoc, 'anchors'>, index: number): Anchor[] | undefined {
  if (index <= 0 || index >= stroke.anchors.length - 1) return undefined;
  return stroke.anchors.filter((_, i) => i !== index);
}

/** Anchors with the pen radius at `index` pinned to `r` px, or freed when `r` is undefined. */
export function anchorsWithRadius(stroke: Pick<StrokeDoc, 'anchors'>, index: number, r: number | undefined, range: [number, number]): Anchor[] {
  if (index < 0 || index >= stroke.anchors.length) throw new RangeError(`the stroke has no anchor ${index}`);
  return stroke.anchors.map((a, i) => {
    if (i !== index) return a;
    if (r === undefined) return { x: a.x, y: a.y };
    // Kept inside the solver's radius range, so what the file says is what was solved.
    return { x: a.x, y: a.y, r: Math.min(range[1], Math.max(range[0], r)) };
  });
}

/**
 * Overrides with samples `from`..`to` (inclusive, either order) marked `kind`, or
 * unmarked when `kind` is undefined: earlier marks over that range are cut back, so the
 * overrides stay sorted and disjoint.
 */
export function overridesWithSpan(
  stroke: Pick<StrokeDoc, 'samples' | 'overrides'>, from: number, to: number, kind: SpanOverride['kind'] | undefined,
): SpanOverride[] {
  const last = stroke.samples.length - 1;
  const lo = Math.max(0, Math.min(from, to));
  const hi = Math.min(last, Math.max(from, to));
  if (!(lo <= hi)) return stroke.overrides.slice();
  const out: SpanOverride[] = [];
  for (const o of stroke.overrides) {
    if (o.to < lo || o.from > hi) {
      out.push(o);
      continue;
    }
    if (o.from < lo) out.push({ from: o.from, to: lo - 1, kind: o.kind });
    if (o.to > hi) out.push({ from: hi + 1, to: o.to, kind: o.kind });
  }
  if (kind) out.push({ from: lo, to: hi, kind });
  out.sort((a, b) => a.from - b.from);
  // Neighbouring marks of the same kind read as one.
  const merged: SpanOverride[] = [];
  for (const o of out) {
    const prev = merged[merged.length - 1];
    if (prev && prev.kind === o.kind && prev.to + 1 >= o.from) merged[merged.length - 1] = { ...prev, to: Math.max(prev.to, o.to) };
    else merged.push(o);
  }
  return merged;
}

/** How samples `from`..`to` are marked by hand: wholly one kind, not at all, or partly. */
export type SpanMarking = 'measured' | SpanOverride['kind'] | 'mixed';

export function spanMarking(stroke: Pick<StrokeDoc, 'overrides'>, from: number, to: number): SpanMarking {
  const lo = Math.min(from, to);
  const hi = Math.max(from, to);
  let covered = 0;
  const kinds = new Set<SpanOverride['kind']>();
  for (const o of stroke.overrides) {
    const a = Math.max(lo, o.from);
    const b = Math.min(hi, o.to);
    if (a > b) continue;
    covered += b - a + 1;
    kinds.add(o.kind);
  }
  if (covered === 0) return 'measured';
  if (covered === hi - lo + 1 && kinds.size === 1) return [...kinds][0];
  return 'mixed';
}
