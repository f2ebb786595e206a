/**
 * An in-process port to an EngineHost, for Node tests and the in-process engine: the
 * messages are cloned and delivered on later tasks (setTimeout 0) in both directions, as
 * postMessage would, so code driven through it sees the same asynchrony as with the
 * worker. Transfer is not emulated: the sender keeps its arrays.
 */
import type { EnginePort } from './client.ts';
import { EngineHost, type EngineHostOptions } from './host.ts';
import type { EngineReply } from './protocol.ts';
import { createPump, type Pump } from './pump.ts';

export interface Loopback {
  port: EnginePort;
  host: EngineHost;
}

export function createLoopback(options: EngineHostOptions & { sliceMs?: number } = {}): Loopback {
  let onReply: ((r: EngineReply) => void) | undefined;
  let closed = false;
  const host = new EngineHost((reply) => {
    const copy = structuredClone(reply);
    setTimeout(() => {
      if (!closed) onReply?.(copy);
    }, 0);
  }, options);
  const pump: Pump = createPump(host, options.sliceMs);
  const port: EnginePort = {
    post(msg) {
      const copy = structuredClone(msg);
      setTimeout(() => {
        if (closed) return;
        host.handle(copy);
        pump();
      }, 0);
    },
    listen(cb) {
      onReply = cb;
    },
    close() {
      closed = true;
      pump.stop();
      host.dispose();
    },
  };
  return { port, host };
}
