/**
 * The engine's side of the protocol: holds, per image, the ink evidence and the solver's
 * preparation (computed once when the image is loaded), answers requests, and does the
 * long work (exact solves, growing the preview tree) in time slices through `tick`, so
 * that preview paths are answered between slices. Pure TypeScript with no DOM: the
 * worker runs it, and so do Node tests and the in-process engine.
 */
import type { Anchor, SolverSettings } from '../doc/model.ts';
import { crc32, decodeImage, type DecodedImage } from '../image/codec.ts';

/** Names a file's bytes: its length and CRC-32 (far cheaper than decoding it again). */
function fileKey(bytes: Uint8Array): string {
  return `${bytes.length}:${crc32(bytes)}`;
}
import { createGray, type GrayImage } from '../image/gray.ts';
import { inkEvidence } from '../ink/index.ts';
import { followStroke, prepareInk, startPreview, type PreparedInk, type PreviewTree, type Stroke, type StrokeSample } from '../trace/index.ts';
import type {
  EngineReply, EngineRequest, ImageProbe, LoadFileRequest, LoadImageRequest, PostReply, PreviewPathRequest, SolveRequest,
} from './protocol.ts';

export interface EngineHostOptions {
  /**
   * Half-size of the square the preview tree covers around its start, px. Default 200
   * (the solver's own: 400 × 400 px, about 30 MB of search state per tree).
   */
  previewExtent?: number;
  /**
   * Run two throw-away solves on each new image when idle, so that the person's first
   * stroke does not pay for compiling the solver (it took 2–4× longer cold). Default true.
   */
  warmUp?: boolean;
}


interface ActivePreview {
  previewId: number;
  /** Undefined when the image was not loaded: every path request then gets no path. */
  tree: PreviewTree | undefined;
}

export class EngineHost {
  private readonly images = new Map<string, PreparedInk>();
  private preview: ActivePreview | undefined;
  /** The one path request waiting for the tree to reach its pixel. */
  private waiting: PreviewPathRequest | undefined;
  private readonly solves: SolveRequest[] = [];
  /** Images whose warm-up solves are still to run. */
  private readonly cold: string[] = [];
  private readonly previewExtent: number;
  private readonly warmUp: boolean;

  constructor(private readonly post: PostReply, options: EngineHostOptions = {}) {
    this.previewExtent = options.previewExtent ?? 200;
    this.warmUp = options.warmUp ?? true;
  }

  /** Whether `tick` has work: a queued solve, a preview tree still growing, a warm-up. */
  get busy(): boolean {
    return this.solves.length > 0 || this.growing || this.cold.length > 0;
  }

  /** Ids of the images held. */
  get imageIds(): string[] {
    return [...this.images.keys()];
  }

  /** The prepared ink of an image (tests and the benchmark read it). */
  prepared(imageId: string): PreparedInk | undefined {
    return this.images.get(imageId);
  }

  private get growing(): boolean {
    const t = this.preview?.tree;
    return t !== undefined && !t.complete;
  }

  handle(msg: EngineRequest): void {
    switch (msg.type) {
      case 'load-image':
        this.loadImage(msg);
        return;
      case 'load-file':
        this.loadFile(msg);
        return;
      case 'probe-file':
        try {
          const d = decodeImage(msg.bytes);
          // The file is usually loaded right after it is checked: keep its decode for that.
          this.probed = { key: fileKey(msg.bytes), decoded: d };
          const probe: ImageProbe = { format: d.format, width: d.bands[0].width, height: d.bands[0].height, bands: d.bands.length, bitDepth: d.bitDepth };
          if (d.pxPerMm !== undefined) probe.pxPerMm = d.pxPerMm;
          this.send({ type: 'probed', id: msg.id, ...probe }, []);
        } catch (e) {
          this.fail(msg.id, undefined, (e as Error).name, (e as Error).message);
        }
        return;
      case 'evidence': {
        const prep = this.images.get(msg.imageId);
        if (!prep) {
          this.fail(msg.id, undefined, 'NotLoaded', `the image ${msg.imageId} is not loaded.`);
          return;
        }
        const ev = prep.evidence;
        // Uint8ClampedArray rounds and clamps on assignment: no per-pixel branches.
        const data = new Uint8ClampedArray(ev.width * ev.height);
        for (let i = 0; i < data.length; i++) data[i] = ev.data[i] * 255;
        this.send({ type: 'evidence', id: msg.id, imageId: msg.imageId, width: ev.width, height: ev.height, data }, [data.buffer]);
        return;
      }
      case 'preview-start': {
        this.dropPreview();
        const prep = this.images.get(msg.imageId);
        const tree = prep
          ? startPreview(prep, msg.start, { extent: this.previewExtent, radius: msg.settings.radius, weights: msg.settings.weights })
          : undefined;
        this.preview = { previewId: msg.previewId, tree };
        return;
      }
      case 'preview-path':
        this.answerPath(msg);
        return;
      case 'preview-stop':
        if (this.preview?.previewId === msg.previewId) this.dropPreview();
        return;
      case 'solve':
        this.solves.push(msg);
        return;
      case 'cancel': {
        const i = this.solves.findIndex((s) => s.jobId === msg.jobId);
        if (i >= 0) {
          const [s] = this.solves.splice(i, 1);
          this.fail(s.id, s.jobId, 'Cancelled', 'the solve was cancelled.');
        }
        return;
      }
    }
  }

  /**
   * Does up to about `budgetMs` of work: one queued solve (solves come first: the person
   * waits for them), then growth of the preview tree, answering a waiting path request
   * as soon as the tree reaches it. Returns whether work remains.
   */
  tick(budgetMs: number): boolean {
    const t0 = performance.now();
    const next = this.solves.shift();
    if (next) this.runSolve(next);
    const left = budgetMs - (performance.now() - t0);
    const tree = this.preview?.tree;
    if (tree && !tree.complete && (left > 0 || !next)) {
      tree.grow(Math.max(1, left));
      if (this.waiting) this.answerPath(this.waiting);
    } else if (!next && !this.growing && this.cold.length > 0) {
      // Only when there is nothing else to do: a warm-up never delays a person's request.
      const prep = this.images.get(this.cold.shift()!);
      if (prep) warmUpSolver(prep);
    }
    return this.busy;
  }

  /** Drops everything: images, the preview, queued solves (unanswered). */
  dispose(): void {
    this.dropPreview();
    this.solves.length = 0;
    this.cold.length = 0;
    this.images.clear();
    this.probed = undefined;
  }

  private loadImage(msg: LoadImageRequest): void {
    this.prepareImage(msg.id, msg.imageId, () => createGray(msg.width, msg.height, msg.luma));
  }

  /** The last file checked by 'probe-file', decoded, until a 'load-file' takes it. */
  private probed: { key: string; decoded: DecodedImage } | undefined;

  private loadFile(msg: LoadFileRequest): void {
    this.prepareImage(msg.id, msg.imageId, () => {
      const key = fileKey(msg.bytes);
      const decoded = this.probed?.key === key ? this.probed.decoded : decodeImage(msg.bytes);
      this.probed = undefined;
      const band = msg.band ?? 0;
      const gray = decoded.bands[band];
      if (!gray) throw new RangeError(`the image has ${decoded.bands.length} band(s), not a band ${band + 1}.`);
      return gray;
    });
  }

  private prepareImage(id: number, imageId: string, source: () => GrayImage): void {
    const msg = { id, imageId };
    try {
      const t0 = performance.now();
      const gray = source();
      const prep = prepareInk(inkEvidence(gray), gray);
      // A reloaded image invalidates a preview grown on the old one.
      if (this.images.has(msg.imageId)) this.dropPreview();
      this.images.set(msg.imageId, prep);
      if (this.warmUp && !this.cold.includes(msg.imageId)) this.cold.push(msg.imageId);
      this.send({ type: 'loaded', id: msg.id, imageId: msg.imageId, ms: performance.now() - t0 }, []);
    } catch (e) {
      this.fail(msg.id, undefined, (e as Error).name, (e as Error).message);
    }
  }

  private answerPath(msg: PreviewPathRequest): void {
    const p = this.preview;
    if (this.waiting && this.waiting !== msg) {
      // Only one request waits; an older one is answered with no path.
      this.sendPath(this.waiting, undefined);
      this.waiting = undefined;
    }
    if (!p || p.previewId !== msg.previewId || !p.tree) {
      this.waiting = undefined;
      this.sendPath(msg, undefined);
      return;
    }
    const t = p.tree;
    const path = t.pathTo(msg.to.x, msg.to.y);
    const outside = msg.to.x < t.x0 || msg.to.y < t.y0 || msg.to.x >= t.x0 + t.w || msg.to.y >= t.y0 + t.h;
    if (path || outside || t.complete) {
      this.waiting = undefined;
      this.sendPath(msg, path);
    } else {
      this.waiting = msg;
    }
  }

  private sendPath(msg: PreviewPathRequest, path: StrokeSample[] | undefined): void {
    this.send({ type: 'preview-path', id: msg.id, previewId: msg.previewId, path }, []);
  }

  private dropPreview(): void {
    this.preview?.tree?.cancel();
    this.preview = undefined;
    if (this.waiting) {
      const w = this.waiting;
      this.waiting = undefined;
      this.sendPath(w, undefined);
    }
  }

  private runSolve(msg: SolveRequest): void {
    const prep = this.images.get(msg.imageId);
    if (!prep) {
      this.fail(msg.id, msg.jobId, 'NotLoaded', `the image ${msg.imageId} is not loaded.`);
      return;
    }
    try {
      const t0 = performance.now();
      const stroke = solveWithPins(prep, msg.anchors, msg.settings);
      this.send({ type: 'solved', id: msg.id, jobId: msg.jobId, stroke, ms: performance.now() - t0 }, []);
    } catch (e) {
      this.fail(msg.id, msg.jobId, (e as Error).name, (e as Error).message);
    }
  }

  private fail(id: number, jobId: string | undefined, name: string, message: string): void {
    this.send({ type: 'error', id, jobId, name, message }, []);
  }

  private send(reply: EngineReply, transfer: ArrayBuffer[]): void {
    this.post(reply, transfer);
  }
}

/** The exact solve; pinned radii (Anchor.r) are held exactly at their anchors by the solver. */
export function solveWithPins(prep: PreparedInk, anchors: Anchor[], settings: SolverSettings): Stroke {
  const [lo, hi] = settings.radius;
  const points = anchors.map((a) => (a.r === undefined ? { x: a.x, y: a.y } : { x: a.x, y: a.y, r: Math.max(lo, Math.min(hi, a.r)) }));
  const s = followStroke(prep, { anchors: points, radius: settings.radius, weights: settings.weights });
  return { samples: s.samples, restoredSpans: s.restoredSpans, cost: s.cost };
}

/** Two short solves across the middle of the image, their results dropped. */
function warmUpSolver(prep: PreparedInk): void {
  const { width: w, height: h } = prep.evidence;
  if (w < 40 || h < 40) return;
  const cx = w / 2;
  const cy = h / 2;
  const d = Math.min(60, w / 3, h / 3);
  for (const anchors of [[{ x: cx - d, y: cy }, { x: cx + d, y: cy }], [{ x: cx - d, y: cy - d }, { x: cx + d, y: cy + d }]]) {
    try {
      followStroke(prep, { anchors });
    } catch {
      // A warm-up that finds no path has still compiled what it ran.
    }
  }
}

