/**
 * Section 3, Compare two correlations: pair B's picker, the design (detected from the addresses, or chosen), both
 * correlations with their intervals and their difference with Zou's interval, as a chart and as tiles.
 */
import { describeComparison } from '../../src/stats/compare/comparison';
import { formatCount, formatPValue, formatR } from '../../src/stats/format';
import { IntervalPlot } from '../charts';
import { METHOD_LABELS } from '../../src/stats/types';
import { CompareFailure, CompareView, isCompareFailure } from '../compare-view';
import { Design, DESIGN_LABELS, DesignDetection } from '../design';
import { el, fill, select } from '../dom';
import { PANEL_TEST_IDS } from '../panel-api';
import { ChartBox, chartBox, section, showMessage, tile, Tile } from '../widgets';

/** The design the user asked for: the detected one, or a fixed one. */
export type DesignChoice = 'auto' | Design;

export class CompareSection {
  readonly root: HTMLElement;
  /** The comparison on screen, or null. */
  shown: CompareView | null = null;
  private readonly plot: IntervalPlot;
  private readonly detected: HTMLElement;
  private readonly message: HTMLElement;
  private readonly results: HTMLElement;
  private readonly note: HTMLElement;
  private readonly cautions: HTMLElement;
  private readonly chartBox: ChartBox;
  private readonly tiles: { r1: Tile; r2: Tile; diff: Tile; interval: Tile; p: Tile };

  constructor(picker: HTMLElement, design: DesignChoice, onDesign: (d: DesignChoice) => void) {
    const { root, body } = section('3', 'Compare two correlations', 'section-compare');
    this.root = root;
    const designSelect = select(PANEL_TEST_IDS.design, [
      { value: 'auto', label: 'Detected from the addresses' },
      { value: 'independent', label: DESIGN_LABELS.independent },
      { value: 'shared', label: DESIGN_LABELS.shared },
      { value: 'separate', label: DESIGN_LABELS.separate },
    ], 'Design');
    designSelect.value = design;
    designSelect.addEventListener('change', () => onDesign(designSelect.value as DesignChoice));
    this.detected = el('div', { class: 'cv-hint', testid: PANEL_TEST_IDS.designDetected });
    this.message = el('div', { class: 'cv-message cv-hidden', attrs: { role: 'alert' } });
    const chart = chartBox(PANEL_TEST_IDS.compareChart, 'Both correlations and their difference, with intervals');
    this.chartBox = chart;
    chart.root.classList.add('cv-chart-short');
    this.plot = new IntervalPlot(chart.canvas);
    this.tiles = {
      r1: tile('Pair A r', PANEL_TEST_IDS.compareR1),
      r2: tile('Pair B r', PANEL_TEST_IDS.compareR2),
      diff: tile('Difference A − B', PANEL_TEST_IDS.compareDifference),
      interval: tile('95% interval of the difference', PANEL_TEST_IDS.compareInterval),
      p: tile('p-value', PANEL_TEST_IDS.compareP),
    };
    this.note = el('div', { class: 'cv-chart-note', testid: PANEL_TEST_IDS.compareMethod });
    this.cautions = el('ul', { class: 'cv-compare-cautions cv-hidden', testid: PANEL_TEST_IDS.compareCautions, attrs: { 'aria-label': 'Cautions about this comparison' } });
    this.results = el('div', { class: 'cv-hidden' }, [
      chart.root,
      el('div', { class: 'cv-tiles cv-tiles-2' }, [this.tiles.r1.root, this.tiles.r2.root]),
      el('div', { class: 'cv-tiles cv-tiles-3' }, [this.tiles.diff.root, this.tiles.interval.root, this.tiles.p.root]),
      this.cautions,
      this.note,
    ]);
    fill(body, [
      el('p', { class: 'cv-hint', text: 'Pair A is the pair above. Pick pair B: other rows (another group) or other columns on the same rows.' }),
      picker,
      el('div', { class: 'cv-field-grid' }, [el('label', { class: 'cv-field-label', text: 'Design' }), designSelect]),
      this.detected,
      this.message,
      this.results,
    ]);
  }

  /** Shows a comparison, a reason it could not run, or nothing (no pair B). */
  render(view: CompareView | CompareFailure | null, detection: DesignDetection | null): void {
    this.shown = null;
    if (detection) {
      this.detected.textContent = detection.design
        ? `Detected: ${DESIGN_LABELS[detection.design].toLowerCase()}. ${detection.why}${detection.caution ? ` ${detection.caution}` : ''}`
        : detection.why;
    } else this.detected.textContent = '';
    if (!view || isCompareFailure(view)) {
      this.results.classList.add('cv-hidden');
      showMessage(this.message, view ? view.error : null);
      return;
    }
    showMessage(this.message, null);
    this.shown = view;
    const r = view.result;
    const { tiles } = this;
    const pct = `${Math.round(r.interval.level * 100)}%`;
    this.results.classList.remove('cv-hidden');
    this.plot.update([
      { label: 'A', estimate: r.r1, lower: view.interval1.lower, upper: view.interval1.upper, kind: 'correlation' },
      { label: 'B', estimate: r.r2, lower: view.interval2.lower, upper: view.interval2.upper, kind: 'correlation' },
      { label: 'A − B', estimate: r.statistic, lower: r.interval.lower, upper: r.interval.upper, kind: 'difference' },
    ]);
    tiles.r1.caption.textContent = `A: ${view.labels.a}`;
    tiles.r1.value.textContent = formatR(r.r1);
    tiles.r1.sub.textContent = `${pct}: ${formatR(view.interval1.lower)} to ${formatR(view.interval1.upper)} · n ${formatCount(r.n1)} · ${view.where.a}`;
    tiles.r1.value.setAttribute('data-value', String(r.r1));
    tiles.r2.caption.textContent = `B: ${view.labels.b}`;
    tiles.r2.value.textContent = formatR(r.r2);
    tiles.r2.sub.textContent = `${pct}: ${formatR(view.interval2.lower)} to ${formatR(view.interval2.upper)} · n ${formatCount(r.n2)} · ${view.where.b}`;
    tiles.r2.value.setAttribute('data-value', String(r.r2));
    tiles.diff.value.textContent = formatR(r.statistic);
    tiles.diff.value.setAttribute('data-value', String(r.statistic));
    tiles.interval.caption.textContent = `${pct} interval of the difference`;
    tiles.interval.value.textContent = `${formatR(r.interval.lower)} to ${formatR(r.interval.upper)}`;
    tiles.interval.value.setAttribute('data-lower', String(r.interval.lower));
    tiles.interval.value.setAttribute('data-upper', String(r.interval.upper));
    tiles.p.value.textContent = formatPValue(r.pValue);
    tiles.p.value.setAttribute('data-value', String(r.pValue));
    this.chartBox.describeData({
      summary: `Pair A ${formatR(r.r1)} (${view.interval1.lower.toFixed(2)} to ${view.interval1.upper.toFixed(2)}), pair B ${formatR(r.r2)} (${view.interval2.lower.toFixed(2)} to ${view.interval2.upper.toFixed(2)}), difference ${formatR(r.statistic)} (${formatR(r.interval.lower)} to ${formatR(r.interval.upper)}), ${pct} intervals.`,
      columns: ['', 'estimate', `${pct} lower`, `${pct} upper`],
      rows: () => [
        [`A: ${view.labels.a}`, r.r1, view.interval1.lower, view.interval1.upper],
        [`B: ${view.labels.b}`, r.r2, view.interval2.lower, view.interval2.upper],
        ['A − B', r.statistic, r.interval.lower, r.interval.upper],
      ],
    });
    fill(this.cautions, view.cautions.map((c) => el('li', { text: c })));
    this.cautions.classList.toggle('cv-hidden', view.cautions.length === 0);
    const crosses = r.interval.lower < 0 && r.interval.upper > 0;
    this.note.textContent = `${METHOD_LABELS[r.method].name} correlations (the coefficient chosen above). ${describeComparison(r)}. ${crosses
      ? 'The interval of the difference includes zero: these data do not show the two correlations differ.'
      : 'The interval of the difference excludes zero.'}${view.skipped > 0 ? ` ${formatCount(view.skipped)} incomplete ${view.skipped === 1 ? 'row' : 'rows'} skipped.` : ''}`;
  }

  destroy(): void {
    this.plot.destroy();
  }
}
