/**
 * Hit tests on the document, in image px, for a ToolContext: the canvas may use these or
 * its own (the tools only see the ToolContext functions).
 */
import type { Project } from '../../src/doc/model.ts';
import type { AnchorHit, StrokeHit } from './types.ts';

/** The visible stroke of `surfaceId` whose pen outline lies nearest (x, y), within `tolerance` px. */
export function hitStrokeIn(p: Project, surfaceId: string, x: number, y: number, tolerance: number): StrokeHit | undefined {
  const surface = p.surfaces.find((s) => s.id === surfaceId);
  if (!surface) return undefined;
  let best: StrokeHit | undefined;
  let bestD = Infinity;
  for (const id of surface.strokeOrder) {
    const st = p.strokes[id];
    if (!st || st.hidden) continue;
    for (let i = 0; i < st.samples.length; i++) {
      const s = st.samples[i];
      // Distance to the pen's edge: a click anywhere on the inked body hits.
      const d = Math.max(0, Math.hypot(s.x - x, s.y - y) - s.r);
      if (d <= tolerance && d < bestD) {
        bestD = d;
        best = { strokeId: id, sampleIndex: i };
      }
    }
  }
  return best;
}

/** The anchor of a visible stroke of `surfaceId` nearest (x, y), within `tolerance` px. */
export function hitAnchorIn(p: Project, surfaceId: string, x: number, y: number, tolerance: number): AnchorHit | undefined {
  const surface = p.surfaces.find((s) => s.id === surfaceId);
  if (!surface) return undefined;
  let best: AnchorHit | undefined;
  let bestD = Infinity;
  for (const id of surface.strokeOrder) {
    const st = p.strokes[id];
    if (!st || st.hidden) continue;
    st.anchors.forEach((a, anchorIndex) => {
      const d = Math.hypot(a.x - x, a.y - y);
      if (d <= tolerance && d < bestD) {
        bestD = d;
        best = { strokeId: id, anchorIndex };
      }
    });
  }
  return best;
}
