/**
 * How the panels write figures: lengths in mm once the surface is calibrated (that is
 * what an epigrapher measures on the object), else in image px.
 */

/** A length given in image px, as mm when `pxPerMm` is known, else px. */
export function formatLength(px: number, pxPerMm: number | undefined, mmDigits = 1): string {
  if (pxPerMm && pxPerMm > 0) return `${(px / pxPerMm).toFixed(mmDigits)} mm`;
  return `${px.toFixed(px < 10 ? 1 : 0)} px`;
}

/** A pen width (px); widths are small, so one more digit in mm. */
export function formatWidth(px: number, pxPerMm: number | undefined): string {
  return formatLength(px, pxPerMm, 2);
}

/** A share 0..1 as a whole percentage ('< 1 %' for a trace, not a misleading 0). */
export function formatShare(share: number): string {
  if (share > 0 && share < 0.005) return '< 1 %';
  return `${Math.round(share * 100)} %`;
}

/** A point in image px, as mm or px. */
export function formatPoint(x: number, y: number, pxPerMm: number | undefined): string {
  if (pxPerMm && pxPerMm > 0) return `${(x / pxPerMm).toFixed(1)}, ${(y / pxPerMm).toFixed(1)} mm`;
  return `${Math.round(x)}, ${Math.round(y)} px`;
}

/** A solver cost (weighted, no unit). */
export function formatCost(v: number): string {
  return Math.abs(v) >= 100 ? v.toFixed(0) : v.toFixed(2);
}
