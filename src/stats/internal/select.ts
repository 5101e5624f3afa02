/** A writable array of numbers: Float64Array, Uint32Array, or a plain array. */
export interface NumberArray {
  length: number;
  [index: number]: number;
}

/**
 * The k-th smallest value (0-based) of `a`, reordering `a` in place: Hoare's selection (Hoare 1961,
 * "Algorithm 65: FIND", Comm. ACM 4:321-322), O(n) on average. Values must not be NaN.
 * @example selectKth(Float64Array.of(5, 1, 4, 2), 1) // 2
 */
export function selectKth(a: NumberArray, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (hi > lo) {
    const pivot = a[(lo + hi) >>> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k];
}

/**
 * The k-th smallest value (0-based) of `a` and the one after it in sorted order (Infinity when k is the last),
 * reordering `a`: after selection everything right of k is at least a[k], so the next order statistic is their
 * minimum, one pass more.
 */
export function selectKthAndNext(a: NumberArray, k: number): [number, number] {
  const v = selectKth(a, k);
  let next = Infinity;
  for (let i = k + 1; i < a.length; i++) if (a[i] < next) next = a[i];
  return [v, next];
}

/** The k-th smallest value (0-based) and the one before it in sorted order (-Infinity when k is 0), reordering `a`. */
export function selectKthAndPrevious(a: NumberArray, k: number): [number, number] {
  const v = selectKth(a, k);
  let previous = -Infinity;
  for (let i = 0; i < k; i++) if (a[i] > previous) previous = a[i];
  return [v, previous];
}
