/**
 * Area under the ROC curve of a score for two classes, computed exactly as the
 * Mann–Whitney U statistic with ties counted one half (Hanley & McNeil 1982,
 * "The meaning and use of the area under a receiver operating characteristic curve").
 */

/**
 * @param scores per item
 * @param label per item: 1 positive, 0 negative, anything else ignored
 */
export function rocAuc(scores: ArrayLike<number>, label: ArrayLike<number>): number {
  const idx: number[] = [];
  for (let i = 0; i < scores.length; i++) if (label[i] === 0 || label[i] === 1) idx.push(i);
  const keys = new Float64Array(idx.length);
  for (let i = 0; i < idx.length; i++) keys[i] = scores[idx[i]];
  const order = new Uint32Array(idx.length);
  for (let i = 0; i < order.length; i++) order[i] = i;
  order.sort((a, b) => keys[a] - keys[b]);
  let pos = 0;
  let neg = 0;
  let u = 0; // Σ over positives of (negatives below + ½ negatives tied)
  let i = 0;
  while (i < order.length) {
    let j = i;
    let p = 0;
    let n = 0;
    while (j < order.length && keys[order[j]] === keys[order[i]]) {
      if (label[idx[order[j]]] === 1) p++;
      else n++;
      j++;
    }
    u += p * (neg + 0.5 * n);
    pos += p;
    neg += n;
    i = j;
  }
  if (pos === 0 || neg === 0) return NaN;
  return u / (pos * neg);
}
