/**
 * Zoomed out over a large surface, hundreds of strokes are on screen at once, and
 * rasterizing all of their outlines every frame of a pan or a zoom takes longer than a
 * frame. So at or below full size a stroke layer is drawn from tiles: square pieces of the
 * layer rendered once at the power-of-two scale at or above the zoom (1, 1/2, 1/4, …) and
 * drawn scaled, like the levels of a photo pyramid. A tile is rendered again only when a
 * stroke that touches it changes; the least recently used tiles are dropped. Closer in
 * than full size, few strokes are on screen and the layer is drawn directly.
 */
import type { Project, StrokeDoc } from '../../src/doc/model.ts';
import { geometryOf } from './geometry.ts';

/** Tiles are used at or below this many device px per image px. */
export const TILE_MAX_SCALE = 1;
/** Side of a tile, level px, and the border rendered around it so scaled tiles meet without seams. */
const TILE = 512;
const BORDER = 2;
/** Tiles kept, at most (4 MB each with their border). */
const MAX_TILES = 64;

interface Tile {
  canvas: HTMLCanvasElement;
  k: number;
  tx: number;
  ty: number;
  used: number;
}

/** Paints the layer into a width × height context (identity transform) seen through `view`, as the canvas would. */
export type TilePaint = (ctx: CanvasRenderingContext2D, view: { zoom: number; panX: number; panY: number }, width: number, height: number) => void;

export class TileCache {
  private readonly tiles = new Map<string, Tile>();
  private strokes: Project['strokes'] | undefined;
  private surfaceKey = '';
  private clock = 0;

  constructor(private readonly paint: TilePaint) {}

  /**
   * Draws the tiles covering the screen. `device` is device px per image px, `view` the
   * view (css px), `dpr` device px per css px; the context's transform is reset here to
   * device px, so tile edges fall on whole device px. Returns false when zoomed in past
   * full size (the caller draws directly).
   */
  draw(
    ctx: CanvasRenderingContext2D, project: Project, surfaceKey: string, image: { width: number; height: number },
    view: { zoom: number; panX: number; panY: number }, dpr: number, screen: { width: number; height: number },
  ): boolean {
    const device = view.zoom * dpr;
    if (device > TILE_MAX_SCALE || device <= 0) return false;
    this.sync(project, surfaceKey);
    const k = Math.max(0, Math.floor(Math.log2(1 / device)));
    const scale = 2 ** -k;
    const span = TILE / scale; // image px per tile
    const ix0 = Math.max(0, -view.panX / view.zoom);
    const iy0 = Math.max(0, -view.panY / view.zoom);
    const ix1 = Math.min(image.width, (screen.width - view.panX) / view.zoom);
    const iy1 = Math.min(image.height, (screen.height - view.panY) / view.zoom);
    if (ix1 <= ix0 || iy1 <= iy0) return true;
    ctx.save();
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.imageSmoothingEnabled = true;
    ctx.imageSmoothingQuality = 'low';
    const sx = (x: number) => Math.round((view.panX + x * view.zoom) * dpr);
    const sy = (y: number) => Math.round((view.panY + y * view.zoom) * dpr);
    for (let ty = Math.floor(iy0 / span); ty * span < iy1; ty++) {
      for (let tx = Math.floor(ix0 / span); tx * span < ix1; tx++) {
        const tile = this.tile(k, tx, ty, scale, span);
        const x = sx(tx * span);
        const y = sy(ty * span);
        ctx.drawImage(tile.canvas, BORDER, BORDER, TILE, TILE, x, y, sx((tx + 1) * span) - x, sy((ty + 1) * span) - y);
      }
    }
    ctx.restore();
    this.evict();
    return true;
  }

  /** Drops every tile touched by a stroke that was added, removed or changed since the last draw. */
  private sync(project: Project, surfaceKey: string): void {
    if (surfaceKey !== this.surfaceKey) {
      this.tiles.clear();
      this.surfaceKey = surfaceKey;
      this.strokes = project.strokes;
      return;
    }
    const before = this.strokes;
    const after = project.strokes;
    if (before === after) return;
    this.strokes = after;
    if (!before) {
      this.tiles.clear();
      return;
    }
    const changed: StrokeDoc[] = [];
    for (const id in after) if (before[id] !== after[id]) changed.push(after[id]);
    for (const id in before) if (before[id] !== after[id]) changed.push(before[id]);
    if (changed.length === 0) return;
    const boxes = changed.filter((s) => s.samples.length > 0).map((s) => geometryOf(s));
    for (const [key, t] of this.tiles) {
      const span = TILE * 2 ** t.k;
      // The border reaches a little beyond the tile: count it.
      const pad = BORDER * 2 ** t.k;
      const x0 = t.tx * span - pad;
      const y0 = t.ty * span - pad;
      const x1 = x0 + span + 2 * pad;
      const y1 = y0 + span + 2 * pad;
      if (boxes.some((g) => g.x1 >= x0 && g.x0 <= x1 && g.y1 >= y0 && g.y0 <= y1)) this.tiles.delete(key);
    }
  }

  private tile(k: number, tx: number, ty: number, scale: number, span: number): Tile {
    const key = `${k}/${tx}/${ty}`;
    let t = this.tiles.get(key);
    if (!t) {
      const canvas = document.createElement('canvas');
      canvas.width = TILE + 2 * BORDER;
      canvas.height = TILE + 2 * BORDER;
      const c = canvas.getContext('2d');
      if (c) this.paint(c, { zoom: scale, panX: BORDER - tx * span * scale, panY: BORDER - ty * span * scale }, canvas.width, canvas.height);
      t = { canvas, k, tx, ty, used: 0 };
      this.tiles.set(key, t);
    }
    t.used = ++this.clock;
    return t;
  }

  private evict(): void {
    if (this.tiles.size <= MAX_TILES) return;
    const byAge = [...this.tiles].sort((a, b) => a[1].used - b[1].used);
    for (const [key] of byAge.slice(0, this.tiles.size - MAX_TILES)) this.tiles.delete(key);
  }
}
