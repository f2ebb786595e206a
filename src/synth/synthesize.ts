/**
 * The generator: lays out letters, profiles the strokes, rasterises the ink, builds the
 * surface and the damage, and composes each band:
 *   value = shading × [surface × (1 − depth × contrast × coverage) × (1 − stain) × (1 − crack)]
 * with the ruler painted over, then sensor noise, block artefacts and a clamp to [0, 1].
 */
import { createGray, type GrayImage } from '../image/gray.ts';
import { paintCracks } from './cracks.ts';
import { applyBlockiness } from './blockiness.ts';
import { layoutLetters, radiusSpread } from './layout.ts';
import { makeLattice } from './noise.ts';
import { resolveOptions, type SynthOptions, type SynthResult } from './options.ts';
import { profileLetter } from './profile.ts';
import { renderInk, type InkLayers } from './render.ts';
import { paintRuler, planRuler, type RulerPlan } from './ruler.ts';
import { buildSampleGrid } from './sampleGrid.ts';
import { STREAM, streamRandom } from './seeds.ts';
import { addSensorNoise } from './sensorNoise.ts';
import { paintStains } from './stains.ts';
import { illumination, surfaceTexture } from './surface.ts';
import type { Degradation } from './presets.ts';
import type { InscriptionTruth, TruthLetter, TruthStroke } from './types.ts';

/** How one band sees the inscription. */
interface BandLook {
  name: 'visible' | 'infrared';
  /** Mean tone of the clay, 0..1. */
  tone: number;
  /** Relative amplitude of the surface texture at surface strength 1. */
  texture: number;
  /** Darkening by ink of contrast 1 and full coverage. */
  inkDepth: number;
  /** Contrast never shows below this (infrared sees through fading). */
  contrastFloor: number;
  /** Share of the stains' darkness that shows. */
  stainShare: number;
  paper: number;
  mark: number;
  noiseStream: number;
}

/** Generate a synthetic inscription with its ground truth. Deterministic in `options`. */
export function synthesize(options: SynthOptions): SynthResult {
  const o = resolveOptions(options);
  const { width: W, height: H, degradation: deg } = o;
  const n = W * H;

  const layoutRng = streamRandom(o.seed, STREAM.layout);
  const layout = layoutLetters({
    width: W, height: H, lines: o.lines, lettersPerLine: o.lettersPerLine, direction: o.direction,
    widthVariation: deg.widthVariation,
  }, layoutRng);
  const letterMm = layoutRng.range(9, 11);
  const pxPerMm = o.pxPerMm ?? Math.round((100 * layout.letterHeight) / letterMm) / 100;

  const profileRng = streamRandom(o.seed, STREAM.profile);
  const gapRng = streamRandom(o.seed, STREAM.gaps);
  const fadeField = makeLattice(streamRandom(o.seed, STREAM.fadeField), W, H, Math.max(W, H) / 3);
  const strokes: TruthStroke[] = [];
  const letters: TruthLetter[] = [];
  for (const placed of layout.letters) {
    const own = profileLetter(placed, {
      penRadius: layout.penRadius, widthVariation: deg.widthVariation, fade: deg.fade,
      abrasion: deg.abrasion, fadeField,
    }, profileRng, gapRng);
    strokes.push(...own);
    letters.push({
      id: placed.id, name: placed.name, line: placed.line, order: placed.order,
      strokeIds: placed.strokeIds, box: letterBox(own),
    });
  }

  const ink = renderInk(W, H, strokes);
  const grid = buildSampleGrid(strokes, W, H);
  const ruler = planRuler(layout.rulerBand, W, pxPerMm);
  const avoidInk = o.difficulty === 'easy';
  const megapixels = n / 1e6;

  const stainDark = new Float32Array(n);
  const stains = paintStains(stainDark, W, H, Math.round(deg.stains * (1.5 + 5 * megapixels)), grid,
    strokes.map((s) => s.samples.length), { avoidInk, maxStrokeShare: 0.12, keepOut: [ruler.box] },
    streamRandom(o.seed, STREAM.stains));
  const crackDark = new Float32Array(n);
  const cracks = paintCracks(crackDark, W, H, Math.round(deg.cracks * (1.5 + 4 * megapixels)), grid,
    { avoidInk, maxInkRadius: layout.penRadius * radiusSpread(deg.widthVariation) },
    streamRandom(o.seed, STREAM.cracks));

  const texture = deg.surface > 0 ? surfaceTexture(W, H, pxPerMm, streamRandom(o.seed, STREAM.surface)) : null;
  const shading = illumination(W, H, deg.shading, streamRandom(o.seed, STREAM.shading));

  const look = streamRandom(o.seed, STREAM.look);
  const tone = look.range(0.6, 0.72);
  const looks: BandLook[] = [{
    name: 'visible', tone, texture: 0.3, inkDepth: look.range(0.55, 0.75), contrastFloor: 0,
    stainShare: 1, paper: 0.9, mark: 0.08, noiseStream: STREAM.noiseVisible,
  }];
  const infraredDepth = look.range(0.78, 0.84);
  const infraredTone = Math.min(0.86, tone + look.range(0.08, 0.14));
  if (o.bands === 2) {
    looks.push({
      name: 'infrared', tone: infraredTone, texture: 0.14, inkDepth: infraredDepth, contrastFloor: 0.7,
      stainShare: 0.15, paper: 0.92, mark: 0.1, noiseStream: STREAM.noiseInfrared,
    });
  }
  const bands: GrayImage[] = looks.map((b) =>
    composeBand(W, H, b, deg, o.seed, ink, texture, shading, stainDark, crackDark, ruler));

  const truth: InscriptionTruth = {
    format: 'inkroute-synth-truth',
    version: 1,
    seed: o.seed,
    difficulty: o.difficulty,
    title: o.title,
    width: W,
    height: H,
    pxPerMm,
    direction: o.direction,
    bands: looks.map((b) => b.name),
    ruler: { x0: ruler.x0, y0: ruler.y0, x1: ruler.x1, y1: ruler.y1, mm: ruler.mm },
    letters,
    strokes,
    penRadius: layout.penRadius,
    letterHeight: layout.letterHeight,
    rulerBox: ruler.box,
    degradation: { ...deg },
    damage: { stains, cracks },
  };
  return { truth, bands, inkMask: ink.cover, fullInkMask: ink.fullCover };
}

/** Bounding box of a letter's pen disks (all ink, gaps included), px. */
function letterBox(strokes: readonly TruthStroke[]): [number, number, number, number] {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const s of strokes) {
    for (const p of s.samples) {
      x0 = Math.min(x0, p.x - p.r);
      y0 = Math.min(y0, p.y - p.r);
      x1 = Math.max(x1, p.x + p.r);
      y1 = Math.max(y1, p.y + p.r);
    }
  }
  return [x0, y0, x1, y1];
}

function composeBand(
  W: number, H: number, look: BandLook, deg: Degradation, seed: number, ink: InkLayers,
  texture: Float32Array | null, shading: Float32Array, stainDark: Float32Array, crackDark: Float32Array,
  ruler: RulerPlan,
): GrayImage {
  const n = W * H;
  const out = new Float32Array(n);
  const texAmp = look.texture * deg.surface;
  const { tone, inkDepth, contrastFloor, stainShare } = look;
  const { cover, contrast } = ink;
  for (let p = 0; p < n; p++) {
    let v = texture ? tone * (1 + texAmp * texture[p]) : tone;
    const cov = cover[p];
    if (cov > 0) {
      const c = contrast[p] < contrastFloor ? contrastFloor : contrast[p];
      v *= 1 - inkDepth * c * cov;
    }
    v *= (1 - stainShare * stainDark[p]) * (1 - crackDark[p]);
    out[p] = v;
  }
  paintRuler(out, W, H, ruler, look.paper, look.mark);
  for (let p = 0; p < n; p++) out[p] *= shading[p];
  addSensorNoise(out, 0.03 * deg.noise, streamRandom(seed, look.noiseStream));
  applyBlockiness(out, W, H, deg.blockiness);
  for (let p = 0; p < n; p++) {
    const v = out[p];
    out[p] = v < 0 ? 0 : v > 1 ? 1 : v;
  }
  return createGray(W, H, out);
}
