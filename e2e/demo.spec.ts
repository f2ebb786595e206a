import { expect, test, type Page } from '@playwright/test';

/** Collects console errors and uncaught page errors from the moment the page opens. */
function watchErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() === 'error') errors.push(msg.text());
  });
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}

/** Pixel statistics of the canvas, read back from its backing store. */
async function canvasStats(page: Page) {
  return page.locator('canvas').evaluate((el: HTMLCanvasElement) => {
    const ctx = el.getContext('2d');
    if (!ctx) throw new Error('no 2d context');
    const { data } = ctx.getImageData(0, 0, el.width, el.height);
    let dark = 0, amber = 0, min = 255, max = 0;
    const n = data.length / 4;
    for (let i = 0; i < data.length; i += 4) {
      const r = data[i], g = data[i + 1], b = data[i + 2];
      const luma = 0.299 * r + 0.587 * g + 0.114 * b;
      if (luma < min) min = luma;
      if (luma > max) max = luma;
      if (luma < 90) dark++;
      // The overlay colour #e0a030: red high, green mid, blue low.
      if (r > 180 && g > 120 && g < 190 && b < 90) amber++;
    }
    return { width: el.width, height: el.height, pixels: n, dark, amber, min, max };
  });
}

test('the demo inscription loads with its title, scale and the interpretation note', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await expect(page.locator('canvas[data-state="ready"]')).toBeVisible();

  await expect(page.locator('.product')).toHaveText('inkroute');
  const truth = await (await page.request.get('/demo/truth.json')).json();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(truth.title);
  await expect(page.getByText(`scale ${truth.pxPerMm.toFixed(1)} px/mm`)).toBeVisible();
  const note = page.getByRole('note');
  await expect(note).toBeVisible();
  await expect(note).toContainText('A facsimile is an interpretation');
  await expect(note).toContainText('restored spans');

  const stats = await canvasStats(page);
  expect(stats.width).toBeGreaterThan(100);
  expect(stats.height).toBeGreaterThan(100);
  // Not blank: a real spread of tones, and some dark ink.
  expect(stats.max - stats.min).toBeGreaterThan(60);
  expect(stats.dark).toBeGreaterThan(stats.pixels * 0.001);
  expect(stats.dark).toBeLessThan(stats.pixels * 0.5);
  expect(stats.amber).toBe(0);
  expect(errors).toEqual([]);
});

test('the toggle draws the true centrelines in amber and removes them again', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await expect(page.locator('canvas[data-state="ready"]')).toBeVisible();
  const toggle = page.getByLabel('Show true centrelines');

  await toggle.check();
  await expect.poll(async () => (await canvasStats(page)).amber).toBeGreaterThan(200);
  await toggle.uncheck();
  await expect.poll(async () => (await canvasStats(page)).amber).toBe(0);
  expect(errors).toEqual([]);
});
