/**
 * A uniform-grid index of all truth samples, for "is any ink near this point" queries
 * while placing stains, cracks and when checking the layout.
 */
import type { TruthStroke } from './types.ts';

export interface SampleGrid {
  /** Interleaved x, y of every sample, px. */
  xy: Float64Array;
  r: Float64Array;
  /** Index of the stroke each sample belongs to. */
  stroke: Int32Array;
  /** Sample ids sorted by cell; cell c holds order[start[c] .. start[c + 1]). */
  order: Int32Array;
  start: Int32Array;
  cell: number;
  cols: number;
  rows: number;
}

/** Index `strokes` with square cells of `cell` px (default 16). */
export function buildSampleGrid(strokes: readonly TruthStroke[], width: number, height: number, cell = 16): SampleGrid {
  let n = 0;
  for (const s of strokes) n += s.samples.length;
  const xy = new Float64Array(2 * n);
  const r = new Float64Array(n);
  const stroke = new Int32Array(n);
  const cols = Math.max(1, Math.ceil(width / cell));
  const rows = Math.max(1, Math.ceil(height / cell));
  const cellOf = new Int32Array(n);
  const start = new Int32Array(cols * rows + 1);
  let k = 0;
  strokes.forEach((s, si) => {
    s.samples.forEach((p) => {
      xy[2 * k] = p.x;
      xy[2 * k + 1] = p.y;
      r[k] = p.r;
      stroke[k] = si;
      const cx = Math.min(cols - 1, Math.max(0, Math.floor(p.x / cell)));
      const cy = Math.min(rows - 1, Math.max(0, Math.floor(p.y / cell)));
      cellOf[k] = cy * cols + cx;
      start[cellOf[k] + 1]++;
      k++;
    });
  });
  for (let c = 0; c < cols * rows; c++) start[c + 1] += start[c];
  const fill = start.slice(0, cols * rows);
  const order = new Int32Array(n);
  for (let m = 0; m < n; m++) order[fill[cellOf[m]]++] = m;
  return { xy, r, stroke, order, start, cell, cols, rows };
}

/**
 * Calls `visit(sampleId)` for every sample whose centre may lie within `reach` px of
 * (x, y) (all cells touching the square of side 2 reach); `visit` returning true stops
 * the search, and then the function returns true.
 */
export function someSampleNear(
  grid: SampleGrid, x: number, y: number, reach: number, visit: (id: number) => boolean,
): boolean {
  const c0 = Math.max(0, Math.floor((x - reach) / grid.cell));
  const c1 = Math.min(grid.cols - 1, Math.floor((x + reach) / grid.cell));
  const r0 = Math.max(0, Math.floor((y - reach) / grid.cell));
  const r1 = Math.min(grid.rows - 1, Math.floor((y + reach) / grid.cell));
  for (let cy = r0; cy <= r1; cy++) {
    for (let cx = c0; cx <= c1; cx++) {
      const c = cy * grid.cols + cx;
      for (let m = grid.start[c]; m < grid.start[c + 1]; m++) {
        if (visit(grid.order[m])) return true;
      }
    }
  }
  return false;
}

/** True when some pen disk comes within `clearance` px of (x, y). */
export function inkWithin(grid: SampleGrid, x: number, y: number, clearance: number, maxRadius: number): boolean {
  return someSampleNear(grid, x, y, clearance + maxRadius, (id) => {
    const dx = grid.xy[2 * id] - x;
    const dy = grid.xy[2 * id + 1] - y;
    const reach = clearance + grid.r[id];
    return dx * dx + dy * dy < reach * reach;
  });
}
