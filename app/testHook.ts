/**
 * TEST ONLY: the handle the end-to-end tests (e2e/) hold on the page, as
 * `window.__inkroute`. main.tsx installs it only when a test drives the browser
 * (navigator.webdriver) or the address has `?test-hook`; the editor never reads it.
 * Coordinates called "screen" here are the page's client px (what page.mouse takes).
 */
import type { Project, StrokeDoc } from '../src/doc/model.ts';
import { newProject } from '../src/doc/rules.ts';
import type { InscriptionTruth } from '../src/synth/types.ts';
import type { StrokeSample } from '../src/trace/types.ts';
import { createRandom } from '../src/util/random.ts';
import { fetchDemoTruth } from './App.tsx';
import { imageEntry, provideImage } from './canvas/images.ts';
import { probe } from './canvas/probe.ts';
import { canvasBox, currentImage, fitToWindow, imageToScreen, screenToImage } from './canvas/view.ts';
import type { EditorStore } from './store/store.ts';
import { editorStore } from './store/useEditor.ts';

export interface SyntheticOptions {
  /** Image size, px. Default 6000 × 4000 (24 MP). */
  width?: number;
  height?: number;
  /** Number of random strokes. Default 1000. */
  strokes?: number;
  seed?: number;
}

export interface InkrouteTestHook {
  store: EditorStore;
  /** The demo inscription's ground truth. */
  truth: Promise<InscriptionTruth>;
  /** Settles once the engine holds the current image (its ink evidence computed). */
  readonly engineReady: Promise<void>;
  imageToScreen(x: number, y: number): { x: number; y: number };
  screenToImage(x: number, y: number): { x: number; y: number };
  /** Timestamps of pointer moves and preview draws, and the last draw time of each layer. */
  probe: typeof probe;
  /** Size of the canvas, css px. */
  canvasBox(): { width: number; height: number };
  /** Replaces the project with a synthetic surface drawn in the page and random strokes (display only). */
  loadSynthetic(options?: SyntheticOptions): Promise<{ width: number; height: number; strokes: number; samples: number }>;
}

declare global {
  interface Window {
    __inkroute?: InkrouteTestHook;
  }
}

function canvasOrigin(): { left: number; top: number } {
  const el = document.querySelector('.canvas');
  const r = el?.getBoundingClientRect();
  return { left: r?.left ?? 0, top: r?.top ?? 0 };
}

/** Resolves with the engine readiness of the current image once there is one. */
function currentEngineReady(store: EditorStore): Promise<void> {
  return new Promise((resolve, reject) => {
    const check = () => {
      const entry = imageEntry(currentImage(store.getState().project)?.id);
      if (!entry) return false;
      entry.engineReady.then(resolve, reject);
      return true;
    };
    if (check()) return;
    const timer = setInterval(() => {
      if (check()) clearInterval(timer);
    }, 20);
  });
}

/** A photo-like surface: a mottled ground with faint dark marks, drawn on a canvas. */
function syntheticSurface(width: number, height: number, rand: () => number): HTMLCanvasElement {
  const c = document.createElement('canvas');
  c.width = width;
  c.height = height;
  const ctx = c.getContext('2d');
  if (!ctx) throw new Error('no 2d context');
  const tile = document.createElement('canvas');
  tile.width = tile.height = 256;
  const tctx = tile.getContext('2d')!;
  const img = tctx.createImageData(256, 256);
  for (let i = 0; i < 256 * 256; i++) {
    const v = 200 + Math.floor(rand() * 30);
    img.data[4 * i] = v;
    img.data[4 * i + 1] = v - 12;
    img.data[4 * i + 2] = v - 30;
    img.data[4 * i + 3] = 255;
  }
  tctx.putImageData(img, 0, 0);
  ctx.fillStyle = ctx.createPattern(tile, 'repeat')!;
  ctx.fillRect(0, 0, width, height);
  for (let i = 0; i < 400; i++) {
    ctx.fillStyle = `rgba(90, 70, 50, ${0.05 + 0.1 * rand()})`;
    ctx.beginPath();
    ctx.arc(rand() * width, rand() * height, 20 + rand() * 200, 0, 2 * Math.PI);
    ctx.fill();
  }
  return c;
}

/** A random smooth stroke (a quadratic curve) with samples 1 px apart and a varying pen. */
function randomStroke(id: string, width: number, height: number, rand: () => number): StrokeDoc {
  const len = 60 + rand() * 340;
  const x0 = 50 + rand() * (width - 100);
  const y0 = 50 + rand() * (height - 100);
  const a = rand() * 2 * Math.PI;
  const x2 = Math.min(width - 10, Math.max(10, x0 + Math.cos(a) * len));
  const y2 = Math.min(height - 10, Math.max(10, y0 + Math.sin(a) * len));
  const bend = (rand() - 0.5) * len * 0.6;
  const x1 = (x0 + x2) / 2 - Math.sin(a) * bend;
  const y1 = (y0 + y2) / 2 + Math.cos(a) * bend;
  const n = Math.max(2, Math.round(len));
  const r0 = 2 + rand() * 4;
  const samples: StrokeSample[] = [];
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1);
    const u = 1 - t;
    samples.push({
      x: u * u * x0 + 2 * u * t * x1 + t * t * x2,
      y: u * u * y0 + 2 * u * t * y1 + t * t * y2,
      r: r0 * (0.8 + 0.2 * Math.sin(6 * t)),
      support: 1,
    });
  }
  const restoredSpans = rand() < 0.3 ? [{ from: Math.floor(n * 0.4), to: Math.floor(n * 0.55) }] : [];
  return {
    id, surfaceId: 'recto', anchors: [{ x: samples[0].x, y: samples[0].y }, { x: samples[n - 1].x, y: samples[n - 1].y }],
    samples, restoredSpans, overrides: [], hidden: false,
    cost: { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 },
  };
}

async function loadSynthetic(store: EditorStore, options: SyntheticOptions = {}) {
  const width = options.width ?? 6000;
  const height = options.height ?? 4000;
  const count = options.strokes ?? 1000;
  const random = createRandom(options.seed ?? 7);
  const rand = () => random.next();
  const surface = syntheticSurface(width, height, rand);
  const file = 'images/synthetic.png';
  let project: Project = newProject('Synthetic surface (24 MP)', { band: 'visible', file, mime: 'image/png', width, height, bitDepth: 8 });
  const strokes: Record<string, StrokeDoc> = {};
  const order: string[] = [];
  let samples = 0;
  for (let i = 0; i < count; i++) {
    const s = randomStroke(`t${i}`, width, height, rand);
    strokes[s.id] = s;
    order.push(s.id);
    samples += s.samples.length;
  }
  project = { ...project, strokes, surfaces: [{ ...project.surfaces[0], strokeOrder: order }] };
  provideImage(project.surfaces[0].images[0], surface);
  // No bytes: the surface exists only in this page, for drawing.
  store.getState().loadProject(project, new Map([[file, new Uint8Array(0)]]));
  fitToWindow(store);
  return { width, height, strokes: count, samples };
}

export function installTestHook(store: EditorStore = editorStore): void {
  const truth = fetchDemoTruth();
  truth.catch(() => undefined);
  window.__inkroute = {
    store,
    truth,
    get engineReady() {
      return currentEngineReady(store);
    },
    imageToScreen(x, y) {
      const o = canvasOrigin();
      const p = imageToScreen(store.getState(), x, y);
      return { x: p.x + o.left, y: p.y + o.top };
    },
    screenToImage(x, y) {
      const o = canvasOrigin();
      return screenToImage(store.getState(), x - o.left, y - o.top);
    },
    probe,
    canvasBox,
    loadSynthetic: (options) => loadSynthetic(store, options),
  };
}
