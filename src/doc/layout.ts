/**
 * Lines and reading order of a surface's text. Letters and text marks fall into lines by
 * the height of their centres (a new line where the gap between neighbouring centres
 * exceeds LINE_BREAK × the median letter height); a line set by hand stays. Within a line
 * the order follows the inscription's reading direction (x falling for right-to-left).
 */
import type { Letter, Project, StrokeDoc, TextMark } from './model.ts';

/** A gap between centres above this share of the median letter height starts a new line. */
export const LINE_BREAK = 0.6;
/** Letter height assumed when a surface has no letter to measure, px. */
const FALLBACK_HEIGHT = 20;

export type Box = [x0: number, y0: number, x1: number, y1: number];

/** Box of a stroke's pen disks, px. */
export function strokeBox(stroke: Pick<StrokeDoc, 'samples'>): Box {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const s of stroke.samples) {
    if (s.x - s.r < x0) x0 = s.x - s.r;
    if (s.y - s.r < y0) y0 = s.y - s.r;
    if (s.x + s.r > x1) x1 = s.x + s.r;
    if (s.y + s.r > y1) y1 = s.y + s.r;
  }
  return [x0, y0, x1, y1];
}

/** Box of a letter's pen disks, px; undefined when none of its strokes exists. */
export function letterBox(p: Pick<Project, 'strokes'>, letter: Pick<Letter, 'strokeIds'>): Box | undefined {
  let box: Box | undefined;
  for (const id of letter.strokeIds) {
    const st = p.strokes[id];
    if (!st || st.samples.length === 0) continue;
    const b = strokeBox(st);
    box = box ? [Math.min(box[0], b[0]), Math.min(box[1], b[1]), Math.max(box[2], b[2]), Math.max(box[3], b[3])] : b;
  }
  return box;
}

interface Item {
  kind: 'letter' | 'mark';
  id: string;
  cx: number;
  cy: number;
  line: number;
  byHand: boolean;
}

function median(v: number[]): number {
  if (v.length === 0) return NaN;
  const s = v.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** The project with every letter's and text mark's line and order set from positions. */
export function layoutText(p: Project): Project {
  const letters: Record<string, Letter> = { ...p.letters };
  const textMarks: Record<string, TextMark> = { ...p.textMarks };
  const rtl = p.inscription.direction === 'rtl';
  for (const surface of p.surfaces) {
    const items: Item[] = [];
    const heights: number[] = [];
    for (const l of Object.values(p.letters)) {
      if (l.surfaceId !== surface.id) continue;
      const b = letterBox(p, l);
      if (!b) continue;
      heights.push(b[3] - b[1]);
      items.push({ kind: 'letter', id: l.id, cx: (b[0] + b[2]) / 2, cy: (b[1] + b[3]) / 2, line: l.line, byHand: l.lineByHand });
    }
    for (const m of Object.values(p.textMarks)) {
      if (m.surfaceId !== surface.id) continue;
      items.push({ kind: 'mark', id: m.id, cx: m.x, cy: m.y, line: m.line, byHand: m.lineByHand });
    }
    const h = median(heights);
    const breakAt = LINE_BREAK * (Number.isFinite(h) && h > 0 ? h : FALLBACK_HEIGHT);
    const auto = items.filter((it) => !it.byHand).sort((a, b) => a.cy - b.cy || a.cx - b.cx);
    let line = 0;
    let prevY = -Infinity;
    for (const it of auto) {
      if (it.cy - prevY > breakAt) line++;
      it.line = line;
      prevY = it.cy;
    }
    const byLine = new Map<number, Item[]>();
    for (const it of items) {
      const list = byLine.get(it.line) ?? [];
      list.push(it);
      byLine.set(it.line, list);
    }
    for (const list of byLine.values()) {
      list.sort((a, b) => (rtl ? b.cx - a.cx : a.cx - b.cx) || a.cy - b.cy || (a.id < b.id ? -1 : 1));
      list.forEach((it, i) => {
        const place = { line: it.line, order: i + 1 };
        if (it.kind === 'letter') {
          const l = letters[it.id];
          if (l.line !== place.line || l.order !== place.order) letters[it.id] = { ...l, ...place };
        } else {
          const m = textMarks[it.id];
          if (m.line !== place.line || m.order !== place.order) textMarks[it.id] = { ...m, ...place };
        }
      });
    }
  }
  return { ...p, letters, textMarks };
}

/** One line of a surface's text: its letters and marks in reading order. */
export interface TextLine {
  line: number;
  items: ({ kind: 'letter'; letter: Letter } | { kind: 'mark'; mark: TextMark })[];
}

/** A surface's text line by line, in reading order (as layoutText left it). */
export function textLines(p: Pick<Project, 'letters' | 'textMarks'>, surfaceId: string): TextLine[] {
  const lines = new Map<number, TextLine['items'][number][]>();
  const add = (line: number, item: TextLine['items'][number]) => {
    const list = lines.get(line) ?? [];
    list.push(item);
    lines.set(line, list);
  };
  for (const letter of Object.values(p.letters)) if (letter.surfaceId === surfaceId) add(letter.line, { kind: 'letter', letter });
  for (const mark of Object.values(p.textMarks)) if (mark.surfaceId === surfaceId) add(mark.line, { kind: 'mark', mark });
  const placeOf = (it: TextLine['items'][number]) => (it.kind === 'letter' ? it.letter.order : it.mark.order);
  return [...lines.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([line, items]) => ({ line, items: items.sort((a, b) => placeOf(a) - placeOf(b)) }));
}
