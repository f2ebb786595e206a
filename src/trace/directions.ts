/**
 * The 16 step directions of the lifted search: the 8 neighbours and the 8 knight
 * moves, in counter-clockwise order of angle (y down, so "counter-clockwise" on screen
 * is clockwise). Direction d and d + 8 are opposite and share one orientation class
 * (d & 7) for the chord across the direction of travel.
 */
export const DIRECTIONS = 16;
export const ORIENTATIONS = 8;

export const DX = new Int32Array([1, 2, 1, 1, 0, -1, -1, -2, -1, -2, -1, -1, 0, 1, 1, 2]);
export const DY = new Int32Array([0, 1, 1, 2, 1, 2, 1, 1, 0, -1, -1, -2, -1, -2, -1, -1]);

/** Step lengths |(DX, DY)| in px. */
export const STEP_LENGTH = new Float64Array(DIRECTIONS);
/** Direction angles atan2(DY, DX) in radians. */
export const ANGLE = new Float64Array(DIRECTIONS);
for (let d = 0; d < DIRECTIONS; d++) {
  STEP_LENGTH[d] = Math.hypot(DX[d], DY[d]);
  ANGLE[d] = Math.atan2(DY[d], DX[d]);
}

/** Unit tangent and normal of each orientation class, for the chord probes. */
export const ORIENT_TX = new Float64Array(ORIENTATIONS);
export const ORIENT_TY = new Float64Array(ORIENTATIONS);
for (let o = 0; o < ORIENTATIONS; o++) {
  ORIENT_TX[o] = DX[o] / STEP_LENGTH[o];
  ORIENT_TY[o] = DY[o] / STEP_LENGTH[o];
}

/** Signed smallest angle from a to b, radians in (−π, π]. */
export function angleDiff(a: number, b: number): number {
  let d = b - a;
  while (d <= -Math.PI) d += 2 * Math.PI;
  while (d > Math.PI) d -= 2 * Math.PI;
  return d;
}

/** Nearest direction index of a vector. */
export function nearestDirection(vx: number, vy: number): number {
  const a = Math.atan2(vy, vx);
  let best = 0;
  let bestErr = Infinity;
  for (let d = 0; d < DIRECTIONS; d++) {
    const e = Math.abs(angleDiff(ANGLE[d], a));
    if (e < bestErr) {
      bestErr = e;
      best = d;
    }
  }
  return best;
}
