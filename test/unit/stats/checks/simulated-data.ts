/**
 * The simulated samples of test/fixtures/checks/checks-r.R and normaltest-scipy.py, regenerated here number for
 * number: Park & Miller's (1988) minimal standard generator (exact in double precision) and the cosine branch of
 * Box-Muller. Keep in step with the two scripts.
 */

/** s <- 16807 s mod (2^31 - 1); u = s / (2^31 - 1). */
export function uniforms(seed: number, count: number): Float64Array {
  const out = new Float64Array(count);
  let s = seed;
  for (let k = 0; k < count; k++) {
    s = (16807 * s) % 2147483647;
    out[k] = s / 2147483647;
  }
  return out;
}

/** One normal from each two consecutive uniforms: sqrt(-2 log u1) cos(2 pi u2). */
export function normals(seed: number, count: number): Float64Array {
  const u = uniforms(seed, 2 * count);
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) out[k] = Math.sqrt(-2 * Math.log(u[2 * k])) * Math.cos(2 * Math.PI * u[2 * k + 1]);
  return out;
}

export type SimulatedKind = 'plain' | 'widening' | 'ar1' | 'curved' | 'heavy';

/** The samples of the fixtures: same seeds, same formulas as simulate() in checks-r.R. */
export function simulate(kind: SimulatedKind, n: number): { x: Float64Array; y: Float64Array } {
  const z1 = normals(12345, n);
  const z2 = normals(67890, n);
  const u = uniforms(13579, n);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  switch (kind) {
    case 'plain':
      for (let i = 0; i < n; i++) {
        x[i] = 10 + 2 * z1[i];
        y[i] = 3 + 0.5 * x[i] + z2[i];
      }
      break;
    case 'widening':
      for (let i = 0; i < n; i++) {
        x[i] = 10 * u[i];
        y[i] = 1 + x[i] + (0.2 + 0.3 * x[i]) * z2[i];
      }
      break;
    case 'ar1': {
      let e = 0;
      for (let i = 0; i < n; i++) {
        e = i === 0 ? z2[0] : 0.6 * e + z2[i];
        x[i] = ((i + 1) / n) * 10 + z1[i];
        y[i] = 2 + 0.3 * x[i] + e;
      }
      break;
    }
    case 'curved':
      for (let i = 0; i < n; i++) {
        x[i] = 4 * u[i] - 2;
        y[i] = x[i] * x[i] + 0.5 * z2[i];
      }
      break;
    case 'heavy':
      for (let i = 0; i < n; i++) {
        x[i] = z1[i];
        y[i] = x[i] + (z2[i] * z2[i] * z2[i]) / 3;
      }
      break;
  }
  return { x, y };
}
