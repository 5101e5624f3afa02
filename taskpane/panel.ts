/**
 * The Covary panel: Relationship, Residual diagnostics, Compare and Cautions, live from the workbook.
 *
 * mountPanel(root, wb, opts) builds the whole panel inside `root` and talks to the workbook only through the
 * small Workbook interface (workbook.ts): inside Excel that is excel-workbook.ts, in the workbench the grid's own
 * implementation. Rendering never calls a host directly.
 *
 * Test hooks (stable): data-testid attributes listed in PANEL_TEST_IDS; on the root element
 * data-last-render-ms (read + compute + draw of the last refresh), data-last-latency-ms (from the first change
 * notification it answered to the end of drawing), data-render-count and data-state ("empty", "busy", "ready",
 * "error"); each point chart's wrapper carries data-drawn-count and data-flagged-rows; a read-only debug handle
 * is returned and also published as window.__covaryPanel.
 */
import { CellBlock, formatBlock } from '../src/sheet/a1';
import { twoColumnsOf } from './address';
import { ComputeClient } from './compute-client';
import { describeComparison } from '../src/stats/compare/comparison';
import { CompareFailure, CompareView, computeComparison, isCompareFailure } from './compare-view';
import { IntervalPlot, PlotPoint, PointPlot } from './charts';
import { Design, DESIGN_LABELS, designProblem, detectDesign, DesignDetection } from './design';
import { button, clear, el, fill, onIdle, select } from './dom';
import { LiveScheduler, RefreshCause } from './live-scheduler';
import { describeSource, PairChoice, PairPicker } from './pair-picker';
import { dataBlock, pairColumns, PairingError, readNumericColumn } from './pairs';
import { formatCount, formatPValue, formatR } from './reading';
import {
  analyseRelationship,
  DEFAULT_RELATIONSHIP_OPTIONS,
  FLAG_INFLUENTIAL,
  FLAG_OUTLIER,
  FLAG_SETS_SLOPE,
  isFailure,
  RelationshipOptions,
  RelationshipView,
  WARM_UP_ROWS,
  warmUpRound,
} from './relationship';
import {
  allBlank,
  formulaBlock,
  formulaPlaces,
  reportSheetCells,
  REPORT_CAUTIONS,
  topLeftOf,
  ColumnRef,
} from './sheet-output';
import type { Method } from '../src/stats/types';
import type { ColumnSource, NumericColumnRead, Workbook } from './workbook';

export interface PanelOptions {
  /** Pair to show at once (e.g. the workbench's demo pair). Without it the panel tries the current selection. */
  initial?: PairChoice;
  /** Second pair for the Compare section. */
  initialCompare?: PairChoice;
  method?: Method;
  /** Confidence level, default 0.95. */
  level?: number;
  /** Significance level of the checks, default 0.05. */
  alpha?: number;
  /** The most points a chart draws, default 2000; flagged points are always among them. */
  drawLimit?: number;
  /** Changes arriving within this many ms of a refresh are merged into one trailing refresh; default 200. */
  debounceMs?: number;
  /** URL of dist/panel-worker.js; default "panel-worker.js" next to the page; null computes on the main thread. */
  workerUrl?: string | null;
  /** Pairs from which the analysis runs in the worker, default 250,000. */
  workerThreshold?: number;
  /** Write A1 references even for table columns (for hosts without structured references). */
  a1References?: boolean;
  /** Publish the read-only debug handle as window.__covaryPanel (default true). */
  publishDebugHandle?: boolean;
}

/** Charts that show points, by name. */
export type PointChartName = 'scatter' | 'residuals' | 'qq' | 'order';

/** Read-only facts about what the panel shows, for tests and troubleshooting. */
export interface PanelDebug {
  /** Sheet rows of the drawn points (scatter), ascending. */
  drawnRows(): number[];
  /** Sheet rows of every flagged point (drawn or not), ascending. */
  flaggedRows(): number[];
  /** Client-pixel position of the point of a sheet row on a chart, or null when not drawn. */
  pointOnScreen(chart: PointChartName, row: number): { x: number; y: number } | null;
  /** The figures shown in the Relationship section, or null before the first result. */
  summary(): { sheet: string; r: number; lower: number; upper: number; p: number; n: number; name: string; flags: string[] } | null;
  /** The figures shown in the Compare section, or null. */
  comparison(): { design: Design; difference: number; lower: number; upper: number; p: number } | null;
  lastRenderMs(): number;
  lastLatencyMs(): number;
  /** Milliseconds by phase of the last refresh: read, pair, compute, draw, compare. */
  lastPhases(): Record<string, number>;
  renderCount(): number;
  /** Resolves once no refresh is running or waiting. */
  whenIdle(): Promise<void>;
}

export interface PanelHandle {
  debug: PanelDebug;
  /** Re-reads and redraws now. */
  refresh(): Promise<void>;
  /** Stops watching, removes the panel's DOM and charts. */
  destroy(): void;
}

/** The data-testid values the panel promises to keep. */
export const PANEL_TEST_IDS = {
  coefficientName: 'coefficient-name',
  r: 'r-value',
  interval: 'interval',
  p: 'p-value',
  pairs: 'pairs',
  flags: 'flags',
  flaggedRows: 'flagged-rows',
  reading: 'reading',
  advice: 'advice',
  checksTable: 'checks-table',
  method: 'method-select',
  level: 'level-select',
  scatter: 'chart-scatter',
  residuals: 'chart-residuals',
  qq: 'chart-qq',
  order: 'chart-order',
  compareChart: 'chart-compare',
  compareR1: 'compare-r1',
  compareR2: 'compare-r2',
  compareDifference: 'compare-difference',
  compareInterval: 'compare-interval',
  compareP: 'compare-p',
  compareMethod: 'compare-method',
  design: 'design-select',
  designDetected: 'design-detected',
  formulasButton: 'btn-formulas',
  reportButton: 'btn-report',
  actionStatus: 'action-status',
  status: 'status',
  progress: 'progress',
  /** Pickers: prefixes "main" and "second" with -mode-selection, -mode-table, -use-selection, -set-x, -set-y,
   *  -table, -x-column, -y-column, -pair-label. */
} as const;

const METHOD_OPTIONS = [
  { value: 'pearson', label: 'Pearson (straight line)' },
  { value: 'spearman', label: 'Spearman (rank order)' },
  { value: 'kendall', label: 'Kendall (rank agreement)' },
];
const LEVEL_OPTIONS = [
  { value: '0.9', label: '90%' },
  { value: '0.95', label: '95%' },
  { value: '0.99', label: '99%' },
];

const now = (): number => performance.now();

function flagWords(bits: number): string[] {
  const words: string[] = [];
  if (bits & FLAG_OUTLIER) words.push('outlier');
  if (bits & FLAG_INFLUENTIAL) words.push('influential');
  if (bits & FLAG_SETS_SLOPE) words.push('sets the slope');
  return words;
}

function fmt(v: number): string {
  if (!Number.isFinite(v)) return '–';
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(2);
  return String(Number(v.toPrecision(4)));
}

/** The core's messages call the columns x and y; say which columns those are. */
export function nameAxes(message: string, xHeader: string, yHeader: string): string {
  return message.replace(/^(x|y)\b/, (axis) => `${axis === 'x' ? xHeader : yHeader} (${axis})`);
}

/** A statistic tile: a small caption over a large value. */
function tile(caption: string, testid: string, captionTestid?: string): { root: HTMLElement; value: HTMLElement; caption: HTMLElement; sub: HTMLElement } {
  const cap = el('div', { class: 'cv-tile-caption', text: caption, testid: captionTestid });
  const value = el('div', { class: 'cv-tile-value', text: '–', testid });
  const sub = el('div', { class: 'cv-tile-sub' });
  return { root: el('div', { class: 'cv-tile' }, [cap, value, sub]), value, caption: cap, sub };
}

function section(number: string, title: string, testid: string): { root: HTMLElement; body: HTMLElement } {
  const body = el('div', { class: 'cv-section-body' });
  const root = el('section', { class: 'cv-section', testid, attrs: { 'aria-label': title } }, [
    el('h2', { class: 'cv-section-title' }, [el('span', { class: 'cv-section-number', text: number }), el('span', { text: title })]),
    body,
  ]);
  return { root, body };
}

function chartBox(testid: string, title: string, note?: string): { root: HTMLElement; canvas: HTMLCanvasElement; frame: HTMLElement } {
  const canvas = el('canvas', { testid, attrs: { role: 'img', 'aria-label': title } });
  const frame = el('div', { class: 'cv-chart-frame', testid: `${testid}-frame` }, [canvas]);
  const root = el('figure', { class: 'cv-chart' }, [
    el('figcaption', { class: 'cv-chart-title', text: title }),
    frame,
    note ? el('div', { class: 'cv-chart-note', text: note }) : null,
  ]);
  return { root, canvas, frame };
}

function legend(): HTMLElement {
  const item = (cls: string, text: string): HTMLElement => el('span', { class: 'cv-legend-item' }, [el('span', { class: `cv-key ${cls}` }), el('span', { text })]);
  return el('div', { class: 'cv-legend', attrs: { 'aria-hidden': 'true' } }, [
    item('cv-key-point', 'rows'),
    item('cv-key-flag', 'flagged row'),
    item('cv-key-fit', 'straight line'),
    item('cv-key-smooth', 'LOWESS smooth'),
  ]);
}

/** Mounts the panel into `root` and starts following the workbook. */
export function mountPanel(root: HTMLElement, wb: Workbook, opts: PanelOptions = {}): PanelHandle {
  const drawLimit = opts.drawLimit ?? DEFAULT_RELATIONSHIP_OPTIONS.drawLimit;
  let method: Method = opts.method ?? 'pearson';
  let level = opts.level ?? 0.95;
  const alpha = opts.alpha ?? 0.05;
  const workerUrl = opts.workerUrl === undefined ? new URL('panel-worker.js', document.baseURI).href : opts.workerUrl;
  const compute = new ComputeClient(workerUrl, opts.workerThreshold ?? 250000);

  // ---- layout -------------------------------------------------------------------------------------------------
  clear(root);
  const status = el('div', { class: 'cv-status', testid: PANEL_TEST_IDS.status, attrs: { role: 'status', 'aria-live': 'polite' } });
  const progress = el('div', { class: 'cv-progress cv-hidden', testid: PANEL_TEST_IDS.progress, attrs: { role: 'progressbar', 'aria-label': 'Computing' } }, [
    el('div', { class: 'cv-progress-bar' }),
    el('div', { class: 'cv-progress-text' }),
  ]);
  const panel = el('div', { class: 'cv-panel' }, [
    el('header', { class: 'cv-header' }, [
      el('div', { class: 'cv-brand' }, [el('span', { class: 'cv-brand-mark', attrs: { 'aria-hidden': 'true' } }), el('span', { class: 'cv-brand-name', text: 'Covary' })]),
      status,
    ]),
    progress,
  ]);
  root.appendChild(panel);

  // 1. Relationship
  const rel = section('1', 'Relationship', 'section-relationship');
  const picker = new PairPicker(wb, 'main', { x: 'X', y: 'Y' }, (c) => choose(c));
  const methodSelect = select(PANEL_TEST_IDS.method, METHOD_OPTIONS, 'Coefficient');
  methodSelect.value = method;
  const levelSelect = select(PANEL_TEST_IDS.level, LEVEL_OPTIONS, 'Confidence level');
  levelSelect.value = String(level);
  const tiles = {
    r: tile('Pearson r', PANEL_TEST_IDS.r, PANEL_TEST_IDS.coefficientName),
    interval: tile('95% interval', PANEL_TEST_IDS.interval),
    p: tile('p-value', PANEL_TEST_IDS.p),
    pairs: tile('Pairs used', PANEL_TEST_IDS.pairs),
  };
  const relMessage = el('div', { class: 'cv-message cv-hidden', attrs: { role: 'alert' } });
  const scatter = chartBox(PANEL_TEST_IDS.scatter, 'Scatter with straight line and smooth');
  const reading = el('ul', { class: 'cv-reading', testid: PANEL_TEST_IDS.reading });
  const advice = el('div', { class: 'cv-advice', testid: PANEL_TEST_IDS.advice });
  const flags = el('div', { class: 'cv-flags', testid: PANEL_TEST_IDS.flags });
  const flaggedRowsList = el('div', { class: 'cv-flagged-rows', testid: PANEL_TEST_IDS.flaggedRows });
  const checksBody = el('tbody');
  const checksTable = el('table', { class: 'cv-checks', testid: PANEL_TEST_IDS.checksTable }, [
    el('thead', {}, [el('tr', {}, ['Check', 'Result', 'p'].map((h) => el('th', { text: h, attrs: { scope: 'col' } })))]),
    checksBody,
  ]);
  const formulasButton = button('Put formulas in sheet', PANEL_TEST_IDS.formulasButton, 'primary');
  const reportButton = button('Write report sheet', PANEL_TEST_IDS.reportButton);
  const actionStatus = el('div', { class: 'cv-inline-message', testid: PANEL_TEST_IDS.actionStatus, attrs: { role: 'status' } });
  // Results stay hidden until there is something to show (no empty charts).
  const relResults = el('div', { class: 'cv-results cv-hidden' }, [
    el('div', { class: 'cv-tiles' }, [tiles.r.root, tiles.interval.root, tiles.p.root, tiles.pairs.root]),
    scatter.root,
    legend(),
    reading,
    advice,
    el('h3', { class: 'cv-subhead', text: 'Flags from the checks' }),
    flags,
    flaggedRowsList,
    el('details', { class: 'cv-details' }, [el('summary', { text: 'All eight checks' }), checksTable]),
    el('div', { class: 'cv-row cv-wrap cv-actions' }, [formulasButton, reportButton]),
    actionStatus,
  ]);
  fill(rel.body, [
    picker.element,
    el('div', { class: 'cv-field-grid' }, [
      el('label', { class: 'cv-field-label', text: 'Coefficient' }), methodSelect,
      el('label', { class: 'cv-field-label', text: 'Interval' }), levelSelect,
    ]),
    relMessage,
    relResults,
  ]);

  // 2. Residual diagnostics
  const res = section('2', 'Residual diagnostics', 'section-residuals');
  const residualsChart = chartBox(PANEL_TEST_IDS.residuals, 'Residuals against fitted values', 'A band of even width around zero is good; a curve or a funnel is not.');
  const qqChart = chartBox(PANEL_TEST_IDS.qq, 'Normal Q-Q plot of the residuals', 'Points near the dashed line: residuals close to normal.');
  const orderChart = chartBox(PANEL_TEST_IDS.order, 'Residuals in sheet row order', 'Runs of same-sign residuals suggest neighbouring rows are alike.');
  const resWaiting = el('p', { class: 'cv-hint', text: 'The residual plots appear once a pair of columns gives a result.' });
  const resResults = el('div', { class: 'cv-results cv-hidden' }, [
    el('p', { class: 'cv-hint', text: 'Hover a point to see its sheet row; click it to select that row.' }),
    residualsChart.root,
    qqChart.root,
    orderChart.root,
  ]);
  fill(res.body, [resWaiting, resResults]);

  // 3. Compare
  const cmp = section('3', 'Compare two correlations', 'section-compare');
  const secondPicker = new PairPicker(wb, 'second', { x: 'X₂', y: 'Y₂' }, (c) => chooseSecond(c));
  const designSelect = select(PANEL_TEST_IDS.design, [
    { value: 'auto', label: 'Detected from the addresses' },
    { value: 'independent', label: DESIGN_LABELS.independent },
    { value: 'shared', label: DESIGN_LABELS.shared },
    { value: 'separate', label: DESIGN_LABELS.separate },
  ], 'Design');
  const designDetected = el('div', { class: 'cv-hint', testid: PANEL_TEST_IDS.designDetected });
  const cmpMessage = el('div', { class: 'cv-message cv-hidden', attrs: { role: 'alert' } });
  const compareChart = chartBox(PANEL_TEST_IDS.compareChart, 'Both correlations and their difference, with intervals');
  compareChart.root.classList.add('cv-chart-short');
  const cmpTiles = {
    r1: tile('Pair A r', PANEL_TEST_IDS.compareR1),
    r2: tile('Pair B r', PANEL_TEST_IDS.compareR2),
    diff: tile('Difference A − B', PANEL_TEST_IDS.compareDifference),
    interval: tile('95% interval of the difference', PANEL_TEST_IDS.compareInterval),
    p: tile('p-value', PANEL_TEST_IDS.compareP),
  };
  const cmpMethod = el('div', { class: 'cv-chart-note', testid: PANEL_TEST_IDS.compareMethod });
  const cmpResults = el('div', { class: 'cv-hidden' }, [
    compareChart.root,
    el('div', { class: 'cv-tiles cv-tiles-2' }, [cmpTiles.r1.root, cmpTiles.r2.root]),
    el('div', { class: 'cv-tiles cv-tiles-3' }, [cmpTiles.diff.root, cmpTiles.interval.root, cmpTiles.p.root]),
    cmpMethod,
  ]);
  fill(cmp.body, [
    el('p', { class: 'cv-hint', text: 'Pair A is the pair above. Pick pair B: other rows (another group) or other columns on the same rows.' }),
    secondPicker.element,
    el('div', { class: 'cv-field-grid' }, [el('label', { class: 'cv-field-label', text: 'Design' }), designSelect]),
    designDetected,
    cmpMessage,
    cmpResults,
  ]);

  // 4. Cautions
  const cau = section('4', 'Cautions', 'section-cautions');
  fill(cau.body, [el('ul', { class: 'cv-cautions', testid: 'cautions' }, REPORT_CAUTIONS.map((c) => el('li', { text: c })))]);

  panel.append(rel.root, res.root, cmp.root, cau.root);

  // ---- charts -------------------------------------------------------------------------------------------------
  let current: RelationshipView | null = null;
  const pick = (row: number): void => {
    if (!current) return;
    const sheet = current.sheet;
    wb.selectRow(sheet, row).catch((e: unknown) => say(`Could not select row ${row}: ${e instanceof Error ? e.message : String(e)}`));
  };
  const plots: Record<PointChartName, PointPlot> = {
    scatter: new PointPlot(scatter.canvas, pick),
    residuals: new PointPlot(residualsChart.canvas, pick),
    qq: new PointPlot(qqChart.canvas, pick),
    order: new PointPlot(orderChart.canvas, pick),
  };
  const frames: Record<PointChartName, HTMLElement> = { scatter: scatter.frame, residuals: residualsChart.frame, qq: qqChart.frame, order: orderChart.frame };
  const intervalPlot = new IntervalPlot(compareChart.canvas);

  // ---- state --------------------------------------------------------------------------------------------------
  let mainChoice: PairChoice | null = null;
  let secondChoice: PairChoice | null = null;
  let mainReads: [NumericColumnRead, NumericColumnRead] | null = null;
  let comparison: CompareView | null = null;
  let unwatch: (() => void) | null = null;
  let generation = 0;
  let renders = 0;
  let lastRenderMs = NaN;
  let lastLatencyMs = NaN;
  let lastPhases: Record<string, number> = {};
  let destroyed = false;
  let busy = false;

  function say(text: string): void {
    status.textContent = text;
  }

  function setState(s: 'empty' | 'busy' | 'ready' | 'error'): void {
    root.setAttribute('data-state', s);
  }
  setState('empty');

  function showMessage(box: HTMLElement, text: string | null): void {
    box.textContent = text ?? '';
    box.classList.toggle('cv-hidden', !text);
  }

  function showProgress(text: string | null): void {
    progress.classList.toggle('cv-hidden', text === null);
    (progress.lastChild as HTMLElement).textContent = text ?? '';
  }

  // ---- reading ------------------------------------------------------------------------------------------------
  async function readPair(c: PairChoice): Promise<[NumericColumnRead, NumericColumnRead]> {
    const [x, y] = await Promise.all([readNumericColumn(wb, c.x), readNumericColumn(wb, c.y)]);
    return [x, y];
  }

  function where(read: NumericColumnRead): string {
    return formatBlock(dataBlock(read));
  }

  // ---- rendering: relationship and residuals ------------------------------------------------------------------
  function pointsOf(v: RelationshipView, xs: Float64Array, ys: Float64Array): PlotPoint[] {
    const d = v.drawn;
    const out: PlotPoint[] = new Array(d.rows.length);
    for (let k = 0; k < d.rows.length; k++) out[k] = { x: xs[k], y: ys[k], row: d.rows[k], flags: d.flags[k] };
    return out;
  }

  function describer(v: RelationshipView): (p: PlotPoint) => string[] {
    const index = new Map<number, number>();
    v.drawn.rows.forEach((r, k) => index.set(r, k));
    return (p) => {
      const k = index.get(p.row);
      if (k === undefined) return [`Row ${p.row}`];
      const d = v.drawn;
      const lines = [`Row ${p.row}`, `${v.xHeader}: ${fmt(d.x[k])}   ${v.yHeader}: ${fmt(d.y[k])}`, `Residual ${fmt(d.residuals[k])}`];
      const words = flagWords(d.flags[k]);
      if (words.length) lines.push(`Flagged: ${words.join(', ')}`);
      lines.push('Click to select this row');
      return lines;
    };
  }

  function renderRelationship(v: RelationshipView): void {
    showResults(true);
    const c = v.correlation;
    tiles.r.caption.textContent = c.name === 'Kendall tau-b' ? 'Kendall τ-b' : c.name === 'Spearman' ? 'Spearman ρ' : `${c.name} r`;
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

    fill(reading, v.reading.map((t) => el('li', { text: t })));
    const rec = v.recommendation;
    advice.classList.toggle('cv-advice-change', rec.changed);
    const switchTo: Method | null = rec.changed ? (rec.name === 'Spearman' ? 'spearman' : rec.name === 'Kendall tau-b' ? 'kendall' : null) : null;
    let use: HTMLButtonElement | null = null;
    if (switchTo) {
      use = el('button', { class: 'cv-link', text: `Use ${rec.name}`, testid: 'advice-switch', attrs: { type: 'button' } });
      use.addEventListener('click', () => {
        methodSelect.value = switchTo;
        method = switchTo;
        scheduler.now();
      });
    }
    fill(advice, [
      el('span', { class: 'cv-advice-head', text: rec.changed ? (rec.name === 'none' ? 'No coefficient is reliable here. ' : `Consider ${rec.name} instead. `) : 'Advice: ' }),
      el('span', { text: rec.reason }),
      use ? el('span', { text: ' ' }) : null,
      use,
    ]);

    if (v.flags.length === 0) fill(flags, [el('span', { class: 'cv-chip cv-chip-ok', text: 'No flags: the checks found nothing to worry about' })]);
    else fill(flags, v.flags.map((f) => el('span', { class: 'cv-chip cv-chip-flag', text: f })));

    const shown = v.flaggedRows.slice(0, 20);
    fill(flaggedRowsList, shown.length === 0 ? [] : [
      el('span', { class: 'cv-muted', text: 'Flagged rows: ' }),
      ...shown.map((r) => {
        const b = el('button', { class: 'cv-link', text: `row ${r}`, attrs: { type: 'button', 'data-row': String(r) } });
        b.addEventListener('click', () => pick(r));
        return b;
      }),
      v.flaggedRows.length > shown.length ? el('span', { class: 'cv-muted', text: ` and ${v.flaggedRows.length - shown.length} more` }) : null,
    ]);

    fill(checksBody, v.checks.map((row) => el('tr', { class: `cv-verdict-${row.verdict.replace(' ', '-')}` }, [
      el('th', { attrs: { scope: 'row' } }, [
        el('div', { text: row.label }),
        el('div', { class: 'cv-meaning', text: row.meaning }),
        el('div', { class: 'cv-test', text: row.test }),
      ]),
      el('td', {}, [el('span', { class: `cv-badge cv-badge-${row.verdict.replace(' ', '-')}`, text: row.verdict === 'ok' ? 'ok' : row.verdict === 'flag' ? 'flag' : 'n/a' })]),
      el('td', { class: 'cv-num', text: row.pValue === null ? '–' : formatPValue(row.pValue) }),
    ])));

    const d = v.drawn;
    const describe = describer(v);
    let xMin = Infinity;
    let xMax = -Infinity;
    for (let k = 0; k < d.x.length; k++) {
      if (d.x[k] < xMin) xMin = d.x[k];
      if (d.x[k] > xMax) xMax = d.x[k];
    }
    const lineAt = (xv: number): { x: number; y: number } => ({ x: xv, y: v.line.intercept + v.line.slope * xv });
    const smoothPoints = v.smooth ? Array.from(v.smooth.x, (xv, k) => ({ x: xv, y: v.smooth!.y[k] })) : [];
    plots.scatter.update({
      points: pointsOf(v, d.x, d.y),
      lines: [
        { kind: 'fit', label: 'straight line', points: [lineAt(xMin), lineAt(xMax)] },
        { kind: 'smooth', label: 'LOWESS smooth', points: smoothPoints },
      ],
      xTitle: v.xHeader,
      yTitle: v.yHeader,
      describe,
    });

    let fMin = Infinity;
    let fMax = -Infinity;
    let rowMin = Infinity;
    let rowMax = -Infinity;
    let zMin = Infinity;
    let zMax = -Infinity;
    for (let k = 0; k < d.fitted.length; k++) {
      fMin = Math.min(fMin, d.fitted[k]);
      fMax = Math.max(fMax, d.fitted[k]);
      rowMin = Math.min(rowMin, d.rows[k]);
      rowMax = Math.max(rowMax, d.rows[k]);
      zMin = Math.min(zMin, d.normalScore[k]);
      zMax = Math.max(zMax, d.normalScore[k]);
    }
    plots.residuals.update({
      points: pointsOf(v, d.fitted, d.residuals),
      lines: [{ kind: 'reference', label: 'zero', points: [{ x: fMin, y: 0 }, { x: fMax, y: 0 }] }],
      xTitle: `fitted ${v.yHeader}`,
      yTitle: 'residual',
      describe,
    });
    plots.qq.update({
      points: pointsOf(v, d.normalScore, d.residuals),
      lines: [{ kind: 'reference', label: 'quartile line', points: [zMin, zMax].map((z) => ({ x: z, y: v.qqLine.intercept + v.qqLine.slope * z })) }],
      xTitle: 'normal quantile',
      yTitle: 'residual (sorted)',
      describe,
    });
    plots.order.update({
      points: pointsOf(v, Float64Array.from(d.rows), d.residuals),
      lines: [{ kind: 'reference', label: 'zero', points: [{ x: rowMin, y: 0 }, { x: rowMax, y: 0 }] }],
      xTitle: 'sheet row',
      yTitle: 'residual',
      describe,
    });

    const flaggedDrawn: number[] = [];
    for (let k = 0; k < d.rows.length; k++) if (d.flags[k]) flaggedDrawn.push(d.rows[k]);
    for (const name of Object.keys(frames) as PointChartName[]) {
      frames[name].setAttribute('data-drawn-count', String(d.rows.length));
      frames[name].setAttribute('data-flagged-rows', flaggedDrawn.join(','));
    }
  }

  function showResults(on: boolean): void {
    relResults.classList.toggle('cv-hidden', !on);
    resResults.classList.toggle('cv-hidden', !on);
    resWaiting.classList.toggle('cv-hidden', on);
  }

  function clearRelationship(): void {
    current = null;
    showResults(false);
    for (const t of Object.values(tiles)) {
      t.value.textContent = '–';
      t.value.removeAttribute('data-value');
    }
    clear(reading);
    clear(advice);
    clear(flags);
    clear(flaggedRowsList);
    clear(checksBody);
  }

  // ---- rendering: compare -------------------------------------------------------------------------------------
  function renderComparison(view: CompareView | CompareFailure | null, detection: DesignDetection | null): void {
    comparison = null;
    if (detection) {
      designDetected.textContent = detection.design
        ? `Detected: ${DESIGN_LABELS[detection.design].toLowerCase()}. ${detection.why}${detection.caution ? ` ${detection.caution}` : ''}`
        : detection.why;
    } else designDetected.textContent = '';
    if (!view) {
      cmpResults.classList.add('cv-hidden');
      showMessage(cmpMessage, null);
      return;
    }
    if (isCompareFailure(view)) {
      cmpResults.classList.add('cv-hidden');
      showMessage(cmpMessage, view.error);
      return;
    }
    showMessage(cmpMessage, null);
    comparison = view;
    const r = view.result;
    const pct = `${Math.round(r.interval.level * 100)}%`;
    cmpResults.classList.remove('cv-hidden');
    intervalPlot.update([
      { label: 'A', estimate: r.r1, lower: view.interval1.lower, upper: view.interval1.upper, kind: 'correlation' },
      { label: 'B', estimate: r.r2, lower: view.interval2.lower, upper: view.interval2.upper, kind: 'correlation' },
      { label: 'A − B', estimate: r.statistic, lower: r.interval.lower, upper: r.interval.upper, kind: 'difference' },
    ]);
    cmpTiles.r1.caption.textContent = `A: ${view.labels.a}`;
    cmpTiles.r1.value.textContent = formatR(r.r1);
    cmpTiles.r1.sub.textContent = `${pct}: ${formatR(view.interval1.lower)} to ${formatR(view.interval1.upper)} · n ${formatCount(r.n1)} · ${view.where.a}`;
    cmpTiles.r1.value.setAttribute('data-value', String(r.r1));
    cmpTiles.r2.caption.textContent = `B: ${view.labels.b}`;
    cmpTiles.r2.value.textContent = formatR(r.r2);
    cmpTiles.r2.sub.textContent = `${pct}: ${formatR(view.interval2.lower)} to ${formatR(view.interval2.upper)} · n ${formatCount(r.n2)} · ${view.where.b}`;
    cmpTiles.r2.value.setAttribute('data-value', String(r.r2));
    cmpTiles.diff.value.textContent = formatR(r.statistic);
    cmpTiles.diff.value.setAttribute('data-value', String(r.statistic));
    cmpTiles.interval.caption.textContent = `${pct} interval of the difference`;
    cmpTiles.interval.value.textContent = `${formatR(r.interval.lower)} to ${formatR(r.interval.upper)}`;
    cmpTiles.interval.value.setAttribute('data-lower', String(r.interval.lower));
    cmpTiles.interval.value.setAttribute('data-upper', String(r.interval.upper));
    cmpTiles.p.value.textContent = formatPValue(r.pValue);
    cmpTiles.p.value.setAttribute('data-value', String(r.pValue));
    const crosses = r.interval.lower < 0 && r.interval.upper > 0;
    cmpMethod.textContent = `Pearson correlations. ${describeComparison(r)}. ${crosses
      ? 'The interval of the difference includes zero: these data do not show the two correlations differ.'
      : 'The interval of the difference excludes zero.'}${view.skipped > 0 ? ` ${formatCount(view.skipped)} incomplete rows skipped.` : ''}`;
  }

  /** The analysis options the panel's controls hold now. */
  const relationshipOptions = (): RelationshipOptions => ({ method, level, alpha, drawLimit });

  // ---- refresh ------------------------------------------------------------------------------------------------
  async function refresh(cause: RefreshCause): Promise<void> {
    const gen = ++generation;
    const started = now();
    const phases: Record<string, number> = {};
    let mark = started;
    const lap = (name: string): void => {
      const t = now();
      phases[name] = Math.round((t - mark) * 10) / 10;
      mark = t;
    };
    busy = true;
    try {
      if (!mainChoice) {
        setState('empty');
        say('Pick two columns to begin.');
        return;
      }
      setState('busy');
      let reads: [NumericColumnRead, NumericColumnRead];
      try {
        reads = await readPair(mainChoice);
      } catch (e) {
        if (gen !== generation) return;
        clearRelationship();
        setState('error');
        showMessage(relMessage, `Could not read the columns: ${e instanceof Error ? e.message : String(e)}`);
        return;
      }
      if (gen !== generation) return;
      lap('read');
      if (!primed && reads[0].numbers.length >= WARM_UP_ROWS && !compute.usesWorker(reads[0].numbers.length)) {
        prime(reads);
        lap('prime');
      }
      mainReads = reads;
      picker.showResolved({ header: reads[0].header, where: where(reads[0]) }, { header: reads[1].header, where: where(reads[1]) });
      let pairs;
      try {
        pairs = pairColumns(reads[0], reads[1]);
      } catch (e) {
        if (!(e instanceof PairingError)) throw e;
        clearRelationship();
        setState('error');
        showMessage(relMessage, e.message);
        return;
      }
      lap('pair');
      const inWorker = compute.usesWorker(pairs.x.length);
      if (inWorker || pairs.x.length >= compute.workerThreshold) {
        showProgress(`Computing on ${formatCount(pairs.x.length)} rows${inWorker ? ' in the background; the sheet stays usable' : ''}…`);
      }
      const view = await compute.analyse(pairs, relationshipOptions(), () => undefined);
      if (gen !== generation) return;
      lap('compute');
      showProgress(null);
      if (isFailure(view)) {
        clearRelationship();
        setState('error');
        showMessage(relMessage, nameAxes(view.error, pairs.xHeader, pairs.yHeader));
      } else {
        showMessage(relMessage, null);
        current = view;
        renderRelationship(view);
        if (!warmedUp && view.n >= WARM_UP_ROWS && !compute.usesWorker(view.n)) {
          warmedUp = true;
          warmUp(0);
        }
      }
      lap('draw');

      if (secondChoice) {
        let second: [NumericColumnRead, NumericColumnRead] | null = null;
        try {
          second = await readPair(secondChoice);
        } catch (e) {
          renderComparison({ error: `Could not read pair B: ${e instanceof Error ? e.message : String(e)}` }, null);
        }
        if (gen !== generation) return;
        if (second) {
          secondPicker.showResolved({ header: second[0].header, where: where(second[0]) }, { header: second[1].header, where: where(second[1]) });
          const blocksA: [CellBlock, CellBlock] = [dataBlock(reads[0]), dataBlock(reads[1])];
          const blocksB: [CellBlock, CellBlock] = [dataBlock(second[0]), dataBlock(second[1])];
          const detection = detectDesign(blocksA, blocksB);
          const chosen = designSelect.value === 'auto' ? detection.design : (designSelect.value as Design);
          if (!chosen) renderComparison({ error: detection.why }, detection);
          else {
            const problem = designProblem(chosen, blocksA, blocksB);
            if (problem) renderComparison({ error: problem }, detection);
            else renderComparison(computeComparison(reads, second, chosen, detection, level), detection);
          }
        }
      } else renderComparison(null, null);
      lap('compare');

      const ended = now();
      renders++;
      lastRenderMs = ended - started;
      lastLatencyMs = ended - cause.firstChangeAt;
      root.setAttribute('data-last-render-ms', lastRenderMs.toFixed(1));
      root.setAttribute('data-last-latency-ms', lastLatencyMs.toFixed(1));
      root.setAttribute('data-render-count', String(renders));
      root.setAttribute('data-last-phases', JSON.stringify(phases));
      lastPhases = phases;
      try {
        performance.clearMeasures('covary-redraw'); // keep one entry, not one per redraw of a long session
        performance.measure('covary-redraw', { start: cause.firstChangeAt, end: ended });
      } catch {
        // performance.measure with options is missing in old engines; the attributes above still hold the figure.
      }
      if (!isFailure(view)) {
        setState('ready');
        say(`${formatCount(view.n)} pairs · updated in ${Math.round(lastRenderMs)} ms`);
      }
    } finally {
      if (gen === generation) showProgress(null);
      busy = false;
    }
  }

  // Before the first analysis of a large sheet: three rounds of it on PRIME_ROWS invented rows, and the pairing of
  // the sheet's first PRIME_ROWS rows, so that every step has run once, start to end, before the script engine
  // optimises it during the first long call (see warmUpRound). About 40 ms, once.
  let primed = false;
  const PRIME_ROWS = 6000;
  function prime(reads: [NumericColumnRead, NumericColumnRead]): void {
    primed = true;
    const head = (c: NumericColumnRead): NumericColumnRead => ({ ...c, numbers: c.numbers.subarray(0, PRIME_ROWS) });
    try {
      for (let round = 0; round < 3; round++) {
        warmUpRound(round, relationshipOptions(), PRIME_ROWS);
        pairColumns(head(reads[0]), head(reads[1]));
      }
    } catch {
      // Nothing depends on priming; the panel works the same without it.
    }
  }

  const scheduler = new LiveScheduler(refresh, opts.debounceMs ?? 200);

  // After the first large redraw, a few rounds of the analysis while the page is idle, so the script engine has
  // compiled it before the user's next edits (see warmUpRound): six on invented data, which vary the kinds of
  // numbers, then four on the sheet's own columns, paired and analysed as the next edit will be. One round per idle
  // slot; a round waits while a refresh runs.
  let warmedUp = false;
  let warming = false;
  const INVENTED_ROUNDS = 6;
  const WARM_UP_ROUNDS = INVENTED_ROUNDS + 4;
  function warmUp(round: number): void {
    warming = !destroyed && round < WARM_UP_ROUNDS;
    if (!warming) return;
    onIdle(() => {
      if (destroyed) return;
      if (busy || !scheduler.idle) {
        warmUp(round);
        return;
      }
      try {
        if (round < INVENTED_ROUNDS) warmUpRound(round, relationshipOptions());
        else if (mainReads) analyseRelationship(pairColumns(mainReads[0], mainReads[1]), relationshipOptions(), compute.memory);
      } catch {
        // Nothing depends on a warm-up round; the panel works the same without it.
      }
      warmUp(round + 1);
    });
  }

  async function rewatch(): Promise<void> {
    if (unwatch) {
      unwatch();
      unwatch = null;
    }
    const sources: ColumnSource[] = [];
    if (mainChoice) sources.push(mainChoice.x, mainChoice.y);
    if (secondChoice) sources.push(secondChoice.x, secondChoice.y);
    if (sources.length === 0) return;
    try {
      const stop = await wb.watch(sources, () => scheduler.changed());
      if (destroyed) stop();
      else unwatch = stop;
    } catch (e) {
      say(`Live updates are off: ${e instanceof Error ? e.message : String(e)}`);
    }
  }

  function choose(c: PairChoice): void {
    mainChoice = c;
    showMessage(relMessage, null);
    void rewatch();
    scheduler.now();
  }

  function chooseSecond(c: PairChoice): void {
    secondChoice = c;
    void rewatch();
    scheduler.now();
  }

  methodSelect.addEventListener('change', () => {
    method = methodSelect.value as Method;
    scheduler.now();
  });
  levelSelect.addEventListener('change', () => {
    level = Number(levelSelect.value);
    scheduler.now();
  });
  designSelect.addEventListener('change', () => scheduler.now());

  // ---- write buttons ------------------------------------------------------------------------------------------
  function refsOf(reads: [NumericColumnRead, NumericColumnRead], c: PairChoice): [ColumnRef, ColumnRef] {
    return [{ source: c.x, block: dataBlock(reads[0]) }, { source: c.y, block: dataBlock(reads[1]) }];
  }

  async function putFormulas(): Promise<void> {
    if (!mainReads || !mainChoice) {
      actionStatus.textContent = 'Pick two columns first.';
      return;
    }
    const [xr, yr] = refsOf(mainReads, mainChoice);
    const sheet = xr.block.sheet;
    try {
      for (const place of formulaPlaces([xr.block, yr.block])) {
        const seen = await wb.readRange(formatBlock(place));
        if (!allBlank(seen.values)) continue;
        const cells = formulaBlock(xr, yr, { x: mainReads[0].header, y: mainReads[1].header }, sheet, { method, level, alpha, a1: opts.a1References });
        await wb.writeCells(topLeftOf(place), cells);
        actionStatus.textContent = `Formulas written at ${formatBlock({ ...place, lastColumn: place.firstColumn + 1 })}. They recalculate with the sheet.`;
        return;
      }
      actionStatus.textContent = 'No empty space found to the right of the data: clear a few columns there and try again.';
    } catch (e) {
      actionStatus.textContent = `Could not write the formulas: ${e instanceof Error ? e.message : String(e)}`;
    }
  }

  async function writeReport(): Promise<void> {
    if (!mainReads || !mainChoice) {
      actionStatus.textContent = 'Pick two columns first.';
      return;
    }
    const [xr, yr] = refsOf(mainReads, mainChoice);
    try {
      const cells = reportSheetCells(xr, yr, { x: mainReads[0].header, y: mainReads[1].header }, { method, level, alpha, a1: opts.a1References }, new Date());
      const name = await wb.addSheet('Covary report', cells);
      actionStatus.textContent = `Report written to the sheet "${name}".`;
    } catch (e) {
      actionStatus.textContent = `Could not write the report sheet: ${e instanceof Error ? e.message : String(e)}`;
    }
  }

  formulasButton.addEventListener('click', () => void putFormulas());
  reportButton.addEventListener('click', () => void writeReport());

  // ---- start --------------------------------------------------------------------------------------------------
  async function start(): Promise<void> {
    if (opts.initial) {
      mainChoice = opts.initial;
      picker.set(opts.initial);
    } else {
      try {
        const address = await wb.getSelection();
        const two = twoColumnsOf(address);
        if (two && two.every((b) => b.lastRow - b.firstRow >= 2)) {
          mainChoice = { x: { kind: 'range', address: formatBlock(two[0]) }, y: { kind: 'range', address: formatBlock(two[1]) } };
          picker.set(mainChoice);
        }
      } catch {
        // No selection to start from: the user picks.
      }
    }
    if (opts.initialCompare) {
      secondChoice = opts.initialCompare;
      secondPicker.set(opts.initialCompare);
    }
    await rewatch();
    scheduler.now();
  }
  void start();

  // ---- handle -------------------------------------------------------------------------------------------------
  const debug: PanelDebug = {
    drawnRows: () => (current ? Array.from(current.drawn.rows) : []),
    flaggedRows: () => (current ? current.flaggedRows.slice() : []),
    pointOnScreen: (chart, row) => plots[chart].screenPosition(row),
    summary: () =>
      current
        ? {
            sheet: current.sheet,
            r: current.correlation.statistic,
            lower: current.correlation.interval.lower,
            upper: current.correlation.interval.upper,
            p: current.correlation.pValue,
            n: current.n,
            name: current.correlation.name,
            flags: current.flags.slice(),
          }
        : null,
    comparison: () =>
      comparison
        ? { design: comparison.design, difference: comparison.result.statistic, lower: comparison.result.interval.lower, upper: comparison.result.interval.upper, p: comparison.result.pValue }
        : null,
    lastRenderMs: () => lastRenderMs,
    lastLatencyMs: () => lastLatencyMs,
    lastPhases: () => ({ ...lastPhases }),
    renderCount: () => renders,
    whenIdle: () =>
      new Promise<void>((resolve) => {
        const check = (): void => {
          if (destroyed || (!busy && !warming && scheduler.idle && !Object.values(plots).some((pl) => pl.stale))) resolve();
          else setTimeout(check, 10);
        };
        check();
      }),
  };
  if (opts.publishDebugHandle !== false) (window as unknown as { __covaryPanel?: PanelDebug }).__covaryPanel = Object.freeze(debug);

  return {
    debug,
    refresh: async () => {
      scheduler.now();
      await debug.whenIdle();
    },
    destroy: () => {
      destroyed = true;
      scheduler.stop();
      if (unwatch) unwatch();
      compute.dispose();
      for (const p of Object.values(plots)) p.destroy();
      intervalPlot.destroy();
      clear(root);
    },
  };
}

export { describeSource };
