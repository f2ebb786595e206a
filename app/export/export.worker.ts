/**
 * The exports' Web Worker: writes the export files off the page's thread, so a big
 * project never freezes the editor, and the dialog can cancel a job by ending the worker.
 * Started by exportClient.ts.
 */
import { exportFiles, exportInputFromBundle } from '../../src/export/exportFiles.ts';
import { facsimileSvg } from '../../src/export/facsimile.ts';
import { ExportError } from '../../src/export/types.ts';
import type { ExportReply, ExportRequest } from './protocol.ts';

// The page's tsconfig has the DOM library, not the worker one: name what is used here.
const scope = self as unknown as {
  postMessage(message: ExportReply, transfer?: Transferable[]): void;
  onmessage: ((e: MessageEvent<ExportRequest>) => void) | null;
};

let images = new Map<string, Uint8Array>();

scope.onmessage = (e) => {
  const req = e.data;
  if (req.type === 'images') {
    images = req.images;
    return;
  }
  try {
    const input = exportInputFromBundle({ project: req.project, images }, req.surfaceId);
    if (req.type === 'preview') {
      scope.postMessage({ type: 'preview', id: req.id, svg: facsimileSvg(input, req.options) });
    } else {
      const files = [...exportFiles(input, req.kinds, req.options)];
      scope.postMessage({ type: 'files', id: req.id, files }, [...new Set(files.map(([, bytes]) => bytes.buffer as ArrayBuffer))]);
    }
  } catch (err) {
    const exportError = err instanceof ExportError;
    scope.postMessage({ type: 'error', id: req.id, message: (err as Error).message ?? String(err), exportError });
  }
};
