/**
 * The rules of the document in one place: every change to a project goes through these
 * pure functions, which return a new project and keep its invariants (a stroke belongs to
 * exactly one surface and appears once in its order; nothing points at a deleted stroke).
 */
import { DEFAULT_RADIUS } from '../trace/follow.ts';
import { DEFAULT_WEIGHTS } from '../trace/energy.ts';
import type { SampleSpan, Stroke } from '../trace/types.ts';
import { layoutText } from './layout.ts';
import {
  PROJECT_VERSION, type Anchor, type ImageRef, type Inscription, type Letter, type Project, type ScaleSource, type SolverSettings, type SpanOverride,
  type StrokeDoc, type TextMark,
} from './model.ts';

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
    inscription: { ...DEFAULT_INSCRIPTION },
    letters: {},
    textMarks: {},
  };
}

/** A new project's text: Latin, left to right, until the user says otherwise. */
export const DEFAULT_INSCRIPTION: Inscription = { script: 'Latin', direction: 'ltr', description: '', creator: '' };

function touch(p: Project): Project {
  return { ...p, modifiedAt: new Date().toISOString() };
}

function surfaceIndex(p: Project, surfaceId: string): number {
  const i = p.surfaces.findIndex((s) => s.id === surfaceId);
  if (i < 0) throw new Error(`no surface ${surfaceId}`);
  return i;
}

/**
 * A stroke document made from a solve, as the Follow tool adds it: the anchors as given
 * (px), the solver's samples, restored spans and cost, no hand overrides, shown.
 */
export function strokeFromSolve(
  id: string, surfaceId: string, anchors: readonly Anchor[], solved: Pick<Stroke, 'samples' | 'restoredSpans' | 'cost'>,
): StrokeDoc {
  return {
    id, surfaceId, anchors: anchors.map((a) => ({ ...a })), samples: solved.samples, restoredSpans: solved.restoredSpans,
    overrides: [], cost: solved.cost, hidden: false,
  };
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

/** Deletes strokes; a letter loses them, and a letter left with no stroke goes too. */
export function deleteStrokes(p: Project, ids: readonly string[]): Project {
  const gone = new Set(ids.filter((id) => p.strokes[id]));
  if (gone.size === 0) return p;
  const strokes = { ...p.strokes };
  for (const id of gone) delete strokes[id];
  const surfaces = p.surfaces.map((s) => ({ ...s, strokeOrder: s.strokeOrder.filter((id) => !gone.has(id)) }));
  let letters = p.letters;
  for (const l of Object.values(p.letters)) {
    if (!l.strokeIds.some((id) => gone.has(id))) continue;
    if (letters === p.letters) letters = { ...p.letters };
    const kept = l.strokeIds.filter((id) => !gone.has(id));
    if (kept.length) letters[l.id] = { ...l, strokeIds: kept };
    else delete letters[l.id];
  }
  const next = { ...p, surfaces, strokes, letters };
  return touch(letters === p.letters ? next : layoutText(next));
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

/** Sets the scale of a surface, px per mm, and where it came from. */
export function setScale(p: Project, surfaceId: string, pxPerMm: number, source: ScaleSource): Project {
  if (!(Number.isFinite(pxPerMm) && pxPerMm > 0)) throw new RangeError(`a scale must be a positive number of px per mm, not ${pxPerMm}`);
  const si = surfaceIndex(p, surfaceId);
  const surfaces = p.surfaces.slice();
  surfaces[si] = { ...surfaces[si], pxPerMm, scaleSource: structuredClone(source) };
  return touch({ ...p, surfaces });
}

export function setInscription(p: Project, patch: Partial<Inscription>): Project {
  const inscription = { ...p.inscription, ...patch };
  return touch(patch.direction && patch.direction !== p.inscription.direction ? layoutText({ ...p, inscription }) : { ...p, inscription });
}

export function setTitle(p: Project, title: string): Project {
  return touch({ ...p, title });
}

/**
 * Makes the given strokes one letter (ids in ductus order). A stroke already in a letter
 * leaves it (a letter left empty goes). The letter's line and place come from layoutText.
 */
export function makeLetter(
  p: Project, strokeIds: readonly string[], fields: Partial<Pick<Letter, 'label' | 'reading' | 'restored'>> = {}, id = newId('l'),
): { project: Project; id: string } {
  const ids = [...new Set(strokeIds)].filter((sid) => p.strokes[sid]);
  if (ids.length === 0) throw new Error('a letter needs at least one stroke');
  const surfaceId = p.strokes[ids[0]].surfaceId;
  if (ids.some((sid) => p.strokes[sid].surfaceId !== surfaceId)) throw new Error('the strokes of a letter must lie on one surface');
  const order = p.surfaces[surfaceIndex(p, surfaceId)].strokeOrder;
  ids.sort((a, b) => order.indexOf(a) - order.indexOf(b));
  const taken = new Set(ids);
  const letters: Record<string, Letter> = {};
  for (const l of Object.values(p.letters)) {
    const kept = l.strokeIds.filter((sid) => !taken.has(sid));
    if (kept.length) letters[l.id] = kept.length === l.strokeIds.length ? l : { ...l, strokeIds: kept };
  }
  letters[id] = {
    id, surfaceId, strokeIds: ids, label: fields.label ?? '', reading: fields.reading ?? 'clear', restored: fields.restored ?? false,
    line: 1, lineByHand: false, order: 1,
  };
  return { project: touch(layoutText({ ...p, letters })), id };
}

/** Changes a letter's label, reading, restored flag or strokes; `line` puts it on that line by hand. */
export function updateLetter(
  p: Project, id: string, patch: Partial<Pick<Letter, 'label' | 'reading' | 'restored' | 'line' | 'lineByHand'>>,
): Project {
  const old = p.letters[id];
  if (!old) throw new Error(`no letter ${id}`);
  const next: Letter = { ...old, ...patch };
  if (patch.line !== undefined && patch.lineByHand === undefined) next.lineByHand = true;
  const moved = next.line !== old.line || next.lineByHand !== old.lineByHand;
  const q = { ...p, letters: { ...p.letters, [id]: next } };
  return touch(moved ? layoutText(q) : q);
}

export function deleteLetters(p: Project, ids: readonly string[]): Project {
  const gone = ids.filter((id) => p.letters[id]);
  if (gone.length === 0) return p;
  const letters = { ...p.letters };
  for (const id of gone) delete letters[id];
  return touch(layoutText({ ...p, letters }));
}

/** Places a word divider or a lacuna at (x, y) px on a surface. */
export function addTextMark(
  p: Project, surfaceId: string, kind: TextMark['kind'], at: { x: number; y: number }, lost?: number, id = newId('m'),
): { project: Project; id: string } {
  surfaceIndex(p, surfaceId);
  if (lost !== undefined && !(Number.isInteger(lost) && lost > 0)) throw new RangeError(`the number of lost letters must be a whole number above 0, not ${lost}`);
  const mark: TextMark = { id, surfaceId, kind, x: at.x, y: at.y, line: 1, lineByHand: false, order: 1 };
  if (kind === 'lacuna' && lost !== undefined) mark.lost = lost;
  return { project: touch(layoutText({ ...p, textMarks: { ...p.textMarks, [id]: mark } })), id };
}

export function updateTextMark(p: Project, id: string, patch: Partial<Pick<TextMark, 'x' | 'y' | 'lost' | 'line' | 'lineByHand'>>): Project {
  const old = p.textMarks[id];
  if (!old) throw new Error(`no text mark ${id}`);
  const next: TextMark = { ...old, ...patch };
  if ('lost' in patch && patch.lost === undefined) delete next.lost;
  if (patch.line !== undefined && patch.lineByHand === undefined) next.lineByHand = true;
  return touch(layoutText({ ...p, textMarks: { ...p.textMarks, [id]: next } }));
}

export function deleteTextMarks(p: Project, ids: readonly string[]): Project {
  const gone = ids.filter((id) => p.textMarks[id]);
  if (gone.length === 0) return p;
  const textMarks = { ...p.textMarks };
  for (const id of gone) delete textMarks[id];
  return touch(layoutText({ ...p, textMarks }));
}
