/**
 * The text over the photo, drawn on the marks layer: each letter as a box around its
 * strokes (ochre for a doubtful reading, teal for a clear one) with its label, word
 * dividers and lacunae as small marks, and the active tool's guide (the Calibrate line
 * with its length in px, the Letter tool's pick box, a mark being placed). Sizes on
 * screen are divided by the zoom.
 */
import { letterBox } from '../../src/doc/layout.ts';
import type { Project } from '../../src/doc/model.ts';
import { lacunaText, readingText, WORD_DIVIDER } from '../../src/export/transcription.ts';
import type { EditorState, ToolGuide } from '../store/store.ts';
import { DOUBTFUL, HALO, INK, SELECTION } from './colours.ts';
import type { Frame } from './draw.ts';
import { currentSurface } from './view.ts';

/** Room between a letter's pen disks and its box, screen px. */
const BOX_PAD = 4;

/** Whether the letters drawing has anything to show (the marks layer stays hidden otherwise). */
export function hasLetterMarks(s: Pick<EditorState, 'project' | 'guide'>): boolean {
  if (s.guide) return true;
  const p = s.project;
  if (!p) return false;
  for (const _ in p.letters) return true;
  for (const _ in p.textMarks) return true;
  return false;
}

function haloText(ctx: CanvasRenderingContext2D, text: string, x: number, y: number, z: number, colour: string): void {
  ctx.lineWidth = 3 / z;
  ctx.strokeStyle = HALO;
  ctx.strokeText(text, x, y);
  ctx.fillStyle = colour;
  ctx.fillText(text, x, y);
}

function letters(ctx: CanvasRenderingContext2D, p: Project, surfaceId: string, selected: ReadonlySet<string>, z: number): void {
  ctx.font = `600 ${13 / z}px system-ui, sans-serif`;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'bottom';
  const pad = BOX_PAD / z;
  for (const l of Object.values(p.letters)) {
    if (l.surfaceId !== surfaceId) continue;
    const b = letterBox(p, l);
    if (!b) continue;
    const colour = l.reading === 'doubtful' ? DOUBTFUL : SELECTION;
    const x = b[0] - pad;
    const y = b[1] - pad;
    const w = b[2] - b[0] + 2 * pad;
    const h = b[3] - b[1] + 2 * pad;
    const on = selected.has(l.id);
    ctx.setLineDash(l.restored ? [6 / z, 4 / z] : []);
    ctx.strokeStyle = HALO;
    ctx.lineWidth = (on ? 5 : 3) / z;
    ctx.strokeRect(x, y, w, h);
    ctx.strokeStyle = colour;
    ctx.lineWidth = (on ? 3 : 1.5) / z;
    ctx.strokeRect(x, y, w, h);
    ctx.setLineDash([]);
    // Only the reading over each box (neighbouring boxes touch); its place in the text
    // (line.order) for the selected letter, which the Letters list also shows.
    const reading = l.restored ? `[${readingText(l)}]` : readingText(l);
    haloText(ctx, on ? `${l.line}.${l.order} ${reading}` : reading, x, y - 2 / z, z, colour);
  }
}

function marks(ctx: CanvasRenderingContext2D, p: Project, surfaceId: string, selected: ReadonlySet<string>, z: number): void {
  ctx.font = `600 ${13 / z}px system-ui, sans-serif`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  for (const m of Object.values(p.textMarks)) {
    if (m.surfaceId !== surfaceId) continue;
    markGlyph(ctx, m.kind, m.x, m.y, z, selected.has(m.id), m.kind === 'lacuna' ? lacunaText(m.lost) : WORD_DIVIDER);
  }
}

/** A text mark: a ringed dot for a word divider, a bracketed tag for a lacuna. */
function markGlyph(ctx: CanvasRenderingContext2D, kind: 'divider' | 'lacuna', x: number, y: number, z: number, on: boolean, text: string): void {
  ctx.beginPath();
  ctx.arc(x, y, (kind === 'divider' ? 4 : 3) / z, 0, 2 * Math.PI);
  ctx.fillStyle = kind === 'divider' ? SELECTION : HALO;
  ctx.fill();
  ctx.lineWidth = (on ? 3 : 1.5) / z;
  ctx.strokeStyle = kind === 'divider' ? HALO : SELECTION;
  ctx.stroke();
  if (on) {
    ctx.beginPath();
    ctx.arc(x, y, 8 / z, 0, 2 * Math.PI);
    ctx.strokeStyle = SELECTION;
    ctx.lineWidth = 2 / z;
    ctx.stroke();
  }
  if (kind === 'lacuna') haloText(ctx, text, x, y - 14 / z, z, INK);
}

function guide(ctx: CanvasRenderingContext2D, g: ToolGuide, z: number): void {
  if (g.kind === 'ruler') {
    const len = Math.hypot(g.x1 - g.x0, g.y1 - g.y0);
    ctx.lineCap = 'round';
    for (const [colour, width] of [[HALO, 4], [SELECTION, 2]] as const) {
      ctx.beginPath();
      ctx.moveTo(g.x0, g.y0);
      ctx.lineTo(g.x1, g.y1);
      ctx.strokeStyle = colour;
      ctx.lineWidth = width / z;
      ctx.stroke();
    }
    // End ticks across the line, so the ends can be set on the ruler's marks.
    const ux = len > 0 ? (g.x1 - g.x0) / len : 1;
    const uy = len > 0 ? (g.y1 - g.y0) / len : 0;
    const t = 8 / z;
    ctx.beginPath();
    for (const [x, y] of [[g.x0, g.y0], [g.x1, g.y1]]) {
      ctx.moveTo(x - uy * t, y + ux * t);
      ctx.lineTo(x + uy * t, y - ux * t);
    }
    ctx.strokeStyle = SELECTION;
    ctx.lineWidth = 2 / z;
    ctx.stroke();
    ctx.font = `600 ${13 / z}px system-ui, sans-serif`;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'bottom';
    haloText(ctx, `${len.toFixed(1)} px`, (g.x0 + g.x1) / 2, (g.y0 + g.y1) / 2 - 10 / z, z, INK);
  } else if (g.kind === 'box') {
    ctx.setLineDash([5 / z, 4 / z]);
    ctx.strokeStyle = HALO;
    ctx.lineWidth = 3 / z;
    ctx.strokeRect(g.x0, g.y0, g.x1 - g.x0, g.y1 - g.y0);
    ctx.strokeStyle = SELECTION;
    ctx.lineWidth = 1.5 / z;
    ctx.strokeRect(g.x0, g.y0, g.x1 - g.x0, g.y1 - g.y0);
    ctx.setLineDash([]);
  } else {
    ctx.font = `600 ${13 / z}px system-ui, sans-serif`;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    markGlyph(ctx, g.mark, g.x, g.y, z, true, g.mark === 'lacuna' ? '[...]' : WORD_DIVIDER);
  }
}

/** Letters, text marks and the tool's guide of the current surface. */
export function drawLetterLayer(ctx: CanvasRenderingContext2D, f: Frame): void {
  const s = f.state;
  const p = s.project;
  const surface = currentSurface(p);
  if (!p || !surface) return;
  const z = s.zoom;
  ctx.transform(z, 0, 0, z, s.panX, s.panY);
  const selected = new Set(s.letterSelection);
  letters(ctx, p, surface.id, selected, z);
  marks(ctx, p, surface.id, selected, z);
  if (s.guide) guide(ctx, s.guide, z);
}
