/**
 * Bootstrap intervals against R's boot package (Debian r-cran-boot 1.3-28.1, R 4.2.2) run on the same resample
 * indices, exported by boot.array(b, indices = TRUE) into test/fixtures/robust/bootstrap-r.json (script
 * bootstrap-r.R beside it): the replicates, the jackknife influence values (empinf type "jack"), and boot.ci's
 * "perc" and "bca" limits at 95% and 90%, to 1e-9. Also: the seeded generator gives the same interval for the
 * same cells.
 */
import bootJson from '../../../fixtures/robust/bootstrap-r.json';
import { indexResamples, jackknifeInfluence, replicate } from '../../../../src/stats/bootstrap/bootstrap';
import { PreparedPairs } from '../../../../src/stats/correlation/prepared';
import { correlate } from '../../../../src/stats/correlation/correlate';
import { bootstrapInterval, weightedStatistic } from '../../../../src/stats/robust/robust';
import { compareSeparateByBootstrap, compareSharedByBootstrap } from '../../../../src/stats/compare/dependent-bootstrap';
import { compareSharedSamples } from '../../../../src/stats/compare/shared';
import { Method } from '../../../../src/stats/types';

interface Bounds { lower: number; upper: number }
interface StatRef {
  name: string;
  t0: number;
  t: (number | null)[];
  L: number[];
  percentile: Record<string, Bounds> | null;
  bca: Record<string, Bounds> | null;
  percentile_reason: string | null;
  bca_reason: string | null;
}
interface Run { B: number; indices: number[][]; statistics: StatRef[] }
interface Dataset { name: string; n: number; data: Record<'x' | 'y' | 'z' | 'w', number[]>; runs: Run[] }
const datasets = (bootJson as unknown as { datasets: Dataset[] }).datasets;

const SINGLE: Record<string, Method> = {
  pearson: 'pearson', spearman: 'spearman', kendall: 'kendall', percentage_bend: 'percentage_bend',
  winsorized: 'winsorized', biweight: 'biweight', skipped_pearson: 'skipped',
};

const close = (a: number, b: number, tol: number) => expect(Math.abs(a - b)).toBeLessThan(tol);

const runs = datasets.flatMap((d) => d.runs.map((r) => [`${d.name}, B = ${r.B}`, d, r] as const));

describe.each(runs)('%s', (_label, d, run) => {
  const singles = run.statistics.filter((s) => SINGLE[s.name] !== undefined);
  test.each(singles.map((s) => [s.name, s] as const))('%s: replicates, jackknife and boot.ci limits on the same indices', (_n, s) => {
    const method = SINGLE[s.name];
    const prep = new PreparedPairs(d.data.x, d.data.y);
    const stat = weightedStatistic(prep, method);
    const t = replicate(stat, d.n, indexResamples(run.indices, 1));
    s.t.forEach((v, b) => {
      if (v === null) expect(t[b]).toBeNaN();
      else close(t[b], v, 1e-12); // boot$t[, k]
    });
    const L = jackknifeInfluence(stat, d.n, s.t0);
    s.L.forEach((v, i) => close(L[i], v, 1e-10)); // empinf(b, index = k, type = "jack")
    for (const level of [0.95, 0.9]) {
      const key = level === 0.95 ? '0.95' : '0.9';
      if (s.percentile) {
        const res = bootstrapInterval(prep, method, s.t0, { level, kind: 'percentile', resamples: indexResamples(run.indices, 1) });
        close(res.lower, s.percentile[key].lower, 1e-9); // boot.ci(type = "perc")
        close(res.upper, s.percentile[key].upper, 1e-9);
      }
      if (s.bca) {
        const res = bootstrapInterval(prep, method, s.t0, { level, kind: 'bca', resamples: indexResamples(run.indices, 1) });
        close(res.lower, s.bca[key].lower, 1e-9); // boot.ci(type = "bca", L = empinf(type = "jack"))
        close(res.upper, s.bca[key].upper, 1e-9);
      }
    }
  });

  const diffs = run.statistics.filter((s) => s.name.startsWith('diff_'));
  test.each(diffs.map((s) => [s.name, s] as const))('%s: the dependent difference, percentile limits on the same indices', (name, s) => {
    const method: Method = name.endsWith('spearman') ? 'spearman' : 'pearson';
    const { x, y, z, w } = d.data;
    for (const level of [0.95, 0.9]) {
      const key = level === 0.95 ? '0.95' : '0.9';
      const opts = { level, tail: 'both' as const, resamples: indexResamples(run.indices, 1) };
      const res = name.startsWith('diff_shared') ? compareSharedByBootstrap(x, y, z, method, opts) : compareSeparateByBootstrap(x, y, z, w, method, opts);
      close(res.statistic, s.t0, 1e-12); // boot$t0[k]: cor(x, y) - cor(x, z) or cor(x, y) - cor(z, w)
      close(res.interval.lower, s.percentile![key].lower, 1e-9); // boot.ci(type = "perc")
      close(res.interval.upper, s.percentile![key].upper, 1e-9);
    }
  });
});

test('the seeded bootstrap: same cells, same interval and p-value, for coefficients and differences alike', () => {
  const d = datasets[1];
  const { x, y, z } = d.data;
  const one = correlate(x, y, { method: 'spearman', tail: 'both', level: 0.95, interval: 'bca' });
  const two = correlate(Float64Array.from(x), Float64Array.from(y), { method: 'spearman', tail: 'both', level: 0.95, interval: 'bca' });
  expect([two.interval.lower, two.interval.upper]).toEqual([one.interval.lower, one.interval.upper]);
  expect(one.interval.method).toMatch(/^BCa bootstrap \(Efron 1987\), B = 2000 resamples of the rows, seeded from the data/);
  const a = compareSharedSamples(x, y, z, { level: 0.95, tail: 'both', method: 'spearman' });
  const b = compareSharedSamples(x.slice(), y.slice(), z.slice(), { level: 0.95, tail: 'both', method: 'spearman' });
  expect([b.interval.lower, b.interval.upper, b.pValue]).toEqual([a.interval.lower, a.interval.upper, a.pValue]);
  expect(a.pMethod).toMatch(/bootstrap/);
});

test('over 50,000 rows the interval comes from 200 disjoint subsamples, and agrees with Fisher\'s where Fisher\'s holds', () => {
  // Bivariate normal rows, rho = 0.5: Fisher's (1921) z interval is exact there in the limit, so a subsampling
  // interval must have about its width (the standard error from 200 groups is itself uncertain by about 5%).
  const n = 120000;
  let s = 20261202;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
    const b = Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
    x[i] = a;
    y[i] = 0.5 * a + Math.sqrt(0.75) * b;
  }
  const fisher = correlate(x, y, { method: 'pearson', tail: 'both', level: 0.95 });
  const sub = correlate(x, y, { method: 'pearson', tail: 'both', level: 0.95, interval: 'bca' });
  expect(sub.interval.method).toMatch(/200 random disjoint subsamples of 600 rows \(Politis & Romano 1994\)/);
  const ratio = (sub.interval.upper - sub.interval.lower) / (fisher.interval.upper - fisher.interval.lower);
  expect(ratio).toBeGreaterThan(0.8);
  expect(ratio).toBeLessThan(1.2);
  // The same cells, the same subsamples.
  const again = correlate(x.slice(), y.slice(), { method: 'pearson', tail: 'both', level: 0.95, interval: 'bca' });
  expect([again.interval.lower, again.interval.upper]).toEqual([sub.interval.lower, sub.interval.upper]);
  // Kendall above 20,000 rows uses the same route instead of refusing.
  const k = correlate(x.subarray(0, 30000), y.subarray(0, 30000), { method: 'kendall', tail: 'both', level: 0.95, interval: 'percentile' });
  expect(k.interval.method).toMatch(/subsamples/);
  expect(k.interval.lower).toBeLessThan(k.statistic);
});
