/**
 * Stable argsort of float64 keys by least-significant-digit radix sort over the IEEE-754 bit pattern, with the
 * usual sign flip so that the unsigned order equals the numeric order. O(n) per pass, which at spreadsheet scale
 * (up to 1,048,576 rows) is several times faster than a comparison sort of an index array. Digits are 16 bits
 * (four passes, 65,536 buckets) for large inputs and 8 bits (eight passes, 256 buckets) for mid-sized ones, so
 * the bucket table never costs more than the data; passes where every key shares the digit are skipped.
 * Written here because neither jstat nor simple-statistics offers an argsort. Keys must not be NaN.
 */
const SMALL = 64;
const WIDE_DIGITS_FROM = 1 << 15;

function comparisonArgsort(keys: ArrayLike<number>, order: Uint32Array<ArrayBufferLike>): Uint32Array<ArrayBufferLike> {
  const idx = Array.from(order);
  // Array.prototype.sort is stable (ES2019), so ties keep the incoming order.
  idx.sort((a, b) => keys[a] - keys[b]);
  return Uint32Array.from(idx);
}

/**
 * Returns the permutation that sorts `keys` ascending, stable with respect to `initial` (identity by default).
 * @example argsort(Float64Array.of(3, 1, 2)) // Uint32Array [1, 2, 0]
 */
export function argsort(keys: ArrayLike<number>, initial?: Uint32Array<ArrayBufferLike>): Uint32Array<ArrayBufferLike> {
  const n = keys.length;
  let order: Uint32Array<ArrayBufferLike>;
  if (initial) order = initial.slice();
  else {
    order = new Uint32Array(n);
    for (let i = 0; i < n; i++) order[i] = i;
  }
  if (n < SMALL) return comparisonArgsort(keys, order);
  // Transform each key to two uint32 words whose unsigned order is the numeric order.
  const f = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = keys[i] === 0 ? 0 : keys[i]; // fold -0 into +0
  const w = new Uint32Array(f.buffer); // little-endian: w[2i] low word, w[2i+1] high word
  for (let i = 0; i < n; i++) {
    const hi = w[2 * i + 1];
    if (hi & 0x80000000) {
      w[2 * i + 1] = ~hi >>> 0;
      w[2 * i] = ~w[2 * i] >>> 0;
    } else {
      w[2 * i + 1] = (hi | 0x80000000) >>> 0;
    }
  }
  let tmp: Uint32Array<ArrayBufferLike> = new Uint32Array(n);
  const bits = n >= WIDE_DIGITS_FROM ? 16 : 8;
  const buckets = 1 << bits;
  const mask = buckets - 1;
  const passesPerWord = 32 / bits;
  const count = new Uint32Array(buckets);
  for (let pass = 0; pass < 2 * passesPerWord; pass++) {
    const word = pass < passesPerWord ? 0 : 1;
    const shift = (pass % passesPerWord) * bits;
    count.fill(0);
    for (let i = 0; i < n; i++) count[(w[2 * order[i] + word] >>> shift) & mask]++;
    // Skip a pass where every key has the same digit (common for small integers and shared exponents).
    let trivial = false;
    for (let d = 0; d < buckets; d++) {
      if (count[d] === n) { trivial = true; break; }
      if (count[d] !== 0) break;
    }
    if (trivial) continue;
    let sum = 0;
    for (let d = 0; d < buckets; d++) {
      const c = count[d];
      count[d] = sum;
      sum += c;
    }
    for (let i = 0; i < n; i++) {
      const o = order[i];
      tmp[count[(w[2 * o + word] >>> shift) & mask]++] = o;
    }
    const t = order;
    order = tmp;
    tmp = t;
  }
  return order;
}
