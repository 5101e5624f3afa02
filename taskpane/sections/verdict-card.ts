/**
 * The verdict card at the top of the Relationship section: the one-line conclusion (does it hold?), the
 * alternatives behind it, the evidence for no correlation worth the name (the equivalence test and the Bayes factor
 * when the interval includes zero; the equivalence test alone when a clear correlation is negligible), with the
 * smallest correlation these rows can detect. The same lines as
 * COVARY.SENSITIVITY and COVARY.REPORT.
 */
import { formatCount, formatR, formatSmallR, pClause } from '../../src/stats/format';
import type { Summary } from '../../src/stats/verdict/sensitivity';
import { el, fill } from '../dom';
import type { VerdictView } from '../relationship';

const HEADS: Record<Summary, string> = {
  'holds under every check': 'Holds under every check',
  'rests on one row': 'Rests on one row',
  'depends on the row order': 'Depends on the row order',
  'changes without the flagged rows': 'Changes without the flagged rows',
  'changes with the coefficient': 'Changes with the coefficient',
  'turns back': 'Turns back',
  'too few rows to say': 'Too few rows to say',
};

const KIND: Record<Summary, 'holds' | 'fragile' | 'unknown'> = {
  'holds under every check': 'holds',
  'rests on one row': 'fragile',
  'depends on the row order': 'fragile',
  'changes without the flagged rows': 'fragile',
  'changes with the coefficient': 'fragile',
  'turns back': 'fragile',
  'too few rows to say': 'unknown',
};

const DIRECTION: Record<string, string> = { positive: 'positive', negative: 'negative', none: 'no clear correlation' };

export class VerdictCard {
  readonly root: HTMLElement;
  private readonly head: HTMLElement;
  private readonly line: HTMLElement;
  private readonly body: HTMLElement;
  private readonly evidence: HTMLElement;

  constructor() {
    this.head = el('div', { class: 'cv-verdict-head', testid: 'verdict-summary' });
    this.line = el('p', { class: 'cv-verdict-line', testid: 'verdict-line' });
    this.body = el('tbody');
    const table = el('table', { class: 'cv-sensitivity', testid: 'verdict-rows' }, [
      el('caption', { class: 'cv-visually-hidden', text: 'The conclusion under each alternative' }),
      el('thead', {}, [el('tr', {}, ['Alternative', 'Estimate', 'Interval', 'Conclusion'].map((h) => el('th', { text: h, attrs: { scope: 'col' } })))]),
      this.body,
    ]);
    this.evidence = el('ul', { class: 'cv-verdict-evidence', testid: 'verdict-evidence' });
    this.root = el('div', { class: 'cv-verdict', testid: 'verdict-card', attrs: { role: 'group', 'aria-label': 'Does the conclusion hold?' } }, [this.head, this.line, table, this.evidence]);
  }

  render(v: VerdictView, n: number, level: number): void {
    this.root.className = `cv-verdict cv-verdict-${KIND[v.summary]}`;
    this.root.setAttribute('data-summary', v.summary);
    this.head.textContent = HEADS[v.summary];
    // The line restates the heading before its colon; the card shows the heading once.
    const rest = v.line.startsWith(`${HEADS[v.summary]}: `) ? v.line.slice(HEADS[v.summary].length + 2) : v.line;
    this.line.textContent = rest.charAt(0).toUpperCase() + rest.slice(1);
    const pct = `${Math.round(level * 100)}%`;
    fill(this.body, v.rows.map((r) => el('tr', { class: r.holds ? '' : 'cv-changes' }, [
      el('th', { text: r.scenario === 'as computed' ? `${r.label}, as computed` : r.label, attrs: { scope: 'row' } }),
      el('td', { class: 'cv-num', text: formatR(r.statistic) }),
      el('td', { class: 'cv-num', text: Number.isFinite(r.lower) ? `${formatR(r.lower)} to ${formatR(r.upper)}` : '–' }),
      el('td', { text: `${DIRECTION[r.direction]}${r.holds ? '' : ' (changes)'}` }),
    ])));
    const items: string[] = [];
    if (v.equivalence) {
      const e = v.equivalence;
      items.push(e.negligible
        ? `${v.direction === 'none' ? 'Negligible' : 'Real but negligible'}: the ${Math.round(e.level * 100)}% interval, ${formatR(e.lower)} to ${formatR(e.upper)}, lies within ±${e.bound} (equivalence test, p ${pClause(e.pValue)}).`
        : `Not shown to be negligible: the ${Math.round(e.level * 100)}% interval, ${formatR(e.lower)} to ${formatR(e.upper)}, reaches beyond ±${e.bound} (equivalence test).`);
    }
    if (v.bayes) {
      const b = v.bayes;
      const favour = b.bf01 >= 1 ? `${b.bf01 < 1000 ? b.bf01.toPrecision(3) : '1000+'} times more likely with no correlation than with one` : `${b.bf10 < 1000 ? b.bf10.toPrecision(3) : '1000+'} times more likely with a correlation than with none`;
      items.push(`Bayes factor: the data are ${favour} (uniform prior on the correlation); at even prior odds that puts the chance of a correlation at ${Math.round(100 * b.posteriorProbability)}%. This is a probability of the hypothesis, which a p-value is not.`);
    }
    if (v.detectable !== null) {
      const d = formatSmallR(v.detectable);
      const found = `With ${formatCount(n)} rows a correlation of ${d} or stronger is found 8 times in 10 (alpha ${Number((1 - level).toPrecision(3))})`;
      if (v.direction === 'none') items.push(`${found}; weaker ones are easily missed, so "${pct} includes zero" is not "no relationship".`);
      else if (v.detectable < 0.1) items.push(`${found}: at this size even a trivial correlation is significant, so judge it by its size and interval, not by its p-value.`);
      // Otherwise the planning line below the checks gives the figure, with more beside it.
    }
    if (v.tooFew > 0) items.push(`${v.tooFew} of the eight checks had too few rows to tell: see the checks below.`);
    fill(this.evidence, items.map((t) => el('li', { text: t })));
  }
}
