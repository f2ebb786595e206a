/**
 * Options and result of `synthesize`, and how missing options are filled in.
 */
import type { GrayImage } from '../image/gray.ts';
import { DEGRADATION_PRESETS, type Degradation } from './presets.ts';
import type { Difficulty, InscriptionTruth } from './types.ts';

export interface SynthOptions {
  /** Seed of every random choice; the same options give bit-identical output. */
  seed: number;
  /** Image width, px. Default 2400. */
  width?: number;
  /** Image height, px. Default 1600. */
  height?: number;
  /** Number of lines of writing. Default 3. */
  lines?: number;
  /** Letters per line, inclusive range. Default [8, 12]. */
  lettersPerLine?: [number, number];
  /** Picks a degradation preset. Default 'medium'. */
  difficulty?: Difficulty;
  /** Overrides single strengths of the preset. */
  degradation?: Partial<Degradation>;
  /** 1: a visible band only; 2: also an 'infrared' band (clearer ink, faint stains). Default 1. */
  bands?: 1 | 2;
  /** Scale, px per mm. Default: chosen so that letters are 9–11 mm tall. */
  pxPerMm?: number;
  /** Reading direction of the script. Default 'rtl'. */
  direction?: 'ltr' | 'rtl';
  /** Name of the find recorded in the truth. Default: a sherd number made from the seed. */
  title?: string;
}

export interface SynthResult {
  truth: InscriptionTruth;
  /** bands[0] is 'visible'; bands[1] is 'infrared' when bands = 2. */
  bands: GrayImage[];
  /** Coverage 0..1 of the visible ink (abrasion gaps removed), width × height, row-major. */
  inkMask: Float32Array;
  /** Coverage 0..1 of all ink, including what abrasion erased. */
  fullInkMask: Float32Array;
}

/** Options with every default applied. */
export interface ResolvedOptions {
  seed: number;
  width: number;
  height: number;
  lines: number;
  lettersPerLine: [number, number];
  difficulty: Difficulty;
  degradation: Degradation;
  bands: 1 | 2;
  pxPerMm: number | undefined;
  direction: 'ltr' | 'rtl';
  title: string;
}

export function resolveOptions(options: SynthOptions): ResolvedOptions {
  const width = options.width ?? 2400;
  const height = options.height ?? 1600;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 160 || height < 120) {
    throw new RangeError(`synthesize: image size must be integers of at least 160×120 px, got ${width}×${height}`);
  }
  const lines = options.lines ?? 3;
  if (!Number.isInteger(lines) || lines < 1) throw new RangeError(`synthesize: lines must be a positive integer, got ${lines}`);
  const [lo, hi] = options.lettersPerLine ?? [8, 12];
  if (!Number.isInteger(lo) || !Number.isInteger(hi) || lo < 1 || hi < lo) {
    throw new RangeError(`synthesize: lettersPerLine must be integers 1 <= lo <= hi, got [${lo}, ${hi}]`);
  }
  if (options.pxPerMm !== undefined && !(options.pxPerMm > 0)) {
    throw new RangeError(`synthesize: pxPerMm must be positive, got ${options.pxPerMm}`);
  }
  const difficulty = options.difficulty ?? 'medium';
  const degradation = { ...DEGRADATION_PRESETS[difficulty], ...options.degradation };
  for (const [key, value] of Object.entries(degradation)) {
    if (!(value >= 0) || !Number.isFinite(value)) throw new RangeError(`synthesize: degradation.${key} must be >= 0, got ${value}`);
  }
  const seed = options.seed;
  if (!Number.isSafeInteger(seed)) throw new RangeError(`synthesize: seed must be an integer, got ${seed}`);
  return {
    seed,
    width,
    height,
    lines,
    lettersPerLine: [lo, hi],
    difficulty,
    degradation,
    bands: options.bands ?? 1,
    pxPerMm: options.pxPerMm,
    direction: options.direction ?? 'rtl',
    title: options.title ?? `Sherd OT-${100 + (Math.abs(seed) % 900)} (synthetic), the Orvane terraces`,
  };
}
