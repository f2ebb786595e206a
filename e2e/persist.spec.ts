import { expect, test, type Page } from '@playwright/test';
import { projectJson, waitForProject, watchErrors } from './helpers.ts';

/**
 * Saving and opening, in a real browser: a project file round-trips stroke for stroke,
 * unsaved work survives a reload through the restore offer, and a bad file leaves the open
 * project alone. Strokes are put into the store through the page's test hook
 * (window.__inkroute), so these tests do not depend on the solver's output.
 */

/** What the spec reads of the test hook; the page's store is a zustand store. */
type Hook = {
  store: {
    getState(): {
      project: Record<string, any> | undefined;
      change(fn: (p: any) => any): void;
    };
  };
};

/**
 * Adds `count` strokes to the first surface, straight into the store (one change), with
 * sample values that no rounding would leave alone. Returns their ids.
 */
async function addStrokes(page: Page, count: number, seed: number): Promise<string[]> {
  return page.evaluate(({ count, seed }) => {
    const { store } = (window as unknown as { __inkroute: Hook }).__inkroute;
    const ids: string[] = [];
    store.getState().change((p: any) => {
      const surface = p.surfaces[0];
      const strokes = { ...p.strokes };
      const order = [...surface.strokeOrder];
      for (let k = 0; k < count; k++) {
        const id = `e2e-${seed}-${k}`;
        const samples = Array.from({ length: 40 + k }, (_, i) => ({
          x: 100 + 37 * k + i * 0.731 + Math.sin(i + seed) / 3,
          y: 200 + 11 * k + i * 0.377 + 1 / 7,
          r: 2 + Math.cos(i / 5 + seed) / 2,
          support: (i % 9) / 8,
        }));
        strokes[id] = {
          id, surfaceId: surface.id,
          anchors: [{ x: samples[0].x, y: samples[0].y }, { x: samples.at(-1)!.x, y: samples.at(-1)!.y, r: 2.25 }],
          samples,
          restoredSpans: [{ from: 5, to: 9 }],
          overrides: k === 0 ? [{ from: 20, to: 24, kind: 'restored' }] : [],
          cost: { adherence: 12.5 + k, widthChange: 0.75, curvature: 1 / 3, length: 2, total: 15.583333333333334 + k },
          hidden: k === 1,
        };
        order.push(id);
        ids.push(id);
      }
      const surfaces = [...p.surfaces];
      surfaces[0] = { ...surface, strokeOrder: order };
      return { ...p, surfaces, strokes, modifiedAt: new Date().toISOString() };
    });
    return ids;
  }, { count, seed });
}

/** The work record kept in IndexedDB (without its JSON), or null. */
async function keptWork(page: Page): Promise<{ title: string; unsaved: boolean; has: string[] } | null> {
  return page.evaluate(() => new Promise((resolve, reject) => {
    const req = indexedDB.open('inkroute');
    // Created as the editor creates it, should this run first: never leave a database without its store.
    req.onupgradeneeded = () => req.result.createObjectStore('work');
    req.onerror = () => reject(req.error);
    req.onsuccess = () => {
      const db = req.result;
      if (!db.objectStoreNames.contains('work')) {
        db.close();
        resolve(null);
        return;
      }
      const get = db.transaction('work', 'readonly').objectStore('work').get('work');
      get.onsuccess = () => {
        const rec = get.result;
        db.close();
        if (!rec) return resolve(null);
        const project = JSON.parse(rec.json);
        resolve({ title: rec.title, unsaved: rec.unsaved, has: Object.keys(project.strokes) });
      };
      get.onerror = () => reject(get.error);
    };
  }));
}

test('a saved project file opens again with identical strokes, sample for sample', async ({ page }, testInfo) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await waitForProject(page);
  const ids = await addStrokes(page, 3, 1);
  const saved = await projectJson(page);
  expect(Object.keys(saved.strokes)).toEqual(expect.arrayContaining(ids));

  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: /^Save/ }).click(),
  ]);
  expect(download.suggestedFilename()).toBe(`${saved.title}.inkroute`);
  const path = testInfo.outputPath(download.suggestedFilename());
  await download.saveAs(path);
  // The save is recorded in the browser too: no offer to restore after the reload.
  await expect.poll(async () => (await keptWork(page))?.unsaved).toBe(false);

  await page.reload();
  await waitForProject(page);
  await expect(page.getByRole('dialog')).toHaveCount(0);
  const fresh = await projectJson(page);
  expect(Object.keys(fresh.strokes)).not.toEqual(expect.arrayContaining(ids));

  await page.getByLabel('Open a project or image').setInputFiles(path);
  await expect.poll(async () => Object.keys((await projectJson(page)).strokes)).toEqual(expect.arrayContaining(ids));
  const opened = await projectJson(page);
  expect(opened).toEqual(saved);
  for (const id of ids) {
    expect(opened.strokes[id].samples.length).toBe(saved.strokes[id].samples.length);
    expect(opened.strokes[id].samples).toEqual(saved.strokes[id].samples);
  }
  expect(opened.surfaces[0].strokeOrder).toEqual(saved.surfaces[0].strokeOrder);
  await expect(page.getByRole('alert')).toHaveCount(0);
  expect(errors).toEqual([]);
});

test('after a reload without saving, the restore offer brings the edit back', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await waitForProject(page);
  const [id] = await addStrokes(page, 1, 2);
  const edited = await projectJson(page);
  // Autosave keeps it within about a second.
  await expect.poll(async () => (await keptWork(page))?.has ?? [], { timeout: 3000 }).toContain(id);

  await page.reload();
  const dialog = page.getByRole('dialog');
  await expect(dialog).toBeVisible();
  await expect(dialog).toContainText(`Restore the unsaved work of ${edited.title} from`);
  await dialog.getByRole('button', { name: 'Restore' }).click();
  await expect(dialog).toHaveCount(0);
  await waitForProject(page);
  expect(await projectJson(page)).toEqual(edited);

  // Still unsaved: a second reload offers it again, and Discard brings the demo back.
  await page.reload();
  await expect(dialog).toBeVisible();
  await dialog.getByRole('button', { name: 'Discard' }).click();
  await waitForProject(page);
  expect(Object.keys((await projectJson(page)).strokes)).not.toContain(id);
  expect(await keptWork(page)).toBeNull();
  expect(errors).toEqual([]);
});

test('opening a file over unsaved work asks first; a file that is not an image, or a truncated PNG, says so and leaves the project alone', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await waitForProject(page);
  await addStrokes(page, 1, 3);
  const before = await projectJson(page);
  const input = page.getByLabel('Open a project or image');

  // The open project has unsaved strokes: choosing a file asks first, and keeping the work keeps it.
  const notes = { name: 'notes.txt', mimeType: 'text/plain', buffer: Buffer.from('Line 1: three strokes, then a lacuna.') };
  const question = page.getByRole('dialog', { name: /has unsaved changes/ });
  await input.setInputFiles(notes);
  await expect(question).toContainText('opening notes.txt');
  await question.getByRole('button', { name: 'Keep my work' }).click();
  await expect(question).toHaveCount(0);
  expect(await projectJson(page)).toEqual(before);
  const openAnyway = async (name: string) => {
    await question.getByRole('button', { name: `Open ${name}` }).click();
    await expect(question).toHaveCount(0);
  };
  await input.setInputFiles(notes);
  await openAnyway('notes.txt');
  const alert = page.getByRole('alert');
  await expect(alert).toContainText('Could not open notes.txt: not an image');
  expect(await projectJson(page)).toEqual(before);

  const png = Buffer.from(await (await page.request.get('/demo/visible.png')).body());
  await input.setInputFiles({ name: 'cut.png', mimeType: 'image/png', buffer: png.subarray(0, Math.floor(png.length / 2)) });
  await openAnyway('cut.png');
  await expect(alert).toContainText('Could not open cut.png');
  await expect(alert).toContainText(/truncated/);
  expect(await projectJson(page)).toEqual(before);

  await input.setInputFiles({ name: 'old.inkroute', mimeType: 'application/zip', buffer: Buffer.from('PK\u0003\u0004 nothing more') });
  await openAnyway('old.inkroute');
  await expect(alert).toContainText('Could not open old.inkroute: the project file is damaged');
  expect(await projectJson(page)).toEqual(before);
  // The messages are the page speaking, not errors of the page.
  expect(errors).toEqual([]);
});
