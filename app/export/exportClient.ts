/**
 * The page's side of the export worker: one job at a time, in order; `cancel()` ends the
 * worker (exportFiles cannot be interrupted otherwise) and rejects what was pending with
 * ExportCancelled. The next job starts a fresh worker and sends it the images again.
 */
import type { Project } from '../../src/doc/model.ts';
import type { ExportOptions } from '../../src/export/exportFiles.ts';
import { ExportError, type ExportKind, type FacsimileOptions } from '../../src/export/types.ts';
import type { ExportReply, ExportRequest } from './protocol.ts';

/** The job was cancelled by the person (or superseded); nothing to report. */
export class ExportCancelled extends Error {
  override name = 'ExportCancelled';
}

type Pending = { resolve(reply: ExportReply): void; reject(e: Error): void };

export class ExportClient {
  private worker: Worker | undefined;
  /** The image map the current worker holds (by identity: the store replaces it on load). */
  private sentImages: Map<string, Uint8Array> | undefined;
  private pending = new Map<number, Pending>();
  private nextId = 1;

  private ensureWorker(images: Map<string, Uint8Array>): Worker {
    if (!this.worker) {
      const w = new Worker(new URL('./export.worker.ts', import.meta.url), { type: 'module', name: 'inkroute-export' });
      w.onmessage = (e: MessageEvent<ExportReply>) => {
        const p = this.pending.get(e.data.id);
        if (!p) return;
        this.pending.delete(e.data.id);
        p.resolve(e.data);
      };
      w.onerror = (e) => {
        e.preventDefault();
        this.fail(new Error(`the export worker failed (${e.message || 'it could not start'}).`));
      };
      this.worker = w;
      this.sentImages = undefined;
    }
    if (this.sentImages !== images) {
      // Copied, not transferred: the store keeps its bytes.
      this.post({ type: 'images', images });
      this.sentImages = images;
    }
    return this.worker;
  }

  private post(req: ExportRequest): void {
    this.worker!.postMessage(req);
  }

  private fail(e: Error): void {
    this.worker?.terminate();
    this.worker = undefined;
    this.sentImages = undefined;
    const all = [...this.pending.values()];
    this.pending.clear();
    for (const p of all) p.reject(e);
  }

  private request(images: Map<string, Uint8Array>, make: (id: number) => ExportRequest): Promise<ExportReply> {
    this.ensureWorker(images);
    const id = this.nextId++;
    const reply = new Promise<ExportReply>((resolve, reject) => this.pending.set(id, { resolve, reject }));
    this.post(make(id));
    return reply.then((r) => {
      if (r.type !== 'error') return r;
      throw r.exportError ? new ExportError(r.message) : new Error(r.message);
    });
  }

  /** The files of `kinds` by file name (EXPORT_FILES). Rejects with ExportError on bad input. */
  async files(
    project: Project, images: Map<string, Uint8Array>, surfaceId: string | undefined,
    kinds: ExportKind[], options: ExportOptions,
  ): Promise<Map<string, Uint8Array>> {
    const r = await this.request(images, (id) => ({ type: 'files', id, project, surfaceId, kinds, options }));
    if (r.type !== 'files') throw new Error('internal: the export worker answered out of turn.');
    return new Map(r.files);
  }

  /** facsimile.svg as text, for the preview. */
  async preview(project: Project, images: Map<string, Uint8Array>, surfaceId: string | undefined, options: FacsimileOptions): Promise<string> {
    const r = await this.request(images, (id) => ({ type: 'preview', id, project, surfaceId, options }));
    if (r.type !== 'preview') throw new Error('internal: the export worker answered out of turn.');
    return r.svg;
  }

  /** True while a job is pending. */
  get busy(): boolean {
    return this.pending.size > 0;
  }

  /** Ends whatever is running; pending jobs reject with ExportCancelled. An idle worker is kept. */
  cancel(): void {
    if (this.pending.size > 0) this.fail(new ExportCancelled('cancelled'));
  }

  /** Ends the worker for good (a later job starts a new one). */
  dispose(): void {
    this.fail(new ExportCancelled('closed'));
  }
}
