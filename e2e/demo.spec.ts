import { expect, test, type Page } from '@playwright/test';
import { openEditor, watchErrors } from './helpers.ts';

/** Pixel statistics of one canvas layer, read back from its backing store. */
async function layerStats(page: Page, layer: string) {
  return page.locator(`canvas[data-layer="${layer}"]`).evaluate((el: HTMLCanvasElement) => {
    const ctx = el.getContext('2d');
    if (!ctx) throw new Error('no 2d context');
    const { data } = ctx.getImageData(0, 0, el.width, el.height);
    let dark = 0, amber = 0, opaque = 0, min = 255, max = 0;
    const n = data.length / 4;
    for (let i = 0; i < data.length; i += 4) {
      const r = data[i], g = data[i + 1], b = data[i + 2], a = data[i + 3];
      if (a < 250) continue;
      opaque++;
      const luma = 0.299 * r + 0.587 * g + 0.114 * b;
      if (luma < min) min = luma;
      if (luma > max) max = luma;
      if (luma < 90) dark++;
    }
    // The overlay: amber #e0a030 wherever its alpha (the evidence) is high.
    for (let i = 0; i < data.length; i += 4) {
      if (data[i + 3] > 128 && Math.abs(data[i] - 0xe0) < 12 && Math.abs(data[i + 1] - 0xa0) < 12 && Math.abs(data[i + 2] - 0x30) < 12) amber++;
    }
    return { width: el.width, height: el.height, pixels: n, opaque, dark, amber, min, max };
  });
}

test('the demo inscription opens with its title, scale, the interpretation note and the photo', async ({ page }) => {
  const errors = watchErrors(page);
  const truth = await openEditor(page);
  await expect(page.locator('.product')).toHaveText('inkroute');
  await expect(page.getByRole('heading', { level: 1 })).toHaveText(truth.title);
  await expect(page.getByText(`scale ${truth.pxPerMm.toFixed(1)} px/mm`)).toBeVisible();
  const note = page.getByRole('note');
  await expect(note).toBeVisible();
  await expect(note).toContainText('A facsimile is an interpretation');
  await expect(note).toContainText('restored spans');

  const photo = await layerStats(page, 'photo');
  expect(photo.width).toBeGreaterThan(100);
  expect(photo.height).toBeGreaterThan(100);
  // Not blank: a real spread of tones, and some dark ink.
  expect(photo.opaque).toBeGreaterThan(photo.pixels * 0.2);
  expect(photo.max - photo.min).toBeGreaterThan(60);
  expect(photo.dark).toBeGreaterThan(photo.opaque * 0.001);
  expect(photo.dark).toBeLessThan(photo.opaque * 0.5);
  await expect(page.locator('canvas[data-layer="overlay"]')).toBeHidden();
  expect(errors).toEqual([]);
});

test('the ink evidence overlay shows in amber at the chosen opacity, and goes again', async ({ page }) => {
  const errors = watchErrors(page);
  await openEditor(page);
  const toggle = page.getByLabel('Ink evidence', { exact: true });
  await toggle.check();
  const overlay = page.locator('canvas[data-layer="overlay"]');
  await expect(overlay).toBeVisible();
  await expect.poll(async () => (await layerStats(page, 'overlay')).amber, { timeout: 10_000 }).toBeGreaterThan(200);
  await page.getByLabel('Ink evidence opacity').fill('0.8');
  await expect(overlay).toHaveCSS('opacity', '0.8');
  await toggle.uncheck();
  await expect(overlay).toBeHidden();
  expect(errors).toEqual([]);
});
