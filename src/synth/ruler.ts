/**
 * The scale bar photographed beside the writing: a light card near the bottom left with
 * a millimetre scale (ticks every mm, longer every 5 and 10 mm) above a dark bar of
 * alternating blocks. Its two end ticks and its length in mm go into the truth.
 */

export interface RulerPlan {
  /** Centre of the 0 mm tick at the tick base, px. */
  x0: number;
  y0: number;
  /** Centre of the last tick at the tick base, px; x1 − x0 = mm × pxPerMm exactly. */
  x1: number;
  y1: number;
  mm: number;
  pxPerMm: number;
  /** The card, [x0, y0, x1, y1] px. */
  box: [number, number, number, number];
  /** Height of one mm on the card drawing, px (the card shrinks to fit narrow bands). */
  unit: number;
}

/** Ruler lengths tried, mm, longest first. */
const LENGTHS = [100, 50, 30, 20, 10, 5];

/**
 * Plan a ruler inside `band` (px rectangle kept free of writing) at the left of the
 * image: the longest of 100/50/30/20/10/5 mm that spans at most 30 % of the width.
 */
export function planRuler(band: readonly [number, number, number, number], imageWidth: number, pxPerMm: number): RulerPlan {
  const mm = LENGTHS.find((l) => l * pxPerMm <= 0.3 * imageWidth) ?? LENGTHS[LENGTHS.length - 1];
  const bandHeight = band[3] - band[1];
  // The card is drawn 6 mm tall, or smaller in px if the band is too low for that.
  const unit = Math.min(pxPerMm, (0.75 * bandHeight) / 6);
  const cardHeight = 6 * unit;
  const left = band[0] + Math.round(0.04 * imageWidth);
  const x0 = left + 2.5 * unit;
  const x1 = x0 + mm * pxPerMm;
  const top = band[1] + 0.5 * (bandHeight - cardHeight);
  const tickBase = top + 3.6 * unit;
  return {
    x0, y0: tickBase, x1, y1: tickBase, mm, pxPerMm,
    box: [left, top, x1 + 2.5 * unit, top + cardHeight],
    unit,
  };
}

/** Paint the ruler into `data` (albedo before shading): card tone `paper`, marks `mark`. */
export function paintRuler(data: Float32Array, width: number, height: number, plan: RulerPlan, paper: number, mark: number): void {
  const { box, unit, mm, pxPerMm, x0, y0 } = plan;
  fillRect(data, width, height, box[0], box[1], box[2], box[3], paper);
  const tickWidth = Math.max(1, 0.16 * pxPerMm);
  for (let k = 0; k <= mm; k++) {
    const len = k % 10 === 0 ? 2.6 : k % 5 === 0 ? 1.9 : 1.2;
    const cx = x0 + k * pxPerMm;
    fillRect(data, width, height, cx - tickWidth / 2, y0 - len * unit, cx + tickWidth / 2, y0, mark);
  }
  // The bar: outlined, every other block (10 mm, or 5 mm on short rulers) filled.
  const block = mm >= 20 ? 10 : 5;
  const barTop = y0 + 0.4 * unit;
  const barBottom = barTop + 1.4 * unit;
  const line = Math.max(1, 0.12 * pxPerMm);
  fillRect(data, width, height, x0, barTop, plan.x1, barTop + line, mark);
  fillRect(data, width, height, x0, barBottom - line, plan.x1, barBottom, mark);
  fillRect(data, width, height, x0 - line / 2, barTop, x0 + line / 2, barBottom, mark);
  fillRect(data, width, height, plan.x1 - line / 2, barTop, plan.x1 + line / 2, barBottom, mark);
  for (let b = 0; b * block < mm; b += 2) {
    fillRect(data, width, height, x0 + b * block * pxPerMm, barTop, x0 + Math.min(mm, (b + 1) * block) * pxPerMm, barBottom, mark);
  }
}

/** Blend `value` over a rectangle with exact area coverage of each pixel (box-filtered edges). */
function fillRect(
  data: Float32Array, width: number, height: number,
  rx0: number, ry0: number, rx1: number, ry1: number, value: number,
): void {
  const i0 = Math.max(0, Math.floor(rx0));
  const i1 = Math.min(width - 1, Math.ceil(rx1) - 1);
  const j0 = Math.max(0, Math.floor(ry0));
  const j1 = Math.min(height - 1, Math.ceil(ry1) - 1);
  for (let j = j0; j <= j1; j++) {
    const cy = Math.min(j + 1, ry1) - Math.max(j, ry0);
    if (cy <= 0) continue;
    for (let i = i0; i <= i1; i++) {
      const cx = Math.min(i + 1, rx1) - Math.max(i, rx0);
      if (cx <= 0) continue;
      const a = cx * cy;
      const p = j * width + i;
      data[p] += (value - data[p]) * a;
    }
  }
}
