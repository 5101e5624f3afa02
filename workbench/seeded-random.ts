/**
 * A small seeded random number generator, so the demo data is the same on every machine and every load.
 * Uniforms come from mulberry32 (a 32-bit multiply-xorshift generator, public domain); normal deviates from the
 * Box–Muller transform.
 *
 * References: Box, G. E. P. & Muller, M. E. (1958). A note on the generation of random normal deviates.
 * Annals of Mathematical Statistics, 29(2), 610–611.
 */
export class SeededRandom {
  private state: number;
  private spare: number | null = null;

  constructor(seed: number) {
    this.state = seed >>> 0;
  }

  /** Uniform on [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** Uniform on [low, high). */
  uniform(low: number, high: number): number {
    return low + (high - low) * this.next();
  }

  /** Normal deviate with the given mean and standard deviation (Box–Muller, using both deviates of each pair). */
  normal(mean = 0, sd = 1): number {
    if (this.spare !== null) {
      const z = this.spare;
      this.spare = null;
      return mean + sd * z;
    }
    let u = 0;
    while (u === 0) u = this.next(); // log(0) is not allowed
    const v = this.next();
    const radius = Math.sqrt(-2 * Math.log(u));
    this.spare = radius * Math.sin(2 * Math.PI * v);
    return mean + sd * radius * Math.cos(2 * Math.PI * v);
  }
}

/** Rounds to a number of decimals (negative: to tens, hundreds). */
export function roundTo(x: number, decimals: number): number {
  if (decimals < 0) {
    const step = Math.pow(10, -decimals);
    return Math.round(x / step) * step;
  }
  const f = Math.pow(10, decimals);
  return Math.round(x * f) / f;
}
