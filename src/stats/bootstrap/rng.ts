/**
 * The bootstrap's random numbers, seeded from the data so that the same cells always resample the same rows: a
 * recalculation, a reopened workbook and the panel all show the same interval, and nothing flickers.
 *
 * Written here rather than taken from a package because it is 40 lines, must be bit-for-bit the same on every
 * host, and must never touch Math.random or a global state.
 */

/**
 * xoshiro128** 1.1: Blackman & Vigna (2021), "Scrambled linear pseudorandom number generators", ACM Transactions
 * on Mathematical Software 47(4):36. 128 bits of state, period 2^128 - 1, 32-bit outputs.
 */
export class Xoshiro128 {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;

  /** Seeds the state from one 32-bit value through SplitMix32 (Steele, Lea & Flood 2014, OOPSLA), so no state is all zero. */
  constructor(seed: number) {
    let z = seed >>> 0;
    const next = (): number => {
      z = (z + 0x9e3779b9) >>> 0;
      let t = z;
      t = Math.imul(t ^ (t >>> 16), 0x21f0aaad);
      t = Math.imul(t ^ (t >>> 15), 0x735a2d97);
      return (t ^ (t >>> 15)) >>> 0;
    };
    this.s0 = next();
    this.s1 = next();
    this.s2 = next();
    this.s3 = next();
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  /** The next 32-bit unsigned output. */
  nextU32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5), 7), 9) >>> 0;
    const t = this.s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl(this.s3, 11);
    return result;
  }

  /** A uniform whole number in [0, n), n <= 2^21, without bias (see fillCounts). */
  below(n: number): number {
    const threshold = (4294967296 - n) % n;
    for (;;) {
      const m = this.nextU32() * n; // exact: below 2^53
      const high = Math.floor(m / 4294967296);
      if (m - high * 4294967296 >= threshold) return high;
    }
  }

  /**
   * Adds one to counts[i] for `draws` indices i drawn uniformly from [0, n): Lemire's (2019) multiply-and-reject
   * mapping, "Fast random integer generation in an interval", ACM TOMACS 29(1):3, in double arithmetic (exact
   * for n <= 2^21), with the generator inlined because this loop is most of a bootstrap resample's cost.
   */
  fillCounts(counts: Int32Array, n: number, draws: number): void {
    const threshold = (4294967296 - n) % n;
    let s0 = this.s0;
    let s1 = this.s1;
    let s2 = this.s2;
    let s3 = this.s3;
    for (let k = 0; k < draws; ) {
      const x = Math.imul(s1, 5);
      const u = (Math.imul((x << 7) | (x >>> 25), 9)) >>> 0;
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      const m = u * n;
      const high = Math.floor(m / 4294967296);
      if (m - high * 4294967296 < threshold) continue;
      counts[high]++;
      k++;
    }
    this.s0 = s0;
    this.s1 = s1;
    this.s2 = s2;
    this.s3 = s3;
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/**
 * A 32-bit seed from the bits of the data (FNV-1a over each double's two 32-bit halves: Fowler, Noll & Vo,
 * IETF draft-eastlake-fnv), so equal cells give equal seeds and any change to any value gives another.
 */
export function seedFromData(...columns: ArrayLike<number>[]): number {
  const f = new Float64Array(1);
  const w = new Uint32Array(f.buffer);
  let h = 0x811c9dc5;
  for (const col of columns) {
    h = Math.imul(h ^ col.length, 0x01000193);
    for (let i = 0; i < col.length; i++) {
      f[0] = col[i] === 0 ? 0 : col[i]; // -0 and 0 are the same cell value
      h = Math.imul(h ^ w[0], 0x01000193);
      h = Math.imul(h ^ w[1], 0x01000193);
    }
  }
  return h >>> 0;
}
