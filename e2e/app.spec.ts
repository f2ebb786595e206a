/**
 * The editor in a real Chromium, click by click: open on the demo, trace strokes from
 * their true endpoints with Follow, see a restored span drawn as such, and a Refine drag
 * with undo and redo. The figures are printed. (Speed figures: e2e/bench/, npm run bench:e2e.)
 */
import { expect, test, type Page } from '@playwright/test';
import {
  centrelineError, distanceToPolyline, fmt, frameStroke, openEditor, strokeById, toScreen, traceStroke,
  truthStroke, watchErrors, type TraceResult,
} from './helpers.ts';

/** Demo strokes whose ends lie well apart; L2.6-s1, L1.5-s1 and L2.1-s1 cross abrasion gaps. */
const ACCURACY_STROKES = ['L1.2-s1', 'L2.6-s1', 'L1.5-s1', 'L3.8-s1', 'L2.1-s1', 'L3.7-s1'];
/** The stroke whose gap is checked on the canvas, and the gap's truth samples. */
const GAP_STROKE = 'L1.5-s1';

test('opens on the demo inscription with no console errors', async ({ page }) => {
  const errors = watchErrors(page);
  const truth = await openEditor(page);
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(truth.title);
  await expect(page.getByText(`scale ${truth.pxPerMm.toFixed(1)} px/mm`)).toBeVisible();
  await expect(page.getByRole('note')).toContainText('A facsimile is an interpretation');
  for (const name of ['Follow', 'Refine', 'Calibrate', 'Letter', 'Export']) await expect(page.getByRole('button', { name, exact: true })).toBeEnabled();
  for (const name of ['Surfaces', 'Teach ink', 'Suggest']) {
    const b = page.getByRole('button', { name, exact: true });
    await expect(b).toBeDisabled();
    await expect(b).toHaveAttribute('title', 'comes later');
  }
  await expect(page.getByRole('button', { name: 'Follow', exact: true })).toHaveAttribute('aria-pressed', 'true');
  expect(errors).toEqual([]);
});

/** Reads pixels of one canvas layer around a point given in image px: max alpha and the count of slate-ish pixels. */
async function layerPixels(page: Page, layer: string, at: { x: number; y: number }, radius: number) {
  const s = await toScreen(page, at);
  return page.evaluate(([name, sx, sy, rad]) => {
    const c = document.querySelector<HTMLCanvasElement>(`canvas[data-layer="${name}"]`)!;
    const box = c.getBoundingClientRect();
    const k = c.width / box.width;
    const x0 = Math.round((sx - box.left - rad) * k);
    const y0 = Math.round((sy - box.top - rad) * k);
    const n = Math.max(1, Math.round(2 * rad * k));
    const d = c.getContext('2d')!.getImageData(x0, y0, n, n).data;
    let maxAlpha = 0;
    let slate = 0;
    let dark = 0;
    let at70 = 0;
    for (let i = 0; i < d.length; i += 4) {
      maxAlpha = Math.max(maxAlpha, d[i + 3]);
      // The restored colour #6b7280 (premultiplied edges make the dashes a little lighter or darker).
      if (d[i + 3] > 100 && Math.abs(d[i] - 0x6b) < 30 && Math.abs(d[i + 1] - 0x72) < 30 && Math.abs(d[i + 2] - 0x80) < 30) slate++;
      if (d[i + 3] > 100 && d[i] < 60 && d[i + 1] < 60 && d[i + 2] < 60) dark++;
      // Ink is drawn at 70 %: alpha 0.7 × 255.
      if (Math.abs(d[i + 3] - 0.7 * 255) <= 3) at70++;
    }
    return { maxAlpha, slate, dark, at70, pixels: n * n };
  }, [layer, s.x, s.y, radius] as const);
}

test('traces demo strokes from their true endpoints within 1 px, and marks a restored span across a gap', async ({ page }) => {
  test.setTimeout(120_000);
  const errors = watchErrors(page);
  const truth = await openEditor(page);
  const lines: string[] = [];
  const traced = new Map<string, TraceResult>();
  for (const id of ACCURACY_STROKES) {
    const t = truthStroke(truth, id);
    const r = await traceStroke(page, t, 4);
    traced.set(id, r);
    const err = centrelineError(t, r.stroke);
    lines.push(`  ${id.padEnd(8)} mean ${fmt(err.all, 2)} px (visible ink ${fmt(err.visible, 2)} px), ${r.stroke.samples.length} samples, restored spans ${r.stroke.restoredSpans.length}`);
    expect(err.all, `${id}: mean centreline error`).toBeLessThanOrEqual(1);
  }
  console.log(`accuracy per traced stroke (truth centreline to traced centreline):\n${lines.join('\n')}`);

  // The gap stroke has an abrasion gap: the trace marks it as restored.
  const gapTruth = truthStroke(truth, GAP_STROKE);
  const gapTrace = traced.get(GAP_STROKE)!.stroke;
  expect(gapTruth.gaps.length).toBeGreaterThan(0);
  expect(gapTrace.restoredSpans.length).toBeGreaterThan(0);
  const gap = gapTruth.gaps[0];
  const mid = gapTruth.samples[Math.round((gap.from + gap.to) / 2)];
  const restoredIdx = gapTrace.restoredSpans.flatMap((s) => Array.from({ length: s.to - s.from + 1 }, (_, i) => s.from + i));
  const nearest = gapTrace.samples.reduce((best, p, i) => (Math.hypot(p.x - mid.x, p.y - mid.y) < Math.hypot(gapTrace.samples[best].x - mid.x, gapTrace.samples[best].y - mid.y) ? i : best), 0);
  expect(restoredIdx).toContain(nearest);

  // On the canvas: no selection ring in the way, the gap framed.
  await page.evaluate(() => window.__inkroute!.store.getState().select([]));
  await frameStroke(page, gapTruth);
  await page.waitForTimeout(100);
  const at = gapTrace.samples[nearest];
  const zoom = await page.evaluate(() => window.__inkroute!.store.getState().zoom);
  // Inside the pen in the gap: nothing in the strokes layer (no black fill) …
  const inside = await layerPixels(page, 'strokes', at, Math.max(1, at.r * zoom * 0.6));
  expect(inside.maxAlpha).toBe(0);
  // … and the dashed slate outline around it, on the same layer.
  const around = await layerPixels(page, 'strokes', at, (at.r + 2) * zoom + 2);
  expect(around.slate).toBeGreaterThan(3);
  // On visible ink of the same stroke the strokes layer is ink black at 70 %, evenly.
  const inked = gapTrace.samples[5];
  const ink = await layerPixels(page, 'strokes', inked, Math.max(1, inked.r * zoom * 0.5));
  expect(ink.dark).toBe(ink.pixels);
  expect(ink.at70).toBe(ink.pixels);
  console.log(`restored span in the gap of ${GAP_STROKE}: strokes-layer alpha ${inside.maxAlpha} inside the pen, ${around.slate} slate outline px around it`);
  await page.screenshot({ path: 'test-results/e2e/restored-span.png' });
  expect(errors).toEqual([]);
});

test('Refine: dragging an anchor re-solves the stroke through it; undo restores it exactly, redo reapplies', async ({ page }) => {
  test.setTimeout(120_000);
  const errors = watchErrors(page);
  const truth = await openEditor(page);
  const t = truthStroke(truth, 'L3.8-s1');
  const { stroke: before } = await traceStroke(page, t, 3);

  await page.keyboard.press('r');
  await expect.poll(() => page.evaluate(() => window.__inkroute!.store.getState().toolPath)).toBe('refine.idle');
  // Drag the end anchor back along the stroke by about 25 px of arc, onto the true centreline.
  const end = before.anchors[before.anchors.length - 1];
  const target = t.samples[t.samples.length - 1 - 50];
  const s0 = await toScreen(page, end);
  const s1 = await toScreen(page, target);
  await page.mouse.move(s0.x, s0.y);
  await page.mouse.down();
  for (let k = 1; k <= 10; k++) {
    await page.mouse.move(s0.x + ((s1.x - s0.x) * k) / 10, s0.y + ((s1.y - s0.y) * k) / 10);
    await page.waitForTimeout(30);
  }
  await page.mouse.up();
  await expect.poll(() => page.evaluate(() => window.__inkroute!.store.getState().toolPath), { timeout: 10_000 }).toBe('refine.idle');
  const after = await strokeById(page, before.id);
  const moved = after.anchors[after.anchors.length - 1];
  const dropped = await page.evaluate(([x, y]) => window.__inkroute!.screenToImage(x, y), [s1.x, s1.y] as const);
  expect(Math.hypot(moved.x - dropped.x, moved.y - dropped.y)).toBeLessThan(0.01);
  const miss = distanceToPolyline(moved, after.samples);
  console.log(`Refine: end anchor dragged ${fmt(Math.hypot(moved.x - end.x, moved.y - end.y))} px; the re-solved stroke passes ${fmt(miss, 3)} px from it`);
  expect(miss).toBeLessThanOrEqual(1);
  expect(after.samples).not.toEqual(before.samples);

  await page.keyboard.press('Control+z');
  await expect.poll(() => strokeById(page, before.id)).toEqual(before);
  await page.keyboard.press('Control+Shift+z');
  await expect.poll(() => strokeById(page, before.id)).toEqual(after);
  expect(errors).toEqual([]);
});

test('Details: pin the pen radius at an anchor and free it; mark a span restored, then inked, by hand; each one undo step', async ({ page }) => {
  test.setTimeout(120_000);
  const errors = watchErrors(page);
  const truth = await openEditor(page);
  // A stroke across an abrasion gap: its measured restored span is what the marks override.
  const { stroke: traced } = await traceStroke(page, truthStroke(truth, 'L2.6-s1'), 3);
  const details = page.getByRole('complementary', { name: 'Details' });
  const solvedStartR = traced.samples[0].r;
  await expect(details.getByText(`radius free (${solvedStartR.toFixed(1)} px)`).first()).toBeVisible();

  // Pin at the current width: the anchor holds the solved radius and the re-solve keeps it.
  await details.getByRole('button', { name: 'Pin radius at start' }).click();
  await expect.poll(async () => (await strokeById(page, traced.id)).anchors[0].r).toBeCloseTo(solvedStartR, 9);
  // Type a new width: the stroke is re-solved with the pen held at exactly that radius there.
  const field = details.getByRole('spinbutton', { name: 'Pinned radius at start, px' });
  await field.fill('3.5');
  await field.press('Enter');
  await expect.poll(async () => (await strokeById(page, traced.id)).anchors[0].r).toBe(3.5);
  const pinned = await strokeById(page, traced.id);
  expect(pinned.samples[0].r).toBeCloseTo(3.5, 6);
  console.log(`Details: start radius solved ${fmt(solvedStartR)} px, pinned at 3.5 px → sample 0 radius ${fmt(pinned.samples[0].r, 3)} px`);
  await details.getByRole('button', { name: 'Free' }).click();
  await expect.poll(async () => (await strokeById(page, traced.id)).anchors[0].r).toBeUndefined();
  // Undo keys go to the editor, not to a focused field.
  const unfocus = () => page.locator('#details-heading').click();
  await unfocus();
  await page.keyboard.press('Control+z');
  await expect.poll(() => strokeById(page, traced.id)).toEqual(pinned);

  // The whole stroke marked restored by hand, then inked by hand.
  const span = details.getByRole('combobox', { name: 'Span start – end' });
  await expect(span).toHaveValue('measured');
  const measuredSpans = pinned.restoredSpans.length;
  expect(measuredSpans).toBeGreaterThan(0);
  await span.selectOption('restored');
  await expect(details.getByText('100 % restored')).toBeVisible();
  await expect(details.getByText(/overridden as restored/)).toBeVisible();
  await details.screenshot({ path: 'test-results/e2e/details-marks.png' });
  const last = pinned.samples.length - 1;
  expect((await strokeById(page, traced.id)).overrides).toEqual([{ from: 0, to: last, kind: 'restored' }]);
  await span.selectOption('inked');
  await expect(details.getByText('0 % restored')).toBeVisible();
  await unfocus();
  await page.keyboard.press('Control+z');
  await expect(span).toHaveValue('restored');
  await details.getByRole('button', { name: `Remove the mark on samples 0–${last}` }).click();
  await expect(span).toHaveValue('measured');
  expect(await strokeById(page, traced.id)).toEqual(pinned);
  expect(errors).toEqual([]);
});
