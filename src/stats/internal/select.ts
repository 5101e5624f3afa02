/** A writable array of numbers: Float64Array, Uint32Array, or a plain array. */
export interface NumberArray {
  length: number;
  [index: number]: number;
}

/**
 * The k-th smallest value (0-based) of `a[left..right]`, reordering that stretch in place so that everything left
 * of k is at most a[k] and everything right of it at least a[k]: Floyd & Rivest's selection (Floyd & Rivest 1975,
 * "Algorithm 489: the algorithm SELECT - for finding the ith smallest of n elements", Comm. ACM 18:173), which
 * first narrows to a small sample's bracket around k and so needs about n + min(k, n - k) comparisons on average,
 * against about 3.4 n for Hoare's FIND (Hoare 1961, Comm. ACM 4:321-322). Written here: the order statistics the
 * checks need (medians, fourths, MADs of up to a million values) are the hot path of the robust rules, and no
 * maintained statistics package for the browser offers an in-place selection on typed arrays. Values must not be
 * NaN.
 * @example selectKth(Float64Array.of(5, 1, 4, 2), 1) // 2
 */
export function selectKth(a: NumberArray, k: number, left = 0, right = a.length - 1): number {
  while (right > left) {
    if (right - left > 600) {
      // Recurse on a bracket that holds the k-th value with high probability (the published constants).
      const n = right - left + 1;
      const i = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (i - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (i * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - i) * s) / n + sd));
      selectKth(a, k, newLeft, newRight);
    }
    const t = a[k];
    let i = left;
    let j = right;
    swap(a, left, k);
    if (a[right] > t) swap(a, left, right);
    while (i < j) {
      swap(a, i, j);
      i++;
      j--;
      while (a[i] < t) i++;
      while (a[j] > t) j--;
    }
    if (a[left] === t) swap(a, left, j);
    else {
      j++;
      swap(a, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
  return a[k];
}

function swap(a: NumberArray, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/**
 * The k-th smallest value (0-based) of `a[left..right]` and the one after it in sorted order (Infinity when k is
 * the last), reordering that stretch: after selection everything right of k is at least a[k], so the next order
 * statistic is their minimum, one pass more.
 */
export function selectKthAndNext(a: NumberArray, k: number, left = 0, right = a.length - 1): [number, number] {
  const v = selectKth(a, k, left, right);
  let next = Infinity;
  // One read per element, outside the branch: a read only inside the branch has no type feedback until the
  // branch has run, and the optimised loop then deoptimises on the first smaller value, call after call.
  for (let i = k + 1; i <= right; i++) {
    const w = a[i];
    if (w < next) next = w;
  }
  return [v, next];
}

/** The k-th smallest value (0-based) of `a[left..right]` and the one before it in sorted order (-Infinity when k
 *  is the first), reordering that stretch. */
export function selectKthAndPrevious(a: NumberArray, k: number, left = 0, right = a.length - 1): [number, number] {
  const v = selectKth(a, k, left, right);
  let previous = -Infinity;
  for (let i = left; i < k; i++) {
    const w = a[i];
    if (w > previous) previous = w;
  }
  return [v, previous];
}
