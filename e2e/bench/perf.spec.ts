/**
 * The canvas under load: a 24-megapixel surface (6000 × 4000, drawn in the page) with
 * 1,000 strokes, panned and zoomed through the canvas's own wheel and pointer handlers,
 * one input per animation frame. Frame time is the interval between animation frames,
 * measured in the page; the layers' own draw time is printed beside it.
 */
import { expect, test, type Page } from '@playwright/test';
import { fmt, openEditor, percentile, watchErrors } from '../helpers.ts';

interface Run {
  frames: number[];
  draws: number[];
}

type Motion = 'zoom' | 'pan';

/** Drives `frames` frames of zooming (in, then out, at the canvas centre) or of middle-button panning. */
function drive(page: Page, motion: Motion, frames: number): Promise<Run> {
  return page.evaluate(([kind, count]) => new Promise<Run>((resolve) => {
    const el = document.querySelector<HTMLElement>('.canvas')!;
    const box = el.getBoundingClientRect();
    const cx = box.left + box.width / 2;
    const cy = box.top + box.height / 2;
    const probe = window.__inkroute!.probe;
    const out: Run = { frames: [], draws: [] };
    const drawSum = () => Object.values(probe.drawMs).reduce((a, b) => a + b, 0);
    let last = 0;
    let i = 0;
    const pointer = (type: string, x: number, buttons: number) => el.dispatchEvent(new PointerEvent(type, {
      bubbles: true, cancelable: true, pointerId: 7, pointerType: 'mouse', button: type === 'pointermove' ? -1 : 1, buttons, clientX: x, clientY: cy,
    }));
    if (kind === 'pan') pointer('pointerdown', cx, 4);
    const step = (t: number) => {
      if (last) {
        out.frames.push(t - last);
        out.draws.push(drawSum());
      }
      last = t;
      if (i >= count) {
        if (kind === 'pan') pointer('pointerup', cx, 0);
        resolve(out);
        return;
      }
      if (kind === 'zoom') {
        el.dispatchEvent(new WheelEvent('wheel', { bubbles: true, cancelable: true, deltaY: i < count / 2 ? -40 : 40, clientX: cx, clientY: cy }));
      } else {
        // Across and back, 12 px a frame.
        const k = i < count / 2 ? i : count - i;
        pointer('pointermove', cx + 12 * k, 4);
      }
      i++;
      requestAnimationFrame(step);
    };
    requestAnimationFrame(step);
  }), [motion, frames] as const);
}

// Playwright's trace records the page while it runs, which would show in the frame times.
test.use({ trace: 'off' });

function summary(name: string, r: Run): string {
  return `${name.padEnd(34)} frames ${r.frames.length}: p50 ${fmt(percentile(r.frames, 0.5))} ms, p95 ${fmt(percentile(r.frames, 0.95))} ms, max ${fmt(Math.max(...r.frames))} ms; layers' draw p95 ${fmt(percentile(r.draws, 0.95))} ms`;
}

test('1,000 strokes on a 24 MP surface pan and zoom with frame time p95 ≤ 20 ms', async ({ page }) => {
  test.setTimeout(180_000);
  const errors = watchErrors(page);
  await openEditor(page);
  const made = await page.evaluate(() => window.__inkroute!.loadSynthetic({ width: 6000, height: 4000, strokes: 1000, seed: 7 }));
  expect(made.strokes).toBe(1000);
  await expect(page.locator('.canvas[data-state="ready"]')).toBeVisible({ timeout: 30_000 });
  expect(await page.evaluate(() => Object.keys(window.__inkroute!.store.getState().project!.strokes).length)).toBe(1000);
  // Let the start-up work settle (the autosave of the new project among it).
  await page.waitForTimeout(3000);

  // A first zoom sweep builds each stroke's paths at each level of detail once.
  const first = await drive(page, 'zoom', 120);
  const zoom = await drive(page, 'zoom', 120);
  const fitPan = await drive(page, 'pan', 120);
  await page.evaluate(() => {
    const s = window.__inkroute!.store.getState();
    const { width, height } = window.__inkroute!.canvasBox();
    s.setView({ zoom: 0.5, panX: width / 2 - 3000 * 0.5, panY: height / 2 - 2000 * 0.5 });
  });
  await page.waitForTimeout(200);
  const halfPan = await drive(page, 'pan', 120);
  const lines = [
    `24 MP surface (6000×4000), ${made.strokes} strokes, ${made.samples} samples; canvas ${JSON.stringify(await page.evaluate(() => window.__inkroute!.canvasBox()))}`,
    summary('zoom, first sweep (paths built)', first),
    summary('zoom in ×36 and out again', zoom),
    summary('pan at fit (every stroke on screen)', fitPan),
    summary('pan at 50 %', halfPan),
  ];
  console.log(lines.join('\n'));
  await page.screenshot({ path: 'test-results/e2e/perf-24mp.png' });
  for (const r of [zoom, fitPan, halfPan]) expect(percentile(r.frames, 0.95)).toBeLessThanOrEqual(20);
  expect(errors).toEqual([]);
});
