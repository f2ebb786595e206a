/**
 * What the end-to-end tests share: opening the editor on the demo, framing and tracing
 * a stroke with the Follow tool as a person would (click the start, move along, click the
 * end, Enter), distances to ground truth, and percentiles. The page is reached through
 * `window.__inkroute` (app/testHook.ts); the stored stroke is typed loosely here. Types of
 * the ground truth come from src/synth.
 */
import { expect, type Page } from '@playwright/test';
import type { InscriptionTruth as Truth, TruthStroke } from '../src/synth/types.ts';
import { distToPolyline } from '../test/helpers/render.ts';

export interface Pt {
  x: number;
  y: number;
}
/** The demo's ground truth and its parts: the synthesiser's own types (src/synth/types.ts). */
export type { InscriptionTruth as Truth, TruthLetter, TruthStroke } from '../src/synth/types.ts';
export interface Sample {
  x: number;
  y: number;
  r: number;
  support: number;
}
export interface StrokeDoc {
  id: string;
  anchors: { x: number; y: number; r?: number }[];
  samples: Sample[];
  restoredSpans: { from: number; to: number }[];
  overrides: { from: number; to: number; kind: 'restored' | 'inked' }[];
}

/** Collects console errors and uncaught page errors from the moment the page opens. */
export function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() === 'error') errors.push(msg.text());
  });
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}

/** Opens the editor and waits for the demo photo on screen and the engine ready to trace. */
export async function openEditor(page: Page): Promise<Truth> {
  await page.goto('/');
  await expect(page.locator('.canvas[data-state="ready"]')).toBeVisible({ timeout: 20_000 });
  await page.waitForFunction(() => Boolean(window.__inkroute));
  await page.evaluate(() => window.__inkroute!.engineReady);
  return page.evaluate(() => window.__inkroute!.truth) as Promise<Truth>;
}

export function truthStroke(truth: Truth, id: string): TruthStroke {
  const s = truth.strokes.find((t) => t.id === id);
  if (!s) throw new Error(`the demo has no stroke ${id}`);
  return s;
}

/** Sets the view so the stroke fills the canvas at a zoom between 1 and 3 (as a person zooms in to trace). */
export async function frameStroke(page: Page, stroke: TruthStroke): Promise<void> {
  await page.evaluate((samples) => {
    const hook = window.__inkroute!;
    const { width, height } = hook.canvasBox();
    const xs = samples.map((s) => s.x);
    const ys = samples.map((s) => s.y);
    const x0 = Math.min(...xs) - 30;
    const x1 = Math.max(...xs) + 30;
    const y0 = Math.min(...ys) - 30;
    const y1 = Math.max(...ys) + 30;
    const zoom = Math.max(1, Math.min(3, width / (x1 - x0), height / (y1 - y0)));
    hook.store.getState().setView({
      zoom, panX: width / 2 - ((x0 + x1) / 2) * zoom, panY: height / 2 - ((y0 + y1) / 2) * zoom,
    });
  }, stroke.samples);
}

export function toScreen(page: Page, p: Pt): Promise<Pt> {
  return page.evaluate(([x, y]) => window.__inkroute!.imageToScreen(x, y), [p.x, p.y] as const);
}

export function strokeCount(page: Page): Promise<number> {
  return page.evaluate(() => Object.keys(window.__inkroute!.store.getState().project?.strokes ?? {}).length);
}

export function strokeById(page: Page, id: string): Promise<StrokeDoc> {
  return page.evaluate((sid) => window.__inkroute!.store.getState().project!.strokes[sid], id) as Promise<StrokeDoc>;
}

export interface TraceResult {
  stroke: StrokeDoc;
  /** Pointer move → preview drawn, ms, one per move along the stroke. */
  previewLatency: number[];
  /** Solve time in the engine (store.lastSolveMs), ms. */
  solveMs: number;
  /** Click on the end + Enter → the stroke in the document, ms. */
  finishMs: number;
}

/**
 * Traces a demo stroke with the Follow tool from its true endpoints: click the start,
 * move the pointer along the true centreline (each move waits for its preview to be
 * drawn, which gives the latency), click the end, press Enter.
 */
export async function traceStroke(page: Page, stroke: TruthStroke, moves = 12): Promise<TraceResult> {
  await frameStroke(page, stroke);
  const before = await strokeCount(page);
  const a = stroke.samples[0];
  const b = stroke.samples[stroke.samples.length - 1];
  const sa = await toScreen(page, a);
  const sb = await toScreen(page, b);
  await page.mouse.move(sa.x, sa.y);
  await page.mouse.click(sa.x, sa.y);
  const previewLatency: number[] = [];
  for (let k = 1; k <= moves; k++) {
    const t = stroke.samples[Math.min(stroke.samples.length - 1, Math.round((k / moves) * (stroke.samples.length - 1)))];
    const st = await toScreen(page, t);
    const target = await page.evaluate(([x, y]) => window.__inkroute!.screenToImage(x, y), [st.x, st.y] as const);
    const drawnBefore = await page.evaluate(() => window.__inkroute!.probe.previewDrawnAt);
    await page.mouse.move(st.x, st.y);
    // The preview that ends at this pointer position, drawn after this move.
    const latency = await page.waitForFunction(([tx, ty, since]) => {
      const p = window.__inkroute!.probe;
      const e = p.previewEnd;
      if (p.previewDrawnAt <= since || p.previewDrawnAt < p.lastMoveAt || !e) return false;
      if (Math.hypot(e.x - tx, e.y - ty) > 1.5) return false;
      return p.previewDrawnAt - p.lastMoveAt;
    }, [target.x, target.y, drawnBefore] as const, { timeout: 5000, polling: 5 });
    previewLatency.push((await latency.jsonValue()) as number);
  }
  await page.mouse.click(sb.x, sb.y);
  // Timed in the page: from the Enter key's event to the stroke arriving in the store.
  await page.evaluate(() => {
    const hook = window.__inkroute!;
    const count = () => Object.keys(hook.store.getState().project?.strokes ?? {}).length;
    const n = count();
    let t0 = NaN;
    const w = window as unknown as { __finished?: Promise<number> };
    w.__finished = new Promise<number>((resolve, reject) => {
      window.addEventListener('keydown', (e) => { if (e.key === 'Enter') t0 = e.timeStamp; }, { capture: true, once: true });
      const unsubscribe = hook.store.subscribe(() => {
        if (count() <= n) return;
        unsubscribe();
        resolve(performance.now() - t0);
      });
      setTimeout(() => reject(new Error('no stroke within 10 s of Enter')), 10_000);
    });
  });
  await page.keyboard.press('Enter');
  const finishMs = await page.evaluate(() => (window as unknown as { __finished: Promise<number> }).__finished);
  await expect.poll(() => strokeCount(page)).toBe(before + 1);
  const { id, solveMs } = await page.evaluate(() => {
    const s = window.__inkroute!.store.getState();
    return { id: s.selection[0], solveMs: s.lastSolveMs ?? NaN };
  });
  return { stroke: await strokeById(page, id), previewLatency, solveMs, finishMs };
}

function distanceToPolyline(p: Pt, line: readonly Pt[]): number {
  return distToPolyline(line, p.x, p.y);
}

/** Mean distance of the truth centreline to the traced one, px: over all truth samples, and over visible ink only. */
export function centrelineError(truth: TruthStroke, traced: StrokeDoc): { all: number; visible: number } {
  let all = 0;
  let vis = 0;
  let nVis = 0;
  truth.samples.forEach((p, i) => {
    const d = distanceToPolyline(p, traced.samples);
    all += d;
    if (!truth.gaps.some((g) => i >= g.from && i <= g.to)) {
      vis += d;
      nVis++;
    }
  });
  return { all: all / truth.samples.length, visible: vis / nVis };
}

export { distanceToPolyline };

/** The p-th percentile (0..1), interpolating between order statistics. */
export function percentile(values: readonly number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  if (s.length === 0) return NaN;
  const at = p * (s.length - 1);
  const lo = Math.floor(at);
  const hi = Math.ceil(at);
  return s[lo] + (s[hi] - s[lo]) * (at - lo);
}

export const fmt = (v: number, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : String(v));

/** Waits for the page to have a project open (the demo, a restored or an opened one). */
export async function waitForProject(page: Page): Promise<void> {
  await page.waitForFunction(() => Boolean(window.__inkroute?.store.getState().project));
}

/** The open project as plain JSON. */
export function projectJson(page: Page): Promise<any> {
  return page.evaluate(() => JSON.parse(JSON.stringify(window.__inkroute!.store.getState().project)));
}

/** Frames an image box on the canvas, at a zoom of at most 3. */
export async function frameBox(page: Page, box: [number, number, number, number], margin = 40): Promise<void> {
  await page.evaluate(([x0, y0, x1, y1, m]) => {
    const hook = window.__inkroute!;
    const { width, height } = hook.canvasBox();
    const zoom = Math.min(3, width / (x1 - x0 + 2 * m), height / (y1 - y0 + 2 * m));
    hook.store.getState().setView({ zoom, panX: width / 2 - ((x0 + x1) / 2) * zoom, panY: height / 2 - ((y0 + y1) / 2) * zoom });
  }, [...box, margin] as const);
}

/** A point on a traced stroke far from every other traced stroke: a click there picks that stroke alone. */
export function clickPoint(stroke: StrokeDoc, others: StrokeDoc[]): Pt {
  const s = stroke.samples;
  let best = s[Math.floor(s.length / 2)];
  let bestD = -1;
  for (let i = Math.floor(s.length * 0.15); i < Math.ceil(s.length * 0.85); i++) {
    let d = Infinity;
    for (const o of others) for (const q of o.samples) d = Math.min(d, Math.hypot(q.x - s[i].x, q.y - s[i].y) - q.r);
    if (d > bestD) {
      bestD = d;
      best = s[i];
    }
  }
  return { x: best.x, y: best.y };
}

/** Clicks an image point on the canvas, with Shift held when `shift`. */
export async function clickImage(page: Page, p: Pt, shift = false): Promise<void> {
  const s = await toScreen(page, p);
  if (shift) await page.keyboard.down('Shift');
  await page.mouse.click(s.x, s.y);
  if (shift) await page.keyboard.up('Shift');
}
