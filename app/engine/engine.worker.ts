/**
 * The engine's Web Worker: an EngineHost answering the editor's messages, its long work
 * (solves, preview growth) run in slices between them. Started by engine/worker.ts.
 */
import { EngineHost } from '../../src/worker/host.ts';
import type { EngineRequest } from '../../src/worker/protocol.ts';
import { createPump } from '../../src/worker/pump.ts';

// The page's tsconfig has the DOM library, not the worker one: name what is used here.
const scope = self as unknown as {
  postMessage(message: unknown, transfer: Transferable[]): void;
  onmessage: ((e: MessageEvent<EngineRequest>) => void) | null;
};

const host = new EngineHost((reply, transfer) => scope.postMessage(reply, transfer));
const pump = createPump(host);

scope.onmessage = (e) => {
  host.handle(e.data);
  pump();
};
