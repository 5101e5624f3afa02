/**
 * Corrections of a validity coefficient (the correlation of a predictor x with a criterion y observed among the
 * people who were selected) for unreliability of the measures and for range restriction, in the order of Hunter &
 * Schmidt (2004), Methods of Meta-Analysis: Correcting Error and Bias in Research Findings, 2nd ed., Sage.
 *
 * - No restriction: Spearman (1904), "The proof and measurement of association between two things", American
 *   Journal of Psychology 15:72-101: r / sqrt(relX relY), each reliability optional.
 * - Direct restriction (selection on x itself): divide by sqrt(relY) (criterion reliability in the selected
 *   sample), apply Thorndike's (1949) Case II (Personnel Selection, Wiley) with U = SD of x among applicants / SD
 *   in the sample, R = U r / sqrt(1 + (U^2 - 1) r^2), which gives the operational validity; divide by sqrt(relX)
 *   (predictor reliability among applicants) for the true-score validity.
 * - Indirect restriction (selection on something related to x): Case IV of Hunter, Schmidt & Le (2006),
 *   "Implications of direct and indirect range restriction for meta-analysis methods and findings", Journal of
 *   Applied Psychology 91:594-612. With u_X = 1/U: the predictor's reliability in the sample
 *   relXi = 1 - U^2 (1 - relX); the true-score restriction ratio u_T = sqrt((u_X^2 - (1 - relX)) / relX); r is
 *   divided by sqrt(relXi relY), Case II is applied with U_T = 1/u_T (true-score validity) and the result times
 *   sqrt(relX) is the operational validity. (These Case IV formulas are [recalled] from the paper, so its equation
 *   numbers are not quoted; they are held to an exact population model in
 *   test/fixtures/corrections/psychometric-r.R, where the selection is made with the Pearson-Lawley formula.)
 *
 * The interval is the Fisher-z interval of the observed r, SE 1/sqrt(n - 3), with each bound put through the same
 * steps: every step is increasing in r, so the bounds keep their order and contain the corrected r (Hunter &
 * Schmidt 2004). A bound that a step carries past +/-1 is held at +/-1 and the interval says so.
 */
import { fisherInterval } from '../correlation/fisher';
import { validLevel } from '../options';
import { StatsInputError } from '../types';

/** How x was selected: directly on x (Case II) or on something related to x (Case IV). */
export type RestrictionKind = 'direct' | 'indirect';

/** What a validity correction needs; every correction is optional except r. */
export interface CorrectionInput {
  /** The correlation observed in the (possibly selected) sample. */
  r: number;
  /** Reliability of the predictor x among applicants (the unrestricted group), in (0, 1]. */
  relX?: number;
  /** Reliability of the criterion y in the selected sample, in (0, 1]. */
  relY?: number;
  /** U = SD of x among applicants / SD of x in the sample; > 0 (below 1 when the sample varies more). */
  sdRatio?: number;
  /** Direct (default when sdRatio is given) or indirect selection; needs sdRatio. */
  restriction?: RestrictionKind;
  /** Rows behind r, at least 4, for the interval; without it the bounds are NaN. */
  n?: number;
  /** Confidence level of the interval, default 0.95. */
  level?: number;
}

/** How the interval of a corrected validity was made. */
export interface CorrectionInterval {
  level: number;
  method: string;
  /** Why a bound is NaN or held at +/-1, when one is. */
  note?: string;
}

/** A corrected validity, the values on the way, and what it can and cannot say. */
export interface CorrectionResult {
  /** trueScore when relX is given, else operational; r itself when nothing was asked. */
  corrected: number;
  /** Bounds of the interval of `corrected`; NaN without n. */
  lower: number;
  upper: number;
  /**
   * Corrected for criterion unreliability and range restriction only: how well x as measured predicts the
   * criterion among applicants. null when neither relY nor sdRatio is given.
   */
  operational: number | null;
  /** Also corrected for predictor unreliability: the relationship of the constructs. null without relX. */
  trueScore: number | null;
  /** Which range restriction was corrected: 'none' without sdRatio. */
  restriction: RestrictionKind | 'none';
  /** The steps in order, each with its input and output value, e.g. "criterion unreliability (rel_y 0.52): 0.300 -> 0.416". */
  steps: string[];
  /** What a corrected validity does and does not mean. */
  caution: string;
  interval: CorrectionInterval;
}

export const CORRECTION_CAUTION =
  'A corrected validity estimates the correlation in an applicant group, not a property of the people in this ' +
  'sheet. It is only as good as the reliabilities and SDs put in, which must come from a group like the one it ' +
  'is meant for. Decisions about selecting people are subject to fairness and adverse-impact law: follow the ' +
  'law where you are and ask qualified professionals before using the number for selection.';

const INTERVAL_METHOD =
  'Fisher z of the observed r (SE = 1/sqrt(n - 3)), each bound corrected in the same steps (Hunter & Schmidt 2004)';

/** Thorndike's (1949) Case II: r in the sample to r in a group whose SD of x is U times larger. */
function caseII(r: number, U: number): number {
  return (U * r) / Math.sqrt(1 + (U * U - 1) * (r * r));
}

const fmt = (v: number): string => v.toFixed(3);
const param = (v: number): string => String(Number(v.toPrecision(3)));

/** One correction: a name for the steps and messages, and the map from a value to its corrected value. */
interface Step {
  label: string;
  apply: (v: number) => number;
  /** Which of the results this step's output is. */
  gives?: 'operational' | 'trueScore';
}

function checkReliability(v: number | undefined, name: string, where: string): void {
  if (v === undefined) return;
  if (!(v > 0 && v <= 1)) {
    throw new StatsInputError('out-of-range', `${name} (the reliability of ${where}) must be above 0 and at most 1, e.g. 0.8 (got ${v})`);
  }
}

/** Validates the input and lays out the steps in the Hunter & Schmidt (2004) order. */
function plan(input: CorrectionInput): { steps: Step[]; notes: string[]; restriction: RestrictionKind | 'none' } {
  const { r, relX, relY, sdRatio, n } = input;
  if (!(Math.abs(r) < 1)) {
    throw new StatsInputError('out-of-range', `r must lie strictly between -1 and 1 (got ${r})`);
  }
  checkReliability(relX, 'rel_x', 'the predictor among applicants');
  checkReliability(relY, 'rel_y', 'the criterion in the sample');
  if (sdRatio !== undefined && !(sdRatio > 0 && Number.isFinite(sdRatio))) {
    throw new StatsInputError(
      'out-of-range',
      `sd_ratio (SD of the predictor among applicants / SD in the sample) must be above 0, e.g. 1.5 (got ${sdRatio})`,
    );
  }
  if (n !== undefined && !(Number.isInteger(n) && n >= 4)) {
    throw new StatsInputError('out-of-range', `n (the rows behind r) must be a whole number of at least 4 for the interval (got ${n})`);
  }
  const kind = input.restriction;
  if (kind !== undefined && kind !== 'direct' && kind !== 'indirect') {
    throw new StatsInputError('bad-option', `restriction must be "direct" or "indirect" (got "${String(kind)}")`);
  }
  if (kind !== undefined && sdRatio === undefined) {
    throw new StatsInputError('bad-option', `restriction "${kind}" needs sd_ratio, the SD of the predictor among applicants divided by its SD in the sample`);
  }

  const steps: Step[] = [];
  const notes: string[] = [];
  if (sdRatio !== undefined && sdRatio < 1) {
    notes.push(
      `note: sd_ratio ${param(sdRatio)} is below 1, so the sample varies more on the predictor than applicants do and the range correction makes |r| smaller`,
    );
  }

  if (sdRatio === undefined) {
    // Spearman (1904).
    if (relY !== undefined) {
      steps.push({ label: `criterion unreliability (rel_y ${param(relY)})`, apply: (v) => v / Math.sqrt(relY), gives: 'operational' });
    }
    if (relX !== undefined) {
      steps.push({ label: `predictor unreliability (rel_x ${param(relX)})`, apply: (v) => v / Math.sqrt(relX), gives: 'trueScore' });
    }
    return { steps, notes, restriction: 'none' };
  }

  if (kind === 'indirect') {
    if (relX === undefined) {
      throw new StatsInputError(
        'out-of-range',
        'indirect range restriction (Case IV) needs rel_x, the reliability of the predictor among applicants',
      );
    }
    // Hunter, Schmidt & Le (2006): the error variance of x is the same in both groups.
    const uX = 1 / sdRatio;
    const relXSample = 1 - sdRatio * sdRatio * (1 - relX);
    const uT2 = (uX * uX - (1 - relX)) / relX;
    if (!(uT2 > 0 && relXSample > 0)) {
      throw new StatsInputError(
        'out-of-range',
        `with indirect range restriction, sd_ratio ${param(sdRatio)} and rel_x ${param(relX)} do not fit together: ` +
          'the measurement error of the predictor alone would be larger than its whole spread in the sample. ' +
          `With this rel_x, sd_ratio must be below ${param(1 / Math.sqrt(1 - relX))}; check both values`,
      );
    }
    const uT = Math.sqrt(uT2);
    const ry = relY ?? 1;
    const both = relY === undefined
      ? `predictor unreliability in the sample (rel_x there ${param(relXSample)})`
      : `predictor and criterion unreliability in the sample (rel_x there ${param(relXSample)}, rel_y ${param(relY)})`;
    steps.push({ label: both, apply: (v) => v / Math.sqrt(relXSample * ry) });
    steps.push({
      label: `indirect range restriction on true scores (Case IV, u_T ${param(uT)})`,
      apply: (v) => caseII(v, 1 / uT),
      gives: 'trueScore',
    });
    steps.push({
      label: `back to the predictor as measured (times sqrt of rel_x ${param(relX)})`,
      apply: (v) => v * Math.sqrt(relX),
      gives: 'operational',
    });
    return { steps, notes, restriction: 'indirect' };
  }

  if (relY !== undefined) {
    steps.push({ label: `criterion unreliability (rel_y ${param(relY)})`, apply: (v) => v / Math.sqrt(relY) });
  }
  steps.push({ label: `direct range restriction (Case II, U ${param(sdRatio)})`, apply: (v) => caseII(v, sdRatio), gives: 'operational' });
  if (relX !== undefined) {
    steps.push({ label: `predictor unreliability (rel_x ${param(relX)})`, apply: (v) => v / Math.sqrt(relX), gives: 'trueScore' });
  }
  return { steps, notes, restriction: 'direct' };
}

/** The values a run of the steps produces from v; the operational step of Case IV starts from the true score. */
function run(steps: Step[], v: number, onStep: (step: Step, from: number, to: number) => number) {
  let operational: number | null = null;
  let trueScore: number | null = null;
  let current = v;
  for (const step of steps) {
    const to = onStep(step, current, step.apply(current));
    if (step.gives === 'operational') operational = to;
    if (step.gives === 'trueScore') trueScore = to;
    // Case IV's last step leaves the chain: the true score stays the value carried on.
    if (!(step.gives === 'operational' && trueScore !== null)) current = to;
  }
  return { operational, trueScore, corrected: trueScore ?? operational ?? current };
}

/**
 * Corrects an observed validity coefficient for unreliability and range restriction (Spearman 1904; Thorndike
 * 1949, Case II; Hunter, Schmidt & Le 2006, Case IV) in the order of Hunter & Schmidt (2004), with the interval of
 * the observed r carried through the same steps.
 *
 * @throws StatsInputError ('out-of-range') when |r| >= 1, a reliability is outside (0, 1], sdRatio <= 0, n is not
 *   a whole number of at least 4, the level is outside (0, 1), indirect restriction lacks relX or does not fit
 *   relX, or a correction carries r past +/-1 (the inputs are inconsistent); ('bad-option') for an unknown
 *   restriction or a restriction without sdRatio.
 * @example correctValidity({ r: 0.3, relY: 0.52, sdRatio: 1.5 }).operational // 0.5658 (0.300 -> 0.416 -> 0.566)
 */
export function correctValidity(input: CorrectionInput): CorrectionResult {
  const level = validLevel(input.level ?? 0.95);
  const { steps, notes, restriction } = plan(input);

  const lines: string[] = [];
  const point = run(steps, input.r, (step, from, to) => {
    if (!(Math.abs(to) <= 1)) {
      throw new StatsInputError(
        'out-of-range',
        `the inputs are inconsistent: the correction for ${step.label} takes ${fmt(from)} to ${fmt(to)}, beyond ` +
          `${to > 0 ? '' : '-'}1, which no correlation can reach. Check the reliabilities and the SD ratio`,
      );
    }
    lines.push(`${step.label}: ${fmt(from)} -> ${fmt(to)}`);
    return to;
  });
  if (steps.length === 0) lines.push('nothing to correct: no reliability or SD ratio was given, so the value is the observed r');
  lines.push(...notes);

  let lower = NaN;
  let upper = NaN;
  let note: string | undefined;
  if (input.n === undefined) {
    note = 'no n given: the interval needs the number of rows behind r';
  } else {
    const observed = fisherInterval(input.r, 1 / Math.sqrt(input.n - 3), level, INTERVAL_METHOD);
    const held: string[] = [];
    const bound = (v: number, which: string) => {
      let first = true; // name only the step that first carried this bound past the limit
      return run(steps, v, (step, _from, to) => {
        if (Math.abs(to) <= 1) return to;
        if (first) held.push(`the ${which} bound passed ${to > 0 ? '' : '-'}1 at the correction for ${step.label}`);
        first = false;
        return to > 0 ? 1 : -1;
      }).corrected;
    };
    lower = bound(observed.lower, 'lower');
    upper = bound(observed.upper, 'upper');
    if (held.length > 0) note = `${held.join('; ')}; it is shown as the limit`;
  }

  return {
    corrected: point.corrected,
    lower,
    upper,
    operational: point.operational,
    trueScore: point.trueScore,
    restriction,
    steps: lines,
    caution: CORRECTION_CAUTION,
    interval: note === undefined ? { level, method: INTERVAL_METHOD } : { level, method: INTERVAL_METHOD, note },
  };
}

/**
 * The steps and what each figure answers, in one line for a cell: the operational validity (the measure as used,
 * predicting the criterion among applicants: the figure for selection decisions) and the true-score correlation
 * (the constructs free of measurement error: for theory, never for decisions about people).
 */
export function correctionText(res: CorrectionResult): string {
  const parts = [res.steps.join('; ')];
  const figures: string[] = [];
  if (res.operational !== null) figures.push(`operational validity ${fmt(res.operational)} (the measure as used, predicting the criterion among applicants: the figure for selection decisions)`);
  if (res.trueScore !== null) figures.push(`true-score correlation ${fmt(res.trueScore)} (the constructs free of measurement error: for theory, not for decisions about people)`);
  if (figures.length > 0) parts.push(`${figures.join('; ')}.`);
  parts.push('An estimate for an applicant group, not a property of the people in the sheet.');
  return parts.join('. ').replace(/\.\./g, '.');
}
