/**
 * Corrections of a validity coefficient against outside references, all in test/fixtures/corrections/
 * psychometric-r.json (script psychometric-r.R beside it; R 4.2.2, psychometric 2.3, exact calls inside):
 * - the Hunter & Schmidt (2004) order and Case IV (Hunter, Schmidt & Le 2006) written out in base R;
 * - psychometric's cRRr (Thorndike Case II), rhoCA / CAFAA (artifact correction) and CIr (Fisher-z interval) where
 *   they compute the same thing;
 * - an exact population model (Pearson-Lawley selection), whose applicant correlations the corrections recover.
 */
import fc from 'fast-check';
import { CORRECTION_CAUTION, correctValidity, CorrectionInput } from '../../../../src/stats/corrections/corrected';
import { StatsInputError } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import fixture from '../../../fixtures/corrections/psychometric-r.json';

interface PsychometricValues {
  cRRr?: number;
  cRRr_sds?: number;
  cRRr_true_scores?: number;
  relX_sample?: number;
  u_T?: number;
  CAFAA?: number;
  rhoCA?: number;
  rhoCA_is_hs_order?: boolean;
  CIr?: number[];
}
interface FixtureCase {
  name: string;
  r: number;
  relX: number | null;
  relY: number | null;
  U: number | null;
  restriction: 'direct' | 'indirect' | 'none';
  n: number | null;
  level: number;
  operational: number | null;
  true_score: number | null;
  corrected: number;
  lower: number | null;
  upper: number | null;
  psychometric: PsychometricValues;
}
const cases = fixture.cases as unknown as FixtureCase[];

const inputOf = (c: FixtureCase): CorrectionInput => ({
  r: c.r,
  ...(c.relX === null ? {} : { relX: c.relX }),
  ...(c.relY === null ? {} : { relY: c.relY }),
  ...(c.U === null ? {} : { sdRatio: c.U }),
  ...(c.restriction === 'none' ? {} : { restriction: c.restriction }),
  ...(c.n === null ? {} : { n: c.n }),
  level: c.level,
});

/** Relative 1e-9, or absolute 1e-15 where the expected value is within 1e-6 of 0 (an interval bound near 0). */
function expectClose(actual: number, expected: number, label: string): void {
  if (Math.abs(expected) < 1e-6) expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-15);
  else expectRel(actual, expected, 1e-9, label);
}

function thrown(input: CorrectionInput): StatsInputError {
  try {
    correctValidity(input);
  } catch (e) {
    if (e instanceof StatsInputError) return e;
    throw e;
  }
  throw new Error(`no error for ${JSON.stringify(input)}`);
}

describe.each(cases.map((c) => [c.name, c] as [string, FixtureCase]))('R 4.2.2 reference: %s', (_name, c) => {
  const res = correctValidity(inputOf(c));

  test('corrected, operational and true-score validity (Hunter & Schmidt order written out in R, psychometric-r.json)', () => {
    expectClose(res.corrected, c.corrected, 'corrected');
    if (c.operational === null) expect(res.operational).toBeNull();
    else expectClose(res.operational as number, c.operational, 'operational');
    if (c.true_score === null) expect(res.trueScore).toBeNull();
    else expectClose(res.trueScore as number, c.true_score, 'true score');
    expect(res.restriction).toBe(c.restriction);
  });

  test('interval: psychometric CIr of r, bounds through the same steps (psychometric-r.json)', () => {
    if (c.n === null) {
      expect(res.lower).toBeNaN();
      expect(res.upper).toBeNaN();
      expect(res.interval.note).toMatch(/no n given/);
      return;
    }
    expectClose(res.lower, c.lower as number, 'lower');
    expectClose(res.upper, c.upper as number, 'upper');
    expect(res.interval.level).toBe(c.level);
    // psychometric 2.3 CIr(r, n, level): the observed interval itself, with no correction asked.
    const plain = correctValidity({ r: c.r, n: c.n, level: c.level });
    expectClose(plain.lower, (c.psychometric.CIr as number[])[0], 'CIr lower');
    expectClose(plain.upper, (c.psychometric.CIr as number[])[1], 'CIr upper');
  });

  const p = c.psychometric;
  if (p.cRRr !== undefined) {
    test('Case II step equals psychometric 2.3 cRRr(r after the criterion step, 1, U) and cRRr with the two SDs', () => {
      expectRel(res.operational as number, p.cRRr as number, 1e-9, 'cRRr');
      expectRel(res.operational as number, p.cRRr_sds as number, 1e-9, 'cRRr with SDs');
    });
  }
  if (p.cRRr_true_scores !== undefined) {
    test('Case IV range step equals psychometric 2.3 cRRr(r / sqrt(relXi relY), u_T, 1)', () => {
      expectRel(res.trueScore as number, p.cRRr_true_scores as number, 1e-9, 'cRRr on true scores');
      expect(res.steps[0]).toContain(`rel_x there ${Number((p.relX_sample as number).toPrecision(3))}`);
      expect(res.steps[1]).toContain(`u_T ${Number((p.u_T as number).toPrecision(3))}`);
    });
  }
  if (p.rhoCA !== undefined) {
    if (p.rhoCA_is_hs_order) {
      test('equals psychometric 2.3 rhoCA on a one-study data frame (no criterion correction before range, so the orders agree)', () => {
        expectRel(res.corrected, p.rhoCA as number, 1e-9, 'rhoCA');
        expectRel(c.r / res.corrected, p.CAFAA as number, 1e-9, 'CAFAA');
      });
    } else {
      test('differs from psychometric 2.3 rhoCA, which corrects range with the observed r instead of the criterion-corrected one', () => {
        expect(Math.abs(res.corrected - (p.rhoCA as number))).toBeGreaterThan(1e-3);
      });
    }
  }
});

describe('exact population model: Pearson-Lawley selection (psychometric-r.json, population_model)', () => {
  test.each(fixture.population_model.map((m) => [m.label, m] as [string, (typeof fixture.population_model)[number]]))('%s', (_label, m) => {
    const res = correctValidity({
      r: m.r,
      relX: m.relX,
      relY: m.relY,
      sdRatio: m.U,
      restriction: m.restriction as 'direct' | 'indirect',
    });
    expectRel(res.operational as number, m.operational, 1e-9, 'operational = cor_applicants(X, P)');
    expectRel(res.trueScore as number, m.true_score, 1e-9, 'true score = cor_applicants(T, P)');
  });
});

describe('bounds held at 1 (psychometric-r.json, clipped)', () => {
  const k = fixture.clipped;
  const res = correctValidity({ r: k.r, relX: k.relX, relY: k.relY, sdRatio: k.U, restriction: 'direct', n: k.n, level: k.level });
  test('upper bound passes 1 at the criterion step and is shown as 1, the rest as R', () => {
    expectRel(res.corrected, k.corrected, 1e-9, 'corrected');
    expectRel(res.lower, k.lower, 1e-9, 'lower');
    expect(res.upper).toBe(k.upper);
    expect(res.upper).toBe(1);
    expect(res.interval.note).toBe('the upper bound passed 1 at the correction for criterion unreliability (rel_y 0.5); it is shown as the limit');
  });
});

describe('steps, caution and defaults', () => {
  test('steps name each correction with its input and output, in the Hunter & Schmidt (2004) order', () => {
    const res = correctValidity({ r: 0.3, relX: 0.8, relY: 0.52, sdRatio: 1.5, n: 120 });
    expect(res.steps).toEqual([
      'criterion unreliability (rel_y 0.52): 0.300 -> 0.416',
      'direct range restriction (Case II, U 1.5): 0.416 -> 0.566',
      'predictor unreliability (rel_x 0.8): 0.566 -> 0.633',
    ]);
    expect(res.restriction).toBe('direct');
    expect(res.interval.level).toBe(0.95);
    expect(res.interval.method).toMatch(/^Fisher z of the observed r/);
    expect(res.caution).toBe(CORRECTION_CAUTION);
    expect(res.caution).toMatch(/applicant group/);
    expect(res.caution).toMatch(/adverse-impact law/);
  });

  test('sdRatio below 1 is allowed and noted', () => {
    const res = correctValidity({ r: 0.4, sdRatio: 0.8 });
    expect(res.steps[res.steps.length - 1]).toMatch(/^note: sd_ratio 0.8 is below 1/);
    expect(Math.abs(res.corrected)).toBeLessThan(0.4);
  });

  test('nothing to correct returns r with a step saying so', () => {
    const res = correctValidity({ r: -0.2, n: 50 });
    expect(res.corrected).toBe(-0.2);
    expect(res.operational).toBeNull();
    expect(res.trueScore).toBeNull();
    expect(res.restriction).toBe('none');
    expect(res.steps).toEqual(['nothing to correct: no reliability or SD ratio was given, so the value is the observed r']);
  });

  test('predictor reliability alone: true score set, operational null', () => {
    const res = correctValidity({ r: 0.3, relX: 0.81 });
    expectRel(res.trueScore as number, 0.3 / 0.9, 1e-15, 'Spearman (1904)');
    expect(res.operational).toBeNull();
    expect(res.corrected).toBe(res.trueScore);
  });

  test('Case IV with relX = 1 is Case II (no measurement error to separate)', () => {
    const four = correctValidity({ r: 0.3, relX: 1, relY: 0.6, sdRatio: 1.4, restriction: 'indirect' });
    const two = correctValidity({ r: 0.3, relY: 0.6, sdRatio: 1.4 });
    expectRel(four.trueScore as number, two.operational as number, 1e-14, 'Case IV = Case II');
  });
});

describe('input errors (StatsInputError)', () => {
  test.each<[string, CorrectionInput, RegExp]>([
    ['|r| = 1', { r: 1, relY: 0.8 }, /^r must lie strictly between -1 and 1/],
    ['|r| > 1', { r: -1.2 }, /^r must lie strictly between -1 and 1/],
    ['r NaN', { r: NaN }, /^r must lie/],
    ['relX 0', { r: 0.3, relX: 0 }, /^rel_x \(the reliability of the predictor among applicants\) must be above 0 and at most 1/],
    ['relY above 1', { r: 0.3, relY: 1.2 }, /^rel_y \(the reliability of the criterion in the sample\)/],
    ['relY negative', { r: 0.3, relY: -0.5 }, /^rel_y/],
    ['sdRatio 0', { r: 0.3, sdRatio: 0 }, /^sd_ratio .* must be above 0/],
    ['sdRatio negative', { r: 0.3, sdRatio: -1.5 }, /^sd_ratio/],
    ['indirect without relX', { r: 0.3, sdRatio: 1.5, restriction: 'indirect' }, /^indirect range restriction \(Case IV\) needs rel_x/],
    ['indirect, u_T not real', { r: 0.1, relX: 0.6, sdRatio: 1.8, restriction: 'indirect' }, /do not fit together.*sd_ratio must be below 1\.58/],
    ['indirect, u_T = 0 exactly', { r: 0.1, relX: 0.75, sdRatio: 2, restriction: 'indirect' }, /do not fit together/],
    ['n 3', { r: 0.3, relY: 0.7, n: 3 }, /^n \(the rows behind r\) must be a whole number of at least 4/],
    ['n not whole', { r: 0.3, relY: 0.7, n: 10.5 }, /^n /],
    ['level 1', { r: 0.3, relY: 0.7, level: 1 }, /^level must be between 0 and 1/],
    [
      'Spearman correction past 1',
      { r: 0.6, relX: 0.5, relY: 0.5 },
      /^the inputs are inconsistent: the correction for predictor unreliability \(rel_x 0.5\) takes 0.849 to 1.200, beyond 1/,
    ],
    [
      'criterion correction past 1, negative',
      { r: -0.7, relY: 0.4, sdRatio: 1.2 },
      /^the inputs are inconsistent: the correction for criterion unreliability \(rel_y 0.4\) takes -0.700 to -1.107, beyond -1/,
    ],
    ['Case IV disattenuation past 1', { r: 0.2, relX: 0.5, relY: 0.7, sdRatio: 1.4, restriction: 'indirect' }, /correction for predictor and criterion unreliability in the sample/],
  ])('%s: out-of-range', (_label, input, message) => {
    const e = thrown(input);
    expect(e.code).toBe('out-of-range');
    expect(e.message).toMatch(message);
  });

  test.each<[string, CorrectionInput, RegExp]>([
    ['unknown restriction', { r: 0.3, sdRatio: 1.2, restriction: 'both' as unknown as 'direct' }, /^restriction must be "direct" or "indirect"/],
    ['restriction without sdRatio', { r: 0.3, relX: 0.8, restriction: 'direct' }, /needs sd_ratio/],
  ])('%s: bad-option', (_label, input, message) => {
    const e = thrown(input);
    expect(e.code).toBe('bad-option');
    expect(e.message).toMatch(message);
  });
});

describe('properties', () => {
  const inputs = fc.record({
    r: fc.double({ min: -0.6, max: 0.6, noNaN: true }),
    dr: fc.double({ min: 1e-6, max: 0.3, noNaN: true }),
    relX: fc.option(fc.double({ min: 0.5, max: 1, noNaN: true }), { nil: undefined }),
    relY: fc.option(fc.double({ min: 0.4, max: 1, noNaN: true }), { nil: undefined }),
    sdRatio: fc.option(fc.double({ min: 0.6, max: 1.4, noNaN: true }), { nil: undefined }),
    indirect: fc.boolean(),
    n: fc.integer({ min: 4, max: 2000 }),
  });
  interface Draw { relX?: number; relY?: number; sdRatio?: number; indirect: boolean; n: number }
  const build = (v: Draw, r: number): CorrectionInput => ({
    r,
    relX: v.indirect && v.sdRatio !== undefined ? (v.relX ?? 0.8) : v.relX,
    relY: v.relY,
    sdRatio: v.sdRatio,
    restriction: v.sdRatio === undefined ? undefined : v.indirect ? 'indirect' : 'direct',
    n: v.n,
  });
  /** The result, or null when these inputs are inconsistent (a correction past 1), which the property skips. */
  const attempt = (input: CorrectionInput) => {
    try {
      return correctValidity(input);
    } catch (e) {
      if (e instanceof StatsInputError && /inconsistent/.test(e.message)) return null;
      throw e;
    }
  };

  test('the interval contains the corrected r, and corrected r and both bounds do not decrease as r grows', () => {
    fc.assert(
      fc.property(inputs, (v) => {
        const a = attempt(build(v, v.r));
        const b = attempt(build(v, Math.min(0.99, v.r + v.dr)));
        fc.pre(a !== null && b !== null);
        const lo = a as NonNullable<typeof a>;
        const hi = b as NonNullable<typeof b>;
        expect(lo.lower).toBeLessThanOrEqual(lo.corrected);
        expect(lo.corrected).toBeLessThanOrEqual(lo.upper);
        expect(Math.abs(lo.lower)).toBeLessThanOrEqual(1);
        expect(Math.abs(lo.upper)).toBeLessThanOrEqual(1);
        expect(hi.corrected).toBeGreaterThanOrEqual(lo.corrected);
        expect(hi.lower).toBeGreaterThanOrEqual(lo.lower);
        expect(hi.upper).toBeGreaterThanOrEqual(lo.upper);
      }),
      { numRuns: 400 },
    );
  });

  test('every correction is odd in r: corrected(-r) = -corrected(r)', () => {
    fc.assert(
      fc.property(inputs, (v) => {
        const a = attempt(build(v, v.r));
        fc.pre(a !== null);
        const m = correctValidity(build(v, -v.r));
        expect(m.corrected + (a as NonNullable<typeof a>).corrected).toBe(0);
      }),
      { numRuns: 200 },
    );
  });
});
