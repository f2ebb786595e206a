/** `inkroute score RESULT.json TRUTH.json`: compares traced strokes with the ground truth. */
import { formatSummary, matchTruthStroke, scoreStroke, summarizeScores, type ScoredStroke, type StrokeScore } from '../score/index.ts';
import type { InscriptionTruth } from '../synth/types.ts';
import { UsageError } from './errors.ts';
import { readJson } from './files.ts';

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function checkStroke(v: unknown, where: string): ScoredStroke {
  if (!isObject(v) || !Array.isArray(v.samples)) throw new UsageError(`${where} has no "samples" list`);
  if (v.samples.length === 0) throw new UsageError(`${where} has no samples`);
  v.samples.forEach((s: unknown, i: number) => {
    if (!isObject(s) || !Number.isFinite(s.x) || !Number.isFinite(s.y) || !Number.isFinite(s.r)) {
      throw new UsageError(`${where}: sample ${i} needs numbers x, y and r`);
    }
  });
  const spans = v.restoredSpans ?? [];
  if (!Array.isArray(spans) || !spans.every((s) => isObject(s) && Number.isInteger(s.from) && Number.isInteger(s.to))) {
    throw new UsageError(`${where}: "restoredSpans" must be a list of {from, to} sample indices`);
  }
  return { samples: v.samples as ScoredStroke['samples'], restoredSpans: spans as ScoredStroke['restoredSpans'] };
}

/** Reads a result document: one stroke `{samples, restoredSpans, cost}` or `{strokes: [...]}`. */
export function parseResultDocument(doc: unknown, name: string): ScoredStroke[] {
  if (isObject(doc) && Array.isArray(doc.strokes)) {
    if (doc.strokes.length === 0) throw new UsageError(`${name} holds no strokes`);
    return doc.strokes.map((s, i) => checkStroke(s, `${name}: stroke ${i}`));
  }
  if (isObject(doc) && 'samples' in doc) return [checkStroke(doc, name)];
  throw new UsageError(`${name} is neither a stroke {samples, restoredSpans, cost} nor {strokes: [...]}`);
}

/** Reads a truth document as written by `inkroute synth`. */
export function parseTruthDocument(doc: unknown, name: string): InscriptionTruth {
  if (!isObject(doc) || doc.format !== 'inkroute-synth-truth' || !Array.isArray(doc.strokes)) {
    throw new UsageError(`${name} is not an inkroute ground truth (truth.json from inkroute synth)`);
  }
  return doc as unknown as InscriptionTruth;
}

/** Scores each result stroke against the truth stroke its endpoints match. */
export function scoreResults(results: ScoredStroke[], truth: InscriptionTruth): StrokeScore[] {
  return results.map((r) => {
    const match = matchTruthStroke(r, truth.strokes);
    if (!match) throw new UsageError('the ground truth has no strokes to match');
    return scoreStroke(r, match, truth.strokes);
  });
}

export function runScore(resultPath: string, truthPath: string): void {
  const results = parseResultDocument(readJson(resultPath), resultPath);
  const truth = parseTruthDocument(readJson(truthPath), truthPath);
  process.stdout.write(formatSummary(summarizeScores(scoreResults(results, truth))) + '\n');
}
