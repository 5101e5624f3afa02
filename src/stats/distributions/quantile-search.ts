/**
 * Shared root search behind the t, F and chi-square quantiles: given an accurate tail function, find the x > 0
 * whose tail equals p. Newton's method (e.g. Press, Teukolsky, Vetterling & Flannery 2007, Numerical Recipes,
 * 3rd ed., §9.4) is applied to ln tail(x) as a function of ln x, a scale on which these tails are nearly
 * linear (power-law tails) or gently curved (exponential tails), so a good start converges in two or three
 * steps, and a p of 1e-250 is as easy as 0.05. A bracket of the root is kept as the search goes, and a step
 * that would leave it is replaced by bisection, so a poor start still converges.
 */

/** A tail probability of a continuous distribution on (0, ∞), seen by the search. */
export interface TailModel {
  /** True for the upper tail P(X > x) (falls with x), false for the lower tail P(X ≤ x) (rises with x). */
  readonly upper: boolean;
  /** The tail probability at x > 0. */
  tail(x: number): number;
  /** x·f(x) for the density f: the magnitude of d tail / d ln x. */
  scaledDensity(x: number): number;
}

const MAX_STEPS = 60;
/** A Newton step this small (in ln x) leaves an error of about its square: done. */
const STEP_TOLERANCE = 1e-8;
/** ln of the largest double and of the smallest positive (subnormal) double. */
const LOG_LARGEST = Math.log(Number.MAX_VALUE);
const LOG_SMALLEST = Math.log(Number.MIN_VALUE);
/** Two tails that agree this closely are the same double for all practical purposes. */
const LOG_TOLERANCE = 1e-15;

function isUsableGuess(x: number | undefined): x is number {
  return x !== undefined && x > 0 && x < Infinity;
}

/**
 * The x > 0 with model.tail(x) = p, for 0 < p < 1, starting from the better of two guesses (either may be
 * undefined or unusable; with neither the search starts at 1).
 */
export function solveTail(model: TailModel, p: number, guess?: number, secondGuess?: number): number {
  const logP = Math.log(p);
  // On the ln x scale: g(s) = ln tail(e^s) − ln p, falling in s for an upper tail and rising for a lower one.
  const direction = model.upper ? -1 : 1;
  let start = isUsableGuess(guess) ? guess : isUsableGuess(secondGuess) ? secondGuess : 1;
  let logTail = Math.log(model.tail(start));
  if (isUsableGuess(guess) && isUsableGuess(secondGuess)) {
    const secondLogTail = Math.log(model.tail(secondGuess));
    if (!(Math.abs(logTail - logP) <= Math.abs(secondLogTail - logP))) {
      start = secondGuess;
      logTail = secondLogTail;
    }
  }
  let s = Math.log(start);
  // Root bracket on the ln x scale.
  let below = -Infinity;
  let above = Infinity;
  for (let step = 0; step < MAX_STEPS; step++) {
    const x = Math.exp(s);
    const g = logTail - logP;
    if (Number.isNaN(g)) return NaN;
    if (Math.abs(g) <= LOG_TOLERANCE) return x;
    // The root lies above s when g and the direction of g have opposite signs.
    const rootAbove = direction * g < 0;
    if (rootAbove) below = s;
    else above = s;
    let next: number;
    const slope = (direction * model.scaledDensity(x)) / Math.exp(logTail);
    const newton = s - g / slope;
    // A step this small has converged, even if rounding puts it on the bracket's edge.
    if (Math.abs(newton - s) <= STEP_TOLERANCE) return Math.exp(newton);
    if (Number.isFinite(newton) && newton > below && newton < above) {
      next = newton;
    } else if (Number.isFinite(below) && Number.isFinite(above)) {
      next = 0.5 * (below + above);
    } else {
      next = rootAbove ? s + 1 : s - 1; // no usable slope and only one side known: walk by a factor e
    }
    if (above - below <= 4e-16 * Math.max(1, Math.abs(s))) return Math.exp(next);
    // A root beyond the range of doubles: once the search stands at the edge and must go further, say so.
    if (next > LOG_LARGEST) {
      if (s === LOG_LARGEST) return Infinity;
      next = LOG_LARGEST;
    } else if (next < LOG_SMALLEST) {
      if (s === LOG_SMALLEST) return 0;
      next = LOG_SMALLEST;
    }
    s = next;
    logTail = Math.log(model.tail(Math.exp(s)));
  }
  return Math.exp(s);
}
