/**
 * The engine host and its client, in Node: images loaded once and kept apart, solves
 * through the anchors, the preview tree grown in slices and answering between them,
 * cancel, pinned radii, and the client's coalescing and supersede over the loopback port.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_SETTINGS } from '../src/doc/rules.ts';
import type { SolverSettings } from '../src/doc/model.ts';
import { encodeGrayPng } from '../src/image/codec.ts';
import { createGray } from '../src/image/gray.ts';
import { EngineClient } from '../src/worker/client.ts';
import { EngineHost } from '../src/worker/host.ts';
import { createLoopback } from '../src/worker/loopback.ts';
import type { EngineReply, EngineRequest } from '../src/worker/protocol.ts';
import { distToPolyline, renderCoverage, sampleCurve, type PenPoint } from './helpers/render.ts';

const W = 220;
const H = 140;
const settings: SolverSettings = structuredClone(DEFAULT_SETTINGS);

/** An arc from (30, 100) up to (190, 40), pen radius 3 px. */
const arcA = sampleCurve((t) => ({ x: 30 + 160 * t, y: 100 - 60 * t - 30 * Math.sin(Math.PI * t), r: 3 }), 400);
/** A straight stroke low across image B, pen radius 2 px. */
const lineB = sampleCurve((t) => ({ x: 20 + 180 * t, y: 110 - 10 * t, r: 2 }), 400);

/** Dark ink (luma 0.25) on a light ground (0.85). */
function luma(stroke: PenPoint[]): Float32Array {
  const cov = renderCoverage(W, H, [stroke]).data;
  const out = new Float32Array(W * H);
  for (let i = 0; i < out.length; i++) out[i] = 0.85 - 0.6 * cov[i];
  return out;
}

/** Mean distance of a truth centreline's points to the result's polyline, px. */
function meanDistance(truth: PenPoint[], result: { x: number; y: number }[]): number {
  return truth.reduce((sum, p) => sum + distToPolyline(result, p.x, p.y), 0) / truth.length;
}

/** A host whose replies are collected in order. */
function hostWithLog(warmUp = false) {
  const replies: EngineReply[] = [];
  const host = new EngineHost((r) => replies.push(r), { previewExtent: 256, warmUp });
  let id = 100;
  const send = (msg: EngineRequest) => host.handle(msg);
  const load = (imageId: string, stroke: PenPoint[]) => send({ type: 'load-image', id: id++, imageId, width: W, height: H, luma: luma(stroke) });
  const last = () => replies[replies.length - 1];
  /** Ticks until the host has no more work (bounded). */
  const drain = () => {
    for (let i = 0; i < 10_000 && host.busy; i++) host.tick(10);
  };
  return { host, replies, send, load, last, drain };
}

const ends = (s: PenPoint[]) => [{ x: s[0].x, y: s[0].y }, { x: s[s.length - 1].x, y: s[s.length - 1].y }];

describe('EngineHost', () => {
  it('loads an image once and answers with its ink evidence as 8-bit values', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    expect(h.last()).toMatchObject({ type: 'loaded', imageId: 'a' });
    const prep = h.host.prepared('a');
    expect(prep?.evidence.width).toBe(W);
    h.send({ type: 'evidence', id: 1, imageId: 'a' });
    const ev = h.last();
    if (ev.type !== 'evidence') throw new Error(`expected evidence, got ${ev.type}`);
    expect(ev.data).toBeInstanceOf(Uint8ClampedArray);
    expect(ev.data.length).toBe(W * H);
    // On the stroke's centre the evidence is high, far from it low.
    const mid = arcA[200];
    expect(ev.data[Math.floor(mid.y) * W + Math.floor(mid.x)]).toBeGreaterThan(180);
    expect(ev.data[10 * W + 10]).toBeLessThan(40);
    // The prepared ink is the same object for later requests: computed once.
    h.send({ type: 'evidence', id: 2, imageId: 'a' });
    expect(h.host.prepared('a')).toBe(prep);
  });

  it('answers an unknown image with an error, not a crash', () => {
    const h = hostWithLog();
    h.send({ type: 'evidence', id: 7, imageId: 'nope' });
    expect(h.last()).toMatchObject({ type: 'error', id: 7, name: 'NotLoaded' });
    h.send({ type: 'solve', id: 8, jobId: 'j8', imageId: 'nope', anchors: ends(arcA), settings });
    h.drain();
    expect(h.last()).toMatchObject({ type: 'error', id: 8, jobId: 'j8', name: 'NotLoaded' });
  });

  it('solves a stroke through its anchors, in a tick, not on receipt', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    const n = h.replies.length;
    h.send({ type: 'solve', id: 1, jobId: 'j1', imageId: 'a', anchors: ends(arcA), settings });
    expect(h.replies.length).toBe(n);
    expect(h.host.busy).toBe(true);
    h.host.tick(10);
    const r = h.last();
    if (r.type !== 'solved') throw new Error(`expected solved, got ${JSON.stringify(r)}`);
    expect(r.jobId).toBe('j1');
    expect(r.ms).toBeGreaterThan(0);
    const s = r.stroke.samples;
    expect(s[0]).toMatchObject({ x: arcA[0].x, y: arcA[0].y });
    expect(s[s.length - 1]).toMatchObject({ x: arcA[400].x, y: arcA[400].y });
    expect(meanDistance(arcA, s)).toBeLessThan(0.5);
    const meanR = s.reduce((a, p) => a + p.r, 0) / s.length;
    expect(Math.abs(meanR - 3)).toBeLessThan(0.5);
    expect(r.stroke.restoredSpans).toEqual([]);
    expect(r.stroke.cost.total).toBeGreaterThan(0);
  });

  it('reports a solve the solver cannot take as a FollowError', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    h.send({ type: 'solve', id: 3, jobId: 'j3', imageId: 'a', anchors: [{ x: 10, y: 10 }, { x: 10.2, y: 10.3 }], settings });
    h.drain();
    expect(h.last()).toMatchObject({ type: 'error', jobId: 'j3', name: 'FollowError' });
  });

  it('grows the preview in slices and answers a path request between them', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    const start = ends(arcA)[0];
    const end = ends(arcA)[1];
    h.send({ type: 'preview-start', previewId: 1, imageId: 'a', start, settings });
    expect(h.host.busy).toBe(true);
    const n = h.replies.length;
    // Asked before the tree has grown: the request waits…
    h.send({ type: 'preview-path', id: 11, previewId: 1, to: end });
    expect(h.replies.length).toBe(n);
    let slices = 0;
    while (h.replies.length === n && slices < 1000) {
      h.host.tick(2);
      slices++;
    }
    // …and is answered after some slices, before the tree is complete.
    expect(slices).toBeGreaterThan(1);
    const r = h.last();
    if (r.type !== 'preview-path') throw new Error(`expected a path, got ${r.type}`);
    expect(r.id).toBe(11);
    const path = r.path!;
    expect(path.length).toBeGreaterThan(100);
    expect(Math.hypot(path[path.length - 1].x - end.x, path[path.length - 1].y - end.y)).toBeLessThan(1);
    expect(meanDistance(arcA.slice(20, 380), path)).toBeLessThan(1.5);
    // Once the tree covers a point, the answer comes at once.
    h.send({ type: 'preview-path', id: 12, previewId: 1, to: arcA[100] });
    expect(h.last()).toMatchObject({ type: 'preview-path', id: 12 });
    expect((h.last() as { path?: unknown[] }).path?.length).toBeGreaterThan(10);
  });

  it('answers with no path outside the tree, for an older preview, and after stop', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    h.send({ type: 'preview-start', previewId: 1, imageId: 'a', start: { x: 30, y: 100 }, settings });
    h.send({ type: 'preview-path', id: 1, previewId: 1, to: { x: 1000, y: 5 } });
    expect(h.last()).toMatchObject({ type: 'preview-path', id: 1, path: undefined });
    h.send({ type: 'preview-path', id: 2, previewId: 1, to: { x: 190, y: 40 } });
    // A new preview answers the waiting request of the old one with no path.
    h.send({ type: 'preview-start', previewId: 2, imageId: 'a', start: { x: 190, y: 40 }, settings });
    expect(h.last()).toMatchObject({ type: 'preview-path', id: 2, path: undefined });
    h.send({ type: 'preview-path', id: 3, previewId: 1, to: { x: 100, y: 60 } });
    expect(h.last()).toMatchObject({ type: 'preview-path', id: 3, path: undefined });
    h.send({ type: 'preview-stop', previewId: 2 });
    expect(h.host.busy).toBe(false);
    h.send({ type: 'preview-path', id: 4, previewId: 2, to: { x: 100, y: 60 } });
    expect(h.last()).toMatchObject({ type: 'preview-path', id: 4, path: undefined });
  });

  it('cancels a queued solve: it answers Cancelled and never runs', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    h.send({ type: 'solve', id: 1, jobId: 'j1', imageId: 'a', anchors: ends(arcA), settings });
    h.send({ type: 'solve', id: 2, jobId: 'j2', imageId: 'a', anchors: ends(arcA), settings });
    h.send({ type: 'cancel', jobId: 'j1' });
    expect(h.last()).toMatchObject({ type: 'error', id: 1, jobId: 'j1', name: 'Cancelled' });
    h.drain();
    const solved = h.replies.filter((r) => r.type === 'solved');
    expect(solved.map((r) => (r as { jobId: string }).jobId)).toEqual(['j2']);
    // Cancelling what is gone already is harmless.
    h.send({ type: 'cancel', jobId: 'j2' });
    expect(h.replies.filter((r) => r.type === 'error')).toHaveLength(1);
  });

  it('warms the solver up on a new image only when nothing else waits', () => {
    const h = hostWithLog(true);
    h.load('a', arcA);
    expect(h.host.busy).toBe(true);
    h.send({ type: 'solve', id: 1, jobId: 'j1', imageId: 'a', anchors: ends(arcA), settings });
    // The first tick serves the person's solve; the warm-up comes after, and answers nothing.
    h.host.tick(10);
    expect(h.last()).toMatchObject({ type: 'solved', jobId: 'j1' });
    const n = h.replies.length;
    expect(h.host.busy).toBe(true);
    h.drain();
    expect(h.host.busy).toBe(false);
    expect(h.replies.length).toBe(n);
  });

  it('keeps a second image separately', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    const prepA = h.host.prepared('a');
    h.load('b', lineB);
    expect(h.host.imageIds.sort()).toEqual(['a', 'b']);
    expect(h.host.prepared('a')).toBe(prepA);
    h.send({ type: 'solve', id: 1, jobId: 'jb', imageId: 'b', anchors: ends(lineB), settings });
    h.send({ type: 'solve', id: 2, jobId: 'ja', imageId: 'a', anchors: ends(arcA), settings });
    h.drain();
    const byJob = new Map(h.replies.filter((r) => r.type === 'solved').map((r) => [(r as { jobId: string }).jobId, r]));
    const sb = (byJob.get('jb') as { stroke: { samples: PenPoint[] } }).stroke.samples;
    const sa = (byJob.get('ja') as { stroke: { samples: PenPoint[] } }).stroke.samples;
    expect(meanDistance(lineB, sb)).toBeLessThan(0.5);
    expect(meanDistance(arcA, sa)).toBeLessThan(0.5);
    expect(Math.abs(sb.reduce((a, p) => a + p.r, 0) / sb.length - 2)).toBeLessThan(0.5);
  });

  it('holds pinned radii exactly at their anchors and measures the width elsewhere', () => {
    const h = hostWithLog();
    h.load('a', arcA);
    const [a, b] = ends(arcA);
    h.send({ type: 'solve', id: 1, jobId: 'all', imageId: 'a', anchors: [{ ...a, r: 4.5 }, { ...b, r: 4.5 }], settings });
    h.send({ type: 'solve', id: 2, jobId: 'one', imageId: 'a', anchors: [{ ...a, r: 2 }, b], settings });
    h.drain();
    const get = (job: string) => (h.replies.find((r) => r.type === 'solved' && r.jobId === job) as { stroke: { samples: PenPoint[] } }).stroke.samples;
    const all = get('all');
    expect(all[0].r).toBe(4.5);
    expect(all[all.length - 1].r).toBe(4.5);
    const one = get('one');
    expect(one[0].r).toBe(2);
    // Away from the pin the pen takes the stroke's own width again.
    const middle = one.slice(Math.floor(one.length / 3), Math.floor((2 * one.length) / 3));
    const meanR = middle.reduce((t, s) => t + s.r, 0) / middle.length;
    const trueR = arcA.reduce((t, p) => t + p.r, 0) / arcA.length;
    expect(Math.abs(meanR - trueR)).toBeLessThan(0.5);
    expect(meanDistance(arcA, one)).toBeLessThan(0.7);
  });
});

describe('EngineClient over the loopback port', () => {
  async function loaded() {
    const { port } = createLoopback();
    const client = new EngineClient(port);
    await client.loadImage('a', W, H, luma(arcA));
    return client;
  }

  it('decodes an image file itself: the same evidence as from the luma, and a clear error for a broken file', async () => {
    const { port } = createLoopback();
    const client = new EngineClient(port);
    // 16-bit grey PNG of the luma: the decoder gives back the same values to 1/65535.
    const l = luma(arcA);
    const png = encodeGrayPng(createGray(W, H, l), { depth: 16 });
    await client.loadImageFile('file', png);
    await client.loadImage('luma', W, H, l);
    const [a, b] = await Promise.all([client.evidence('file'), client.evidence('luma')]);
    let worst = 0;
    for (let i = 0; i < a.data.length; i++) worst = Math.max(worst, Math.abs(a.data[i] - b.data[i]));
    expect(worst).toBeLessThanOrEqual(1);
    expect(png.length).toBeGreaterThan(100); // the caller's bytes are kept (a copy travelled)
    await expect(client.loadImageFile('bad', png.slice(0, 60))).rejects.toThrow(/PNG|image|truncated|decode/i);
    await expect(client.loadImageFile('band', png, 1)).rejects.toThrow('the image has 1 band(s), not a band 2.');
    // A probe decodes to check and reads the header figures, keeping nothing.
    const tagged = encodeGrayPng(createGray(W, H, l), { pxPerMm: 12.5 });
    expect(await client.probeImageFile(tagged)).toEqual({ format: 'png', width: W, height: H, bands: 1, bitDepth: 8, pxPerMm: 12.5 });
    await expect(client.probeImageFile(new Uint8Array([1, 2, 3, 4]))).rejects.toThrow('not an image: the file is neither PNG nor JPEG.');
    await expect(client.probeImageFile(tagged.slice(0, 80))).rejects.toThrow(/truncated/);
    // The probe's decode serves the load of the same file only: another file is decoded afresh.
    const other = encodeGrayPng(createGray(W, H, luma(lineB)));
    await client.probeImageFile(tagged);
    await client.loadImageFile('other', other);
    await client.loadImageFile('line', other);
    const [o, line] = await Promise.all([client.evidence('other'), client.evidence('line')]);
    expect(o.data).toEqual(line.data);
    expect(o.data).not.toEqual(a.data);
    await client.loadImageFile('tagged-alone', tagged);
    await client.probeImageFile(tagged);
    await client.loadImageFile('tagged', tagged);
    expect((await client.evidence('tagged')).data).toEqual((await client.evidence('tagged-alone')).data);
    client.dispose();
  });

  it('is asynchronous and answers load, evidence and solve', async () => {
    const client = await loaded();
    const ev = await client.evidence('a');
    expect(ev.width).toBe(W);
    const { stroke, ms } = await client.solve('a', ends(arcA), settings);
    expect(ms).toBeGreaterThan(0);
    expect(meanDistance(arcA, stroke.samples)).toBeLessThan(0.5);
    client.dispose();
  });

  it('coalesces preview paths: one in flight, the newest pending, the replaced ones undefined', async () => {
    const client = await loaded();
    const [start, end] = ends(arcA);
    expect(await client.previewTo(end)).toBeUndefined(); // no preview yet
    client.startPreview('a', start, settings);
    const first = client.previewTo(end);
    const second = client.previewTo(arcA[300]);
    const third = client.previewTo(arcA[200]);
    const [p1, p2, p3] = await Promise.all([first, second, third]);
    expect(p1?.length).toBeGreaterThan(100);
    expect(p2).toBeUndefined();
    const last = p3![p3!.length - 1];
    expect(Math.hypot(last.x - arcA[200].x, last.y - arcA[200].y)).toBeLessThan(1);
    // Stopping resolves what is outstanding with no path.
    const late = client.previewTo(arcA[250]);
    client.stopPreview();
    expect(await late).toBeUndefined();
    expect(await client.previewTo(arcA[250])).toBeUndefined();
    client.dispose();
  });

  it('drops the answers of a restarted preview', async () => {
    const client = await loaded();
    const [start, end] = ends(arcA);
    client.startPreview('a', start, settings);
    const old = client.previewTo(end);
    client.startPreview('a', end, settings);
    expect(await old).toBeUndefined();
    const fresh = await client.previewTo(start);
    expect(Math.hypot(fresh![0].x - end.x, fresh![0].y - end.y)).toBeLessThan(1);
    client.dispose();
  });

  it('supersedes a solve by key: the older rejects as Superseded, the newer resolves', async () => {
    const client = await loaded();
    const [a, b] = ends(arcA);
    const older = client.solve('a', [a, arcA[150], b], settings, 'stroke-1');
    const newer = client.solve('a', [a, b], settings, 'stroke-1');
    const other = client.solve('a', [a, arcA[200]], settings, 'stroke-2');
    await expect(older).rejects.toMatchObject({ name: 'Superseded' });
    const r = await newer;
    expect(r.stroke.samples.length).toBeGreaterThan(100);
    expect((await other).stroke.samples.length).toBeGreaterThan(50);
    // A solve the solver refuses rejects with its error.
    await expect(client.solve('a', [a, a], settings)).rejects.toMatchObject({ name: 'FollowError' });
    client.dispose();
    await expect(client.solve('a', [a, b], settings)).rejects.toMatchObject({ name: 'Closed' });
  });
});
