import { borrowF64 } from '../internal/scratch';
import { argsort } from '../internal/sort';

/**
 * Ranks 1..n with ties given the average of the ranks they span (the "mid-rank" convention used by Spearman's
 * coefficient; Kendall 1948, Rank Correlation Methods, ch. 3).
 * @example averageRanks([10, 20, 20, 30]) // Float64Array [1, 2.5, 2.5, 4]
 */
export function averageRanks(v: ArrayLike<number>, order: Uint32Array<ArrayBufferLike> = argsort(v)): Float64Array {
  const n = v.length;
  const ranks = borrowF64(n); // every element is written below
  let i = 0;
  while (i < n) {
    let j = i + 1;
    const value = v[order[i]];
    while (j < n && v[order[j]] === value) j++;
    const rank = (i + 1 + j) / 2; // average of ranks i+1 .. j
    for (let k = i; k < j; k++) ranks[order[k]] = rank;
    i = j;
  }
  return ranks;
}
