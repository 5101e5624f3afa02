/**
 * 1,048,576 rows (Excel's whole column): 256 invented rows repeated 4,096 times, fitted by polychoric and
 * polyserial with both estimators, against R 4.2.2 / polycor 0.8.1's likelihood for the repeated rows maximised
 * tightly (test/fixtures/ordinal/polycor-r.json, "large"; the repeated likelihood is 4,096 times the base one,
 * see polycor-r.R). Correctness only, no timing assertions.
 *
 * The fits run in a child Node.js process (support/large-child.js): inside Jest's sandbox every global lookup
 * (Math.exp, Math.log, ...) is much slower, which would make the million-row passes about twenty times longer.
 */
import { spawnSync } from 'child_process';
import * as path from 'path';
import { expectRel } from '../../../helpers/close';
import fixture from '../../../fixtures/ordinal/polycor-r.json';

interface ChildFit {
  rho: number;
  se: number;
  thresholdsX?: number[];
  thresholdsY: number[];
  logLik: number;
  lrStatistic: number;
  pValue: number;
  n: number;
  rows: number;
  converged: boolean;
  note?: string;
}
interface Reference {
  rho: number;
  se: number;
  thresholdsX?: number[];
  thresholdsY: number[];
  logLik: number;
  lrStatistic: number;
  pValue: number;
}

const fixturePath = path.resolve(__dirname, '../../../fixtures/ordinal/polycor-r.json');
const child = spawnSync(process.execPath, [path.join(__dirname, 'support/large-child.js'), fixturePath], {
  encoding: 'utf8',
  maxBuffer: 16 * 1024 * 1024,
});
if (child.status !== 0) throw new Error(`large-child.js failed: ${child.stderr}`);
const results = JSON.parse(child.stdout) as Record<'polychoric' | 'polyserial', Record<'two-step' | 'ml', ChildFit>>;
const large = fixture.large as unknown as Record<'polychoric' | 'polyserial', { n: number; twostep: Reference; ml: Reference }>;

describe.each(['polychoric', 'polyserial'] as const)('%s on 1,048,576 rows (R tight fit of the repeated rows)', (kind) => {
  test.each([
    ['two-step', 'twostep'],
    ['ml', 'ml'],
  ] as const)('%s', (estimator, key) => {
    const fit = results[kind][estimator];
    const ref = large[kind][key];
    expect(fit).toMatchObject({ rows: 1048576, n: 1048576, converged: true });
    expect(large[kind].n).toBe(1048576);
    expect(fit.note).toBeUndefined();
    expect(Math.abs(fit.rho - ref.rho)).toBeLessThan(1e-9);
    expectRel(fit.se, ref.se, 1e-7, 'se');
    fit.thresholdsY.forEach((t, i) => expect(Math.abs(t - ref.thresholdsY[i])).toBeLessThan(1e-9));
    if (ref.thresholdsX) fit.thresholdsX!.forEach((t, i) => expect(Math.abs(t - ref.thresholdsX![i])).toBeLessThan(1e-9));
    expectRel(fit.logLik, ref.logLik, 1e-12, 'logLik');
    expectRel(fit.lrStatistic, ref.lrStatistic, 1e-9, 'G^2');
    // G^2 above 2e5: the p-value underflows to 0 in R and here.
    expect(fit.pValue).toBe(ref.pValue);
  });
});
