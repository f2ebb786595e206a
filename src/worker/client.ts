/**
 * The editor's side of the protocol, over any message port: the Web Worker in the page,
 * an in-process EngineHost in Node tests. Both engines use this one client, so they
 * behave the same: every call is asynchronous, preview paths are coalesced, and a solve
 * with a key supersedes the previous solve with that key.
 *
 * It has the shape of app/engine/bridge.ts's EngineBridge (src/ cannot import app/; the
 * app checks the fit where it builds the bridge).
 */
import type { Anchor, SolverSettings } from '../doc/model.ts';
import type { Point, Stroke, StrokeSample } from '../trace/types.ts';
import type { EngineReply, EngineRequest, ImageProbe } from './protocol.ts';

/** A two-way message channel to an EngineHost. */
export interface EnginePort {
  post(msg: EngineRequest, transfer: ArrayBuffer[]): void;
  /** Called once, with the function that takes every reply. */
  listen(onReply: (reply: EngineReply) => void): void;
  close(): void;
}

/** The error a superseded or cancelled solve rejects with; `name` tells which. */
export class EngineCallError extends Error {
  constructor(name: string, message: string) {
    super(message);
    this.name = name;
  }
}

interface Call {
  resolve(reply: EngineReply): void;
  reject(e: Error): void;
}

type PathResolve = (path: StrokeSample[] | undefined) => void;

export class EngineClient {
  private nextId = 1;
  private readonly calls = new Map<number, Call>();
  /** The solve currently standing for each key: its request id and job id. */
  private readonly keyed = new Map<string, { id: number; jobId: string }>();
  private previewId = 0;
  private previewOn = false;
  /** The one path request sent and not answered yet. */
  private inFlight: { id: number; resolve: PathResolve } | undefined;
  /** The newest path request waiting for the one in flight. */
  private pending: { to: Point; resolve: PathResolve } | undefined;
  private closed = false;

  constructor(private readonly port: EnginePort) {
    port.listen((r) => this.onReply(r));
  }

  /** Hands one band's luma (0..1) to the engine. The array's buffer is transferred (emptied here) when the port transfers. */
  loadImage(imageId: string, width: number, height: number, data: Float32Array): Promise<void> {
    const whole = data.byteOffset === 0 && data.byteLength === data.buffer.byteLength && data.buffer instanceof ArrayBuffer;
    const luma = whole ? data : data.slice();
    return this.call({ type: 'load-image', id: 0, imageId, width, height, luma }, [luma.buffer as ArrayBuffer]).then(() => undefined);
  }

  /**
   * Hands an image file (PNG or JPEG) to the engine, which decodes band `band` (default 0)
   * itself, off the page's thread. A copy of the bytes travels, so the caller keeps its own.
   */
  loadImageFile(imageId: string, bytes: Uint8Array, band = 0): Promise<void> {
    const copy = bytes.slice();
    return this.call({ type: 'load-file', id: 0, imageId, bytes: copy, band }, [copy.buffer as ArrayBuffer]).then(() => undefined);
  }

  /** Decodes an image file in the engine to check it and read its figures; a bad file rejects with the decoder's message. */
  probeImageFile(bytes: Uint8Array): Promise<ImageProbe> {
    const copy = bytes.slice();
    return this.call({ type: 'probe-file', id: 0, bytes: copy }, [copy.buffer as ArrayBuffer]).then((r) => {
      if (r.type !== 'probed') throw new Error(`internal: answer ${r.type} to a probe request`);
      const { type: _t, id: _i, ...probe } = r;
      return probe;
    });
  }

  evidence(imageId: string): Promise<{ width: number; height: number; data: Uint8ClampedArray }> {
    return this.call({ type: 'evidence', id: 0, imageId }, []).then((r) => {
      if (r.type !== 'evidence') throw new Error(`internal: answer ${r.type} to an evidence request`);
      return { width: r.width, height: r.height, data: r.data };
    });
  }

  startPreview(imageId: string, start: Point, settings: SolverSettings): void {
    this.endPaths();
    this.previewId++;
    this.previewOn = true;
    this.send({ type: 'preview-start', previewId: this.previewId, imageId, start: { x: start.x, y: start.y }, settings: plainSettings(settings) }, []);
  }

  /**
   * The preview path to `to`. At most one request is in flight; a call made meanwhile
   * waits as the newest pending one, and the pending call it replaces resolves undefined.
   * The request in flight is answered with its own path. Without a preview: undefined.
   */
  previewTo(to: Point): Promise<StrokeSample[] | undefined> {
    if (!this.previewOn || this.closed) return Promise.resolve(undefined);
    return new Promise((resolve) => {
      if (this.inFlight) {
        this.pending?.resolve(undefined);
        this.pending = { to: { x: to.x, y: to.y }, resolve };
        return;
      }
      this.sendPath({ x: to.x, y: to.y }, resolve);
    });
  }

  stopPreview(): void {
    if (!this.previewOn) return;
    this.endPaths();
    this.previewOn = false;
    this.send({ type: 'preview-stop', previewId: this.previewId }, []);
  }

  /** The exact solve; a newer solve with the same key rejects this one with an error named 'Superseded'. */
  solve(imageId: string, anchors: Anchor[], settings: SolverSettings, key?: string): Promise<{ stroke: Stroke; ms: number }> {
    const id = this.nextId;
    const jobId = `job${id}`;
    if (key !== undefined) {
      const old = this.keyed.get(key);
      if (old) {
        const call = this.calls.get(old.id);
        this.calls.delete(old.id);
        call?.reject(new EngineCallError('Superseded', 'a newer solve of the same stroke replaced this one.'));
        this.send({ type: 'cancel', jobId: old.jobId }, []);
      }
      this.keyed.set(key, { id, jobId });
    }
    const plain = anchors.map((a) => (a.r === undefined ? { x: a.x, y: a.y } : { x: a.x, y: a.y, r: a.r }));
    const done = this.call({ type: 'solve', id: 0, jobId, imageId, anchors: plain, settings: plainSettings(settings) }, []);
    const forget = (): void => {
      if (key !== undefined && this.keyed.get(key)?.id === id) this.keyed.delete(key);
    };
    return done.then((r) => {
      forget();
      if (r.type !== 'solved') throw new Error(`internal: answer ${r.type} to a solve`);
      return { stroke: r.stroke, ms: r.ms };
    }, (e: Error) => {
      forget();
      throw e;
    });
  }

  dispose(): void {
    if (this.closed) return;
    this.endPaths();
    this.previewOn = false;
    this.closed = true;
    for (const c of this.calls.values()) c.reject(new EngineCallError('Closed', 'the engine was closed.'));
    this.calls.clear();
    this.keyed.clear();
    this.port.close();
  }

  private call(msg: EngineRequest & { id: number }, transfer: ArrayBuffer[]): Promise<EngineReply> {
    if (this.closed) return Promise.reject(new EngineCallError('Closed', 'the engine was closed.'));
    const id = this.nextId++;
    msg.id = id;
    return new Promise((resolve, reject) => {
      this.calls.set(id, { resolve, reject });
      this.send(msg, transfer);
    });
  }

  private sendPath(to: Point, resolve: PathResolve): void {
    const id = this.nextId++;
    this.inFlight = { id, resolve };
    this.send({ type: 'preview-path', id, previewId: this.previewId, to }, []);
  }

  /** Resolves the path requests of the current preview with no path; late answers are then dropped. */
  private endPaths(): void {
    this.inFlight?.resolve(undefined);
    this.inFlight = undefined;
    this.pending?.resolve(undefined);
    this.pending = undefined;
  }

  private send(msg: EngineRequest, transfer: ArrayBuffer[]): void {
    if (!this.closed) this.port.post(msg, transfer);
  }

  private onReply(r: EngineReply): void {
    if (this.closed) return;
    if (r.type === 'preview-path') {
      // An answer to a request no longer in flight (a restarted or stopped preview) is stale.
      if (!this.inFlight || this.inFlight.id !== r.id) return;
      const { resolve } = this.inFlight;
      this.inFlight = undefined;
      resolve(r.previewId === this.previewId ? r.path : undefined);
      const next = this.pending;
      this.pending = undefined;
      if (next && this.previewOn) this.sendPath(next.to, next.resolve);
      else next?.resolve(undefined);
      return;
    }
    const call = this.calls.get(r.id);
    // Superseded solves were forgotten here already: their answers are dropped.
    if (!call) return;
    this.calls.delete(r.id);
    if (r.type === 'error') call.reject(new EngineCallError(r.name, r.message));
    else call.resolve(r);
  }
}

/** Settings as plain data (a store object may carry more than the protocol needs). */
function plainSettings(s: SolverSettings): SolverSettings {
  return { weights: { ...s.weights }, radius: [s.radius[0], s.radius[1]] };
}
