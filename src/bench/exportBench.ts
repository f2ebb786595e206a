/**
 * The export benchmark: 5,000 synthetic strokes (150–300 samples each, pen radius 1–6 px,
 * smooth and sharply turning) on a 6000 × 4000 px surface at 10 px/mm, written as the SVG
 * facsimile. Target: ≤ 2 s per export (median).
 */
import type { Project, StrokeDoc } from '../doc/model.ts';
import { DEFAULT_INSCRIPTION, DEFAULT_SETTINGS } from '../doc/rules.ts';
import { facsimileSvg } from '../export/facsimile.ts';
import type { ExportInput } from '../export/types.ts';
import { createRandom } from '../util/random.ts';
import { fmt, median, timeRuns } from './stats.ts';

/** A project of `count` random strokes (deterministic in `seed`). */
export function benchProject(count: number, seed = 1): Project {
  const rnd = createRandom(seed);
  const strokes: Record<string, StrokeDoc> = {};
  const order: string[] = [];
  for (let k = 0; k < count; k++) {
    const n = 150 + Math.floor(rnd.next() * 151);
    let x = 100 + rnd.next() * 5800, y = 100 + rnd.next() * 3800, h = rnd.next() * 2 * Math.PI;
    let r = 1 + rnd.next() * 5;
    const samples = [];
    for (let i = 0; i < n; i++) {
      samples.push({ x, y, r, support: 1 });
      h += (rnd.next() - 0.5) * 0.2 + (rnd.next() < 0.01 ? (rnd.next() - 0.5) * 3 : 0);
      r = Math.min(6, Math.max(1, r + (rnd.next() - 0.5) * 0.1));
      x += 0.8 * Math.cos(h);
      y += 0.8 * Math.sin(h);
    }
    const id = `s${k}`;
    const restoredSpans = rnd.next() < 0.2 ? [{ from: 40, to: 60 }] : [];
    strokes[id] = {
      id, surfaceId: 'recto', anchors: [samples[0], samples[n - 1]], samples, restoredSpans, overrides: [],
      cost: { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 }, hidden: false,
    };
    order.push(id);
  }
  return {
    format: 'inkroute-project', version: 2, id: 'p-bench', title: 'Bench sherd, the Orvane terraces',
    createdAt: '2026-01-01T00:00:00.000Z', modifiedAt: '2026-01-01T00:00:00.000Z', defaults: structuredClone(DEFAULT_SETTINGS),
    surfaces: [{
      id: 'recto', name: 'recto', pxPerMm: 10, strokeOrder: order,
      images: [{ id: 'i-visible', band: 'visible', file: 'images/visible.png', mime: 'image/png', width: 6000, height: 4000, bitDepth: 8 }],
    }],
    strokes, inscription: { ...DEFAULT_INSCRIPTION }, letters: {}, textMarks: {},
  };
}

export function exportBench(log: (line: string) => void, quick: boolean): void {
  const project = benchProject(5000);
  const input: ExportInput = { project, images: {} };
  let samples = 0;
  for (const s of Object.values(project.strokes)) samples += s.samples.length;
  const { ms, last } = timeRuns(() => facsimileSvg(input), quick ? 3 : 5, 1);
  log(`SVG facsimile of 5,000 strokes (${samples} samples, 20 % with a restored span): p50 ${fmt(median(ms), 0)} ms ` +
    `(target ≤ 2000 ms), ${(last.length / 2 ** 20).toFixed(1)} MiB`);
}

/**
 * The exports of the finished example (the demo inscription traced, lettered and
 * calibrated, as `npm run demo` writes it to public/examples/): every file once, and its
 * strokes tiled over a large surface up to 5,000 for the SVG.
 */
export async function exampleExportBench(log: (line: string) => void, quick: boolean): Promise<void> {
  const { existsSync, readFileSync } = await import('node:fs');
  const { readProjectFile } = await import('../doc/projectFile.ts');
  const { exportFiles, exportInputFromBundle } = await import('../export/exportFiles.ts');
  const { EXPORT_FILES } = await import('../export/types.ts');
  const file = 'public/examples/finished.inkroute';
  let input: ExportInput;
  if (existsSync(file)) {
    input = exportInputFromBundle(readProjectFile(new Uint8Array(readFileSync(file))));
  } else {
    const { finishedExample } = await import('../example/finished.ts');
    const ex = finishedExample('demo');
    input = exportInputFromBundle({ project: ex.project, images: ex.images });
  }
  const kinds = Object.keys(EXPORT_FILES) as (keyof typeof EXPORT_FILES)[];
  const p = input.project;
  const times: string[] = [];
  for (const kind of kinds) {
    const { ms, last } = timeRuns(() => exportFiles(input, [kind]), quick ? 1 : 3, quick ? 0 : 1);
    const bytes = [...last.values()][0].length;
    times.push(`${EXPORT_FILES[kind]} ${fmt(median(ms), 0)} ms (${(bytes / 1024).toFixed(0)} KiB)`);
  }
  log(`finished example (${Object.keys(p.strokes).length} strokes, ${Object.keys(p.letters).length} letters): ${times.join(', ')}`);

  // Its strokes copied side by side over a large surface, up to 5,000.
  const surface = p.surfaces[0];
  const src = surface.strokeOrder.map((id) => p.strokes[id]);
  const img = surface.images[0];
  const across = Math.ceil(Math.sqrt(5000 / src.length));
  const strokes: Record<string, StrokeDoc> = {};
  const order: string[] = [];
  for (let k = 0; order.length < 5000; k++) {
    const dx = (k % across) * img.width, dy = Math.floor(k / across) * img.height;
    for (const st of src) {
      if (order.length >= 5000) break;
      const id = `${st.id}-${k}`;
      strokes[id] = { ...st, id, samples: st.samples.map((s) => ({ ...s, x: s.x + dx, y: s.y + dy })) };
      order.push(id);
    }
  }
  const rows = Math.ceil(Math.ceil(5000 / src.length) / across);
  const big: Project = {
    ...p, letters: {}, textMarks: {}, strokes,
    surfaces: [{ ...surface, strokeOrder: order, images: [{ ...img, width: img.width * across, height: img.height * rows }] }],
  };
  let samples = 0;
  for (const s of Object.values(strokes)) samples += s.samples.length;
  const { ms } = timeRuns(() => facsimileSvg({ project: big, images: {} }), quick ? 3 : 5, 1);
  log(`SVG facsimile of the example's strokes tiled to 5,000 (${samples} samples): p50 ${fmt(median(ms), 0)} ms (target ≤ 2000 ms)`);
}
