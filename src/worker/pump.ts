/**
 * Runs an EngineHost's sliced work: after each message, and again after each slice while
 * work remains, one `tick` is scheduled with setTimeout(0). Messages that arrive in the
 * meantime are handled between slices, which is what keeps preview paths quick while the
 * tree grows and lets a queued solve be cancelled before it starts.
 */
import type { EngineHost } from './host.ts';

/** Length of one slice of work, ms: short enough to answer a preview path within a frame. */
export const SLICE_MS = 10;

export interface Pump {
  /** Call after handing the host a message: schedules slices while it has work. */
  (): void;
  /** Stops scheduling slices for good (on dispose). */
  stop(): void;
}

export function createPump(host: EngineHost, sliceMs = SLICE_MS): Pump {
  let scheduled = false;
  let stopped = false;
  const run = (): void => {
    scheduled = false;
    if (stopped) return;
    host.tick(sliceMs);
    schedule();
  };
  const schedule = (): void => {
    if (scheduled || stopped || !host.busy) return;
    scheduled = true;
    setTimeout(run, 0);
  };
  return Object.assign(schedule, { stop: () => { stopped = true; } });
}
