/**
 * The finished example project: a synthetic inscription traced stroke by stroke, its
 * strokes grouped into labelled letters, its surface calibrated from the ruler in the
 * photo. It is what a person would have after tracing the whole find in the editor, built
 * with the editor's own calls (the worker's preparation and solve, the document rules),
 * so the editor can open it and the exports have a realistic project to work on.
 * Deterministic: the same options give byte-identical .inkroute files.
 */
import { PROJECT_VERSION, type ImageRef, type Project } from '../doc/model.ts';
import {
  DEFAULT_INSCRIPTION, DEFAULT_SETTINGS, addStroke, makeLetter, restoredShare, setInscription, setScale, strokeFromSolve,
  updateLetter,
} from '../doc/rules.ts';
import { crc32, decodeImage, encodeGrayPng } from '../image/codec.ts';
import { inkEvidence } from '../ink/index.ts';
import { synthesize } from '../synth/synthesize.ts';
import { demoOptions } from '../synth/recipes.ts';
import { resolveOptions, type SynthOptions } from '../synth/options.ts';
import type { InscriptionTruth } from '../synth/types.ts';
import { prepareInk } from '../trace/prepare.ts';
import { solveWithPins } from '../worker/host.ts';
import { labelOf } from './labels.ts';

/** Time stamp of every example project, so that its bytes do not depend on the clock. */
export const EXAMPLE_TIME = '2026-01-01T00:00:00.000Z';
/** Id of the example's one surface. */
export const EXAMPLE_SURFACE = 'recto';
/** How many letters the example marks as doubtful readings (those with the most restored ink). */
export const DOUBTFUL_LETTERS = 2;

export interface FinishedExample {
  project: Project;
  /** Image files by their path in the bundle ('images/visible.png', …): PNG bytes with pHYs. */
  images: Map<string, Uint8Array>;
  truth: InscriptionTruth;
  /** Coverage 0..1 of the visible ink and of all ink, width × height, row-major (see SynthResult). */
  masks: { inkMask: Float32Array; fullInkMask: Float32Array };
}

/**
 * The id of the example project for these options: the seed, readable, and a CRC-32 of
 * all resolved options, so that two examples that differ in anything get different ids
 * (`inkroute synth --project --if-missing` compares it).
 */
export function exampleProjectId(options: SynthOptions | 'demo'): string {
  const o = resolveOptions(options === 'demo' ? demoOptions() : options);
  const digest = crc32(new TextEncoder().encode(JSON.stringify(o))).toString(16).padStart(8, '0');
  return `p-example-${o.seed}-${digest}`;
}

/** Path of a band's image inside the project file, from its name kept to safe characters. */
function bandPath(name: string, index: number): string {
  const safe = name.toLowerCase().replace(/[^a-z0-9-]+/g, '-').replace(/^-+|-+$/g, '');
  return `images/${safe || `band-${index + 1}`}.png`;
}

/**
 * Builds the finished example of a synthetic inscription ('demo': the built-in demo, the
 * same one as public/demo). Every truth stroke is traced on the first band (visible) from
 * its true first to its true last sample with the project's default solver settings;
 * letters are labelled with {@link labelOf}; the two letters holding the strokes with the
 * largest restored share read 'doubtful', the rest 'clear'.
 */
export function finishedExample(options: SynthOptions | 'demo'): FinishedExample {
  const synthOptions = options === 'demo' ? demoOptions() : options;
  const { truth, bands, inkMask, fullInkMask } = synthesize(synthOptions);
  const projectId = exampleProjectId(options);

  const images = new Map<string, Uint8Array>();
  const refs: ImageRef[] = bands.map((band, i) => {
    const name = truth.bands[i] ?? `band-${i + 1}`;
    const file = bandPath(name, i);
    images.set(file, encodeGrayPng(band, { pxPerMm: truth.pxPerMm }));
    return { id: `i-${name}`, band: name, file, mime: 'image/png', width: band.width, height: band.height, bitDepth: 8 };
  });

  let project: Project = {
    format: 'inkroute-project',
    version: PROJECT_VERSION,
    id: projectId,
    title: truth.title,
    createdAt: EXAMPLE_TIME,
    modifiedAt: EXAMPLE_TIME,
    defaults: structuredClone(DEFAULT_SETTINGS),
    surfaces: [{ id: EXAMPLE_SURFACE, name: 'recto', images: refs, strokeOrder: [] }],
    strokes: {},
    inscription: { ...DEFAULT_INSCRIPTION },
    letters: {},
    textMarks: {},
  };

  // As the worker does it: the file's bytes decoded (so the 8-bit rounding the editor
  // sees is what is traced), then the ink evidence and the solver's preparation.
  const first = images.get(refs[0].file) as Uint8Array;
  const band = decodeImage(first).bands[0];
  const prep = prepareInk(inkEvidence(band), band);
  for (const ts of truth.strokes) {
    const a = ts.samples[0];
    const b = ts.samples[ts.samples.length - 1];
    const anchors = [{ x: a.x, y: a.y }, { x: b.x, y: b.y }];
    const solved = solveWithPins(prep, anchors, project.defaults);
    project = addStroke(project, strokeFromSolve(`s-${ts.id}`, EXAMPLE_SURFACE, anchors, solved));
  }

  const { x0, y0, x1, y1, mm } = truth.ruler;
  project = setScale(project, EXAMPLE_SURFACE, Math.hypot(x1 - x0, y1 - y0) / mm, { kind: 'ruler', x0, y0, x1, y1, mm });
  project = setInscription(project, {
    script: 'Latin',
    direction: truth.direction,
    description:
      `A synthetic ${truth.difficulty} inscription (seed ${truth.seed}) in an invented script on a clay sherd from ` +
      `the invented site of the Orvane terraces, every stroke traced from its true ends; letters transliterated into Latin.`,
    creator: '',
  });

  for (const tl of truth.letters) {
    project = makeLetter(project, tl.strokeIds.map((id) => `s-${id}`), { label: labelOf(tl.name), reading: 'clear' }, `l-${tl.id}`).project;
  }

  // The letters whose most restored stroke has the largest share; ties by id, for determinism.
  const ranked = Object.values(project.letters)
    .map((l) => ({ id: l.id, share: Math.max(...l.strokeIds.map((sid) => restoredShare(project.strokes[sid]))) }))
    .sort((p, q) => q.share - p.share || (p.id < q.id ? -1 : 1));
  for (const { id } of ranked.slice(0, DOUBTFUL_LETTERS)) project = updateLetter(project, id, { reading: 'doubtful' });

  // The rules stamp every change with the clock; the example keeps its fixed time.
  project = { ...project, modifiedAt: EXAMPLE_TIME };
  return { project, images, truth, masks: { inkMask, fullInkMask } };
}
