/**
 * Set operations on rings (flat x, y, … px) under nonzero winding, with clipper2: the
 * union of pen outlines, and one region minus another.
 */
import { Clipper, FillRule, type PathD, type PathsD } from 'clipper2-ts';
import type { Ring } from './outline.ts';

/** Decimal places clipper keeps when it unions outlines in px: 0.001 px is far below a pixel. */
const UNION_PRECISION = 3;

function toPaths(rings: readonly Ring[]): PathsD {
  const out: PathsD = [];
  for (const r of rings) {
    if (r.length < 6) continue;
    const path: PathD = [];
    for (let i = 0; i < r.length; i += 2) path.push({ x: r[i], y: r[i + 1] });
    out.push(path);
  }
  return out;
}

function fromPaths(paths: PathsD): Ring[] {
  const out: Ring[] = [];
  for (const p of paths) {
    if (p.length < 3) continue;
    const r: Ring = new Array(p.length * 2);
    for (let i = 0; i < p.length; i++) {
      r[2 * i] = p[i].x;
      r[2 * i + 1] = p[i].y;
    }
    out.push(r);
  }
  return out;
}

/** Union of rings under nonzero winding (clipper2), as disjoint outer rings and holes. */
export function unionRings(rings: readonly Ring[]): Ring[] {
  if (rings.length === 0) return [];
  return fromPaths(Clipper.unionD(toPaths(rings), [], FillRule.NonZero, UNION_PRECISION));
}

/** a minus b, both filled with nonzero winding. */
export function differenceRings(a: readonly Ring[], b: readonly Ring[]): Ring[] {
  if (a.length === 0) return [];
  if (b.length === 0) return unionRings(a);
  return fromPaths(Clipper.differenceD(toPaths(a), toPaths(b), FillRule.NonZero, UNION_PRECISION));
}

/** Signed area of a ring (shoelace), px²; the sign depends on orientation. */
export function ringArea(r: Ring): number {
  let a = 0;
  const n = r.length;
  for (let i = 0, j = n - 2; i < n; j = i, i += 2) a += r[j] * r[i + 1] - r[i] * r[j + 1];
  return a / 2;
}

/** a ∩ b, both filled with nonzero winding. */
export function intersectRings(a: readonly Ring[], b: readonly Ring[]): Ring[] {
  if (a.length === 0 || b.length === 0) return [];
  return fromPaths(Clipper.intersectD(toPaths(a), toPaths(b), FillRule.NonZero, UNION_PRECISION));
}
