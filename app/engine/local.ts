/**
 * An in-process engine with the worker bridge's behaviour (asynchronous answers,
 * coalesced preview paths, solves superseded by key), for Vitest tests of tools and
 * panels in Node. The same client and host as the worker, over a loopback port.
 */
import { EngineClient } from '../../src/worker/client.ts';
import type { EngineHostOptions } from '../../src/worker/host.ts';
import { createLoopback } from '../../src/worker/loopback.ts';
import type { EngineBridge } from './bridge.ts';

export function createLocalEngine(options: EngineHostOptions = {}): EngineBridge {
  const bridge: EngineBridge = new EngineClient(createLoopback(options).port);
  return bridge;
}
