/**
 * The PNG facsimile (`facsimile.png`): the same drawing as the SVG (drawing.ts),
 * rasterised by raster.ts at `dpi` on paper. Pixel size = object mm × scale × dpi / 25.4;
 * the pHYs chunk says round(dpi / 0.0254) px per metre (PNG specification 11.3.5.3).
 *
 * What the PNG holds: the inked strokes (ink black), the restored spans (slate, dashed
 * edge or fill), the scale bar with its label and the line numbers (in a small line font
 * of digits, strokeFont.ts). It leaves out the letter labels (any script: a
 * pure-TypeScript rasteriser has no font for them) and the photo.
 */
import { encode } from 'fast-png';
import { withPhys } from '../image/codec.ts';
import { facsimileDrawing, type FacsimileDrawing } from './drawing.ts';
import type { Ring } from './outline.ts';
import { dashRings, rasterizeRings } from './raster.ts';
import { canDraw, textRings } from './strokeFont.ts';
import { ExportError, type ExportInput, type PngOptions } from './types.ts';

/** Grey levels of ink black #1b1b1f and slate #6b7280 (Rec. 709 luma, rounded). */
export const INK_GREY = 27;
export const RESTORED_GREY = 114;

/** Largest PNG side we write, px (a guard against a dpi typed wrong). */
const MAX_SIDE = 40_000;

/** Pixel size of the PNG of a drawing at `dpi`: mm × scale × dpi / 25.4, rounded. */
export function pngSize(d: Pick<FacsimileDrawing, 'widthMm' | 'heightMm' | 'scale'>, dpi: number): { width: number; height: number } {
  const k = (d.scale * dpi) / 25.4;
  return { width: Math.max(1, Math.round(d.widthMm * k)), height: Math.max(1, Math.round(d.heightMm * k)) };
}

/** Coverage of the ink and of the restored layer (with the scale bar in the ink) on the PNG's grid. */
export function drawingCoverage(d: FacsimileDrawing, dpi: number): { width: number; height: number; ink: Float32Array; restored: Float32Array } {
  const { width, height } = pngSize(d, dpi);
  const k = (d.scale * dpi) / 25.4;
  const ink = rasterizeRings(d.ink, width, height, { scale: k });
  if (d.scaleBar) {
    const b = d.scaleBar;
    const bar: Ring = [b.x, b.y, b.x + b.width, b.y, b.x + b.width, b.y + b.height, b.x, b.y + b.height];
    rasterizeRings([bar], width, height, { scale: k, out: ink });
  }
  const texts = [...d.lineNumbers, ...(d.scaleBar ? [d.scaleBar.label] : [])].filter((t) => canDraw(t.text));
  if (texts.length) rasterizeRings(texts.flatMap(textRings), width, height, { scale: k, out: ink });
  const restoredRings = d.restoredStyle === 'grey' ? d.restoredFill : dashRings(d.restoredEdge, d.line.width, d.line.dash, d.line.gap);
  const restored = rasterizeRings(restoredRings, width, height, { scale: k });
  return { width, height, ink, restored };
}

/**
 * The PNG facsimile of a surface. Options as facsimileSvg's, plus `dpi` (default 300) and
 * `background` ('white': 8-bit grey, black on white, the default; 'transparent': grey and
 * alpha). Letter labels and the photo are not drawn (see above). Throws ExportError for an
 * uncalibrated surface or a dpi that is not a positive number.
 */
export function facsimilePng(input: ExportInput, opts: PngOptions = {}): Uint8Array {
  const dpi = opts.dpi ?? 300;
  if (!(dpi > 0 && Number.isFinite(dpi))) throw new ExportError(`The PNG resolution must be a positive number of dpi, got ${dpi}.`);
  const d = facsimileDrawing(input, opts);
  const { width, height } = pngSize(d, dpi);
  if (width > MAX_SIDE || height > MAX_SIDE) {
    throw new ExportError(`A PNG of ${width} × ${height} px is too large: choose a lower dpi or scale.`);
  }
  const { ink, restored } = drawingCoverage(d, dpi);
  const n = width * height;
  const transparent = opts.background === 'transparent';
  const data = new Uint8Array(transparent ? 2 * n : n);
  for (let p = 0; p < n; p++) {
    const ci = ink[p], cr = restored[p];
    // Restored under ink, both over the paper (white, or nothing).
    if (transparent) {
      const a = cr + ci - cr * ci;
      const g = a > 0 ? ((1 - ci) * cr * RESTORED_GREY + ci * INK_GREY) / a : 0;
      data[2 * p] = Math.round(g);
      data[2 * p + 1] = Math.round(255 * a);
    } else {
      const v = (255 * (1 - cr) + RESTORED_GREY * cr) * (1 - ci) + INK_GREY * ci;
      data[p] = Math.round(v);
    }
  }
  const png = encode({ width, height, data, depth: 8, channels: transparent ? 2 : 1 });
  return withPhys(png, Math.round(dpi / 0.0254));
}
