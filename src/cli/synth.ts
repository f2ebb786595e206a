/**
 * `inkroute synth`: writes a synthetic inscription with its ground truth, as the demo
 * and as test and benchmark material (--out), and the finished example project, every
 * stroke traced and grouped into letters (--project).
 */
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { encodeGrayPng } from '../image/codec.ts';
import { createGray } from '../image/gray.ts';
import type { SynthOptions } from '../synth/options.ts';
import type { Difficulty } from '../synth/types.ts';
import { parseBands, parseDifficulty, parseSeed } from './args.ts';
import { UsageError } from './errors.ts';
import { writeFailure } from './files.ts';

/** Options of `inkroute synth` as commander hands them over. */
export interface SynthArgs {
  seed?: string;
  out?: string;
  /** The finished example project, FILE.inkroute. */
  project?: string;
  difficulty?: string;
  bands?: string;
  demo?: boolean;
  ifMissing?: boolean;
}

export interface SynthPlan {
  out?: string;
  project?: string;
  demo: boolean;
  ifMissing: boolean;
  seed?: number;
  difficulty?: Difficulty;
  bands?: 1 | 2;
}

export function parseSynthArgs(args: SynthArgs): SynthPlan {
  if (args.seed === undefined && !args.demo) throw new UsageError('synth needs --seed N (or --demo)');
  if (args.out === undefined && args.project === undefined) throw new UsageError('synth needs --out DIR or --project FILE.inkroute');
  return {
    out: args.out,
    project: args.project,
    demo: Boolean(args.demo),
    ifMissing: Boolean(args.ifMissing),
    seed: args.seed === undefined ? undefined : parseSeed(args.seed),
    difficulty: args.difficulty === undefined ? undefined : parseDifficulty(args.difficulty),
    bands: args.bands === undefined ? undefined : parseBands(args.bands),
  };
}

/** File name of a band's image: its name from the truth, kept to safe characters. */
export function bandFileName(name: string | undefined, index: number): string {
  const safe = (name ?? '').toLowerCase().replace(/[^a-z0-9-]+/g, '-').replace(/^-+|-+$/g, '');
  return `${safe || `band-${index + 1}`}.png`;
}

/**
 * Whether DIR already holds this inscription: truth.json with the same seed (and the
 * same difficulty and band count when those were asked for) and every band image.
 */
export function isUpToDate(out: string, want: { seed: number; difficulty?: Difficulty; bands?: number }): boolean {
  const truthPath = join(out, 'truth.json');
  if (!existsSync(truthPath)) return false;
  let truth: { seed?: unknown; difficulty?: unknown; bands?: unknown };
  try {
    truth = JSON.parse(readFileSync(truthPath, 'utf8'));
  } catch {
    return false;
  }
  if (truth.seed !== want.seed) return false;
  if (want.difficulty !== undefined && truth.difficulty !== want.difficulty) return false;
  if (!Array.isArray(truth.bands)) return false;
  if (want.bands !== undefined && truth.bands.length !== want.bands) return false;
  return truth.bands.every((b: unknown, i: number) => existsSync(join(out, bandFileName(String(b), i))));
}

/**
 * Whether FILE already holds the finished example of these options: a readable project
 * file whose project id is the one {@link exampleProjectId} gives (it encodes the seed
 * and a digest of every option).
 */
export async function isProjectUpToDate(file: string, options: SynthOptions): Promise<boolean> {
  if (!existsSync(file)) return false;
  const { readProjectFile } = await import('../doc/projectFile.ts');
  const { exampleProjectId } = await import('../example/finished.ts');
  try {
    return readProjectFile(readFileSync(file)).project.id === exampleProjectId(options);
  } catch {
    // Unreadable or damaged: made again.
    return false;
  }
}

/** Writes a file whole or not at all: to a temporary name first, then renamed over. */
function writeWhole(path: string, data: Uint8Array | string): void {
  const tmp = `${path}.${process.pid}.tmp`;
  try {
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(tmp, data);
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw writeFailure(path, e);
  }
}

export async function runSynth(args: SynthArgs): Promise<void> {
  const plan = parseSynthArgs(args);
  // Loaded here so that the other commands start without the generator.
  const { demoOptions } = await import('../synth/index.ts');
  const options: SynthOptions = {
    ...(plan.demo ? demoOptions() : { seed: plan.seed as number }),
    ...(plan.seed !== undefined && { seed: plan.seed }),
    ...(plan.difficulty !== undefined && { difficulty: plan.difficulty }),
    ...(plan.bands !== undefined && { bands: plan.bands }),
  };
  if (plan.out !== undefined) await writeSynthFolder(plan.out, plan.ifMissing, options);
  if (plan.project !== undefined) await writeExampleProject(plan.project, plan.ifMissing, options);
}

async function writeExampleProject(file: string, ifMissing: boolean, options: SynthOptions): Promise<void> {
  if (ifMissing && (await isProjectUpToDate(file, options))) {
    process.stdout.write(`synth: ${file} already holds seed ${options.seed}, left as is\n`);
    return;
  }
  const t0 = performance.now();
  const { finishedExample } = await import('../example/finished.ts');
  const { writeProjectFile } = await import('../doc/projectFile.ts');
  const { project, images, truth } = finishedExample(options);
  writeWhole(file, writeProjectFile({ project, images }));
  const doubtful = Object.values(project.letters).filter((l) => l.reading === 'doubtful').length;
  process.stdout.write(
    `synth: wrote the finished example ${file} (seed ${truth.seed}, ${truth.difficulty}, ${truth.width}×${truth.height} px, ` +
      `${Object.keys(project.strokes).length} strokes traced, ${Object.keys(project.letters).length} letters, ` +
      `${doubtful} doubtful, ${(performance.now() - t0).toFixed(0)} ms)\n`,
  );
}

async function writeSynthFolder(out: string, ifMissing: boolean, options: SynthOptions): Promise<void> {
  const { synthesize } = await import('../synth/index.ts');
  if (ifMissing && isUpToDate(out, options)) {
    process.stdout.write(`synth: ${out} already holds seed ${options.seed}, left as is\n`);
    return;
  }

  const t0 = performance.now();
  const { truth, bands, inkMask } = synthesize(options);
  const files: Array<[string, Uint8Array | string]> = [];
  bands.forEach((band, i) => files.push([bandFileName(truth.bands[i], i), encodeGrayPng(band, { pxPerMm: truth.pxPerMm })]));
  files.push(['truth.json', JSON.stringify(truth) + '\n']);
  files.push(['scale.json', JSON.stringify({ pxPerMm: truth.pxPerMm }) + '\n']);
  // Black where the visible ink covers at least half the pixel, white elsewhere.
  const mask = new Float32Array(truth.width * truth.height);
  for (let p = 0; p < mask.length; p++) mask[p] = inkMask[p] >= 0.5 ? 0 : 1;
  files.push(['ink-mask.png', encodeGrayPng(createGray(truth.width, truth.height, mask), { pxPerMm: truth.pxPerMm })]);

  try {
    mkdirSync(out, { recursive: true });
  } catch (e) {
    throw writeFailure(out, e);
  }
  for (const [name, data] of files) {
    const path = join(out, name);
    try {
      writeFileSync(path, data);
    } catch (e) {
      throw writeFailure(path, e);
    }
  }
  const ms = performance.now() - t0;
  process.stdout.write(
    `synth: wrote ${files.map(([n]) => n).join(', ')} to ${out} ` +
      `(seed ${truth.seed}, ${truth.difficulty}, ${truth.width}×${truth.height} px, ${truth.pxPerMm} px/mm, ` +
      `${truth.strokes.length} strokes, ${ms.toFixed(0)} ms)\n`,
  );
}
