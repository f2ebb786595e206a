/**
 * The solver's energy, shared by the exact discrete search and the sub-pixel refinement.
 *
 * A stroke is a sequence of pen states (position p, direction of travel θ, radius r).
 * Each step of length ℓ from state i−1 to state i costs
 *
 *   ℓ · (λ + A · adh(p_i, θ_i, r_i))  +  W · |r_i − r_{i−1}|  +  C · Δθ_i² / ℓ̄_i
 *
 * with Δθ the turning angle between the two steps and ℓ̄ their mean length (a discrete
 * elastica: squared curvature per length), λ the length cost, and the adherence
 *
 *   adh(p, θ, r) = q · κ · [ In(r) + Out(r) ] + (1 − q) · offInk
 *
 * measured along the chord through p across the direction of travel (the line swept by
 * the pen disk as it moves), with E the ink evidence along that chord at offset t:
 *
 *   In(r)  = ∫_{−r}^{r} (1 − E(t)) dt                 ink missing inside the pen,
 *   Out(r) = ∫_{r}^{r+δ} E(t) dt + ∫_{−r−δ}^{−r} E(t) dt   ink left uncovered just beyond its edge,
 *   q      = ramp of m = mean of E over |t| ≤ coreRadius: 0 below presenceLow, 1 above
 *            presenceHigh, linear between        is there ink at the centre at all.
 *
 * In + Out is smallest when the pen's edge sits where the ink ends (E = ½ on a
 * symmetric edge), so the radius is not biased; probing only across the direction of
 * travel keeps the ink ahead and behind from inflating it. The presence ramp keeps weak
 * clutter of a rough surface from passing for faint ink. Where there is no ink
 * (q = 0, an abrasion gap or bare surface) the cost is the constant offInk whatever the radius, so the
 * width and curvature terms carry the pen across with steady width and direction.
 */
import type { GrayImage } from '../image/gray.ts';

export interface Weights {
  /** A: weight of staying on ink. Default 1. */
  adherence: number;
  /** W: cost per px of pen radius change. Default 1.5. */
  widthChange: number;
  /** C: cost of squared turning angle per length (rad² · px). Default 4. */
  curvature: number;
  /** λ: cost per px of length. Default 0.05. */
  length: number;
}

export const DEFAULT_WEIGHTS: Weights = { adherence: 1, widthChange: 1.5, curvature: 4, length: 0.05 };

export interface ChordModel {
  /** δ: width of the band probed beyond the pen's edge on each side, px. Default 1.5. */
  outerWidth: number;
  /** Half-width of the central chord that decides whether ink is present, px. Default 1. */
  coreRadius: number;
  /**
   * κ: weight of the width fit In + Out against offInk. On real ink the fit never
   * reaches 0 (edges are soft), so κ < 1 keeps faint but real ink clearly cheaper than
   * bare surface; it does not move the best radius. Default 0.35.
   */
  fitWeight: number;
  /** Mean central evidence below which no ink is present (q = 0). Default 0.2. */
  presenceLow: number;
  /** Mean central evidence above which ink is fully present (q = 1). Default 0.8. */
  presenceHigh: number;
  /** Adherence where no ink is present (px of missing ink per px of travel). Default 5. */
  offInk: number;
  /** Spacing of the samples along the chord, px. Default 0.5. */
  spacing: number;
}

export const DEFAULT_CHORD: ChordModel = { outerWidth: 1.5, coreRadius: 1, fitWeight: 0.35, presenceLow: 0.2, presenceHigh: 0.8, offInk: 5, spacing: 0.5 };

/**
 * Scratch space for one chord profile: E sampled at t_j = (j − J)·h for j = 0..2J, and
 * its running integral F (trapezoid rule, exact for the piecewise-linear interpolant).
 */
export class ChordProfile {
  readonly half: number;
  readonly h: number;
  readonly e: Float64Array;
  readonly f: Float64Array;

  constructor(maxRadius: number, model: ChordModel) {
    this.h = model.spacing;
    this.half = Math.ceil((maxRadius + model.outerWidth) / model.spacing) + 1;
    this.e = new Float64Array(2 * this.half + 1);
    this.f = new Float64Array(2 * this.half + 1);
  }

  /**
   * Samples the evidence across the unit tangent (tx, ty) through (x, y): bilinear,
   * pixel-centre convention, edge clamped (as sampleBilinear, inlined: this is the
   * solver's innermost loop).
   */
  sample(ink: GrayImage, x: number, y: number, tx: number, ty: number, extent = Infinity): void {
    const { half, h, e, f } = this;
    const { width: W, height: H, data } = ink;
    const nx = -ty * h;
    const ny = tx * h;
    // Only the offsets |t| ≤ extent (+ one sample) when the caller needs no more.
    const m = Math.min(half, Math.ceil(extent / h) + 1);
    const j0 = half - m;
    const J = half + m;
    for (let j = j0; j <= J; j++) {
      let fx = x + nx * (j - half) - 0.5;
      let fy = y + ny * (j - half) - 0.5;
      if (fx < 0) fx = 0;
      else if (fx > W - 1) fx = W - 1;
      if (fy < 0) fy = 0;
      else if (fy > H - 1) fy = H - 1;
      const i0 = fx | 0;
      const j0 = fy | 0;
      const i1 = i0 + 1 < W ? i0 + 1 : i0;
      const r0 = j0 * W;
      const r1 = (j0 + 1 < H ? j0 + 1 : j0) * W;
      const ax = fx - i0;
      const ay = fy - j0;
      const top = data[r0 + i0] + (data[r0 + i1] - data[r0 + i0]) * ax;
      const bot = data[r1 + i0] + (data[r1 + i1] - data[r1 + i0]) * ax;
      e[j] = top + (bot - top) * ay;
    }
    // Running integral from the first sampled offset; only differences are used.
    f[j0] = 0;
    const hh = 0.5 * h;
    for (let j = j0 + 1; j <= J; j++) f[j] = f[j - 1] + hh * (e[j - 1] + e[j]);
  }

  /** ∫ E from the first sampled offset to offset t (|t| within the sampled range). */
  integral(t: number): number {
    const { half, h, e, f } = this;
    const u = t / h + half;
    let j = Math.floor(u);
    if (j >= 2 * half) j = 2 * half - 1;
    if (j < 0) j = 0;
    const a = u - j;
    return f[j] + h * (a * e[j] + 0.5 * a * a * (e[j + 1] - e[j]));
  }

  /** ∫_{a}^{b} E(t) dt. */
  between(a: number, b: number): number {
    return this.integral(b) - this.integral(a);
  }
}

/** Adherence of a pen of radius r on the sampled chord (see the file comment). */
export function chordAdherence(p: ChordProfile, r: number, model: ChordModel, q: number): number {
  const inside = 2 * r - p.between(-r, r);
  const outer = p.between(r, r + model.outerWidth) + p.between(-r - model.outerWidth, -r);
  return q * model.fitWeight * (inside + outer) + (1 - q) * model.offInk;
}

/** q: the presence of ink from the mean evidence over the central chord, |t| ≤ coreRadius. */
export function chordPresence(p: ChordProfile, model: ChordModel): number {
  const c = model.coreRadius;
  return presenceRamp(p.between(-c, c) / (2 * c), model);
}

/** q from the mean central evidence m. */
export function presenceRamp(m: number, model: ChordModel): number {
  const q = (m - model.presenceLow) / (model.presenceHigh - model.presenceLow);
  return q < 0 ? 0 : q > 1 ? 1 : q;
}

/** Support: share of the pen chord [−r, r] on ink (the chord's mean evidence), 0..1. */
export function chordSupport(p: ChordProfile, r: number): number {
  const s = p.between(-r, r) / (2 * r);
  return s < 0 ? 0 : s > 1 ? 1 : s;
}
