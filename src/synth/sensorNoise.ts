/**
 * Sensor noise of the camera: independent gaussian noise per pixel.
 */
import type { Random } from '../util/random.ts';

/** data[p] += sigma × N(0, 1) for every pixel; sigma in image units (0..1 scale). */
export function addSensorNoise(data: Float32Array, sigma: number, rng: Random): void {
  if (sigma <= 0) return;
  for (let p = 0; p < data.length; p++) data[p] += sigma * rng.normal();
}
