/**
 * The content cache behind the cell functions: shared work within a recalculation, never a stale answer after
 * an edit, bounded memory. Expected coefficients after edits come from R 4.2.2 (cor(x, y) on the stated data,
 * values in the comments) so the check does not rest on the project's own output.
 */
import { COEF, PVALUE } from '../../../src/functions/fn-correlation';
import { clearSharedPairs, sharedPairs, sharedPairsStats } from '../../../src/functions/shared-pairs';
import { expectRel } from '../../helpers/close';

const col = (v: unknown[]) => v.map((a) => [a]);
const HW_X = [44.4, 45.9, 41.9, 53.3, 44.7, 44.1, 50.7, 45.2, 60.1];
const HW_Y = [2.6, 3.1, 2.5, 5.0, 3.6, 4.0, 5.2, 2.8, 3.8];

beforeEach(() => clearSharedPairs());

test('the same contents in fresh arrays find the same prepared columns (shared sorting)', () => {
  const a = sharedPairs(col(HW_X), col(HW_Y));
  const b = sharedPairs(col([...HW_X]), col([...HW_Y]));
  expect(b.prepared).toBe(a.prepared);
  COEF(col(HW_X), col(HW_Y), 'spearman');
  const ranks = a.prepared.ranksX;
  COEF(col([...HW_X]), col([...HW_Y]), 'spearman');
  expect(sharedPairs(col(HW_X), col(HW_Y)).prepared.ranksX).toBe(ranks);
});

test('editing one cell gives the new answer at once (R: cor = 0.5711816 before, 0.0785223 after y[4] = 1.0)', () => {
  // R 4.2.2: cor(c(44.4,45.9,41.9,53.3,44.7,44.1,50.7,45.2,60.1), c(2.6,3.1,2.5,1.0,3.6,4.0,5.2,2.8,3.8))
  expectRel(COEF(col(HW_X), col(HW_Y)), 0.571181557563829, 1e-9);
  const edited = [...HW_Y];
  edited[3] = 1.0;
  const r = COEF(col(HW_X), col(edited));
  expect(r).not.toBeCloseTo(0.571181557563829, 6);
  expectRel(r, 0.0785223073167484, 1e-9);
  // ...and back again
  expectRel(COEF(col(HW_X), col(HW_Y)), 0.571181557563829, 1e-9);
});

test('a cell turned blank or text drops its row at once', () => {
  expect(PVALUE(col(HW_X), col(HW_Y))).toBeCloseTo(0.108173054349494, 9);
  const blanked: unknown[] = [...HW_Y];
  blanked[3] = null;
  const pBlank = PVALUE(col(HW_X), col(blanked));
  const texted: unknown[] = [...HW_Y];
  texted[3] = 'five';
  expect(PVALUE(col(HW_X), col(texted))).toBe(pBlank);
  expect(pBlank).not.toBeCloseTo(0.108173054349494, 4);
});

test('memory stays bounded over many different inputs', () => {
  for (let k = 0; k < 200; k++) {
    const x = Array.from({ length: 5000 }, (_, i) => i + k);
    const y = Array.from({ length: 5000 }, (_, i) => (i * 7919 + k) % 5003);
    COEF(col(x), col(y));
  }
  const s = sharedPairsStats();
  expect(s.entries).toBeLessThanOrEqual(16);
  expect(s.values).toBeLessThanOrEqual(8_000_000);
});
