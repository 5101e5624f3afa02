import { CoMoments } from './comoments';
import { borrowF64 } from '../internal/scratch';
import { argsort, KeyedOrder, sameAsPrevious } from '../internal/sort';

/**
 * Ranks 1..n with ties given the average of the ranks they span (the "mid-rank" convention used by Spearman's
 * coefficient; Kendall 1948, Rank Correlation Methods, ch. 3).
 * @example averageRanks([10, 20, 20, 30]) // Float64Array [1, 2.5, 2.5, 4]
 */
export function averageRanks(v: ArrayLike<number>, order: Uint32Array<ArrayBufferLike> | KeyedOrder = argsort(v)): Float64Array {
  const n = v.length;
  const ranks = borrowF64(n); // every element is written below
  // A radix sort's keys are in sorted order already: tie groups are found reading them in sequence, instead of
  // gathering the values through the permutation.
  const sorted: KeyedOrder = ArrayBuffer.isView(order) ? { order, sortedWords: null } : order;
  const perm = sorted.order;
  const same = sameAsPrevious(sorted, v);
  for (let i = 0; i < n; ) {
    let j = i + 1;
    while (j < n && same(j)) j++;
    const rank = (i + 1 + j) / 2; // average of ranks i+1 .. j
    for (let k = i; k < j; k++) ranks[perm[k]] = rank;
    i = j;
  }
  return ranks;
}

/**
 * Co-moments of two columns of mid-ranks 1..n (as averageRanks gives them), for Spearman's coefficient. Mid-ranks
 * have the mean (n + 1)/2 exactly, and every doubled deviation 2r - (n + 1) is an integer, so one pass gives the
 * sums: the products are exact integers, added exactly in blocks small enough that a block's sum stays below 2^53,
 * and the block sums are added with Neumaier's compensation (Neumaier 1974, "Rundungsfehleranalyse einiger
 * Verfahren zur Summation endlicher Summen", ZAMM 54:39-51). The general coMoments would first test both columns
 * for decimals and take two passes for the same figures.
 */
export function rankCoMoments(rx: ArrayLike<number>, ry: ArrayLike<number>): CoMoments {
  const n = rx.length;
  const c = n + 1;
  // |2r - (n + 1)| < n + 1, so a product is below (n + 1)^2 and a block of this many stays exact.
  const block = Math.max(1, Math.min(4096, Math.floor(9007199254740992 / (c * c))));
  let xx = 0, xxc = 0, yy = 0, yyc = 0, xy = 0, xyc = 0;
  for (let start = 0; start < n; start += block) {
    const end = Math.min(n, start + block);
    let bx = 0, by = 0, bxy = 0;
    for (let i = start; i < end; i++) {
      const a = 2 * rx[i] - c;
      const b = 2 * ry[i] - c;
      bx += a * a;
      by += b * b;
      bxy += a * b;
    }
    let t = xx + bx;
    xxc += Math.abs(xx) >= Math.abs(bx) ? xx - t + bx : bx - t + xx;
    xx = t;
    t = yy + by;
    yyc += Math.abs(yy) >= Math.abs(by) ? yy - t + by : by - t + yy;
    yy = t;
    t = xy + bxy;
    xyc += Math.abs(xy) >= Math.abs(bxy) ? xy - t + bxy : bxy - t + xy;
    xy = t;
  }
  const mean = c / 2;
  return { n, meanX: mean, meanY: mean, sxx: (xx + xxc) / 4, syy: (yy + yyc) / 4, sxy: (xy + xyc) / 4, scaleX: 1, scaleY: 1 };
}
