/**
 * Reusable 32-bit work arrays for the sorts and counts that run on every cold call.
 *
 * Why: a Kendall or Spearman call on a million rows needs about a dozen temporary 4-8 MB arrays. Allocated
 * fresh, each costs twice: its pages are faulted in on first write (about 40 ms per 8 MB on the 2-core bench
 * machine, measured), and it counts as external memory, which V8 answers every ~64 MB with a full mark-compact
 * collection that must walk everything alive, including the million one-cell row arrays the host passed in
 * (120-160 ms each). Taking the temporaries from a small pool and handing them back keeps both off the call. Pooled arrays hold stale contents: a borrower writes every element before
 * reading it.
 *
 * Bounded: at most MAX_HELD buffers and MAX_BYTES bytes are kept between calls, the oldest leaving first; a buffer
 * is reused only for a request of at least half its size, so a small call never pins a large buffer.
 */
const MAX_HELD = 16;
const MAX_BYTES = 96 * 1024 * 1024;
/** Below this many elements allocation is cheap and pooling is not worth the bookkeeping. */
const MIN_POOLED = 1 << 14;

const held: ArrayBuffer[] = [];
let heldBytes = 0;

function take(bytes: number): ArrayBuffer | null {
  let best = -1;
  for (let i = 0; i < held.length; i++) {
    const b = held[i].byteLength;
    if (b >= bytes && b <= 2 * bytes && (best < 0 || b < held[best].byteLength)) best = i;
  }
  if (best < 0) return null;
  const buf = held[best];
  held.splice(best, 1);
  heldBytes -= buf.byteLength;
  return buf;
}

/** A Uint32Array of length n with unspecified contents, from the pool when one fits. */
export function borrowU32(n: number): Uint32Array {
  if (n < MIN_POOLED) return new Uint32Array(n);
  const buf = take(n * 4);
  return buf ? new Uint32Array(buf, 0, n) : new Uint32Array(n);
}

/** An Int32Array of length n with unspecified contents, from the pool when one fits. */
export function borrowI32(n: number): Int32Array {
  if (n < MIN_POOLED) return new Int32Array(n);
  const buf = take(n * 4);
  return buf ? new Int32Array(buf, 0, n) : new Int32Array(n);
}

/**
 * Gives arrays back for reuse. The caller must hold no other reference to them (nor to views of their buffers)
 * afterwards. Arrays that are views into a larger buffer than their own span, or too small to pool, are dropped.
 */
export function giveBack(...arrays: (ArrayBufferView | null | undefined)[]): void {
  for (const a of arrays) {
    // (No `instanceof ArrayBuffer` test: it is false across realms, e.g. under a test runner's vm context. Nothing
    // here creates a SharedArrayBuffer.)
    if (!a || a.byteOffset !== 0) continue;
    const buf = a.buffer as ArrayBuffer;
    if (buf.byteLength < MIN_POOLED * 4 || buf.byteLength > MAX_BYTES || held.includes(buf)) continue;
    // Full: the oldest buffers make room. Sizes follow the data in use, so buffers left from an earlier, smaller
    // data set must not keep a larger one's out.
    while (held.length >= MAX_HELD || heldBytes + buf.byteLength > MAX_BYTES) heldBytes -= held.shift()!.byteLength;
    held.push(buf);
    heldBytes += buf.byteLength;
  }
}

/** A Float64Array of length n with unspecified contents, from the pool when one fits. */
export function borrowF64(n: number): Float64Array {
  if (n < MIN_POOLED) return new Float64Array(n);
  const buf = take(n * 8);
  return buf ? new Float64Array(buf, 0, n) : new Float64Array(n);
}

/** Empties the pool (tests). */
export function clearScratch(): void {
  held.length = 0;
  heldBytes = 0;
}

/** Buffers and bytes held now (tests). */
export function scratchStats(): { buffers: number; bytes: number } {
  return { buffers: held.length, bytes: heldBytes };
}
