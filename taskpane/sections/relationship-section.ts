/**
 * Section 1, Relationship: the pair picker, the coefficient and level, the four tiles (r, interval, p, pairs),
 * the scatter with its line and smooth, the reading, the advice, the flags with their rows, the eight checks,
 * and the write buttons. It renders a RelationshipView and reports the user's choices through callbacks; it
 * holds no state of its own beyond what is on screen.
 */
import { formatCount, formatPValue, formatR } from '../../src/stats/format';
import { Method, METHOD_LABELS, METHODS } from '../../src/stats/types';
import { PointPlot } from '../charts';
import { clear, el, fill, select } from '../dom';
import { PANEL_TEST_IDS } from '../panel-api';
import { RelationshipView } from '../relationship';
import { ChartBox, chartBox, legend, section, showMessage, tile, Tile } from '../widgets';
import { describer, markFrame, pointsOf, pointTable } from './plot-points';
import { PlanningLine } from './planning-line';
import { VerdictCard } from './verdict-card';

const LEVEL_OPTIONS = [
  { value: '0.9', label: '90%' },
  { value: '0.95', label: '95%' },
  { value: '0.99', label: '99%' },
];

export interface RelationshipSectionEvents {
  /** The user picked a coefficient (from the select or the advice's switch). */
  method(m: Method): void;
  level(level: number): void;
  /** The user asked to see a sheet row. */
  pick(row: number): void;
}

export class RelationshipSection {
  readonly root: HTMLElement;
  readonly scatter: PointPlot;
  private readonly scatterBox: ChartBox;
  readonly scatterFrame: HTMLElement;
  private readonly methodSelect: HTMLSelectElement;
  private readonly levelSelect: HTMLSelectElement;
  private readonly message: HTMLElement;
  private readonly results: HTMLElement;
  private readonly tiles: { r: Tile; interval: Tile; p: Tile; pairs: Tile };
  private readonly reading: HTMLElement;
  private readonly advice: HTMLElement;
  private readonly flags: HTMLElement;
  private readonly flaggedRows: HTMLElement;
  private readonly checksBody: HTMLElement;
  private readonly verdict = new VerdictCard();
  private readonly planning = new PlanningLine();

  /**
   * @param picker the pair picker's element, placed at the top
   * @param actions the write buttons and their status, placed at the end of the results
   */
  constructor(picker: HTMLElement, actions: HTMLElement, initial: { method: Method; level: number }, private readonly on: RelationshipSectionEvents) {
    const { root, body } = section('1', 'Relationship', 'section-relationship');
    this.root = root;
    this.methodSelect = select(PANEL_TEST_IDS.method, METHODS.map((m) => ({ value: m, label: `${METHOD_LABELS[m].name} (${METHOD_LABELS[m].gist})` })), 'Coefficient');
    this.methodSelect.value = initial.method;
    this.levelSelect = select(PANEL_TEST_IDS.level, LEVEL_OPTIONS, 'Confidence level');
    this.levelSelect.value = String(initial.level);
    this.tiles = {
      r: tile('Pearson r', PANEL_TEST_IDS.r, PANEL_TEST_IDS.coefficientName),
      interval: tile('95% interval', PANEL_TEST_IDS.interval),
      p: tile('p-value', PANEL_TEST_IDS.p),
      pairs: tile('Pairs used', PANEL_TEST_IDS.pairs),
    };
    this.message = el('div', { class: 'cv-message cv-hidden', attrs: { role: 'alert' } });
    const scatter = chartBox(PANEL_TEST_IDS.scatter, 'Scatter with straight line and smooth');
    this.scatter = new PointPlot(scatter.canvas, (row) => on.pick(row));
    this.scatterFrame = scatter.frame;
    this.scatterBox = scatter;
    this.reading = el('ul', { class: 'cv-reading', testid: PANEL_TEST_IDS.reading });
    this.advice = el('div', { class: 'cv-advice', testid: PANEL_TEST_IDS.advice });
    this.flags = el('div', { class: 'cv-flags', testid: PANEL_TEST_IDS.flags });
    this.flaggedRows = el('div', { class: 'cv-flagged-rows', testid: PANEL_TEST_IDS.flaggedRows });
    this.checksBody = el('tbody');
    const checksTable = el('table', { class: 'cv-checks', testid: PANEL_TEST_IDS.checksTable }, [
      el('thead', {}, [el('tr', {}, ['Check', 'Result', 'p'].map((h) => el('th', { text: h, attrs: { scope: 'col' } })))]),
      this.checksBody,
    ]);
    // Results stay hidden until there is something to show (no empty charts).
    this.results = el('div', { class: 'cv-results cv-hidden' }, [
      this.verdict.root,
      el('div', { class: 'cv-tiles' }, [this.tiles.r.root, this.tiles.interval.root, this.tiles.p.root, this.tiles.pairs.root]),
      scatter.root,
      legend(),
      this.reading,
      this.advice,
      el('h3', { class: 'cv-subhead', text: 'Flags from the checks' }),
      this.flags,
      this.flaggedRows,
      el('details', { class: 'cv-details' }, [el('summary', { text: 'All eight checks' }), checksTable]),
      this.planning.root,
      actions,
    ]);
    fill(body, [
      picker,
      el('div', { class: 'cv-field-grid' }, [
        el('label', { class: 'cv-field-label', text: 'Coefficient' }), this.methodSelect,
        el('label', { class: 'cv-field-label', text: 'Interval' }), this.levelSelect,
      ]),
      this.message,
      this.results,
    ]);
    this.methodSelect.addEventListener('change', () => on.method(this.methodSelect.value as Method));
    this.levelSelect.addEventListener('change', () => on.level(Number(this.levelSelect.value)));
  }

  /** Shows the coefficient chosen elsewhere (the advice's switch) in the select. */
  showMethod(m: Method): void {
    this.methodSelect.value = m;
  }

  /** An error in place of the results, or null to clear it. */
  say(text: string | null): void {
    showMessage(this.message, text);
  }

  render(v: RelationshipView): void {
    this.results.classList.remove('cv-hidden');
    const { tiles } = this;
    const c = v.correlation;
    // Pearson on two-valued columns keeps its own name (point-biserial, phi).
    tiles.r.caption.textContent = `${c.method === 'pearson' ? c.name : METHOD_LABELS[c.method].name} ${METHOD_LABELS[c.method].glyph}`;
    tiles.r.value.textContent = formatR(c.statistic);
    tiles.r.value.setAttribute('data-value', String(c.statistic));
    tiles.interval.caption.textContent = `${Math.round(c.interval.level * 100)}% interval`;
    tiles.interval.value.textContent = Number.isFinite(c.interval.lower) ? `${formatR(c.interval.lower)} to ${formatR(c.interval.upper)}` : 'needs more pairs';
    tiles.interval.value.setAttribute('data-lower', String(c.interval.lower));
    tiles.interval.value.setAttribute('data-upper', String(c.interval.upper));
    tiles.p.value.textContent = formatPValue(c.pValue);
    tiles.p.value.setAttribute('data-value', String(c.pValue));
    tiles.pairs.value.textContent = v.skipped > 0 ? `${formatCount(v.n)} (${formatCount(v.skipped)} skipped)` : formatCount(v.n);
    tiles.pairs.value.setAttribute('data-value', String(v.n));
    // Which rows were left out, so they can be found and mended (blank, text or TRUE/FALSE in either column).
    tiles.pairs.sub.textContent = v.skipped > 0
      ? `Skipped (a cell not a number): ${v.skipped === 1 ? 'row' : 'rows'} ${v.skippedRows.join(', ')}${v.skipped > v.skippedRows.length ? ` and ${formatCount(v.skipped - v.skippedRows.length)} more` : ''}`
      : '';

    this.verdict.render(v.verdict, v.n, c.interval.level);
    this.planning.render(v.n, 1 - c.interval.level, c.method);
    fill(this.reading, v.reading.map((t) => el('li', { text: t })));
    this.renderAdvice(v);

    // Never "nothing to worry about" when the checks could not see: say how many could not tell.
    const blind = v.verdict.tooFew + v.checks.filter((k) => k.verdict === 'not testable').length;
    const chips: HTMLElement[] = v.flags.map((f) => el('span', { class: 'cv-chip cv-chip-flag', text: f }));
    for (const m of v.verdict.minor) chips.push(el('span', { class: 'cv-chip cv-chip-slight', text: `slight: ${m}` }));
    if (v.flags.length === 0) {
      chips.unshift(blind > 0
        ? el('span', { class: 'cv-chip cv-chip-unknown', text: `No problems found, but ${blind} of the eight checks could not tell with ${v.n} rows` })
        : el('span', { class: 'cv-chip cv-chip-ok', text: 'No problems found: the checks could have seen one' }));
    }
    fill(this.flags, chips);

    const shown = v.flaggedRows.slice(0, 20);
    fill(this.flaggedRows, shown.length === 0 ? [] : [
      el('span', { class: 'cv-muted', text: 'Flagged rows: ' }),
      ...shown.map((r) => {
        const b = el('button', { class: 'cv-link', text: `row ${r}`, attrs: { type: 'button', 'data-row': String(r) } });
        b.addEventListener('click', () => this.on.pick(r));
        return b;
      }),
      v.flaggedRows.length > shown.length ? el('span', { class: 'cv-muted', text: ` and ${v.flaggedRows.length - shown.length} more` }) : null,
    ]);

    fill(this.checksBody, v.checks.map((row) => el('tr', { class: `cv-verdict-${row.verdict.replace(/ /g, '-')}` }, [
      el('th', { attrs: { scope: 'row' } }, [
        el('div', { text: row.label }),
        el('div', { class: 'cv-meaning', text: row.meaning }),
        el('div', { class: 'cv-test', text: row.test }),
      ]),
      el('td', {}, [el('span', { class: `cv-badge cv-badge-${row.verdict.replace(/ /g, '-')}`, text: row.verdict })]),
      el('td', { class: 'cv-num', text: row.pValue === null ? '–' : formatPValue(row.pValue) }),
    ])));

    const d = v.drawn;
    let xMin = Infinity;
    let xMax = -Infinity;
    for (let k = 0; k < d.x.length; k++) {
      if (d.x[k] < xMin) xMin = d.x[k];
      if (d.x[k] > xMax) xMax = d.x[k];
    }
    const lineAt = (xv: number): { x: number; y: number } => ({ x: xv, y: v.line.intercept + v.line.slope * xv });
    const smooth = v.smooth;
    const smoothPoints = smooth ? Array.from(smooth.x, (xv, k) => ({ x: xv, y: smooth.y[k] })) : [];
    this.scatter.update({
      points: pointsOf(v, d.x, d.y),
      lines: [
        { kind: 'fit', label: 'straight line', points: [lineAt(xMin), lineAt(xMax)] },
        { kind: 'smooth', label: 'LOWESS smooth', points: smoothPoints },
      ],
      xTitle: v.xHeader,
      yTitle: v.yHeader,
      describe: describer(v),
    });
    markFrame(this.scatterFrame, v);
    this.scatterBox.describeData(pointTable(v, `Scatter of ${v.yHeader} against ${v.xHeader}, with the straight line and a LOWESS smooth`, v.xHeader, v.yHeader, d.x, d.y));
  }

  private renderAdvice(v: RelationshipView): void {
    const rec = v.recommendation;
    this.advice.classList.toggle('cv-advice-change', rec.changed);
    const switchTo = rec.changed ? rec.method : null;
    let use: HTMLButtonElement | null = null;
    if (switchTo) {
      use = el('button', { class: 'cv-link', text: `Use ${rec.name}`, testid: 'advice-switch', attrs: { type: 'button' } });
      use.addEventListener('click', () => {
        this.showMethod(switchTo);
        this.on.method(switchTo);
      });
    }
    fill(this.advice, [
      el('span', { class: 'cv-advice-head', text: adviceHead(rec) }),
      el('span', { text: rec.reason }),
      use ? el('span', { text: ' ' }) : null,
      use,
    ]);
  }

  /** Hides the results and empties them (an error or no pair). */
  clear(): void {
    this.results.classList.add('cv-hidden');
    for (const t of Object.values(this.tiles)) {
      t.value.textContent = '–';
      t.value.removeAttribute('data-value');
    }
    clear(this.reading);
    clear(this.advice);
    clear(this.flags);
    clear(this.flaggedRows);
    clear(this.checksBody);
  }

  destroy(): void {
    this.scatter.destroy();
  }
}

/** The advice's bold start: the remedy comes first when a row should be checked before anything else. */
function adviceHead(rec: RelationshipView['recommendation']): string {
  if (rec.remedy === 'check-row') return 'Check a row first. ';
  if (rec.remedy === 'each-side') return 'No single coefficient fits this curve. ';
  if (!rec.changed) return 'Advice: ';
  return rec.name === 'none' ? 'No coefficient is reliable here. ' : `Consider ${rec.name} instead. `;
}
