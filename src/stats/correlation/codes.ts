import { MAX_PLACES, POW10 } from './comoments';
import { borrowF64, borrowI32, giveBack } from '../internal/scratch';

/**
 * A column of few distinct decimals (ratings 1-7, counts, amounts to the cent within a bounded range) as integer
 * codes: code = round(x * 10^d) - min, so equal codes mean equal values and code order is value order.
 *
 * Why: ranks and Kendall's counts of such a column need no sort. Counting how often each code occurs gives every
 * value's mid-rank in two passes over the rows (countingRanks), and two coded columns give Kendall's counts from
 * their table of joint frequencies (kendall.ts, kendallFromTable). Written here because a comparison or radix sort
 * does O(n log n) or several passes of scattered writes for what a frequency table does in one.
 */
export interface Codes {
  /** Per row, round(x * 10^d) - min: from 0 to span. Borrowed from the scratch pool (see release in prepared.ts). */
  codes: Int32Array;
  span: number;
}

/** The most distinct codes worth a frequency table: 2^20 counts (8 MB) at most. */
export const MAX_CODE_SPAN = (1 << 20) - 1;

/**
 * The codes of v when it is a decimal column (at most 9 places, see decimalPlaces) whose span of codes is at most
 * maxSpan, else null. maxSpan is below 2^31, so codes fit 32-bit integers.
 */
export function smallSpanCodes(v: ArrayLike<number>, maxSpan: number): Codes | null {
  const n = v.length;
  if (n === 0) return null;
  const limit = 4503599627370496; // 2^52, as decimalPlaces
  // One pass finds the decimal places and the codes together: each value is tested at the places found so far,
  // as decimalPlaces tests it (so the places are the same), and when a value needs more, the codes before it
  // are made again at the new places (at most nine times, and on typed data only within the first rows).
  let d = 0;
  let s = 1;
  let k0 = Math.round(v[0]);
  let min = k0;
  let max = k0;
  const codes = borrowI32(n);
  for (let i = 0; i < n; i++) {
    const x = v[i];
    let k = Math.round(x * s);
    if (k / s !== x || Math.abs(x * s) >= limit) {
      do {
        d++;
        if (d > MAX_PLACES) return giveUp(codes);
        s = POW10[d];
        k = Math.round(x * s);
      } while (k / s !== x || Math.abs(x * s) >= limit);
      k0 = Math.round(v[0] * s);
      min = k0;
      max = k0;
      for (let j = 0; j < i; j++) {
        const kj = Math.round(v[j] * s);
        if (kj < min) min = kj;
        else if (kj > max) max = kj;
        codes[j] = kj - k0;
      }
      if (max - min > maxSpan) return giveUp(codes);
    }
    // Codes relative to the first value, stopping as soon as the span passes maxSpan (so they fit).
    if (k < min) {
      min = k;
      if (max - min > maxSpan) return giveUp(codes);
    } else if (k > max) {
      max = k;
      if (max - min > maxSpan) return giveUp(codes);
    }
    codes[i] = k - k0;
  }
  const shift = min - k0;
  if (shift !== 0) for (let i = 0; i < n; i++) codes[i] -= shift;
  return { codes, span: max - min };
}

function giveUp(codes: Int32Array): null {
  giveBack(codes);
  return null;
}

/**
 * Mid-ranks 1..n (ties given the average of the ranks they span, as averageRanks in ranks.ts) from codes: a code's
 * rows take the sorted places after every smaller code's, so its mid-rank is (rows with smaller codes) + (t + 1)/2
 * for its t rows. The same numbers as sorting and averageRanks, bit for bit (both are exact half-integers).
 */
export function countingRanks(c: Codes): Float64Array {
  const { codes, span } = c;
  const n = codes.length;
  const mid = borrowF64(span + 1);
  mid.fill(0);
  for (let i = 0; i < n; i++) mid[codes[i]]++;
  let below = 0;
  for (let k = 0; k <= span; k++) {
    const t = mid[k];
    mid[k] = below + (t + 1) / 2;
    below += t;
  }
  const ranks = borrowF64(n);
  for (let i = 0; i < n; i++) ranks[i] = mid[codes[i]];
  giveBack(mid);
  return ranks;
}
