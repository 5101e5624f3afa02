/**
 * Whole-column references holding a few filled rows: MATRIX's size limit and PARTIAL's reading follow the filled
 * rows, not the 1,048,576 rows of the reference, and the answers equal those on the filled rows alone (the same
 * function on the same numbers is the reference here: what is checked is that the blank tail changes nothing).
 */
import { MATRIX, PARTIAL } from '../../../src/functions/fn-compare';

const EXCEL_ROWS = 1048576;
const FILLED = 1000;

/** Deterministic columns (an LCG's normals), k of them, FILLED rows each. */
function columns(k: number): number[][] {
  let s = 7;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const base = Array.from({ length: FILLED }, () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u()));
  return Array.from({ length: k }, (_, j) => base.map((b) => Math.round((b * (j % 3 === 0 ? 1 : -0.5) + u()) * 100) / 100));
}

function wholeBlock(cols: number[][], rows: number): (number | null)[][] {
  const out: (number | null)[][] = new Array(rows);
  for (let i = 0; i < rows; i++) out[i] = cols.map((c) => (i < c.length ? c[i] : null));
  return out;
}

test('MATRIX over 50 whole columns with 1,000 filled rows answers, as on the filled block', () => {
  const cols = columns(50);
  const whole = MATRIX(wholeBlock(cols, EXCEL_ROWS), null as unknown as string, null as unknown as string, null as unknown as boolean);
  const small = MATRIX(wholeBlock(cols, FILLED), null as unknown as string, null as unknown as string, null as unknown as boolean);
  expect(whole).toEqual(small);
  expect(whole.length).toBe(50);
});

test('PARTIAL with three whole-column controls reads only as far as x and y go', () => {
  const [x, y, a, b, c] = columns(5);
  const one = (v: number[], rows: number) => wholeBlock([v], rows);
  const controls = (rows: number) => wholeBlock([a, b, c], rows);
  const whole = PARTIAL(one(x, EXCEL_ROWS), one(y, EXCEL_ROWS), controls(EXCEL_ROWS), null as unknown as number, null as unknown as string);
  const small = PARTIAL(one(x, FILLED), one(y, FILLED), controls(FILLED), null as unknown as number, null as unknown as string);
  expect(whole).toEqual(small);
});
