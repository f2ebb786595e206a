/**
 * Timestamps the end-to-end tests read through the test hook (testHook.ts): when the
 * last pointer move arrived and when the live layer last drew the preview, in
 * performance.now() ms. Writing two numbers per event costs nothing in normal use.
 */
export const probe = {
  /** PointerEvent.timeStamp of the last move over the canvas. */
  lastMoveAt: 0,
  /** When the live layer last drew a preview path. */
  previewDrawnAt: 0,
  /** The last sample of that preview, image px. */
  previewEnd: undefined as { x: number; y: number } | undefined,
  /** Time of the last draw of each layer, ms (the perf test reads them). */
  drawMs: { photo: 0, overlay: 0, strokes: 0, marks: 0, live: 0 },
};
