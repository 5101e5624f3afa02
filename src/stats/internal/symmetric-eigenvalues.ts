/**
 * Eigenvalues of a real symmetric matrix by the cyclic Jacobi method (Jacobi 1846, J. reine angew. Math.
 * 30:51-94) with Rutishauser's stable rotation formulas (Rutishauser 1971, "The Jacobi method for real symmetric
 * matrices", in Wilkinson & Reinsch, Handbook for Automatic Computation II, Linear Algebra, pp. 202-211).
 * Jacobi rotations give eigenvalues to high relative accuracy; O(n^3) per sweep, so meant for small matrices
 * (the exact Durbin-Watson distribution uses it below 100 points). Written here because the project has no
 * linear-algebra dependency.
 *
 * @param a the matrix, row-major n x n; only its upper triangle is read. Not modified.
 * @returns the eigenvalues in decreasing order
 * @example symmetricEigenvalues(Float64Array.of(2, 1, 1, 2), 2) // Float64Array [3, 1]
 */
export function symmetricEigenvalues(a: Float64Array, n: number): Float64Array {
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = i; j < n; j++) m[i * n + j] = m[j * n + i] = a[i * n + j];
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) d[i] = m[i * n + i];
  // b accumulates the diagonal over a sweep, z the updates within it (Rutishauser's scheme).
  const b = Float64Array.from(d);
  const z = new Float64Array(n);
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < n - 1; p++) for (let q = p + 1; q < n; q++) off += Math.abs(m[p * n + q]);
    if (off === 0) break;
    const threshold = sweep < 3 ? (0.2 * off) / (n * n) : 0;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = m[p * n + q];
        const g = 100 * Math.abs(apq);
        // After four sweeps, an element too small to change either diagonal entry is set to zero.
        if (sweep > 3 && Math.abs(d[p]) + g === Math.abs(d[p]) && Math.abs(d[q]) + g === Math.abs(d[q])) {
          m[p * n + q] = 0;
          continue;
        }
        if (Math.abs(apq) <= threshold) continue;
        const h = d[q] - d[p];
        let t: number;
        if (Math.abs(h) + g === Math.abs(h)) {
          t = apq / h;
        } else {
          const theta = (0.5 * h) / apq;
          t = 1 / (Math.abs(theta) + Math.sqrt(1 + theta * theta));
          if (theta < 0) t = -t;
        }
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        const tau = s / (1 + c);
        const hh = t * apq;
        z[p] -= hh;
        z[q] += hh;
        d[p] -= hh;
        d[q] += hh;
        m[p * n + q] = 0;
        const rotate = (i1: number, j1: number, i2: number, j2: number): void => {
          const gg = m[i1 * n + j1];
          const hv = m[i2 * n + j2];
          m[i1 * n + j1] = gg - s * (hv + gg * tau);
          m[i2 * n + j2] = hv + s * (gg - hv * tau);
        };
        for (let j = 0; j < p; j++) rotate(j, p, j, q);
        for (let j = p + 1; j < q; j++) rotate(p, j, j, q);
        for (let j = q + 1; j < n; j++) rotate(p, j, q, j);
      }
    }
    for (let p = 0; p < n; p++) {
      b[p] += z[p];
      d[p] = b[p];
      z[p] = 0;
    }
  }
  return d.sort().reverse();
}
