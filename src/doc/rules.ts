/**
 * The rules of the document in one place: every change to a project goes through these
 * pure functions, which return a new project and keep its invariants (a stroke belongs to
 * exactly one surface and appears once in its order; nothing points at a deleted stroke).
 */
import { DEFAULT_RADIUS } from '../trace/follow.ts';
import { DEFAULT_WEIGHTS } from '../trace/energy.ts';
import type { SampleSpan } from '../trace/types.ts';
import { PROJECT_VERSION, type ImageRef, type Project, type SolverSettings, type SpanOverride, type StrokeDoc } from './model.ts';

export const DEFAULT_SETTINGS: SolverSettings = { weights: { ...DEFAULT_WEIGHTS }, radius: [...DEFAULT_RADIUS] };

let counter = 0;
/** A short unique id with a readable prefix ('s' strokes, 'p' projects, …). */
export function newId(prefix: string): string {
  counter = (counter + 1) % 1_000_000;
  return `${prefix}${Date.now().toString(36)}${counter.toString(36)}${Math.floor(Math.random() * 1296).toString(36)}`;
}

export function newProject(title: string, image: Omit<ImageRef, 'id'>, pxPerMm?: number, now = new Date()): Project {
  const t = now.toISOString();
  return {
    format: 'inkroute-project',
    version: PROJECT_VERSION,
    id: newId('p'),
    title,
    createdAt: t,
    modifiedAt: t,
    defaults: structuredClone(DEFAULT_SETTINGS),
    surfaces: [{ id: 'recto', name: 'recto', images: [{ ...image, id: newId('i') }], pxPerMm, strokeOrder: [] }],
    strokes: {},
  };
}

function touch(p: Project): Project {
  return { ...p, modifiedAt: new Date().toISOString() };
}

function surfaceIndex(p: Project, surfaceId: string): number {
  const i = p.surfaces.findIndex((s) => s.id === surfaceId);
  if (i < 0) throw new Error(`no surface ${surfaceId}`);
  return i;
}

export function addStroke(p: Project, stroke: StrokeDoc, at?: number): Project {
  if (p.strokes[stroke.id]) throw new Error(`stroke ${stroke.id} exists already`);
  const si = surfaceIndex(p, stroke.surfaceId);
  const surfaces = p.surfaces.slice();
  const order = surfaces[si].strokeOrder.slice();
  order.splice(at ?? order.length, 0, stroke.id);
  surfaces[si] = { ...surfaces[si], strokeOrder: order };
  return touch({ ...p, surfaces, strokes: { ...p.strokes, [stroke.id]: stroke } });
}

/** Replaces a stroke's fields (its id and surface stay). */
export function updateStroke(p: Project, id: string, patch: Partial<Omit<StrokeDoc, 'id' | 'surfaceId'>>): Project {
  const old = p.strokes[id];
  if (!old) throw new Error(`no stroke ${id}`);
  return touch({ ...p, strokes: { ...p.strokes, [id]: { ...old, ...patch } } });
}

export function deleteStrokes(p: Project, ids: readonly string[]): Project {
  const gone = new Set(ids.filter((id) => p.strokes[id]));
  if (gone.size === 0) return p;
  const strokes = { ...p.strokes };
  for (const id of gone) delete strokes[id];
  const surfaces = p.surfaces.map((s) => ({ ...s, strokeOrder: s.strokeOrder.filter((id) => !gone.has(id)) }));
  return touch({ ...p, surfaces, strokes });
}

/** Moves a stroke to position `to` in its surface's ductus order. */
export function moveStroke(p: Project, id: string, to: number): Project {
  const st = p.strokes[id];
  if (!st) throw new Error(`no stroke ${id}`);
  const si = surfaceIndex(p, st.surfaceId);
  const order = p.surfaces[si].strokeOrder.filter((x) => x !== id);
  order.splice(Math.max(0, Math.min(order.length, to)), 0, id);
  const surfaces = p.surfaces.slice();
  surfaces[si] = { ...surfaces[si], strokeOrder: order };
  return touch({ ...p, surfaces });
}

export function setHidden(p: Project, ids: readonly string[], hidden: boolean): Project {
  const strokes = { ...p.strokes };
  for (const id of ids) if (strokes[id]) strokes[id] = { ...strokes[id], hidden };
  return touch({ ...p, strokes });
}

export function setDefaults(p: Project, defaults: SolverSettings): Project {
  return touch({ ...p, defaults: structuredClone(defaults) });
}

export function settingsOf(p: Project, id: string): SolverSettings {
  return p.strokes[id]?.settings ?? p.defaults;
}

/**
 * The restored spans a stroke shows: the measured ones, with the hand-marked overrides
 * applied on top (an 'inked' override clears, a 'restored' one marks), as sorted,
 * disjoint spans.
 */
export function effectiveRestoredSpans(stroke: Pick<StrokeDoc, 'samples' | 'restoredSpans' | 'overrides'>): SampleSpan[] {
  const n = stroke.samples.length;
  const mark = new Uint8Array(n);
  for (const s of stroke.restoredSpans) for (let i = Math.max(0, s.from); i <= Math.min(n - 1, s.to); i++) mark[i] = 1;
  for (const o of stroke.overrides as SpanOverride[]) {
    for (let i = Math.max(0, o.from); i <= Math.min(n - 1, o.to); i++) mark[i] = o.kind === 'restored' ? 1 : 0;
  }
  const out: SampleSpan[] = [];
  for (let i = 0; i < n; i++) {
    if (!mark[i]) continue;
    let j = i;
    while (j + 1 < n && mark[j + 1]) j++;
    out.push({ from: i, to: j });
    i = j;
  }
  return out;
}

/** Length of a stroke's centreline, px. */
export function strokeLength(stroke: Pick<StrokeDoc, 'samples'>): number {
  let len = 0;
  const s = stroke.samples;
  for (let i = 1; i < s.length; i++) len += Math.hypot(s[i].x - s[i - 1].x, s[i].y - s[i - 1].y);
  return len;
}

/** Mean pen width (2r) along the stroke, px. */
export function meanWidth(stroke: Pick<StrokeDoc, 'samples'>): number {
  const s = stroke.samples;
  return s.length === 0 ? 0 : (2 * s.reduce((a, p) => a + p.r, 0)) / s.length;
}

/** Share of the centreline's length inside the shown restored spans, 0..1. */
export function restoredShare(stroke: Pick<StrokeDoc, 'samples' | 'restoredSpans' | 'overrides'>): number {
  const total = strokeLength(stroke);
  if (total === 0) return 0;
  let part = 0;
  const s = stroke.samples;
  for (const span of effectiveRestoredSpans(stroke)) {
    for (let i = span.from + 1; i <= span.to; i++) part += Math.hypot(s[i].x - s[i - 1].x, s[i].y - s[i - 1].y);
  }
  return part / total;
}
