/**
 * A stroke cut into what is drawn as ink and what is drawn as restored. Each inked run and
 * each restored run is the union of its pen disks (penOutline), and where an inked run
 * meets a restored one the two are cut square across the stroke, half-way between the
 * last inked sample and the first restored one: the ink is drawn as far as the ink goes
 * and no farther (a round pen end would reach a pen radius into the restored stretch),
 * and the restored outline starts where the ink stops, so the two never overlap.
 */
import type { StrokeDoc } from '../doc/model.ts';
import { effectiveRestoredSpans } from '../doc/rules.ts';
import { differenceRings } from './clip.ts';
import { penOutline, type PenSample, type Ring } from './outline.ts';

export interface StrokeParts {
  /** Pen outlines of the inked runs, px (nonzero fill). */
  inked: Ring[];
  /** Pen outlines of the restored runs, px (nonzero fill), as disjoint outer rings and holes. */
  restored: Ring[];
}

/**
 * The part of the plane beyond the cut between samples `keep` and `drop` (neighbours), on
 * `drop`'s side: a rectangle across the stroke, wide and deep enough to take the round pen
 * end of the run that stops at `keep`.
 */
function beyondCut(s: readonly PenSample[], keep: number, drop: number): Ring {
  const n = s.length;
  // The direction across the cut from a few samples either side, steadier than one step.
  const a = s[Math.max(0, Math.min(keep, drop) - 2)];
  const b = s[Math.min(n - 1, Math.max(keep, drop) + 2)];
  let ux = b.x - a.x, uy = b.y - a.y;
  const l = Math.hypot(ux, uy) || 1;
  ux /= l;
  uy /= l;
  if (drop < keep) {
    ux = -ux;
    uy = -uy;
  }
  const mx = (s[keep].x + s[drop].x) / 2, my = (s[keep].y + s[drop].y) / 2;
  const R = Math.max(s[keep].r, s[drop].r) * 1.5 + 2;
  const nx = -uy, ny = ux;
  return [
    mx + nx * R, my + ny * R,
    mx - nx * R, my - ny * R,
    mx - nx * R + ux * R, my - ny * R + uy * R,
    mx + nx * R + ux * R, my + ny * R + uy * R,
  ];
}

export function strokeParts(stroke: Pick<StrokeDoc, 'samples' | 'restoredSpans' | 'overrides'>): StrokeParts {
  const s = stroke.samples;
  const n = s.length;
  const inked: Ring[] = [];
  const restored: Ring[] = [];
  if (n === 0) return { inked, restored };
  const spans = effectiveRestoredSpans(stroke);
  if (spans.length === 0) return { inked: penOutline(s), restored };
  const mark = new Uint8Array(n);
  for (const sp of spans) for (let i = sp.from; i <= sp.to; i++) mark[i] = 1;
  for (let i = 0; i < n; i++) {
    let j = i;
    while (j + 1 < n && mark[j + 1] === mark[i]) j++;
    const cuts: Ring[] = [];
    if (i > 0) cuts.push(beyondCut(s, i, i - 1));
    if (j < n - 1) cuts.push(beyondCut(s, j, j + 1));
    if (mark[i]) {
      // A restored run takes the steps to its inked neighbours, then is cut back to the cuts.
      const run = penOutline(s, Math.max(0, i - 1), Math.min(n - 1, j + 1));
      for (const r of differenceRings(run, cuts)) restored.push(r);
    } else {
      const run = penOutline(s, i, j);
      if (cuts.length === 0) for (const r of run) inked.push(r);
      else for (const r of differenceRings(run, cuts)) inked.push(r);
    }
    i = j;
  }
  return { inked, restored };
}
