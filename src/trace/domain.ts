/**
 * Search domains: the set of pixels the lifted search may visit, with a compact index
 * per pixel (a "cell") and a lookup table over the domain's bounding box.
 */

export interface Domain {
  /** Bounding box of the cells: x0, y0 and size in px. */
  x0: number;
  y0: number;
  w: number;
  h: number;
  /** Cell index of each bounding-box pixel, −1 outside the domain. */
  cellOf: Int32Array;
  /** Pixel column and row of each cell. */
  cellX: Int32Array;
  cellY: Int32Array;
  count: number;
}

function fromMask(x0: number, y0: number, w: number, h: number, mask: Uint8Array): Domain {
  const cellOf = new Int32Array(w * h).fill(-1);
  let count = 0;
  for (let i = 0; i < mask.length; i++) if (mask[i]) cellOf[i] = count++;
  const cellX = new Int32Array(count);
  const cellY = new Int32Array(count);
  for (let i = 0; i < mask.length; i++) {
    const c = cellOf[i];
    if (c >= 0) {
      cellX[c] = x0 + (i % w);
      cellY[c] = y0 + Math.floor(i / w);
    }
  }
  return { x0, y0, w, h, cellOf, cellX, cellY, count };
}

/** Every pixel of the rectangle [x0, x1] × [y0, y1] (inclusive), clipped to the image. */
export function boxDomain(imageW: number, imageH: number, x0: number, y0: number, x1: number, y1: number): Domain {
  const ax = Math.max(0, Math.floor(x0));
  const ay = Math.max(0, Math.floor(y0));
  const bx = Math.min(imageW - 1, Math.ceil(x1));
  const by = Math.min(imageH - 1, Math.ceil(y1));
  const w = bx - ax + 1;
  const h = by - ay + 1;
  return fromMask(ax, ay, w, h, new Uint8Array(w * h).fill(1));
}

/**
 * The pixels within `radius` px of a pixel path (integer pixel columns/rows,
 * consecutive points at most a few px apart), clipped to the image.
 */
export function tubeDomain(imageW: number, imageH: number, px: Int32Array, py: Int32Array, radius: number): Domain {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < px.length; i++) {
    if (px[i] < minX) minX = px[i];
    if (px[i] > maxX) maxX = px[i];
    if (py[i] < minY) minY = py[i];
    if (py[i] > maxY) maxY = py[i];
  }
  const R = Math.ceil(radius);
  const x0 = Math.max(0, minX - R);
  const y0 = Math.max(0, minY - R);
  const x1 = Math.min(imageW - 1, maxX + R);
  const y1 = Math.min(imageH - 1, maxY + R);
  const w = x1 - x0 + 1;
  const h = y1 - y0 + 1;
  const mask = new Uint8Array(w * h);
  const r2 = radius * radius;
  for (let i = 0; i < px.length; i++) {
    const cx = px[i];
    const cy = py[i];
    for (let y = Math.max(y0, cy - R); y <= Math.min(y1, cy + R); y++) {
      const dy = y - cy;
      const row = (y - y0) * w;
      for (let x = Math.max(x0, cx - R); x <= Math.min(x1, cx + R); x++) {
        const dx = x - cx;
        if (dx * dx + dy * dy <= r2) mask[row + x - x0] = 1;
      }
    }
  }
  return fromMask(x0, y0, w, h, mask);
}

/** Cell index of pixel (x, y), −1 outside the domain. */
export function cellAt(domain: Domain, x: number, y: number): number {
  const lx = x - domain.x0;
  const ly = y - domain.y0;
  if (lx < 0 || ly < 0 || lx >= domain.w || ly >= domain.h) return -1;
  return domain.cellOf[ly * domain.w + lx];
}
