import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  checkDistinct, checkInside, parseBands, parseDifficulty, parseFollowArgs, parseNumber, parsePoint,
  parsePolarity, parseRadius, parseSeed, parseWeight,
} from '../src/cli/args.ts';
import { loadBench } from '../src/cli/bench.ts';
import { formatFollowLine, restoredShare, strokeLength } from '../src/cli/follow.ts';
import { formatCommanderError } from '../src/cli/program.ts';
import { parseResultDocument, parseTruthDocument } from '../src/cli/score.ts';
import { bandFileName, parseSynthArgs } from '../src/cli/synth.ts';
import { decodeImage, encodeGrayPng } from '../src/image/codec.ts';
import { createGray } from '../src/image/gray.ts';
import type { InscriptionTruth } from '../src/synth/types.ts';
import { expectUsageError, inkroute, usage } from './helpers/cli.ts';

describe('parsePoint', () => {
  it('reads X,Y with decimals, signs and spaces', () => {
    expect(parsePoint('12,34')).toEqual({ x: 12, y: 34 });
    expect(parsePoint(' 12.5 , .25 ')).toEqual({ x: 12.5, y: 0.25 });
    expect(parsePoint('-1,2e1')).toEqual({ x: -1, y: 20 });
  });
  it('rejects anything else, naming the option', () => {
    for (const bad of ['', '5', '1,2,3', 'a,b', '1,', ',1', 'Infinity,1', '0x10,1', '1;2', 'NaN,NaN']) {
      expect(usage(() => parsePoint(bad, '--from'))).toBe(`--from must be a point X,Y in pixels, got "${bad}"`);
    }
  });
});

describe('parseRadius', () => {
  it('reads MIN,MAX', () => {
    expect(parseRadius('1,4')).toEqual([1, 4]);
    expect(parseRadius('0.5, 2.5')).toEqual([0.5, 2.5]);
  });
  it('rejects an empty range', () => {
    for (const bad of ['4,1', '2,2', '0,3', '-1,2']) expect(usage(() => parseRadius(bad))).toMatch(/range is empty/);
  });
  it('rejects malformed text', () => {
    expect(usage(() => parseRadius('3'))).toBe('--radius must be MIN,MAX in pixels, got "3"');
  });
});

describe('numbers and choices', () => {
  it('parseSeed takes whole numbers in 32 bits only', () => {
    expect(parseSeed('0')).toBe(0);
    expect(parseSeed('4294967295')).toBe(4294967295);
    for (const bad of ['-1', '1.5', 'abc', '', '4294967296', '1e3']) expect(usage(() => parseSeed(bad))).toMatch(/--seed must be a whole number/);
  });
  it('parseNumber and parseWeight', () => {
    expect(parseNumber('2.5', '--x')).toBe(2.5);
    expect(usage(() => parseNumber('', '--x'))).toBe('--x must be a number, got ""');
    expect(parseWeight('0', '--curvature')).toBe(0);
    expect(usage(() => parseWeight('-0.1', '--curvature'))).toBe('--curvature must be zero or more, got "-0.1"');
  });
  it('choices', () => {
    expect(parseDifficulty('hard')).toBe('hard');
    expect(usage(() => parseDifficulty('extreme'))).toBe('--difficulty must be one of easy, medium, hard, got "extreme"');
    expect(parseBands('2')).toBe(2);
    expect(usage(() => parseBands('3'))).toMatch(/--bands must be one of 1, 2/);
    expect(parsePolarity('light')).toBe('light');
    expect(usage(() => parsePolarity('grey'))).toMatch(/--polarity/);
  });
});

describe('checks', () => {
  it('checkInside accepts points on the pixels and rejects beyond', () => {
    expect(() => checkInside({ x: 0, y: 19.9 }, 20, 20)).not.toThrow();
    expect(usage(() => checkInside({ x: 20, y: 5 }, 20, 20))).toBe('point 20,5 is outside the image (20×20 px)');
    expect(usage(() => checkInside({ x: 30, y: 5 }, 20, 20, '--to'))).toBe('--to 30,5 is outside the image (20×20 px)');
    expect(usage(() => checkInside({ x: 5, y: -0.5 }, 20, 20))).toMatch(/outside the image/);
  });
  it('checkDistinct', () => {
    expect(usage(() => checkDistinct({ x: 3, y: 4 }, { x: 3, y: 4 }))).toBe('--from and --to are the same point (3,4)');
    expect(usage(() => checkDistinct({ x: 3, y: 4 }, { x: 3, y: 4.5 }))).toBe('--from 3,4 and --to 3,4.5 fall on the same pixel');
    expect(() => checkDistinct({ x: 3, y: 4 }, { x: 3, y: 5 })).not.toThrow();
  });
  it('parseFollowArgs gathers anchors, radius, weights and polarity', () => {
    const plan = parseFollowArgs({ from: '1,2', to: '9,8', via: ['4,4', '6,5'], radius: '1,3', widthChange: '0.5', polarity: 'light' });
    expect(plan).toEqual({
      from: { x: 1, y: 2 }, to: { x: 9, y: 8 }, via: [{ x: 4, y: 4 }, { x: 6, y: 5 }],
      radius: [1, 3], weights: { widthChange: 0.5 }, polarity: 'light',
    });
    expect(parseFollowArgs({ from: '1,2', to: '9,8' }).polarity).toBe('dark');
    expect(usage(() => parseFollowArgs({ to: '9,8' }))).toBe('follow needs --from X,Y');
  });
  it('parseSynthArgs needs a seed unless --demo', () => {
    expect(usage(() => parseSynthArgs({ out: 'd' }))).toBe('synth needs --seed N (or --demo)');
    expect(parseSynthArgs({ out: 'd', demo: true }).demo).toBe(true);
    expect(parseSynthArgs({ out: 'd', seed: '3', difficulty: 'easy', bands: '2' })).toMatchObject({ seed: 3, difficulty: 'easy', bands: 2 });
  });
  it('bandFileName keeps names plain', () => {
    expect(bandFileName('visible', 0)).toBe('visible.png');
    expect(bandFileName('Infra Red', 1)).toBe('infra-red.png');
    expect(bandFileName('../', 1)).toBe('band-2.png');
    expect(bandFileName(undefined, 0)).toBe('band-1.png');
  });
  it('formatCommanderError makes one prefixed line', () => {
    expect(formatCommanderError("error: unknown option '--fro'\n(Did you mean --from?)\n"))
      .toBe("inkroute: unknown option '--fro' (Did you mean --from?)\n");
  });
});

describe('result and truth documents', () => {
  const stroke = { samples: [{ x: 1, y: 2, r: 1, support: 1 }, { x: 3, y: 2, r: 1, support: 1 }], restoredSpans: [{ from: 0, to: 1 }], cost: {} };
  it('takes one stroke or a list', () => {
    expect(parseResultDocument(stroke, 'r.json')).toHaveLength(1);
    expect(parseResultDocument({ strokes: [stroke, stroke] }, 'r.json')).toHaveLength(2);
  });
  it('names what is wrong', () => {
    expect(usage(() => parseResultDocument([], 'r.json'))).toMatch(/neither a stroke/);
    expect(usage(() => parseResultDocument({ samples: [] }, 'r.json'))).toBe('r.json has no samples');
    expect(usage(() => parseResultDocument({ samples: [{ x: 1, y: 'a', r: 1 }] }, 'r.json'))).toBe('r.json: sample 0 needs numbers x, y and r');
    expect(usage(() => parseResultDocument({ strokes: [stroke, { ...stroke, restoredSpans: 3 }] }, 'r.json'))).toMatch(/stroke 1: "restoredSpans"/);
    expect(usage(() => parseTruthDocument({ strokes: [] }, 't.json'))).toMatch(/not an inkroute ground truth/);
  });
});

describe('follow summaries', () => {
  it('length, restored share and the summary line', () => {
    const s = {
      samples: [{ x: 0, y: 0, r: 1, support: 1 }, { x: 3, y: 4, r: 2, support: 0 }, { x: 3, y: 10, r: 3, support: 1 }, { x: 3, y: 11, r: 2, support: 1 }],
      restoredSpans: [{ from: 1, to: 1 }],
      cost: { adherence: 1, widthChange: 2, curvature: 3, length: 4, total: 10 },
    };
    expect(strokeLength(s)).toBeCloseTo(12, 12);
    expect(restoredShare(s)).toBe(0.25);
    expect(formatFollowLine(s, 12.4)).toBe('follow: 4 samples, length 12.0 px, mean radius 2.00 px, restored 25 %, cost 10.0, 12 ms');
  });
});

describe('bench loading', () => {
  it('reports a missing benchmark module plainly', async () => {
    await expect(loadBench(new URL('./no-such-bench.ts', import.meta.url))).rejects.toThrow(/benchmark is not in this checkout/);
  });
});

describe('inkroute errors (spawned)', () => {
  let dir: string;
  let png: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'inkroute-cli-'));
    png = join(dir, 'small.png');
    const data = new Float32Array(20 * 20).fill(1);
    for (let x = 3; x < 17; x++) data[10 * 20 + x] = 0;
    writeFileSync(png, encodeGrayPng(createGray(20, 20, data), { pxPerMm: 10 }));
    writeFileSync(join(dir, 'note.txt'), 'not an image\n');
    writeFileSync(join(dir, 'cut.png'), readFileSync(png).subarray(0, 50));
    writeFileSync(join(dir, 'bad.json'), '{ "samples": [');
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('missing file', () => {
    expectUsageError(inkroute('follow', join(dir, 'nope.png'), '--from', '1,1', '--to', '5,5'), /cannot read .*nope\.png: no such file/);
  });
  it('not an image', () => {
    expectUsageError(inkroute('follow', join(dir, 'note.txt'), '--from', '1,1', '--to', '5,5'), /note\.txt: not an image/);
  });
  it('truncated PNG', () => {
    expectUsageError(inkroute('follow', join(dir, 'cut.png'), '--from', '1,1', '--to', '5,5'), /cut\.png: the PNG file is (damaged or )?truncated/);
  });
  it('point outside the image', () => {
    expectUsageError(inkroute('follow', png, '--from', '5,5', '--to', '30,5'), '--to 30,5 is outside the image (20×20 px)');
  });
  it('malformed point', () => {
    expectUsageError(inkroute('follow', png, '--from', '5', '--to', '10,5'), '--from must be a point X,Y in pixels, got "5"');
  });
  it('start equal to end', () => {
    expectUsageError(inkroute('follow', png, '--from', '5,5', '--to', '5,5'), '--from and --to are the same point (5,5)');
  });
  it('empty radius range', () => {
    expectUsageError(inkroute('follow', png, '--from', '3,10', '--to', '16,10', '--radius', '3,1'), /--radius range is empty/);
  });
  it('bad number', () => {
    expectUsageError(inkroute('follow', png, '--from', '3,10', '--to', '16,10', '--curvature', 'lots'), '--curvature must be a number, got "lots"');
    expectUsageError(inkroute('synth', '--seed', 'abc', '--out', join(dir, 'x')), /--seed must be a whole number/);
  });
  it('unknown option and unknown command', () => {
    expectUsageError(inkroute('follow', png, '--from', '3,10', '--to', '16,10', '--bogus'), "unknown option '--bogus'");
    expectUsageError(inkroute('frobnicate'), "unknown command 'frobnicate'");
  });
  it('score with malformed JSON', () => {
    expectUsageError(inkroute('score', join(dir, 'bad.json'), join(dir, 'bad.json')), /bad\.json is not valid JSON/);
  });
});

describe('inkroute synth, score and follow (spawned)', () => {
  let dir: string;
  let truth: InscriptionTruth;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'inkroute-synth-'));
    const r = inkroute('synth', '--seed', '3', '--out', dir, '--difficulty', 'easy');
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('writes the band images, truth, scale and ink mask', () => {
    expect(truth.format).toBe('inkroute-synth-truth');
    expect(truth.seed).toBe(3);
    expect(truth.difficulty).toBe('easy');
    expect(JSON.parse(readFileSync(join(dir, 'scale.json'), 'utf8'))).toEqual({ pxPerMm: truth.pxPerMm });
    expect(truth.bands[0]).toBe('visible');
    for (const name of truth.bands) {
      const img = decodeImage(readFileSync(join(dir, `${name}.png`)));
      expect(img.bitDepth).toBe(8);
      expect(img.bands[0].width).toBe(truth.width);
      expect(img.bands[0].height).toBe(truth.height);
      expect(img.pxPerMm).toBeCloseTo(truth.pxPerMm, 3);
    }
    const mask = decodeImage(readFileSync(join(dir, 'ink-mask.png'))).bands[0].data;
    let black = 0;
    let grey = 0;
    for (let p = 0; p < mask.length; p++) {
      if (mask[p] === 0) black++;
      else if (mask[p] !== 1) grey++;
    }
    expect(grey).toBe(0);
    expect(black).toBeGreaterThan(0);
    expect(black).toBeLessThan(mask.length / 2);
  });

  it('--if-missing leaves an up-to-date folder alone', () => {
    const before = statSync(join(dir, 'truth.json')).mtimeMs;
    const r = inkroute('synth', '--seed', '3', '--out', dir, '--difficulty', 'easy', '--if-missing');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/already holds seed 3, left as is/);
    expect(statSync(join(dir, 'truth.json')).mtimeMs).toBe(before);
  });

  it('score: the truth itself scores zero error', () => {
    const strokes = truth.strokes.map((s) => ({ samples: s.samples.map(({ x, y, r }) => ({ x, y, r, support: 1 })), restoredSpans: s.gaps }));
    const resultPath = join(dir, 'perfect.json');
    writeFileSync(resultPath, JSON.stringify({ strokes }));
    const r = inkroute('score', resultPath, join(dir, 'truth.json'));
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain(`strokes scored: ${truth.strokes.length}`);
    expect(r.stdout).toContain('visible centreline error: mean 0.00 px, p95 0.00 px');
    expect(r.stdout).toContain('strokes leaving for another: 0');
  });

  it('follow: rejects a point outside the synthetic image', () => {
    const r = inkroute('follow', join(dir, 'visible.png'), '--from', '5,5', '--to', `${truth.width + 10},5`);
    expectUsageError(r, /is outside the image/);
  });

  it('follow --json: a stroke from the start to the end of a truth stroke', () => {
    const s = truth.strokes[0].samples;
    const a = s[0];
    const b = s[s.length - 1];
    const r = inkroute('follow', join(dir, 'visible.png'), '--from', `${a.x},${a.y}`, '--to', `${b.x},${b.y}`, '--json');
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out).sort()).toEqual(['cost', 'restoredSpans', 'samples']);
    expect(out.samples.length).toBeGreaterThan(2);
    expect(Math.hypot(out.samples[0].x - a.x, out.samples[0].y - a.y)).toBeLessThan(1.5);
    expect(Number.isFinite(out.cost.total)).toBe(true);
  });

  it('follow: the summary line', () => {
    const s = truth.strokes[0].samples;
    const a = s[0];
    const b = s[s.length - 1];
    const r = inkroute('follow', join(dir, 'visible.png'), '--from', `${a.x},${a.y}`, '--to', `${b.x},${b.y}`);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^follow: \d+ samples, length [\d.]+ px, mean radius [\d.]+ px, restored \d+ %, cost [\d.]+, \d+ ms\n$/);
  });
});
