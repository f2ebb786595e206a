/**
 * The engine bridge of the page: the solver runs in a Web Worker (engine.worker.ts), so
 * the canvas never waits for it. The client (src/worker/client.ts) coalesces preview
 * paths, supersedes solves by key and drops stale answers; typed arrays are transferred.
 */
import { EngineClient, type EnginePort } from '../../src/worker/client.ts';
import type { EngineReply } from '../../src/worker/protocol.ts';
import type { EngineBridge } from './bridge.ts';

export function createWorkerEngine(): EngineBridge {
  const worker = new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'inkroute-engine' });
  const port: EnginePort = {
    post: (msg, transfer) => worker.postMessage(msg, transfer),
    listen: (onReply) => {
      worker.onmessage = (e: MessageEvent<EngineReply>) => onReply(e.data);
    },
    close: () => worker.terminate(),
  };
  // A worker that fails to start would leave every call hanging: say so in the console.
  worker.onerror = (e) => console.error(`inkroute: the engine worker failed: ${e.message}`);
  const bridge: EngineBridge = new EngineClient(port);
  return bridge;
}
