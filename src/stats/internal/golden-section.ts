/**
 * Golden-section search for the minimum of a unimodal function on [a, b] (Kiefer 1953, "Sequential minimax search
 * for a maximum", Proceedings of the AMS 4:502-506): each step keeps the part of the bracket that holds the
 * smaller of two interior values, shrinking it by (sqrt 5 - 1)/2, until `done(a, b)` or 200 steps. Returns the
 * bracket's midpoint. Written here because the core needs it in two places and no dependency for it is worth a
 * package.
 */
export function goldenSectionMinimum(f: (x: number) => number, a: number, b: number, done: (a: number, b: number) => boolean): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let it = 0; it < 200 && !done(a, b); it++) {
    if (f1 < f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = f(x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = f(x2);
    }
  }
  return (a + b) / 2;
}
