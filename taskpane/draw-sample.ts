import { selectKth } from '../src/stats/internal/select';
/**
 * Which points to draw when there are more rows than a chart can show legibly. The statistics always use every
 * row; only the drawing is thinned. Pure.
 *
 * Rules:
 * - every flagged point is drawn (up to the limit), so a problem the checks found is always visible;
 * - the rest are chosen by a fixed hash of the row's position, keeping those with the smallest hashes. A row's
 *   chance of being drawn depends only on its own position, so typing into one cell or appending a row leaves
 *   almost the whole drawing in place (a fresh random sample would make every point jump on each edit);
 * - the result is sorted ascending (row order), with no duplicates.
 */

/** A 32-bit integer mix (the finaliser of MurmurHash3, Appleby 2011): well spread, cheap, deterministic. */
export function positionHash(i: number): number {
  let h = (i ^ 0x9e3779b9) >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b) >>> 0;
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35) >>> 0;
  h ^= h >>> 16;
  return h >>> 0;
}

/**
 * Positions (0-based, ascending) of at most `limit` of `n` points to draw, always including the flagged ones.
 * When more than `limit` points are flagged, the first `limit` flagged positions are drawn.
 * @param n number of points
 * @param flagged positions that must be drawn (any order; out-of-range and repeated ones are ignored)
 * @param limit the most points to draw (at least 1)
 * @example drawSample(10, [7], 3) // three positions including 7
 */
export function drawSample(n: number, flagged: ArrayLike<number>, limit: number): Int32Array {
  const cap = Math.max(1, Math.floor(limit));
  if (n <= cap) {
    const all = new Int32Array(n);
    for (let i = 0; i < n; i++) all[i] = i;
    return all;
  }
  const take = new Uint8Array(n);
  let kept = 0;
  const flaggedSorted = Array.from(flagged).filter((f) => Number.isInteger(f) && f >= 0 && f < n).sort((p, q) => p - q);
  for (const f of flaggedSorted) {
    if (kept >= cap) break;
    if (!take[f]) {
      take[f] = 1;
      kept++;
    }
  }
  const room = cap - kept;
  if (room > 0) {
    // Candidates: hashes below a generous guess of the threshold (hashes are spread evenly over 32 bits), so the
    // exact selection runs on a few thousand values instead of all n. Falls back to all when the guess is short.
    const others = n - kept;
    const guess = Math.min(4294967296, ((room * 1.25 + 64) / others) * 4294967296);
    let candidates = new Uint32Array(Math.min(others, Math.ceil(room * 1.5 + 256)));
    let m = 0;
    for (let i = 0; i < n; i++) {
      if (take[i]) continue;
      const h = positionHash(i);
      if (h < guess) {
        if (m === candidates.length) {
          const grown = new Uint32Array(Math.min(others, candidates.length * 2));
          grown.set(candidates);
          candidates = grown;
        }
        candidates[m++] = h;
      }
    }
    if (m < room) {
      m = 0;
      candidates = new Uint32Array(others);
      for (let i = 0; i < n; i++) if (!take[i]) candidates[m++] = positionHash(i);
    }
    // The hash is a bijection on 32 bits, so distinct positions never tie: keep hashes up to the room-th smallest.
    const threshold = selectKth(candidates.subarray(0, m), room - 1);
    for (let i = 0; i < n; i++) if (!take[i] && positionHash(i) <= threshold) take[i] = 2;
  }
  let count = 0;
  for (let i = 0; i < n; i++) if (take[i]) count++;
  const out = new Int32Array(count);
  let j = 0;
  for (let i = 0; i < n; i++) if (take[i]) out[j++] = i;
  return out;
}
