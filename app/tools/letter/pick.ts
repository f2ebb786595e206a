/**
 * What the Letter tool picks, as pure functions of the project (image px): the strokes a
 * box takes, the letter under a point, and making a letter of the picked strokes.
 */
import { letterBox, type Box } from '../../../src/doc/layout.ts';
import type { Project } from '../../../src/doc/model.ts';
import { makeLetter } from '../../../src/doc/rules.ts';
import type { EditorStore } from '../../store/store.ts';

/** Share of a stroke's centreline that must lie inside a pick box for the box to take it. */
export const BOX_SHARE = 0.5;

/** The box spanned by two corners, in any order. */
export function boxOf(a: { x: number; y: number }, b: { x: number; y: number }): Box {
  return [Math.min(a.x, b.x), Math.min(a.y, b.y), Math.max(a.x, b.x), Math.max(a.y, b.y)];
}

function inside(b: Box, x: number, y: number): boolean {
  return x >= b[0] && x <= b[2] && y >= b[1] && y <= b[3];
}

/**
 * The visible strokes of a surface whose centreline lies mostly inside `box`: the share of
 * its length (segment by segment, judged at each segment's middle) at least `share`.
 * A one-sample stroke counts by its one point. Ids in ductus order.
 */
export function strokesInBox(p: Project, surfaceId: string, box: Box, share = BOX_SHARE): string[] {
  const surface = p.surfaces.find((s) => s.id === surfaceId);
  if (!surface) return [];
  const out: string[] = [];
  for (const id of surface.strokeOrder) {
    const st = p.strokes[id];
    if (!st || st.hidden || st.samples.length === 0) continue;
    const s = st.samples;
    if (s.length === 1) {
      if (inside(box, s[0].x, s[0].y)) out.push(id);
      continue;
    }
    let total = 0;
    let within = 0;
    for (let i = 1; i < s.length; i++) {
      const len = Math.hypot(s[i].x - s[i - 1].x, s[i].y - s[i - 1].y);
      total += len;
      if (inside(box, (s[i].x + s[i - 1].x) / 2, (s[i].y + s[i - 1].y) / 2)) within += len;
    }
    if (total > 0 ? within / total >= share : inside(box, s[0].x, s[0].y)) out.push(id);
  }
  return out;
}

/** The letter of `surfaceId` whose box holds (x, y); of several, the smallest box. */
export function letterAt(p: Project, surfaceId: string, x: number, y: number): string | undefined {
  let best: string | undefined;
  let bestArea = Infinity;
  for (const l of Object.values(p.letters)) {
    if (l.surfaceId !== surfaceId) continue;
    const b = letterBox(p, l);
    if (!b || !inside(b, x, y)) continue;
    const area = (b[2] - b[0]) * (b[3] - b[1]);
    if (area < bestArea) {
      bestArea = area;
      best = l.id;
    }
  }
  return best;
}

/** The text mark of `surfaceId` within `tolerance` px of (x, y), nearest first. */
export function markAt(p: Project, surfaceId: string, x: number, y: number, tolerance: number): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  for (const m of Object.values(p.textMarks)) {
    if (m.surfaceId !== surfaceId) continue;
    const d = Math.hypot(m.x - x, m.y - y);
    if (d <= tolerance && d < bestD) {
      bestD = d;
      best = m.id;
    }
  }
  return best;
}

/**
 * Makes the picked strokes (store.selection) one letter: one undo step; the new letter
 * becomes the letter selection and the picks are cleared. Returns its id, or undefined
 * with a message when nothing is picked.
 */
export function makeLetterOfPicked(store: EditorStore): string | undefined {
  const s = store.getState();
  const p = s.project;
  const ids = p ? s.selection.filter((id) => p.strokes[id]) : [];
  if (!p || ids.length === 0) {
    s.setMessage({ kind: 'info', text: 'Pick the strokes of a letter first: click, Shift+click or drag a box around them.' });
    return undefined;
  }
  const surfaceId = p.strokes[ids[0]].surfaceId;
  if (ids.some((id) => p.strokes[id].surfaceId !== surfaceId)) {
    s.setMessage({ kind: 'error', text: 'The strokes of a letter must lie on one surface.' });
    return undefined;
  }
  let id: string | undefined;
  s.change((q) => {
    const made = makeLetter(q, ids);
    id = made.id;
    return made.project;
  });
  store.getState().select([]);
  if (id) store.getState().selectLetters([id]);
  return id;
}
