/**
 * What each cell of each function's answer means, read from the functions' JSDoc (@returns) and the README's
 * table, so that range properties can be checked: correlations in [-1, 1], p-values in [0, 1], intervals that
 * contain their estimate, counts that are whole numbers no larger than the rows given.
 *
 * A function not listed here still gets the properties every answer must have (no raw exception, no NaN or
 * Infinity, no null in a spilled array, rectangular arrays); add a row when a function lands to get the rest.
 */
import { callCell } from './registry';

/** Returns the violations found in `value`, an answer of the function to `args` (empty when all hold). */
export type RoleCheck = (value: unknown, args: unknown[]) => string[];

const isNum = (v: unknown): v is number => typeof v === 'number';

function inUnit(v: unknown, what: string): string[] {
  return isNum(v) && v >= -1 && v <= 1 ? [] : [`${what} ${String(v)} is not a number in [-1, 1]`];
}

function probability(v: unknown, what = 'p-value'): string[] {
  return isNum(v) && v >= 0 && v <= 1 ? [] : [`${what} ${String(v)} is not in [0, 1]`];
}

/** One row [lower, upper, ...]: both bounds in [-1, 1], ordered, containing the estimate when it is known. */
function intervalRow(value: unknown, estimate: number | undefined): string[] {
  if (!Array.isArray(value) || value.length !== 1 || !Array.isArray(value[0])) return [`expected one row, got ${JSON.stringify(value)}`];
  const [lo, hi] = value[0] as unknown[];
  const out = [...inUnit(lo, 'lower bound'), ...inUnit(hi, 'upper bound')];
  if (out.length) return out;
  if (!((lo as number) <= (hi as number))) out.push(`lower bound ${lo} is above upper bound ${hi}`);
  if (estimate !== undefined && !((lo as number) <= estimate && estimate <= (hi as number))) {
    out.push(`interval [${lo}, ${hi}] does not contain the estimate ${estimate}`);
  }
  return out;
}

/** The coefficient the same data and method give, for interval containment; undefined when COEF refuses. */
function coefficientOf(x: unknown, y: unknown, method: unknown): number | undefined {
  const out = callCell('COEF', [x, y, method]);
  return out.kind === 'value' && isNum(out.value) ? out.value : undefined;
}

/** One row [estimate, lower, upper, p]: the estimate within `bound`, inside its interval, p in [0, 1]. */
function estimateIntervalP(value: unknown, bound: number): string[] {
  if (!Array.isArray(value) || value.length !== 1 || !Array.isArray(value[0]) || (value[0] as unknown[]).length !== 4) {
    return [`expected one row of four cells, got ${JSON.stringify(value)}`];
  }
  const [est, lo, hi, p] = value[0] as unknown[];
  const within = (v: unknown, what: string) => (isNum(v) && v >= -bound && v <= bound ? [] : [`${what} ${String(v)} is not in [${-bound}, ${bound}]`]);
  const out = [...within(est, 'estimate'), ...within(lo, 'lower bound'), ...within(hi, 'upper bound'), ...probability(p)];
  if (out.length === 0 && !((lo as number) <= (est as number) && (est as number) <= (hi as number))) {
    out.push(`interval [${lo}, ${hi}] does not contain the estimate ${est}`);
  }
  return out;
}

/** The option word a call passed, as the functions read it (trimmed, lower case), or the default. */
function word(v: unknown, fallback: string): string {
  return v === null || v === undefined || v === '' ? fallback : String(v).trim().toLowerCase();
}

/** MATRIX: a square table (plus a header row and column), symmetric, each cell in the range of what it shows. */
function matrixTable(value: unknown, args: unknown[]): string[] {
  const show = word(args[2], 'coef');
  const headers = args[3] === true;
  if (!Array.isArray(value)) return ['MATRIX answered a scalar'];
  const rows = value as unknown[][];
  const body = (headers ? rows.slice(1) : rows).map((r) => (headers ? r.slice(1) : r));
  const k = body.length;
  const out: string[] = [];
  if (body.some((r) => r.length !== k)) out.push(`table is not square (${k} rows, ${body[0]?.length} columns)`);
  for (let i = 0; i < k && out.length < 3; i++) {
    for (let j = 0; j < k; j++) {
      const v = body[i][j];
      if (v !== body[j]?.[i]) out.push(`not symmetric at [${i}][${j}]: ${String(v)} vs ${String(body[j]?.[i])}`);
      if (show === 'coef') {
        out.push(...inUnit(v, `coefficient [${i}][${j}]`));
        if (i === j && v !== 1) out.push(`diagonal [${i}][${i}] is ${String(v)}, not 1`);
      } else if (show === 'pairs') {
        if (!(isNum(v) && Number.isInteger(v) && v >= 0)) out.push(`pair count [${i}][${j}] is ${String(v)}`);
      } else if (i === j) {
        if (v !== '') out.push(`p-value diagonal [${i}][${i}] is ${String(v)}, not empty`);
      } else out.push(...probability(v, `p-value [${i}][${j}]`));
    }
  }
  return out;
}

/** CHECKS: a header row and one row per check: statistic, p-value in [0, 1] or "", effect text, a known verdict,
 * a meaning and the rule applied. */
function checksTable(value: unknown): string[] {
  if (!Array.isArray(value) || value.length !== 9) return ['CHECKS answered no table of a header and eight rows'];
  const rows = value as unknown[][];
  const out: string[] = [];
  rows.slice(1).forEach((r, i) => {
    if (r.length !== 8) out.push(`check row ${i + 1} has ${r.length} cells`);
    const [label, , statistic, p, effect, verdict, meaning, rule] = r;
    if (typeof label !== 'string' || label === '') out.push(`check row ${i + 1} has no label`);
    if (statistic !== '' && typeof statistic !== 'number') out.push(`${label}: statistic ${String(statistic)}`);
    if (p !== '') out.push(...probability(p, `${label} p-value`));
    if (typeof effect !== 'string') out.push(`${label}: effect ${String(effect)}`);
    if (!['fine', 'slight', 'problem', 'too few rows', 'not testable'].includes(verdict as string)) out.push(`${label}: verdict ${String(verdict)}`);
    if (verdict !== 'not testable' && effect === '') out.push(`${label}: a check that ran gives no effect`);
    if (typeof meaning !== 'string' || meaning === '' || typeof rule !== 'string' || rule === '') out.push(`${label}: no meaning or rule`);
  });
  return out;
}

/** SENSITIVITY: a header, the alternatives (coefficient in [-1, 1], its interval, p, rows, a conclusion), a summary. */
function sensitivityTable(value: unknown): string[] {
  if (!Array.isArray(value) || value.length < 3) return ['SENSITIVITY answered no table'];
  const rows = value as unknown[][];
  const out: string[] = [];
  rows.slice(1, -1).forEach((r, i) => {
    if (r.length !== 8) out.push(`row ${i + 1} has ${r.length} cells`);
    out.push(...inUnit(r[1], `row ${i + 1} coefficient`));
    if (isNum(r[2]) && isNum(r[3]) && !(r[2] <= (r[1] as number) && (r[1] as number) <= r[3])) out.push(`row ${i + 1}: interval [${r[2]}, ${r[3]}] does not contain ${r[1]}`);
    out.push(...probability(r[4], `row ${i + 1} p-value`));
    if (!['positive correlation', 'negative correlation', 'no clear correlation'].includes(r[6] as string)) out.push(`row ${i + 1}: conclusion ${String(r[6])}`);
    if (!['yes', 'no'].includes(r[7] as string)) out.push(`row ${i + 1}: holds ${String(r[7])}`);
  });
  const last = rows[rows.length - 1];
  if (last[0] !== 'Summary' || typeof last[1] !== 'string' || (last[1] as string).length < 10) out.push('no summary row');
  return out;
}

/** BAYES and BAYES_REPORTED: BF10 and BF01 (reciprocal) positive, a probability, median within its interval. */
function bayesRow(value: unknown): string[] {
  if (!Array.isArray(value) || value.length !== 1 || !Array.isArray(value[0]) || value[0].length !== 6) return [`expected one row of six cells, got ${JSON.stringify(value)}`];
  const [bf10, bf01, post, median, lower, upper] = value[0] as unknown[];
  const out: string[] = [];
  if (isNum(bf10) && isNum(bf01)) {
    if (!(bf10 >= 0 && bf01 >= 0)) out.push(`negative Bayes factor ${bf10}, ${bf01}`);
    if (bf10 > 1e-300 && bf01 > 1e-300 && Math.abs(bf10 * bf01 - 1) > 1e-9) out.push(`BF10 ${bf10} and BF01 ${bf01} are not reciprocal`);
  } else if (typeof bf10 !== 'string' && typeof bf01 !== 'string') out.push('Bayes factors are neither numbers nor words');
  out.push(...probability(post, 'posterior probability'), ...inUnit(median, 'median'), ...inUnit(lower, 'lower'), ...inUnit(upper, 'upper'));
  if (isNum(lower) && isNum(median) && isNum(upper) && !(lower <= median && median <= upper)) out.push(`median ${median} outside [${lower}, ${upper}]`);
  return out;
}

/** REPORT: two columns, label and value; the coefficient inside its interval, probabilities in [0, 1]. */
function reportTable(value: unknown): string[] {
  if (!Array.isArray(value)) return ['REPORT answered a scalar'];
  const rows = value as unknown[][];
  const out: string[] = [];
  const find = (re: RegExp) => rows.find((r) => typeof r[0] === 'string' && re.test(r[0] as string))?.[1];
  rows.forEach((r, i) => {
    if (r.length !== 2) out.push(`report row ${i} has ${r.length} cells`);
  });
  const coefficientRow = rows.findIndex((r) => r[0] === 'Coefficient');
  const estimate = coefficientRow >= 0 ? rows[coefficientRow + 1]?.[1] : undefined;
  out.push(...inUnit(estimate, 'reported coefficient'));
  const lower = find(/interval, lower/);
  const upper = find(/interval, upper/);
  if (isNum(lower) && isNum(upper) && isNum(estimate) && !(lower <= estimate && estimate <= upper)) {
    out.push(`interval [${lower}, ${upper}] does not contain ${estimate}`);
  }
  out.push(...probability(find(/^p-value/)), ...probability(find(/^r²/), 'r²'));
  for (const r of rows) if (typeof r[0] === 'string' && / alongside$/.test(r[0])) out.push(...inUnit(r[1], r[0]));
  return out;
}

/** The cells of a single-row or single-column range, in order (the rows and columns the functions pair). */
function vectorCells(range: unknown): unknown[] {
  if (!Array.isArray(range)) return [];
  const rows = range as unknown[][];
  return rows.length === 1 && Array.isArray(rows[0]) ? rows[0] : rows.map((r) => (Array.isArray(r) ? r[0] : undefined));
}

/**
 * RESIDUALS: one row per complete pair (both cells finite numbers), in order, three numbers each: a whole number
 * that increases down the block (sheet row, sheet column or position), the fitted value and the residual, which
 * add up to y (within rounding of the largest |y|) and sum to about 0.
 */
function residualBlock(value: unknown, args: unknown[]): string[] {
  if (!Array.isArray(value)) return ['RESIDUALS answered a scalar'];
  const rows = value as unknown[][];
  const xs = vectorCells(args[0]);
  const ys = vectorCells(args[1]);
  const used: number[] = [];
  xs.forEach((v, i) => {
    const w = ys[i];
    if (isNum(v) && Number.isFinite(v) && isNum(w) && Number.isFinite(w)) used.push(w);
  });
  if (rows.length !== used.length) return [`${rows.length} rows for ${used.length} complete pairs`];
  const out: string[] = [];
  const top = Math.max(...used.map(Math.abs));
  let sum = 0;
  let size = 0;
  rows.forEach((r, i) => {
    if (out.length > 3) return;
    const [at, fitted, residual] = r;
    if (r.length !== 3 || !isNum(at) || !isNum(fitted) || !isNum(residual)) {
      out.push(`row ${i} is ${JSON.stringify(r)}, not three numbers`);
      return;
    }
    if (!(Number.isInteger(at) && at >= 1 && (i === 0 || at > (rows[i - 1][0] as number)))) out.push(`row ${i}: ${at} does not follow ${String(rows[i - 1]?.[0])}`);
    if (Math.abs(fitted + residual - used[i]) > 1e-12 * top) out.push(`row ${i}: fitted ${fitted} + residual ${residual} is not y = ${used[i]}`);
    sum += residual;
    size = Math.max(size, Math.abs(fitted) + Math.abs(residual));
  });
  if (out.length === 0 && Math.abs(sum) > 1e-9 * rows.length * size) out.push(`the residuals sum to ${sum}`);
  return out;
}

export const OUTPUT_ROLES: Record<string, RoleCheck> = {
  // @returns The coefficient, between -1 and 1.
  COEF: (v) => inUnit(v, 'coefficient'),
  // @returns One row of two cells: lower bound, upper bound (args: x, y, level, method).
  INTERVAL: (v, a) => {
    const r = coefficientOf(a[0], a[1], a[3]);
    const out = intervalRow(v, r);
    if (r === undefined) out.push('INTERVAL answered where COEF on the same data refused');
    return out;
  },
  // @returns The p-value, between 0 and 1.
  PVALUE: (v) => probability(v),
  // @returns The count of rows used: a whole number, at most the cells in x.
  PAIRS: (v, a) => {
    const cells = Array.isArray(a[0]) ? (a[0] as unknown[][]).reduce((s, row) => s + (Array.isArray(row) ? row.length : 0), 0) : 0;
    return isNum(v) && Number.isInteger(v) && v >= 0 && v <= cells ? [] : [`pair count ${String(v)} is not a whole number in [0, ${cells}]`];
  },
  // @returns One row: lower bound, upper bound, p-value (args: r, n, level, tail, method).
  REPORTED: (v, a) => {
    const out = intervalRow(v, isNum(a[0]) ? a[0] : undefined);
    const row = Array.isArray(v) && Array.isArray(v[0]) ? (v[0] as unknown[]) : [];
    return [...out, ...probability(row[2])];
  },
  // @returns One row of four cells: difference of two correlations, lower and upper end of its interval, p-value.
  DIFF_GROUPS: (v) => estimateIntervalP(v, 2),
  DIFF_SHARED: (v) => estimateIntervalP(v, 2),
  DIFF_SEPARATE: (v) => estimateIntervalP(v, 2),
  DIFF_REPORTED: (v, a) => {
    const out = estimateIntervalP(v, 2);
    const row = Array.isArray(v) && Array.isArray(v[0]) ? (v[0] as unknown[]) : [];
    if (isNum(a[0]) && isNum(a[2]) && isNum(row[0]) && Math.abs(row[0] - (a[0] - a[2])) > 1e-15) out.push(`difference ${row[0]} is not r1 - r2 = ${a[0] - a[2]}`);
    return out;
  },
  // @returns One row of four cells: the partial correlation, lower and upper end of its interval, p-value.
  PARTIAL: (v) => estimateIntervalP(v, 1),
  // @returns A square table; the diagonal is 1 for "coef", the count for "pairs", empty for p-values.
  MATRIX: matrixTable,
  // @returns A table with a header row and eight rows: check, test used, statistic, p-value, verdict, meaning.
  CHECKS: checksTable,
  // @returns One cell of text.
  FLAGS: (v) => (Array.isArray(v) && v.length === 1 && Array.isArray(v[0]) && v[0].length === 1 && typeof v[0][0] === 'string' ? [] : [`FLAGS answered ${JSON.stringify(v)}`]),
  // @returns A two-column table: what is reported, and its value.
  REPORT: reportTable,
  // @returns A table: header, alternatives, summary.
  SENSITIVITY: sensitivityTable,
  // @returns One row: the larger one-sided p, the 1 - 2 alpha interval, the verdict in words.
  NEGLIGIBLE: (v) => {
    if (!Array.isArray(v) || v.length !== 1 || !Array.isArray(v[0]) || v[0].length !== 4) return [`expected one row of four cells, got ${JSON.stringify(v)}`];
    const [p, lo, hi, words] = v[0] as unknown[];
    return [...probability(p), ...inUnit(lo, 'lower'), ...inUnit(hi, 'upper'), ...(typeof words === 'string' && /negligible/.test(words) ? [] : [`verdict ${String(words)}`])];
  },
  BAYES: bayesRow,
  BAYES_REPORTED: bayesRow,
  // @returns One row: the corrected correlation, the ends of its interval (empty without n), the steps in words.
  CORRECTED: (v) => {
    if (!Array.isArray(v) || v.length !== 1 || !Array.isArray(v[0]) || v[0].length !== 4) return [`expected one row of four cells, got ${JSON.stringify(v)}`];
    const [r, lo, hi, words] = v[0] as unknown[];
    const out = inUnit(r, 'corrected r');
    if (lo !== '' || hi !== '') {
      out.push(...inUnit(lo, 'lower'), ...inUnit(hi, 'upper'));
      if (isNum(lo) && isNum(hi) && isNum(r) && !(lo <= r && r <= hi)) out.push(`interval [${lo}, ${hi}] does not hold ${r}`);
    }
    if (typeof words !== 'string' || !/applicant group/.test(words)) out.push(`steps ${String(words)}`);
    return out;
  },
  // @returns One row per pair used: where it sits, the fitted value, the residual.
  RESIDUALS: residualBlock,
  // @returns The power, between 0 and 1.
  POWER: (v) => probability(v, 'power'),
  // @returns The number of rows (pairs of values), a whole number.
  SAMPLE_SIZE: (v) => (isNum(v) && Number.isInteger(v) && v >= 4 ? [] : [`sample size ${String(v)} is not a whole number of at least 4`]),
  // @returns The smallest correlation detectable, between 0 and 1 (between -1 and 0 for tail "negative").
  DETECTABLE: (v, a) => {
    const negative = word(a[3], 'both') === 'negative';
    const ok = isNum(v) && (negative ? v >= -1 && v <= 0 : v >= 0 && v <= 1);
    return ok ? [] : [`detectable r ${String(v)} is outside ${negative ? '[-1, 0]' : '[0, 1]'}`];
  },
};
