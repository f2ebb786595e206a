/**
 * The editor's one engine. App registers the worker bridge at start (setEngine); panels
 * and tools ask for it with getEngine. Tests register an in-process engine instead.
 */
import type { EngineBridge } from './bridge.ts';

let engine: EngineBridge | undefined;

export function setEngine(e: EngineBridge): void {
  engine = e;
}

/** The engine when one is registered (the page, tests that set one); undefined otherwise. */
export function engineIfStarted(): EngineBridge | undefined {
  return engine;
}

export function getEngine(): EngineBridge {
  if (!engine) throw new Error('the engine is not started yet');
  return engine;
}
