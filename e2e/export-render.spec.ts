/**
 * The exported SVG facsimile in a real browser: Chromium draws it as resvg does (the two
 * ink rasters agree, IoU ≥ 0.99), and a facsimile whose title and labels hold `<script>`
 * runs no script when opened as a document. The files are made with src/ directly.
 */
import { Resvg } from '@resvg/resvg-js';
import { expect, test, type Page } from '@playwright/test';
import type { ExportInput } from '../src/export/types.ts';
import type { Project } from '../src/doc/model.ts';
import { finishedExample, type FinishedExample } from '../src/example/finished.ts';
import { facsimileSvg } from '../src/export/facsimile.ts';

let ex: FinishedExample | undefined;
function example(): FinishedExample {
  ex ??= finishedExample({ seed: 4101, width: 640, height: 400, lines: 2, lettersPerLine: [5, 6], difficulty: 'easy', bands: 1, direction: 'rtl', title: 'Sherd OT-17' });
  return ex;
}

function inputOf(e: FinishedExample, project: Project = e.project): ExportInput {
  const images: ExportInput['images'] = {};
  for (const ref of project.surfaces[0].images) images[ref.id] = { bytes: e.images.get(ref.file)!, mime: ref.mime };
  return { project, images };
}

/** Alpha of each pixel of `svg` drawn by Chromium (as an image onto a canvas of W × H px). */
async function chromiumAlpha(page: Page, svg: string, W: number, H: number): Promise<Uint8Array> {
  await page.setContent('<!doctype html><canvas id="c"></canvas>');
  const b64: string = await page.evaluate(async ({ src, W, H }) => {
    const img = new Image();
    img.src = src;
    await img.decode();
    const c = document.getElementById('c') as HTMLCanvasElement;
    c.width = W;
    c.height = H;
    const g = c.getContext('2d')!;
    g.drawImage(img, 0, 0, W, H);
    const d = g.getImageData(0, 0, W, H).data;
    let out = '';
    for (let p = 0; p < W * H; p++) out += String.fromCharCode(d[4 * p + 3]);
    return btoa(out);
  }, { src: `data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`, W, H });
  return new Uint8Array(Buffer.from(b64, 'base64'));
}

function resvgAlpha(svg: string, W: number, H: number): Uint8Array {
  const r = new Resvg(svg, { fitTo: { mode: 'original' } }).render();
  expect([r.width, r.height]).toEqual([W, H]);
  const px = r.pixels; // a getter that copies: read it once
  const out = new Uint8Array(W * H);
  for (let p = 0; p < W * H; p++) out[p] = px[4 * p + 3];
  return out;
}

/** Intersection over union of the pixels at least half covered, and the count of their union. */
function iouOf(a: Uint8Array, b: Uint8Array): { iou: number; union: number } {
  let both = 0, either = 0;
  for (let p = 0; p < a.length; p++) {
    const x = a[p] >= 128, y = b[p] >= 128;
    if (x && y) both++;
    if (x || y) either++;
  }
  return { iou: both / either, union: either };
}

test('Chromium and resvg render the SVG facsimile alike (IoU ≥ 0.99)', async ({ page }) => {
  const e = example();
  // No text: resvg and Chromium have different fonts. 4:1 so that strokes are several px wide.
  const svg = facsimileSvg(inputOf(e), { scale: 4, restoredStyle: 'grey', scaleBarMm: 0 });
  // CSS Values and Units Level 3: 96 px per inch, 25.4 mm per inch.
  const widthMm = parseFloat(/width="([\d.]+)mm"/.exec(svg)![1]);
  const heightMm = parseFloat(/height="([\d.]+)mm"/.exec(svg)![1]);
  const W = Math.round((widthMm * 96) / 25.4), H = Math.round((heightMm * 96) / 25.4);
  // Both renderers get the same drawing at exactly W × H px (the viewBox stays), so neither
  // rescales a fractional size afterwards.
  const svgPx = svg.replace(/width="[\d.]+mm"/, `width="${W}"`).replace(/height="[\d.]+mm"/, `height="${H}"`);
  // SVG 1.1 §11.7.1 shape-rendering="crispEdges": no anti-aliasing, a pixel is ink when its
  // centre lies in the fill — the comparison of the geometry itself. Anti-aliased, the two
  // renderers estimate edge coverage differently (by up to ≈ 30/255 here), which flips
  // half-covered edge pixels at any threshold: that figure is printed, not asserted.
  const crisp = svgPx.replace(/<svg /, '<svg shape-rendering="crispEdges" ');
  expect(crisp).not.toBe(svgPx);
  const geometry = iouOf(await chromiumAlpha(page, crisp, W, H), resvgAlpha(crisp, W, H));
  const smooth = iouOf(await chromiumAlpha(page, svgPx, W, H), resvgAlpha(svgPx, W, H));
  console.log(`Chromium vs resvg, ${W}×${H} px: IoU ${geometry.iou.toFixed(4)} over ${geometry.union} px without anti-aliasing; anti-aliased, thresholded at 50 %: ${smooth.iou.toFixed(4)}`);
  expect(geometry.union).toBeGreaterThan(1000);
  expect(geometry.iou).toBeGreaterThanOrEqual(0.99);
  // The comparison can fail: the same drawing with the even-odd fill rule (holes where
  // outlines overlap, as where strokes cross) does not pass it.
  const evenOdd = crisp.replace(/fill-rule="nonzero"/g, 'fill-rule="evenodd"');
  expect(evenOdd).not.toBe(crisp);
  const wrong = iouOf(await chromiumAlpha(page, evenOdd, W, H), resvgAlpha(crisp, W, H));
  console.log(`control: even-odd fill against nonzero, IoU ${wrong.iou.toFixed(4)}`);
  expect(wrong.iou).toBeLessThan(0.99);
});

test('a facsimile whose title and labels hold <script> runs no script when opened', async ({ page }) => {
  const e = example();
  const evil = '<script>window.__pwned = 1; alert(1)</script>]]><img src=x onerror="window.__pwned = 2">';
  const letters = Object.fromEntries(Object.entries(e.project.letters).map(([id, l]) => [id, { ...l, label: evil }]));
  const project = { ...e.project, title: evil, inscription: { ...e.project.inscription, description: evil }, letters };
  const svg = facsimileSvg(inputOf(e, project), { labels: true, lineNumbers: true });
  let dialogs = 0;
  page.on('dialog', (d) => { dialogs++; void d.dismiss(); });
  await page.goto(`data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`);
  // The document opened as SVG and shows the text as text.
  const title = await page.evaluate(() => document.querySelector('title')?.textContent ?? '');
  expect(title).toBe(evil);
  const labels = await page.evaluate(() => [...document.querySelectorAll('text.label')].map((t) => t.textContent));
  expect(labels.length).toBeGreaterThan(0);
  expect(labels.map((t) => (t ?? '').replace(/\u0323/g, ''))).toContain(evil); // doubtful letters carry dots below
  expect(await page.evaluate(() => document.querySelectorAll('script').length)).toBe(0);
  await page.waitForTimeout(200);
  expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
  expect(dialogs).toBe(0);
});
