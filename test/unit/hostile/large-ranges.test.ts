/**
 * Whole-column references: ranges of 1,048,576 rows (Excel's maximum) holding 1,000 filled rows and blanks
 * (null, as Excel on the web passes them, or "") answer exactly as the 1,000 rows alone, and match scipy on those
 * rows (test/fixtures/stress/make-large.py, scipy 1.10.1); with the blanks passed as 0 (some desktop builds) the
 * column is refused with the documented message. Correctness only, no timing assertions.
 *
 * The calls run in a child Node.js process (support/large-ranges-child.js) that hosts dist/functions.js with
 * CustomFunctions as its only host global: inside Jest's sandbox every global lookup of the bundle is much slower,
 * which would make this test minutes long. Needs `npm run build` first.
 */
import { spawnSync } from 'child_process';
import * as path from 'path';
import large from '../../fixtures/stress/large-scipy.json';
import { distFile } from '../../helpers/bare-host';
import { expectRel } from '../../helpers/close';

interface Outcome {
  kind: 'value' | 'host-error' | 'raw-exception' | 'missing';
  value?: unknown;
  code?: string;
  message?: string;
}
type Results = Record<string, Record<string, { big: Outcome; small?: Outcome }>>;

const child = spawnSync(
  process.execPath,
  [path.join(__dirname, 'support/large-ranges-child.js'), distFile('functions.js'), path.resolve(__dirname, '../../fixtures/stress/large-scipy.json')],
  { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 },
);
if (child.status !== 0) throw new Error(`large-ranges-child.js failed: ${child.stderr}`);
const results = JSON.parse(child.stdout) as Results;

const valueOf = (o: Outcome, what: string): unknown => {
  if (o.kind !== 'value') throw new Error(`${what}: ${o.kind} ${o.code ?? ''} ${o.message ?? ''}`);
  return o.value;
};

describe.each(['blanks null', 'blanks ""', 'blanks null, data at the bottom'])('1,048,576-row ranges with 1,000 filled rows, %s', (variant) => {
  const cases = results[variant];

  test('every function answers as on the 1,000 rows alone (REPORT: but for the count of skipped rows)', () => {
    for (const [label, { big, small }] of Object.entries(cases)) {
      if (big.kind === 'missing') continue;
      let a = valueOf(big, `${label} on the whole column`);
      let b = valueOf(small!, `${label} on the 1,000 rows`);
      if (label === 'REPORT') {
        // The whole column skips 1,047,576 blank rows; the 1,000-row range skips none. Everything else agrees.
        const skipped = (v: unknown) => (v as unknown[][]).find((r) => /skipped/.test(String(r[0])))?.[1];
        expect(skipped(a)).toBe(1_048_576 - large.x.length);
        expect(skipped(b)).toBe(0);
        [a, b] = [a, b].map((v) => (v as unknown[][]).filter((r) => !/skipped/.test(String(r[0]))));
      }
      expect([label, a]).toEqual([label, b]);
    }
  });

  test('the coefficients and p-values match scipy on the 1,000 rows; PAIRS counts 1,000', () => {
    expect(valueOf(cases.PAIRS.big, 'PAIRS')).toBe(1000);
    expectRel(valueOf(cases['COEF pearson'].big, 'COEF') as number, large.pearson.r, 1e-12, large.pearson.call);
    expectRel(valueOf(cases['COEF kendall'].big, 'COEF kendall') as number, large.kendall.tau, 1e-12, large.kendall.call);
    expectRel(valueOf(cases['PVALUE spearman'].big, 'PVALUE spearman') as number, large.spearman.p, 1e-6, large.spearman.call);
    if (cases['COEF spearman']) expectRel(valueOf(cases['COEF spearman'].big, 'COEF spearman') as number, large.spearman.rho, 1e-12, large.spearman.call);
    if (cases['PVALUE pearson']) expectRel(valueOf(cases['PVALUE pearson'].big, 'PVALUE') as number, large.pearson.p, 1e-6, large.pearson.call);
    if (cases['PVALUE kendall']) expectRel(valueOf(cases['PVALUE kendall'].big, 'PVALUE kendall') as number, large.kendall.p, 1e-6, large.kendall.call);
    if (cases['MATRIX pairs']) expect(valueOf(cases['MATRIX pairs'].big, 'MATRIX pairs')).toEqual([[1000, 1000, 1000], [1000, 1000, 1000], [1000, 1000, 1000]]);
  });
});

test('a whole column whose blanks arrive as 0 is refused with the documented message, not answered', () => {
  for (const id of ['COEF', 'PAIRS']) {
    const out = results['blanks as 0'][id].big;
    expect(out.kind).toBe('host-error');
    expect(out.code).toBe('#VALUE!');
    expect(out.message).toMatch(/are all 0: these look like empty cells/);
  }
});
