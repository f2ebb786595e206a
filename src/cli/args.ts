/**
 * Parsing and validation of command-line values: small pure functions, each turning one
 * option's text into a checked value or throwing a {@link UsageError} that names the option.
 * They run before any file is read or any heavy work starts.
 */
import type { Difficulty } from '../synth/types.ts';
import type { Point } from '../trace/types.ts';
import { UsageError } from './errors.ts';

// A plain decimal number: no hex, no "Infinity", no empty string (which Number() takes as 0).
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Parses a finite decimal number; `what` names the option in the error. */
export function parseNumber(text: string, what: string): number {
  const t = text.trim();
  const v = Number(t);
  if (!NUMBER.test(t) || !Number.isFinite(v)) throw new UsageError(`${what} must be a number, got "${text}"`);
  return v;
}

/** Parses "X,Y" (image pixels) into a point. */
export function parsePoint(text: string, what = 'point'): Point {
  const parts = text.split(',');
  if (parts.length !== 2 || !NUMBER.test(parts[0].trim()) || !NUMBER.test(parts[1].trim())) {
    throw new UsageError(`${what} must be a point X,Y in pixels, got "${text}"`);
  }
  const x = Number(parts[0]);
  const y = Number(parts[1]);
  if (!Number.isFinite(x) || !Number.isFinite(y)) throw new UsageError(`${what} must be a point X,Y in pixels, got "${text}"`);
  return { x, y };
}

/** Parses "MIN,MAX" pen radii in pixels with 0 < MIN < MAX. */
export function parseRadius(text: string, what = '--radius'): [number, number] {
  const parts = text.split(',');
  if (parts.length !== 2 || !NUMBER.test(parts[0].trim()) || !NUMBER.test(parts[1].trim())) {
    throw new UsageError(`${what} must be MIN,MAX in pixels, got "${text}"`);
  }
  const lo = Number(parts[0]);
  const hi = Number(parts[1]);
  if (!(lo > 0) || !(hi > lo) || !Number.isFinite(hi)) {
    throw new UsageError(`${what} range is empty: it needs 0 < MIN < MAX, got "${text}"`);
  }
  return [lo, hi];
}

/** Parses a seed: a whole number from 0 to 2^32 − 1 (the generator's state is 32 bits). */
export function parseSeed(text: string, what = '--seed'): number {
  const t = text.trim();
  const v = Number(t);
  if (!/^\d+$/.test(t) || !Number.isSafeInteger(v) || v > 0xffffffff) {
    throw new UsageError(`${what} must be a whole number from 0 to 4294967295, got "${text}"`);
  }
  return v;
}

/** Parses a solver weight: a finite number ≥ 0. */
export function parseWeight(text: string, what: string): number {
  const v = parseNumber(text, what);
  if (v < 0) throw new UsageError(`${what} must be zero or more, got "${text}"`);
  return v;
}

function oneOf<T extends string>(text: string, allowed: readonly T[], what: string): T {
  if ((allowed as readonly string[]).includes(text)) return text as T;
  throw new UsageError(`${what} must be one of ${allowed.join(', ')}, got "${text}"`);
}

export function parseDifficulty(text: string, what = '--difficulty'): Difficulty {
  return oneOf(text, ['easy', 'medium', 'hard'] as const, what);
}

export function parseBands(text: string, what = '--bands'): 1 | 2 {
  return Number(oneOf(text, ['1', '2'] as const, what)) as 1 | 2;
}

export function parsePolarity(text: string, what = '--polarity'): 'dark' | 'light' {
  return oneOf(text, ['dark', 'light'] as const, what);
}

/**
 * Checks that a point lies on the image: 0 ≤ x < width and 0 ≤ y < height, so that it
 * falls on one of the image's pixels (the solver's own rule).
 */
export function checkInside(p: Point, width: number, height: number, what = 'point'): void {
  if (!(p.x >= 0 && p.x < width && p.y >= 0 && p.y < height)) {
    throw new UsageError(`${what} ${p.x},${p.y} is outside the image (${width}×${height} px)`);
  }
}

/**
 * Checks that the stroke's start and end differ: a stroke needs somewhere to go. Two
 * points on the same pixel count as the same point, as they do for the solver.
 */
export function checkDistinct(from: Point, to: Point): void {
  if (from.x === to.x && from.y === to.y) {
    throw new UsageError(`--from and --to are the same point (${from.x},${from.y})`);
  }
  if (Math.floor(from.x) === Math.floor(to.x) && Math.floor(from.y) === Math.floor(to.y)) {
    throw new UsageError(`--from ${from.x},${from.y} and --to ${to.x},${to.y} fall on the same pixel`);
  }
}

/** Options of `inkroute follow` as commander hands them over: all text. */
export interface FollowArgs {
  from?: string;
  to?: string;
  via?: string[];
  radius?: string;
  adherence?: string;
  widthChange?: string;
  curvature?: string;
  polarity?: string;
}

export interface FollowPlan {
  from: Point;
  to: Point;
  via: Point[];
  radius?: [number, number];
  weights: { adherence?: number; widthChange?: number; curvature?: number };
  polarity: 'dark' | 'light';
}

/** Parses and checks everything about a follow request that does not need the image. */
export function parseFollowArgs(args: FollowArgs): FollowPlan {
  if (args.from === undefined) throw new UsageError('follow needs --from X,Y');
  if (args.to === undefined) throw new UsageError('follow needs --to X,Y');
  const from = parsePoint(args.from, '--from');
  const to = parsePoint(args.to, '--to');
  checkDistinct(from, to);
  const via = (args.via ?? []).map((v) => parsePoint(v, '--via'));
  const weights: FollowPlan['weights'] = {};
  if (args.adherence !== undefined) weights.adherence = parseWeight(args.adherence, '--adherence');
  if (args.widthChange !== undefined) weights.widthChange = parseWeight(args.widthChange, '--width-change');
  if (args.curvature !== undefined) weights.curvature = parseWeight(args.curvature, '--curvature');
  return {
    from,
    to,
    via,
    radius: args.radius === undefined ? undefined : parseRadius(args.radius),
    weights,
    polarity: args.polarity === undefined ? 'dark' : parsePolarity(args.polarity),
  };
}

/** Checks a parsed plan's points against the image size. */
export function checkPlanInside(plan: FollowPlan, width: number, height: number): void {
  checkInside(plan.from, width, height, '--from');
  checkInside(plan.to, width, height, '--to');
  for (const v of plan.via) checkInside(v, width, height, '--via');
}
