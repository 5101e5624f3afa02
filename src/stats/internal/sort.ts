/**
 * Stable argsort of float64 keys by least-significant-digit radix sort, written here because neither jstat nor
 * simple-statistics offers an argsort and a comparison sort of an index array costs several times more at
 * spreadsheet scale (up to 1,048,576 rows).
 *
 * - Keys become unsigned integers whose order is the numeric order: the IEEE-754 bit pattern with the usual sign
 *   flip (two 32-bit words), or, when every key is a decimal of at most 9 places whose integer span fits in 32
 *   bits (most spreadsheet columns), the single word round(x * 10^d) - min, which halves the passes.
 * - Each pass moves (key words, index) together, so reads are sequential; 11-bit digits (2,048 buckets) keep the
 *   scattered writes cache-friendly; all digit histograms come from one reading pass, and a pass whose digit is
 *   the same for every key is skipped.
 * Keys must not be NaN. -0 and +0 are equal keys (stability keeps their order).
 */
import { Codes } from '../correlation/codes';
import { decimalPlaces } from '../correlation/comoments';
import { borrowU32, giveBack } from './scratch';

const SMALL = 64;
const BITS = 11;
const BUCKETS = 1 << BITS;
const MASK = BUCKETS - 1;
const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];

function comparisonArgsort(keys: ArrayLike<number>, order: Uint32Array<ArrayBufferLike>): Uint32Array<ArrayBufferLike> {
  const idx = Array.from(order);
  // Array.prototype.sort is stable (ES2019), so ties keep the incoming order.
  idx.sort((a, b) => keys[a] - keys[b]);
  return Uint32Array.from(idx);
}

/** One-word keys when the column is a decimal of small integer span (with that span, max - min), else null. */
function decimalKeys(keys: ArrayLike<number>, order: Uint32Array<ArrayBufferLike>): { word: Uint32Array; span: number } | null {
  const d = decimalPlaces(keys);
  if (d < 0) return null;
  const s = POW10[d];
  const n = order.length;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const k = Math.round(keys[i] * s);
    if (k < min) min = k;
    if (k > max) max = k;
  }
  if (max - min >= 4294967296) return null;
  const out = borrowU32(n);
  for (let i = 0; i < n; i++) out[i] = Math.round(keys[order[i]] * s) - min;
  return { word: out, span: max - min };
}

/** The one-word keys from codes, in the incoming order. */
function codeKeys(c: Codes, order: Uint32Array<ArrayBufferLike>): { word: Uint32Array; span: number } {
  const n = order.length;
  const out = borrowU32(n);
  const codes = c.codes;
  for (let i = 0; i < n; i++) out[i] = codes[order[i]];
  return { word: out, span: c.span };
}

/** Digit passes a word needs when its keys span [0, span]: none for one value, else enough for span's bits. */
function passesFor(span: number): number {
  return span === 0 ? 0 : Math.ceil((32 - Math.clz32(span)) / BITS);
}

/**
 * The digit histograms of one word's first `passes` digits, into counts[(first + p) * BUCKETS + digit]. Written
 * out per pass count, so the loop over the keys has no inner loop over passes and skips the digits above the span.
 */
function histogram(word: Uint32Array<ArrayBufferLike>, passes: number, counts: Uint32Array, first: number): void {
  const n = word.length;
  const b0 = first * BUCKETS;
  const b1 = b0 + BUCKETS;
  const b2 = b1 + BUCKETS;
  if (passes === 1) {
    for (let i = 0; i < n; i++) counts[b0 + (word[i] & MASK)]++;
  } else if (passes === 2) {
    for (let i = 0; i < n; i++) {
      const v = word[i];
      counts[b0 + (v & MASK)]++;
      counts[b1 + ((v >>> BITS) & MASK)]++;
    }
  } else if (passes === 3) {
    for (let i = 0; i < n; i++) {
      const v = word[i];
      counts[b0 + (v & MASK)]++;
      counts[b1 + ((v >>> BITS) & MASK)]++;
      counts[b2 + (v >>> (2 * BITS))]++;
    }
  }
}

/** Two-word keys from the bit pattern: hi/lo words, sign-flipped so unsigned order = numeric order. */
function bitKeys(keys: ArrayLike<number>, order: Uint32Array<ArrayBufferLike>): { hi: Uint32Array; lo: Uint32Array } {
  const n = order.length;
  const f = new Float64Array(1);
  const w = new Uint32Array(f.buffer); // little-endian: w[0] low word, w[1] high word
  const hi = borrowU32(n);
  const lo = borrowU32(n);
  for (let i = 0; i < n; i++) {
    const v = keys[order[i]];
    f[0] = v === 0 ? 0 : v; // fold -0 into +0
    const h = w[1];
    if (h & 0x80000000) {
      hi[i] = ~h >>> 0;
      lo[i] = ~w[0] >>> 0;
    } else {
      hi[i] = (h | 0x80000000) >>> 0;
      lo[i] = w[0];
    }
  }
  return { hi, lo };
}

/**
 * Returns the permutation that sorts `keys` ascending, stable with respect to `initial` (identity by default).
 * @example argsort(Float64Array.of(3, 1, 2)) // Uint32Array [1, 2, 0]
 */
export function argsort(keys: ArrayLike<number>, initial?: Uint32Array<ArrayBufferLike>): Uint32Array<ArrayBufferLike> {
  return argsortKeyed(keys, initial).order;
}

/** A sort's permutation with, when the radix path ran, its integer keys in sorted order (least significant word
 *  first): equal keys mean equal values, so callers can find ties by reading these sequentially instead of
 *  gathering the values through the permutation. */
export interface KeyedOrder {
  order: Uint32Array<ArrayBufferLike>;
  sortedWords: Uint32Array<ArrayBufferLike>[] | null;
}

/**
 * As argsort, also returning the sorted keys (see KeyedOrder). `codes`, when the caller has them for these keys
 * (codes.ts), are the one-word keys the decimal path would compute (the same round(x * 10^d) - min), so they are
 * used as they are.
 */
export function argsortKeyed(keys: ArrayLike<number>, initial?: Uint32Array<ArrayBufferLike>, codes?: Codes | null): KeyedOrder {
  const n = keys.length;
  let order: Uint32Array<ArrayBufferLike>;
  if (initial) {
    order = borrowU32(n);
    order.set(initial);
  } else {
    order = borrowU32(n);
    for (let i = 0; i < n; i++) order[i] = i;
  }
  if (n < SMALL) return { order: comparisonArgsort(keys, order), sortedWords: null };
  const single = codes ? codeKeys(codes, order) : decimalKeys(keys, order);
  // Words, least significant first, each sorted in up to ceil(32 / BITS) digit passes: a decimal word only in as
  // many as its span needs.
  const words: Uint32Array[] = single ? [single.word] : (() => {
    const k = bitKeys(keys, order);
    return [k.lo, k.hi];
  })();
  const passesPerWord = Math.ceil(32 / BITS);
  const wordPasses = single ? [passesFor(single.span)] : [passesPerWord, passesPerWord];
  const passes = words.length * passesPerWord;
  // All histograms in one reading pass per word.
  const counts = new Uint32Array(passes * BUCKETS);
  for (let wi = 0; wi < words.length; wi++) histogram(words[wi], wordPasses[wi], counts, wi * passesPerWord);
  let src: Uint32Array<ArrayBufferLike>[] = words.map((wd) => wd);
  // Work arrays come from the scratch pool (see scratch.ts); the pair not returned goes back to it at the end.
  let dst: Uint32Array<ArrayBufferLike>[] = words.map(() => borrowU32(n));
  let idxSrc = order;
  let idxDst: Uint32Array<ArrayBufferLike> = borrowU32(n);
  for (let pass = 0; pass < passes; pass++) {
    const wi = Math.floor(pass / passesPerWord);
    if (pass % passesPerWord >= wordPasses[wi]) continue; // a digit above the word's span: 0 for every key
    const shift = (pass % passesPerWord) * BITS;
    const base = pass * BUCKETS;
    let trivial = false;
    for (let d = 0; d < BUCKETS; d++) {
      const c = counts[base + d];
      if (c === n) { trivial = true; break; }
      if (c !== 0) break;
    }
    if (trivial) continue;
    let sum = 0;
    for (let d = 0; d < BUCKETS; d++) {
      const c = counts[base + d];
      counts[base + d] = sum;
      sum += c;
    }
    const digitWord = src[wi];
    if (src.length === 1) {
      const s0 = src[0], d0 = dst[0];
      for (let i = 0; i < n; i++) {
        const v = s0[i];
        const at = counts[base + ((v >>> shift) & MASK)]++;
        d0[at] = v;
        idxDst[at] = idxSrc[i];
      }
    } else {
      const s0 = src[0], s1 = src[1], d0 = dst[0], d1 = dst[1];
      for (let i = 0; i < n; i++) {
        const at = counts[base + ((digitWord[i] >>> shift) & MASK)]++;
        d0[at] = s0[i];
        d1[at] = s1[i];
        idxDst[at] = idxSrc[i];
      }
    }
    const ts = src;
    src = dst;
    dst = ts;
    const ti = idxSrc;
    idxSrc = idxDst;
    idxDst = ti;
  }
  giveBack(idxDst, ...dst);
  return { order: idxSrc, sortedWords: src };
}

/** Whether the i-th value in sorted order equals the (i-1)-th: from the sorted keys when present, else values. */
export function sameAsPrevious(sorted: KeyedOrder, v: ArrayLike<number>): (i: number) => boolean {
  const w = sorted.sortedWords;
  if (w && w.length === 1) {
    const a = w[0];
    return (i) => a[i] === a[i - 1];
  }
  if (w && w.length === 2) {
    const lo = w[0];
    const hi = w[1];
    return (i) => lo[i] === lo[i - 1] && hi[i] === hi[i - 1];
  }
  const o = sorted.order;
  return (i) => v[o[i]] === v[o[i - 1]];
}

/** Returns a sort's arrays to the scratch pool once the caller is done with them (nothing may still use them). */
export function releaseKeyedOrder(k: KeyedOrder): void {
  giveBack(k.order, ...(k.sortedWords ?? []));
}
