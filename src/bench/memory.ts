/**
 * Peak memory of the per-image precomputation for a 24-megapixel image (6000 × 4000),
 * run in its own process so that the peak resident set is this work's alone.
 * Prints one JSON line.
 */
import { resourceUsage } from 'node:process';
import { createGray } from '../image/gray.ts';
import { inkEvidence } from '../ink/index.ts';
import { prepareInk } from '../trace/index.ts';
import { createRandom } from '../util/random.ts';

const W = 6000;
const H = 4000;
const rnd = createRandom(5);
const data = new Float32Array(W * H);
for (let i = 0; i < data.length; i++) data[i] = 0.75 + 0.02 * rnd.normal();
for (let k = 0; k < 400; k++) {
  // Short dark bars standing in for strokes.
  const x = rnd.int(20, W - 80);
  const y = rnd.int(20, H - 20);
  for (let j = 0; j < 5; j++) for (let i = 0; i < 60; i++) data[(y + j) * W + x + i] *= 0.5;
}
const image = createGray(W, H, data);
const before = resourceUsage().maxRSS * 1024;
const t = performance.now();
// As the worker keeps it: the evidence, its coarse copy and the band (widths are measured on it).
const prep = prepareInk(inkEvidence(image), image);
const ms = performance.now() - t;
const peak = resourceUsage().maxRSS * 1024;
const imageBytes = data.byteLength;
const keptBytes = prep.evidence.data.byteLength + prep.coarse.data.byteLength + (prep.image?.data.byteLength ?? 0);
console.log(JSON.stringify({ width: W, height: H, ms, baselineRss: before, peakRss: peak, imageBytes, keptBytes }));
