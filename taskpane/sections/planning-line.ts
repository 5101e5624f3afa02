/**
 * The planning line under the tiles: what the rows in hand can detect, and how many rows a chosen true
 * correlation would need. A fixed table of power at the conventional small, medium and large correlations
 * (0.1, 0.3, 0.5: Cohen 1988, "Statistical Power Analysis for the Behavioral Sciences", 2nd ed., Erlbaum,
 * chapter 3), and one line for a correlation the analyst types in. Power is for Pearson's r under a bivariate
 * normal at the interval's alpha, two-sided (src/stats/planning/power.ts: the exact distribution of r,
 * Hotelling 1953). The observed r is deliberately not planned for: power computed at the observed effect only
 * restates the p-value (Hoenig & Heisey 2001, "The abuse of power", The American Statistician 55:19-24).
 */
import { correlationPower, detectableCorrelation, MAX_PLANNING_N, MIN_PLANNING_N, sampleSizeForCorrelation } from '../../src/stats/planning/power';
import { formatCount, formatR, formatSmallR } from '../../src/stats/format';
import type { Method } from '../../src/stats/types';
import { el, fill } from '../dom';

/** The conventional sizes the table shows. */
export const PLANNING_SIZES: readonly { rho: number; word: string }[] = [
  { rho: 0.1, word: 'small' },
  { rho: 0.3, word: 'medium' },
  { rho: 0.5, word: 'large' },
];

/** A chance as a whole percentage, never rounded to 0% or 100% when it is not exactly that. */
export function percent(p: number): string {
  if (p >= 1) return '100%';
  if (p > 0.995) return 'over 99%';
  if (p <= 0) return '0%';
  if (p < 0.005) return 'under 1%';
  return `${Math.round(p * 100)}%`;
}

/** Reads what the analyst typed as a correlation to plan for: 0.25, .25, -0.25 or 25%. Null when it is none. */
export function parseTarget(text: string): number | null {
  const t = text.trim().replace(/\u2212/g, '-');
  const m = /^(-?)(\d*\.?\d+)(%?)$/.exec(t);
  if (!m) return null;
  const v = Number(m[2]) / (m[3] ? 100 : 1);
  if (!(v > 0 && v < 1)) return null;
  return m[1] ? -v : v;
}

export class PlanningLine {
  readonly root: HTMLElement;
  private readonly lead: HTMLElement;
  private readonly body: HTMLElement;
  private readonly input: HTMLInputElement;
  private readonly answer: HTMLElement;
  private readonly note: HTMLElement;
  private n = 0;
  private alpha = 0.05;
  /** Answers already found, by what they depend on: a redraw after an edit usually keeps n and alpha, and each
   *  search of the exact distribution costs a few milliseconds (about 20 ms for the whole line at any n). */
  private readonly memo = new Map<string, number>();

  constructor() {
    this.lead = el('p', { class: 'cv-planning-lead', testid: 'planning-lead' });
    this.body = el('tbody');
    const table = el('table', { class: 'cv-planning-table', testid: 'planning-table' }, [
      el('caption', { class: 'cv-visually-hidden', text: 'Chance of a significant result at these rows, by true correlation' }),
      el('thead', {}, [el('tr', {}, ['True correlation', 'Chance these rows find it', 'Rows for 8 in 10'].map((h) => el('th', { text: h, attrs: { scope: 'col' } })))]),
      this.body,
    ]);
    this.input = el('input', { class: 'cv-input cv-planning-input', testid: 'planning-target', attrs: { type: 'text', inputmode: 'decimal', value: '0.2', 'aria-describedby': 'cv-planning-answer', size: '5', autocomplete: 'off' } });
    this.answer = el('span', { class: 'cv-planning-answer', testid: 'planning-answer', attrs: { id: 'cv-planning-answer', role: 'status' } });
    this.note = el('p', { class: 'cv-planning-note cv-muted', testid: 'planning-note' });
    this.root = el('div', { class: 'cv-planning', testid: 'planning', attrs: { role: 'group', 'aria-label': 'Planning at these rows' } }, [
      el('h3', { class: 'cv-subhead', text: 'Planning at these rows' }),
      this.lead,
      table,
      el('div', { class: 'cv-planning-ask' }, [
        el('label', { class: 'cv-field-label', text: 'Plan for a true correlation of', attrs: { for: 'cv-planning-target' } }),
        this.input,
        this.answer,
      ]),
      this.note,
    ]);
    this.input.id = 'cv-planning-target';
    this.input.addEventListener('input', () => this.renderTarget());
  }

  /**
   * Shows the planning figures for n pairs tested two-sided at alpha (the interval's: 1 - level), for the
   * coefficient on screen (figures are Pearson's; a note says how the rank coefficients differ).
   */
  render(n: number, alpha: number, method: Method): void {
    this.n = n;
    this.alpha = alpha;
    const a = Number(alpha.toPrecision(3));
    if (n < MIN_PLANNING_N) {
      this.lead.textContent = `With ${formatCount(n)} pairs nothing can be planned: a test of r needs at least ${MIN_PLANNING_N}.`;
      fill(this.body, []);
      this.answer.textContent = '';
      this.note.textContent = '';
      return;
    }
    const opts = { alpha, tail: 'both' as const };
    const n1 = Math.min(n, MAX_PLANNING_N);
    const d8 = this.remember(`d|${n1}|${alpha}|0.8`, () => detectableCorrelation(n1, 0.8, opts).rho);
    const d9 = this.remember(`d|${n1}|${alpha}|0.9`, () => detectableCorrelation(n1, 0.9, opts).rho);
    this.lead.textContent = `Smallest true correlation these ${formatCount(n)} pairs find 8 times in 10: ${formatSmallR(d8)}; 9 times in 10: ${formatSmallR(d9)} (two-sided test, alpha ${a}).`;
    fill(this.body, PLANNING_SIZES.map((s) => el('tr', {}, [
      el('th', { text: `${formatR(s.rho)} (${s.word})`, attrs: { scope: 'row' } }),
      el('td', { class: 'cv-num', text: percent(this.remember(`p|${n1}|${alpha}|${s.rho}`, () => correlationPower(s.rho, n1, opts).power)) }),
      el('td', { class: 'cv-num', text: this.rowsFor(s.rho, alpha) }),
    ])));
    this.note.textContent = method === 'pearson'
      ? 'For Pearson\u2019s r on roughly normal data. Plan on the rows that will be complete, after blanks are left out.'
      : 'Figures are for Pearson\u2019s r on roughly normal data; a rank coefficient needs about a tenth more rows there, and can need fewer when outliers or skew are present.';
    this.renderTarget();
  }

  private renderTarget(): void {
    if (this.n < MIN_PLANNING_N) return;
    const rho = parseTarget(this.input.value);
    this.input.setAttribute('aria-invalid', rho === null ? 'true' : 'false');
    if (rho === null) {
      this.say('Type a correlation between 0 and 1, such as 0.25 or 25%.');
      return;
    }
    const opts = { alpha: this.alpha, tail: 'both' as const };
    const n1 = Math.min(this.n, MAX_PLANNING_N);
    const power = this.remember(`p|${n1}|${this.alpha}|${rho}`, () => correlationPower(rho, n1, opts).power);
    this.say(`A true correlation of ${formatSmallR(Math.abs(rho))} is found ${percent(power)} of the time with ${formatCount(this.n)} pairs; ${this.rowsFor(rho, this.alpha)} rows find it 8 times in 10.`);
  }

  /** The answer is a live region: it changes only when its words do, so a redraw that keeps n says nothing. */
  private say(text: string): void {
    if (this.answer.textContent !== text) this.answer.textContent = text;
  }

  private remember(key: string, find: () => number): number {
    let v = this.memo.get(key);
    if (v === undefined) {
      if (this.memo.size > 200) this.memo.clear();
      v = find();
      this.memo.set(key, v);
    }
    return v;
  }

  /** Rows for 80% power, or a phrase when the answer is past what planning searches. */
  private rowsFor(rho: number, alpha: number): string {
    const n = this.remember(`n|${alpha}|${Math.abs(rho)}`, () => {
      try {
        return sampleSizeForCorrelation(Math.abs(rho), 0.8, { alpha, tail: 'both' }).n;
      } catch {
        return Infinity;
      }
    });
    return Number.isFinite(n) ? formatCount(n) : `over ${formatCount(MAX_PLANNING_N)}`;
  }
}
