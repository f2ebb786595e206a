/**
 * Calibrate and Letter in a real Chromium, as a person does it: drag along the demo's
 * ruler from its true ends and type its length (the scale must match the demo's true
 * scale within 1 %), then trace the strokes of three demo letters, make each a letter
 * (click + Shift+click + Enter, the "Make letter" button, a box), label them from the
 * palette and by typing, mark one doubtful, and read the transcription with its dot below.
 * Undo and redo of making a letter. The figures are printed.
 */
import { expect, test, type Page } from '@playwright/test';
import {
  clickImage, clickPoint, fmt, frameBox, openEditor, toScreen, traceStroke, truthStroke, watchErrors, type StrokeDoc, type Truth,
} from './helpers.ts';

/** Three neighbouring letters of the demo's first line, two strokes each. */
const LETTERS = ['L1.2', 'L1.3', 'L1.4'];

function historyLength(page: Page): Promise<number> {
  return page.evaluate(() => window.__inkroute!.store.temporal.getState().pastStates.length);
}

function letterCount(page: Page): Promise<number> {
  return page.evaluate(() => Object.keys(window.__inkroute!.store.getState().project!.letters).length);
}

test('Calibrate along the demo ruler: the scale matches the true scale within 1 %, bad input changes nothing', async ({ page }) => {
  const errors = watchErrors(page);
  const truth: Truth = await openEditor(page);
  // The demo opens with its scale given: take it away, so the ruler is what sets it.
  await page.evaluate(() => window.__inkroute!.store.getState().change((p) => ({ ...p, surfaces: p.surfaces.map((s) => ({ ...s, pxPerMm: undefined })) })));
  const status = page.getByRole('contentinfo', { name: 'Status' });
  await expect(status).toContainText('scale not calibrated');

  await page.getByRole('button', { name: 'Calibrate', exact: true }).click();
  await expect(page.getByRole('button', { name: 'Calibrate', exact: true })).toHaveAttribute('aria-pressed', 'true');
  const r = truth.ruler;
  await frameBox(page, [r.x0, r.y0 - 20, r.x1, r.y1 + 20]);
  const a = await toScreen(page, { x: r.x0, y: r.y0 });
  const b = await toScreen(page, { x: r.x1, y: r.y1 });
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  for (let k = 1; k <= 10; k++) await page.mouse.move(a.x + ((b.x - a.x) * k) / 10, a.y + ((b.y - a.y) * k) / 10);
  await expect.poll(() => page.evaluate(() => window.__inkroute!.store.getState().toolPath)).toBe('calibrate.dragging');
  await page.mouse.up();

  const form = page.getByRole('form', { name: 'Ruler length' });
  await expect(form).toBeVisible();
  const truePx = Math.hypot(r.x1 - r.x0, r.y1 - r.y0);
  // The form shows the line's length in px.
  const shownPx = Number(/Line ([\d.]+) px/.exec((await form.textContent()) ?? '')?.[1]);
  expect(Math.abs(shownPx - truePx)).toBeLessThan(2);
  const history = await historyLength(page);
  const field = page.getByLabel('Ruler length (mm)');
  for (const [bad, says] of [['abc', /not a number/], ['0', /more than 0 mm/], ['-5', /more than 0 mm/]] as const) {
    await field.fill(bad);
    await page.getByRole('button', { name: 'Set scale' }).click();
    await expect(page.getByRole('alert')).toContainText(says);
    await page.getByRole('button', { name: 'Dismiss the message' }).click();
    expect(await page.evaluate(() => window.__inkroute!.store.getState().project!.surfaces[0].pxPerMm)).toBeUndefined();
  }
  expect(await historyLength(page)).toBe(history);
  await field.fill(String(r.mm));
  await page.getByRole('button', { name: 'Set scale' }).click();
  await expect(form).toBeHidden();

  const surface = await page.evaluate(() => window.__inkroute!.store.getState().project!.surfaces[0]);
  const err = Math.abs(surface.pxPerMm! - truth.pxPerMm) / truth.pxPerMm;
  console.log(`calibrate: drawn ${fmt(Math.hypot(surface.scaleSource!.kind === 'ruler' ? surface.scaleSource!.x1 - surface.scaleSource!.x0 : NaN,
    surface.scaleSource!.kind === 'ruler' ? surface.scaleSource!.y1 - surface.scaleSource!.y0 : NaN), 2)} px (true ${fmt(truePx, 2)} px) along ${r.mm} mm → `
    + `${fmt(surface.pxPerMm!, 3)} px/mm, true ${fmt(truth.pxPerMm, 3)} px/mm, error ${fmt(100 * err, 3)} %`);
  expect(err).toBeLessThan(0.01);
  expect(surface.scaleSource).toMatchObject({ kind: 'ruler', mm: r.mm });
  expect(await historyLength(page)).toBe(history + 1);
  await expect(status).toContainText(`scale ${surface.pxPerMm!.toFixed(1)} px/mm`);
  await expect(status).toContainText('from a ruler');
  // Figures are in mm from now on: the cursor readout, for one.
  await page.mouse.move(a.x + 40, a.y - 40);
  await expect(status).toContainText(/cursor [\d.]+, [\d.]+ mm/);

  // Esc drops a second line before its length is typed.
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  await page.mouse.move(b.x, b.y - 30, { steps: 4 });
  await page.mouse.up();
  await expect(form).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(form).toBeHidden();
  expect(await page.evaluate(() => window.__inkroute!.store.getState().project!.surfaces[0].pxPerMm)).toBe(surface.pxPerMm);
  expect(errors).toEqual([]);
});

test('Letter: three demo letters by click, Shift+click, button and box; labels, a doubtful reading, the transcription; undo and redo', async ({ page }) => {
  test.setTimeout(150_000);
  const errors = watchErrors(page);
  const truth: Truth = await openEditor(page);
  const letters = LETTERS.map((id) => truth.letters.find((l) => l.id === id)!);

  // The inscription's script and direction first: the palette follows the script.
  await page.getByRole('combobox', { name: 'Script', exact: true }).selectOption('Phoenician');
  await page.getByRole('combobox', { name: 'Reading direction' }).selectOption('rtl');
  const inscription = await page.evaluate(() => window.__inkroute!.store.getState().project!.inscription);
  expect(inscription).toMatchObject({ script: 'Phoenician', direction: 'rtl' });

  // Trace every stroke of the three letters with Follow.
  const traced = new Map<string, StrokeDoc>();
  const t0 = Date.now();
  for (const l of letters) for (const sid of l.strokeIds) traced.set(sid, (await traceStroke(page, truthStroke(truth, sid))).stroke);
  console.log(`traced ${traced.size} strokes in ${fmt((Date.now() - t0) / 1000)} s`);
  const all = [...traced.values()];
  const idsOf = (l: (typeof letters)[number]) => l.strokeIds.map((sid) => traced.get(sid)!.id);
  const pointOf = (sid: string) => clickPoint(traced.get(sid)!, all.filter((s) => s !== traced.get(sid)));

  await page.getByRole('button', { name: 'Letter', exact: true }).click();
  const x0 = Math.min(...letters.map((l) => l.box[0]));
  const x1 = Math.max(...letters.map((l) => l.box[2]));
  const y0 = Math.min(...letters.map((l) => l.box[1]));
  const y1 = Math.max(...letters.map((l) => l.box[3]));
  await frameBox(page, [x0, y0, x1, y1]);
  const selection = () => page.evaluate(() => window.__inkroute!.store.getState().selection);

  // 1: click + Shift+click, Enter.
  const [first, second, third] = letters;
  await clickImage(page, pointOf(first.strokeIds[0]));
  await clickImage(page, pointOf(first.strokeIds[1]), true);
  expect((await selection()).sort()).toEqual(idsOf(first).sort());
  let history = await historyLength(page);
  await page.keyboard.press('Enter');
  await expect.poll(() => letterCount(page)).toBe(1);
  expect(await historyLength(page)).toBe(history + 1);
  // Labelled from the palette of the script.
  await page.getByRole('button', { name: 'Label 𐤀 (U+10900)' }).click();

  // 2: click + Shift+click, the "Make letter" button; labelled by typing, marked doubtful.
  await clickImage(page, pointOf(second.strokeIds[0]));
  await clickImage(page, pointOf(second.strokeIds[1]), true);
  expect((await selection()).sort()).toEqual(idsOf(second).sort());
  await page.getByRole('button', { name: 'Make letter' }).click();
  await expect.poll(() => letterCount(page)).toBe(2);
  const label = page.getByRole('textbox', { name: 'Label', exact: true });
  await label.fill('𐤁');
  await label.press('Enter');
  await page.getByRole('checkbox', { name: 'Doubtful' }).check();

  // 3: a box dragged around the letter takes its strokes and no other.
  const bx = third.box;
  const p0 = await toScreen(page, { x: bx[0] - 12, y: bx[1] - 12 });
  const p1 = await toScreen(page, { x: bx[2] + 12, y: bx[3] + 12 });
  await page.mouse.move(p0.x, p0.y);
  await page.mouse.down();
  await page.mouse.move(p1.x, p1.y, { steps: 8 });
  await page.mouse.up();
  expect((await selection()).sort()).toEqual(idsOf(third).sort());
  history = await historyLength(page);
  await page.keyboard.press('Enter');
  await expect.poll(() => letterCount(page)).toBe(3);
  expect(await historyLength(page)).toBe(history + 1);

  // Undo and redo of making it: one step each way.
  await page.keyboard.press('Control+z');
  await expect.poll(() => letterCount(page)).toBe(2);
  expect(await historyLength(page)).toBe(history);
  await page.keyboard.press('Control+Shift+z');
  await expect.poll(() => letterCount(page)).toBe(3);
  expect(await historyLength(page)).toBe(history + 1);

  // Select it in the list and label it from the palette.
  const thirdId = await page.evaluate((ids) => Object.values(window.__inkroute!.store.getState().project!.letters)
    .find((l) => l.strokeIds.includes(ids[0]))!.id, idsOf(third));
  await page.locator(`li[data-letter-id="${thirdId}"] button`).click();
  await page.getByRole('button', { name: 'Label 𐤂 (U+10902)' }).click();

  // The layout's reading order is the demo's true order (right to left along line 1).
  const placed = await page.evaluate(() => Object.values(window.__inkroute!.store.getState().project!.letters)
    .map((l) => ({ strokeIds: l.strokeIds, line: l.line, order: l.order, label: l.label, reading: l.reading })));
  for (const [k, l] of letters.entries()) {
    const got = placed.find((p) => p.strokeIds.includes(traced.get(l.strokeIds[0])!.id))!;
    expect({ line: got.line, order: got.order }).toEqual({ line: 1, order: k + 1 });
  }
  // Leiden conventions: the doubtful letter carries a combining dot below (U+0323).
  const expected = '𐤀𐤁\u0323𐤂';
  const line = page.locator('.transcription .transcription-line');
  await expect(line).toHaveCount(1);
  await expect(line.locator('.line-number')).toHaveText('1');
  await expect(line.locator('.line-text')).toHaveText(expected);
  await expect(page.getByText('A transcription is a reading: doubtful letters carry a dot below, restored ones stand in brackets.')).toBeVisible();
  console.log(`letters: ${placed.map((p) => `${p.line}.${p.order} ${p.label} ${p.reading}`).join(', ')}; transcription "${expected}"`);
  await page.locator('.workspace').screenshot({ path: 'test-results/e2e/letters.png' });
  expect(errors).toEqual([]);
});

test('a label typed without Enter is kept when the selection moves to another letter', async ({ page }) => {
  const errors = watchErrors(page);
  await openEditor(page);
  await page.getByRole('button', { name: 'Open finished example' }).click();
  await expect.poll(() => letterCount(page)).toBeGreaterThan(2);
  await page.keyboard.press('l');
  const [a, b] = await page.evaluate(() => Object.keys(window.__inkroute!.store.getState().project!.letters).slice(0, 2));
  await page.evaluate((id) => window.__inkroute!.store.getState().selectLetters([id]), a);
  const label = page.getByRole('textbox', { name: 'Label', exact: true });
  await label.fill('zz');
  // The selection moves by the store (as a click on the photo does): the field is replaced, no blur.
  await page.evaluate((id) => window.__inkroute!.store.getState().selectLetters([id]), b);
  await expect.poll(() => page.evaluate((id) => window.__inkroute!.store.getState().project!.letters[id].label, a)).toBe('zz');
  expect(await page.evaluate((id) => window.__inkroute!.store.getState().project!.letters[id].label, b)).not.toBe('zz');
  expect(errors).toEqual([]);
});
