import { execFile } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { expect, test, type Download, type Page } from '@playwright/test';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { decode as decodePng, encode as encodePng } from 'fast-png';
import { strFromU8, unzipSync } from 'fflate';
import {
  clickPoint, fmt, frameBox, openEditor, projectJson, toScreen, traceStroke, truthStroke, waitForProject, watchErrors, type StrokeDoc, type Truth,
} from './helpers.ts';
import { pngPhys } from '../test/helpers/png.ts';

/**
 * Exports from the editor, in a real browser: the finished example's six files saved from
 * the Export dialog are well-formed and byte for byte what `inkroute export` writes from
 * the same project file; an uncalibrated surface gets a plain message and no download; a
 * hostile title stays text in the SVG. The page is reached through window.__inkroute.
 */

const run = promisify(execFile);

/** What the spec reads of the test hook (app/testHook.ts); the store is a zustand store. */
type Hook = {
  store: {
    getState(): {
      project: Record<string, any> | undefined;
      change(fn: (p: any) => any): void;
      message: { kind: string; text: string } | undefined;
    };
  };
};

const FILES = ['facsimile.svg', 'facsimile.png', 'letters.zip', 'chart.svg', 'transcription.tei.xml', 'annotations.jsonld'] as const;

/** Opens the finished example with the top-bar button and waits until it is the open project. */
async function openFinishedExample(page: Page): Promise<any> {
  await page.goto('/');
  await waitForProject(page);
  await page.getByRole('button', { name: 'Open finished example' }).click();
  await expect.poll(async () => (await projectJson(page)).id, { timeout: 15_000 }).toMatch(/^p-example-/);
  return projectJson(page);
}

async function openExportDialog(page: Page) {
  await page.getByRole('navigation', { name: 'Working order' }).getByRole('button', { name: 'Export' }).click();
  const dialog = page.getByRole('dialog', { name: 'Export' });
  await expect(dialog).toBeVisible();
  return dialog;
}

/** Clicks a Save button of the dialog and keeps the download in `dir`. */
async function saveFromDialog(page: Page, name: string, dir: string): Promise<{ download: Download; bytes: Buffer }> {
  const dialog = page.getByRole('dialog', { name: 'Export' });
  const [download] = await Promise.all([
    page.waitForEvent('download', { timeout: 60_000 }),
    dialog.getByRole('button', { name: `Save ${name}` }).click(),
  ]);
  const path = join(dir, download.suggestedFilename());
  await download.saveAs(path);
  return { download, bytes: readFileSync(path) };
}

/** Checks one export file's content by its kind; throws on anything wrong. */
function checkFile(name: string, bytes: Buffer, project: any, dpi: number): void {
  if (name.endsWith('.svg') || name.endsWith('.xml')) {
    const text = bytes.toString('utf8');
    // Well-formed XML (XML 1.0; fast-xml-parser's validator).
    expect(XMLValidator.validate(text), name).toBe(true);
    const doc = new XMLParser({ ignoreAttributes: false, removeNSPrefix: false }).parse(text);
    if (name.endsWith('.svg')) {
      // The root is an SVG element in the SVG namespace (SVG 1.1 / SVG 2).
      expect(doc.svg, name).toBeDefined();
      expect(doc.svg['@_xmlns'], name).toBe('http://www.w3.org/2000/svg');
    } else {
      // The TEI root element in the TEI namespace (TEI P5 Guidelines).
      expect(doc.TEI, name).toBeDefined();
      expect(doc.TEI['@_xmlns'], name).toBe('http://www.tei-c.org/ns/1.0');
    }
  } else if (name.endsWith('.png')) {
    // Decodes as a PNG (PNG specification; fast-png's decoder).
    const png = decodePng(bytes);
    expect(png.width, name).toBeGreaterThan(0);
    expect(png.height, name).toBeGreaterThan(0);
    // pHYs: pixels per metre, unit 1 = metre (PNG specification); dpi / 0.0254 m per inch.
    expect(pngPhys(bytes), name).toEqual({ x: Math.round(dpi / 0.0254), y: Math.round(dpi / 0.0254), unit: 1 });
  } else if (name.endsWith('.zip')) {
    const entries = unzipSync(bytes);
    expect(Object.keys(entries), name).toEqual(expect.arrayContaining(['letters.csv', 'letters.json']));
    const letters = JSON.parse(strFromU8(entries['letters.json']));
    const list: unknown[] = Array.isArray(letters) ? letters : letters.letters;
    // One entry per letter of the project (what the letter set is for).
    expect(list.length, name).toBe(Object.keys(project.letters).length);
    // A header row plus a row per letter (common practice for CSV, RFC 4180).
    const rows = strFromU8(entries['letters.csv']).split(/\r?\n/).filter((l) => l.length > 0);
    expect(rows.length, name).toBe(list.length + 1);
  } else if (name.endsWith('.jsonld')) {
    const doc = JSON.parse(bytes.toString('utf8'));
    const context = ([] as unknown[]).concat(doc['@context']);
    // The Web Annotation context (W3C Web Annotation Data Model, 3.1).
    expect(context, name).toContain('http://www.w3.org/ns/anno.jsonld');
  } else {
    throw new Error(`no check for ${name}`);
  }
}

test('the finished example exports all six files from the dialog, each well-formed and byte-identical to the CLI', async ({ page }, testInfo) => {
  test.setTimeout(180_000);
  const errors = watchErrors(page);
  const project = await openFinishedExample(page);
  expect(Object.keys(project.letters).length).toBeGreaterThan(0);
  const dialog = await openExportDialog(page);
  await expect(dialog.getByRole('note')).toContainText('A facsimile is an interpretation');
  // The preview is facsimile.svg as an image.
  await expect(dialog.getByRole('img', { name: 'Preview of facsimile.svg' })).toBeVisible({ timeout: 30_000 });

  const dpi = 600;
  await dialog.getByLabel('PNG resolution').selectOption(`${dpi}`);
  const dir = testInfo.outputPath('editor');
  mkdirSync(dir, { recursive: true });
  const saved = new Map<string, Buffer>();
  for (const name of FILES) {
    const { download, bytes } = await saveFromDialog(page, name, dir);
    expect(download.suggestedFilename()).toBe(name);
    checkFile(name, bytes, project, dpi);
    saved.set(name, bytes);
  }
  await expect(dialog.getByRole('alert')).toHaveCount(0);
  // Save all: the six files again, the same bytes.
  const all = new Map<string, Promise<Buffer>>();
  const onDownload = (d: Download) => {
    const path = join(dir, `all-${d.suggestedFilename()}`);
    all.set(d.suggestedFilename(), d.saveAs(path).then(() => readFileSync(path)));
  };
  page.on('download', onDownload);
  await dialog.getByRole('button', { name: 'Save all' }).click();
  await expect.poll(() => all.size, { timeout: 60_000 }).toBe(FILES.length);
  page.off('download', onDownload);
  for (const name of FILES) expect((await all.get(name)!).equals(saved.get(name)!), `Save all: ${name}`).toBe(true);
  // Exports never change the project.
  expect(await projectJson(page)).toEqual(project);

  // The CLI on the very file the page opened.
  const served = Buffer.from(await (await page.request.get('/examples/finished.inkroute')).body());
  const cliDir = testInfo.outputPath('cli');
  mkdirSync(cliDir, { recursive: true });
  const projectPath = join(cliDir, 'finished.inkroute');
  writeFileSync(projectPath, served);
  const out = (name: string) => join(cliDir, name);
  await run(process.execPath, [
    'bin/inkroute.js', 'export', projectPath,
    '--svg', out('facsimile.svg'), '--png', out('facsimile.png'), '--dpi', String(dpi),
    '--letters', out('letters.zip'), '--chart', out('chart.svg'), '--tei', out('transcription.tei.xml'),
    '--annotations', out('annotations.jsonld'),
  ], { timeout: 120_000 });
  for (const name of FILES) {
    const cli = readFileSync(out(name));
    // Same project, same options, same exportFiles: the same bytes (src/export/types.ts contract).
    expect(cli.length, name).toBe(saved.get(name)!.length);
    expect(cli.equals(saved.get(name)!), name).toBe(true);
  }
  expect(errors).toEqual([]);
});

test('an uncalibrated photo: saving facsimile.svg says why in one sentence and downloads nothing', async ({ page }) => {
  const errors = watchErrors(page);
  await page.goto('/');
  await waitForProject(page);
  // A grey PNG with a dark bar and no pHYs chunk, so the file gives no scale (PNG specification).
  const width = 160;
  const height = 90;
  const data = new Uint8Array(width * height).fill(210);
  for (let y = 40; y < 48; y++) for (let x = 30; x < 130; x++) data[y * width + x] = 40;
  const png = Buffer.from(encodePng({ width, height, data, depth: 8, channels: 1 }));
  expect(pngPhys(png)).toBeUndefined();
  await page.getByLabel('Open a project or image').setInputFiles({ name: 'unscaled.png', mimeType: 'image/png', buffer: png });
  await expect.poll(async () => (await projectJson(page)).title).toBe('unscaled');
  const project = await projectJson(page);
  expect(project.surfaces[0].pxPerMm).toBeUndefined();

  let downloads = 0;
  page.on('download', () => downloads++);
  const dialog = await openExportDialog(page);
  await dialog.getByRole('button', { name: 'Save facsimile.svg' }).click();
  const alert = dialog.getByRole('alert');
  await expect(alert).toBeVisible({ timeout: 20_000 });
  const text = (await alert.textContent()) ?? '';
  // A plain reason that names the missing scale (the export contract, ExportError).
  expect(text).toMatch(/scale|calibrat/i);
  // One sentence: a single full stop, at the end.
  expect(text.trim()).toMatch(/^[^\n]+\.$/);
  expect(text.replace(/\.$/, '')).not.toMatch(/\.\s/);
  // Give a download a moment to show up, should one have been started.
  await page.waitForTimeout(500);
  expect(downloads).toBe(0);
  expect(await projectJson(page)).toEqual(project);
  // Esc closes the dialog.
  await page.keyboard.press('Escape');
  await expect(dialog).toHaveCount(0);
  expect(errors).toEqual([]);
});

test('a title with markup exports an SVG that shows it as text and runs no script', async ({ page, context }, testInfo) => {
  const errors = watchErrors(page);
  await openFinishedExample(page);
  const title = '<script>window.__pwned=1</script>]]>';
  // As src/doc/rules.ts setTitle does: the title replaced, the modification time touched.
  await page.evaluate((t) => {
    (window as unknown as { __inkroute: Hook }).__inkroute.store.getState()
      .change((p: any) => ({ ...p, title: t, modifiedAt: new Date().toISOString() }));
  }, title);
  // Unsaved work now: the example button asks first, and keeping the work keeps it.
  await page.getByRole('button', { name: 'Open finished example' }).click();
  const question = page.getByRole('dialog', { name: /has unsaved changes/ });
  await expect(question).toBeVisible();
  await question.getByRole('button', { name: 'Keep my work' }).click();
  await expect(question).toHaveCount(0);
  expect((await projectJson(page)).title).toBe(title);
  await openExportDialog(page);
  const dir = testInfo.outputPath('hostile');
  mkdirSync(dir, { recursive: true });
  const { bytes } = await saveFromDialog(page, 'facsimile.svg', dir);
  const svg = bytes.toString('utf8');
  // Well-formed XML even with ']]>' and '<' in the text (XML 1.0).
  expect(XMLValidator.validate(svg)).toBe(true);

  // The file as a document of its own in Chromium, served from the test's origin.
  const url = `${new URL(page.url()).origin}/__e2e/hostile-facsimile.svg`;
  const viewer = await context.newPage();
  await viewer.route(url, (route) => route.fulfill({ status: 200, contentType: 'image/svg+xml', body: bytes }));
  await viewer.goto(url);
  await viewer.waitForLoadState('load');
  const seen = await viewer.evaluate(() => ({
    pwned: (window as unknown as { __pwned?: unknown }).__pwned,
    root: document.documentElement.localName,
    scripts: document.getElementsByTagName('script').length,
    parseErrors: document.getElementsByTagName('parsererror').length,
    text: document.documentElement.textContent ?? '',
  }));
  // Not run, not even an element: the title is character data (XML 1.0 escaping).
  expect(seen.pwned).toBeUndefined();
  expect(seen.scripts).toBe(0);
  expect(seen.parseErrors).toBe(0);
  expect(seen.root).toBe('svg');
  expect(seen.text).toContain(title);
  await viewer.close();
  expect(errors).toEqual([]);
});

test('the whole way on the demo: calibrate on the ruler, trace and make three letters, export every file from the dialog', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const errors = watchErrors(page);
  const truth: Truth = await openEditor(page);
  // The demo opens with its scale given: take it away, so the ruler is what sets it.
  await page.evaluate(() => window.__inkroute!.store.getState().change((p) => ({ ...p, surfaces: p.surfaces.map((s) => ({ ...s, pxPerMm: undefined })) })));

  // Calibrate: drag along the ruler from its true ends, type its length.
  await page.getByRole('button', { name: 'Calibrate', exact: true }).click();
  const r = truth.ruler;
  await frameBox(page, [r.x0, r.y0 - 20, r.x1, r.y1 + 20]);
  const a = await toScreen(page, { x: r.x0, y: r.y0 });
  const b = await toScreen(page, { x: r.x1, y: r.y1 });
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  for (let k = 1; k <= 10; k++) await page.mouse.move(a.x + ((b.x - a.x) * k) / 10, a.y + ((b.y - a.y) * k) / 10);
  await page.mouse.up();
  await page.getByLabel('Ruler length (mm)').fill(String(r.mm));
  await page.getByRole('button', { name: 'Set scale' }).click();
  await expect.poll(() => page.evaluate(() => window.__inkroute!.store.getState().project!.surfaces[0].pxPerMm ?? 0)).toBeGreaterThan(0);
  const pxPerMm = await page.evaluate(() => window.__inkroute!.store.getState().project!.surfaces[0].pxPerMm!);
  // Within 1 % of the demo's true scale (its ground truth).
  expect(Math.abs(pxPerMm - truth.pxPerMm) / truth.pxPerMm).toBeLessThan(0.01);

  // Trace the strokes of three letters with Follow, then make each a letter with the Letter tool.
  const letters = ['L1.2', 'L1.3', 'L1.4'].map((id) => truth.letters.find((l) => l.id === id)!);
  await page.getByRole('button', { name: 'Follow', exact: true }).click();
  const traced = new Map<string, StrokeDoc>();
  for (const l of letters) for (const sid of l.strokeIds) traced.set(sid, (await traceStroke(page, truthStroke(truth, sid))).stroke);
  const all = [...traced.values()];
  await page.getByRole('button', { name: 'Letter', exact: true }).click();
  await frameBox(page, [
    Math.min(...letters.map((l) => l.box[0])), Math.min(...letters.map((l) => l.box[1])),
    Math.max(...letters.map((l) => l.box[2])), Math.max(...letters.map((l) => l.box[3])),
  ]);
  const labels = ['A', 'B', 'C'];
  for (const [k, l] of letters.entries()) {
    for (const [i, sid] of l.strokeIds.entries()) {
      const own = traced.get(sid)!;
      const p = await toScreen(page, clickPoint(own, all.filter((o) => o !== own)));
      if (i > 0) await page.keyboard.down('Shift');
      await page.mouse.click(p.x, p.y);
      if (i > 0) await page.keyboard.up('Shift');
    }
    await page.getByRole('button', { name: 'Make letter' }).click();
    await expect.poll(() => page.evaluate(() => Object.keys(window.__inkroute!.store.getState().project!.letters).length)).toBe(k + 1);
    const label = page.getByRole('textbox', { name: 'Label', exact: true });
    await label.fill(labels[k]);
    await label.press('Enter');
    if (k === 1) await page.getByRole('checkbox', { name: 'Doubtful' }).check();
  }
  const project = await page.evaluate(() => JSON.parse(JSON.stringify(window.__inkroute!.store.getState().project)));
  expect(Object.values(project.letters).map((l: any) => l.label).sort()).toEqual(labels);

  const dialog = await openExportDialog(page);
  await expect(dialog.getByRole('img', { name: 'Preview of facsimile.svg' })).toBeVisible({ timeout: 30_000 });
  await dialog.getByLabel('Letter labels').check();
  const dpi = 300;
  const dir = testInfo.outputPath('whole-way');
  mkdirSync(dir, { recursive: true });
  const sizes: string[] = [];
  for (const name of FILES) {
    const t0 = Date.now();
    const { bytes } = await saveFromDialog(page, name, dir);
    checkFile(name, bytes, project, dpi);
    sizes.push(`${name} ${bytes.length} B in ${fmt((Date.now() - t0) / 1000, 2)} s`);
  }
  // The reading reaches the files: every label in the TEI transcription and the annotations (their text content).
  const tei = readFileSync(join(dir, 'transcription.tei.xml'), 'utf8');
  const anno = readFileSync(join(dir, 'annotations.jsonld'), 'utf8');
  for (const label of labels) {
    expect(tei).toContain(label);
    expect(anno).toContain(label);
  }
  console.log(`whole way: ${fmt(pxPerMm, 3)} px/mm (true ${fmt(truth.pxPerMm, 3)}); ${sizes.join('; ')}`);
  await expect(dialog.getByRole('alert')).toHaveCount(0);
  expect(errors).toEqual([]);
});
