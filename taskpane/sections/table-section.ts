/**
 * Section 4, Across the table: a heatmap of the correlations between every numeric column of a table (the
 * coefficient and the Holm-adjusted p on hover or focus; a click or Enter makes that pair the main pair), and the
 * partial correlation of the main pair holding ticked columns fixed.
 *
 * The section does its own reading, after the main pair's refresh and only while it is on screen (or within
 * 300 px of it): a wide table is read column by column, which the main pair's redraw must not wait for. It
 * watches the table's columns while it shows them, so an edit anywhere in the table redraws it.
 *
 * The colour scale is our own: five strengths of |r| (below 0.1, 0.3, 0.5, 0.7, and above), a blue-green for
 * positive and a brown for negative correlations at matched lightness, so in greyscale the lightness still
 * gives the strength, while the sign is printed in the cell and negative cells are striped. Blue-green against
 * brown stays apart for the common red-green colour deficiencies.
 */
import { formatCount, formatPValue, formatR, pClause } from '../../src/stats/format';
import { METHOD_LABELS, Method } from '../../src/stats/types';
import { clear, el, fill, onIdle, select, setOptions } from '../dom';
import { LiveScheduler } from '../live-scheduler';
import type { PairChoice } from '../pair-picker';
import { readNumericColumn } from '../pairs';
import {
  cellText,
  heatStep,
  HEAT_LIMITS,
  isOverviewFailure,
  OverviewColumn,
  OverviewMatrix,
  partialOf,
  partialReading,
  tableMatrix,
} from '../table-overview';
import type { NumericColumnRead, TableInfo, Workbook } from '../workbook';
import { section, showMessage, tile, Tile } from '../widgets';

/** The most columns the heatmap draws (the first ones of a wider table; a note says so). */
export const HEATMAP_COLUMNS = 24;

export interface TableSectionHost {
  wb: Workbook;
  /** The main pair as picked and as last read, or null. */
  main(): { choice: PairChoice; reads: [NumericColumnRead, NumericColumnRead] } | null;
  method(): Method;
  level(): number;
  alpha(): number;
  /** Makes a pair of this table the main pair. */
  pickPair(choice: PairChoice): void;
}

export const TABLE_TEST_IDS = {
  section: 'section-table',
  table: 'overview-table',
  heatmap: 'heatmap',
  detail: 'heatmap-detail',
  left: 'heatmap-left',
  controls: 'partial-controls',
  partial: 'partial-result',
  partialReading: 'partial-reading',
  message: 'overview-message',
} as const;

export class TableSection {
  readonly root: HTMLElement;
  /** The matrix on screen, or null. */
  shown: OverviewMatrix | null = null;
  /** Refreshes done (tests wait on it). */
  renders = 0;
  private readonly tableSelect: HTMLSelectElement;
  private readonly message: HTMLElement;
  private readonly heatHolder: HTMLElement;
  private readonly detail: HTMLElement;
  private readonly scrollHint: HTMLElement;
  private readonly leftOut: HTMLElement;
  private readonly controlsBox: HTMLElement;
  private readonly partialBox: HTMLElement;
  private readonly partialTiles: { r: Tile; interval: Tile; p: Tile; n: Tile };
  private readonly partialText: HTMLElement;
  private readonly partialSaid: HTMLElement;
  private readonly scheduler: LiveScheduler;
  private readonly observer: IntersectionObserver | null = null;
  private readonly resizer: ResizeObserver | null = null;
  private onScreen = true;
  private owed = false;
  private tables: TableInfo[] = [];
  /** The table the user chose in this section, or null to follow the main pair. */
  private chosenTable: string | null = null;
  private columns: OverviewColumn[] = [];
  /** Ticked control columns, by name, for the table they were ticked in. */
  private ticked = new Set<string>();
  private tickedTable = '';
  /** Whether the main pair sits on the section's table rows (drawControls decides). */
  private partialAllowed = false;
  private unwatch: (() => void) | null = null;
  private watchedKey = '';
  private destroyed = false;
  /** The heatmap cell that takes Tab (roving focus). */
  private focusAt: [number, number] = [1, 0];

  constructor(private readonly host: TableSectionHost) {
    const { root, body } = section('4', 'Across the table', TABLE_TEST_IDS.section);
    this.root = root;
    this.tableSelect = select(TABLE_TEST_IDS.table, [], 'Table for the heatmap');
    this.tableSelect.addEventListener('change', () => {
      this.chosenTable = this.tableSelect.value || null;
      this.scheduler.now();
    });
    this.message = el('div', { class: 'cv-message cv-hidden', testid: TABLE_TEST_IDS.message, attrs: { role: 'status' } });
    this.heatHolder = el('div', { class: 'cv-heat-wrap', attrs: { role: 'region', 'aria-label': 'Correlation heatmap', tabindex: '-1' } });
    this.scrollHint = el('p', { class: 'cv-hint cv-hidden', testid: 'heatmap-scroll-hint', text: 'More columns to the right: scroll sideways, or move with the arrow keys.' });
    this.detail = el('p', { class: 'cv-heat-detail', testid: TABLE_TEST_IDS.detail, text: 'Point at or tab to a cell for its figures; click it or press Enter to analyse that pair above.' });
    this.leftOut = el('p', { class: 'cv-hint', testid: TABLE_TEST_IDS.left });
    this.controlsBox = el('fieldset', { class: 'cv-controls', testid: TABLE_TEST_IDS.controls });
    this.partialTiles = {
      r: tile('Partial r', 'partial-r'),
      interval: tile('95% interval', 'partial-interval'),
      p: tile('p-value', 'partial-p'),
      n: tile('Complete rows', 'partial-n'),
    };
    this.partialText = el('p', { class: 'cv-partial-reading', testid: TABLE_TEST_IDS.partialReading });
    this.partialBox = el('div', { class: 'cv-partial', testid: TABLE_TEST_IDS.partial });
    // Said when the user ticks or unticks a column, not on every redraw of the table.
    this.partialSaid = el('p', { class: 'cv-visually-hidden', attrs: { role: 'status' } });
    fill(body, [
      el('p', { class: 'cv-hint', text: 'Every numeric column of a table against every other: the pairs worth a closer look, and what is left of the main pair once other columns are held fixed.' }),
      el('div', { class: 'cv-field-grid' }, [el('label', { class: 'cv-field-label', text: 'Table' }), this.tableSelect]),
      this.message,
      this.heatHolder,
      this.scrollHint,
      heatLegend(),
      this.detail,
      this.leftOut,
      el('h3', { class: 'cv-subhead', text: 'Partial correlation' }),
      this.controlsBox,
      this.partialBox,
      this.partialSaid,
    ]);
    this.scheduler = new LiveScheduler(() => this.refresh(), 200);
    // The pane can be made narrower or wider at any time.
    if (typeof ResizeObserver !== 'undefined') {
      this.resizer = new ResizeObserver(() => this.showWidth());
      this.resizer.observe(this.heatHolder);
    }
    if (typeof IntersectionObserver !== 'undefined') {
      this.observer = new IntersectionObserver((entries) => {
        for (const e of entries) this.onScreen = e.isIntersecting;
        if (this.onScreen && this.owed) {
          this.owed = false;
          this.scheduler.now();
        }
      }, { rootMargin: '300px 0px' });
      this.observer.observe(root);
    }
  }

  /** The main pair or the options changed: redraw when on screen, else when it comes into view. */
  mainChanged(): void {
    if (this.destroyed) return;
    if (!this.onScreen) {
      this.owed = true;
      return;
    }
    onIdle(() => this.scheduler.changed());
  }

  /** True when no refresh of the section is running or owed. */
  get idle(): boolean {
    return this.scheduler.idle && !this.owed;
  }

  destroy(): void {
    this.destroyed = true;
    this.scheduler.stop();
    this.observer?.disconnect();
    this.resizer?.disconnect();
    if (this.unwatch) this.unwatch();
    this.unwatch = null;
  }

  private say(text: string | null): void {
    showMessage(this.message, text);
  }

  private async refresh(): Promise<void> {
    if (this.destroyed) return;
    try {
      await this.redraw();
    } catch (e) {
      this.say(`Could not read the table: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      this.renders++;
      this.root.setAttribute('data-render-count', String(this.renders));
    }
  }

  private async redraw(): Promise<void> {
    this.tables = await this.host.wb.listTables();
    const main = this.host.main();
    if (this.tables.length === 0) {
      setOptions(this.tableSelect, []);
      this.clearAll();
      this.say('This workbook has no tables with headers: format a block as a table to see all its columns at once.');
      return;
    }
    const table = this.pickTable(main);
    setOptions(this.tableSelect, this.tables.map((t) => ({ value: t.name, label: `${t.name} (${t.sheet})` })), false);
    this.tableSelect.value = table.name;
    if (this.tickedTable !== table.name) {
      this.ticked.clear();
      this.tickedTable = table.name;
    }
    await this.watchTable(table);
    const reads = await Promise.all(table.columns.map((column, position) => readNumericColumn(this.host.wb, { kind: 'table', table: table.name, column, position })));
    if (this.destroyed) return;
    this.columns = reads.map((read, position) => ({ name: table.columns[position], position, read }));
    const drawn = this.columns.slice(0, HEATMAP_COLUMNS);
    const view = tableMatrix(table.name, drawn, this.host.method());
    if (isOverviewFailure(view)) {
      this.shown = null;
      clear(this.heatHolder);
      this.leftOut.textContent = '';
      this.say(view.error);
    } else {
      this.say(null);
      this.shown = view;
      this.drawHeatmap(view, main);
      const notes: string[] = [];
      if (view.methodNote) notes.push(view.methodNote);
      if (view.left.length > 0) notes.push(`Left out: ${view.left.map((c) => `${c.name} (${c.why})`).join(', ')}.`);
      if (this.columns.length > HEATMAP_COLUMNS) notes.push(`Only the first ${HEATMAP_COLUMNS} of the ${this.columns.length} columns are drawn.`);
      this.leftOut.textContent = notes.join(' ');
    }
    this.drawControls(view, main);
    this.drawPartial(main);
  }

  /** The section's table: the user's choice, else the main pair's table, else one on the main pair's sheet. */
  private pickTable(main: ReturnType<TableSectionHost['main']>): TableInfo {
    const byName = (name: string | null) => this.tables.find((t) => t.name === name);
    const x = main?.choice.x;
    return byName(this.chosenTable)
      ?? byName(x && x.kind === 'table' ? x.table : null)
      ?? this.tables.find((t) => t.sheet === main?.reads[0].sheet)
      ?? this.tables[0];
  }

  private async watchTable(table: TableInfo): Promise<void> {
    const key = `${table.name}\u0000${table.columns.join('\u0000')}`;
    if (key === this.watchedKey && this.unwatch) return;
    if (this.unwatch) this.unwatch();
    this.unwatch = null;
    this.watchedKey = key;
    try {
      const stop = await this.host.wb.watch(table.columns.map((column, position) => ({ kind: 'table' as const, table: table.name, column, position })), () => this.mainChanged());
      if (this.destroyed) stop();
      else this.unwatch = stop;
    } catch {
      // Without change notifications the section still redraws with the main pair.
    }
  }

  private clearAll(): void {
    this.shown = null;
    clear(this.heatHolder);
    clear(this.controlsBox);
    clear(this.partialBox);
    this.leftOut.textContent = '';
  }

  // ---- heatmap --------------------------------------------------------------------------------------------------

  private drawHeatmap(v: OverviewMatrix, main: ReturnType<TableSectionHost['main']>): void {
    const m = v.matrix;
    const k = m.k;
    const name = METHOD_LABELS[m.method].name;
    const alpha = this.host.alpha();
    const mainPositions = mainInTable(v, main);
    if (this.focusAt[0] >= k || this.focusAt[1] >= this.focusAt[0]) this.focusAt = [1, 0];
    // The lower triangle without its diagonal: columns stop one short of the last (it has no cell below the
    // diagonal); the first row holds no cell but names column 1.
    const across = v.columns.slice(0, k - 1);
    const head = el('tr', {}, [
      el('td', { class: 'cv-heat-corner' }),
      ...across.map((c, j) => el('th', { class: 'cv-heat-colhead', text: String(j + 1), attrs: { scope: 'col', title: c.name, 'aria-label': c.name } })),
    ]);
    const rows = v.columns.map((c, i) => el('tr', {}, [
      el('th', { class: 'cv-heat-rowhead', attrs: { scope: 'row', title: c.name } }, [
        el('span', { class: 'cv-heat-num', text: `${i + 1}` }),
        el('span', { class: 'cv-heat-name', text: c.name }),
      ]),
      ...across.map((d, j) => {
        if (j >= i) return el('td', { class: 'cv-heat-none' });
        const r = m.coef[i * k + j];
        const p = m.pHolm[i * k + j];
        const n = m.pairs[i * k + j];
        const step = heatStep(r);
        const strong = p < alpha;
        const isMain = mainPositions !== null && ((mainPositions[0] === j && mainPositions[1] === i) || (mainPositions[0] === i && mainPositions[1] === j));
        // The cell's own text in its spoken label (WCAG 2.5.3, label in name).
        const words = `${c.name} with ${d.name}: ${name} r = ${cellText(r)}, Holm-adjusted p ${pClause(p)}, ${formatCount(n)} pairs${isMain ? ' (the main pair)' : ''}`;
        const b = el('button', {
          class: `cv-heat-cell cv-heat-${step.sign}-${step.level}${strong ? ' cv-heat-strong' : ''}${isMain ? ' cv-heat-main' : ''}`,
          text: cellText(r),
          attrs: {
            type: 'button',
            title: words,
            'aria-label': `${words}. Press Enter to analyse this pair.`,
            tabindex: this.focusAt[0] === i && this.focusAt[1] === j ? '0' : '-1',
            'data-i': String(i),
            'data-j': String(j),
            'data-r': String(r),
            'data-p-holm': String(p),
          },
        });
        const show = () => {
          this.detail.textContent = `${words}. Click to analyse this pair above.`;
        };
        b.addEventListener('mouseenter', show);
        b.addEventListener('focus', () => {
          this.focusAt = [i, j];
          show();
        });
        b.addEventListener('click', () => this.choose(v, j, i));
        b.addEventListener('keydown', (ev) => this.move(ev, i, j, k));
        return el('td', {}, [b]);
      }),
    ]));
    const table = el('table', { class: 'cv-heat', testid: TABLE_TEST_IDS.heatmap }, [
      el('caption', { class: 'cv-visually-hidden', text: `${name} correlations between the numeric columns of ${v.table}, each pair on the rows where both hold numbers; p-values adjusted by Holm's method across the ${formatCount(m.tests)} pairs. Arrow keys move between the cells.` }),
      el('thead', {}, [head]),
      el('tbody', {}, rows),
    ]);
    const hadFocus = this.heatHolder.contains(document.activeElement);
    fill(this.heatHolder, [table]);
    if (hadFocus) this.cell(this.focusAt[0], this.focusAt[1])?.focus();
    this.showWidth();
  }

  /** A heatmap wider than the pane scrolls sideways inside its frame: say so, as the cut-off edge may not show it. */
  private showWidth(): void {
    const wide = this.heatHolder.scrollWidth > this.heatHolder.clientWidth + 1;
    this.heatHolder.classList.toggle('cv-heat-wide', wide);
    this.scrollHint.classList.toggle('cv-hidden', !wide);
  }

  private cell(i: number, j: number): HTMLButtonElement | null {
    return this.heatHolder.querySelector(`button[data-i="${i}"][data-j="${j}"]`);
  }

  /** Arrow keys, Home and End move within the lower triangle (i > j). */
  private move(ev: KeyboardEvent, i: number, j: number, k: number): void {
    let to: [number, number] | null = null;
    if (ev.key === 'ArrowUp' && i - 1 > j) to = [i - 1, j];
    else if (ev.key === 'ArrowDown' && i + 1 < k) to = [i + 1, j];
    else if (ev.key === 'ArrowLeft' && j > 0) to = [i, j - 1];
    else if (ev.key === 'ArrowRight' && j + 1 < i) to = [i, j + 1];
    else if (ev.key === 'Home') to = [i, 0];
    else if (ev.key === 'End') to = [i, i - 1];
    if (!to) return;
    ev.preventDefault();
    const from = this.cell(i, j);
    const next = this.cell(to[0], to[1]);
    if (!next) return;
    from?.setAttribute('tabindex', '-1');
    next.setAttribute('tabindex', '0');
    next.focus();
  }

  private choose(v: OverviewMatrix, xi: number, yi: number): void {
    const x = v.columns[xi];
    const y = v.columns[yi];
    this.host.pickPair({
      x: { kind: 'table', table: v.table, column: x.name, position: x.position },
      y: { kind: 'table', table: v.table, column: y.name, position: y.position },
    });
  }

  // ---- partial correlation ----------------------------------------------------------------------------------

  private drawControls(view: OverviewMatrix | { error: string }, main: ReturnType<TableSectionHost['main']>): void {
    const usable = isOverviewFailure(view) ? [] : view.columns;
    const own = main ? main.reads : null;
    // Rows are matched by sheet row: only a pair on the table's own rows can have the table's columns held fixed
    // (another table on the same sheet holds other records).
    const rowsOf = this.columns[0]?.read;
    const onTableRows = !!own && !!rowsOf && own.every((r) => r.sheet === rowsOf.sheet && r.firstRow === rowsOf.firstRow && r.numbers.length === rowsOf.numbers.length);
    this.partialAllowed = onTableRows;
    const candidates = this.columns.filter((c) => usable.some((u) => u.position === c.position) && !(own && own.some((r) => sameColumn(r, c.read))));
    for (const name of [...this.ticked]) if (!candidates.some((c) => c.name === name)) this.ticked.delete(name);
    const legendText = !main
      ? 'Hold fixed (pick the main pair above first)'
      : onTableRows
        ? `Hold fixed, for ${main.reads[1].header} with ${main.reads[0].header}`
        : `Hold fixed: the main pair is not on this table's rows; pick X and Y from ${this.tableSelect.value} to hold its columns fixed`;
    const boxes = candidates.map((c) => {
      const box = el('input', { testid: `partial-control-${c.position}`, attrs: { type: 'checkbox', value: c.name } });
      box.checked = this.ticked.has(c.name);
      box.disabled = !onTableRows;
      box.addEventListener('change', () => {
        if (box.checked) this.ticked.add(c.name);
        else this.ticked.delete(c.name);
        this.drawPartial(this.host.main());
        const result = this.partialBox.contains(this.partialText);
        this.partialSaid.textContent = result
          ? `Partial r ${this.partialTiles.r.value.textContent}, p ${this.partialTiles.p.value.textContent}. ${this.partialText.textContent}`
          : (this.partialBox.textContent ?? '');
      });
      return el('label', { class: 'cv-check' }, [box, el('span', { text: c.name })]);
    });
    fill(this.controlsBox, [
      el('legend', { text: legendText }),
      ...(boxes.length > 0 ? boxes : [el('span', { class: 'cv-muted', text: 'No other numeric columns in this table to hold fixed.' })]),
    ]);
  }

  private drawPartial(main: ReturnType<TableSectionHost['main']>): void {
    if (!main || !this.partialAllowed) {
      fill(this.partialBox, []);
      return;
    }
    const controls = this.columns.filter((c) => this.ticked.has(c.name));
    if (controls.length === 0) {
      fill(this.partialBox, [el('p', { class: 'cv-muted', text: 'Tick one or more columns to see the correlation of the main pair with them held fixed.' })]);
      return;
    }
    const [x, y] = main.reads;
    const level = this.host.level();
    const v = partialOf(x, y, controls, level);
    if (isOverviewFailure(v)) {
      fill(this.partialBox, [el('p', { class: 'cv-inline-message', text: v.error })]);
      return;
    }
    const t = this.partialTiles;
    const pct = `${Math.round(level * 100)}%`;
    t.r.value.textContent = formatR(v.r);
    t.r.value.setAttribute('data-value', String(v.r));
    t.r.sub.textContent = `plain r on the same rows: ${formatR(v.plain)}`;
    t.interval.caption.textContent = `${pct} interval`;
    t.interval.value.textContent = Number.isFinite(v.lower) ? `${formatR(v.lower)} to ${formatR(v.upper)}` : '–';
    t.interval.sub.textContent = `plain: ${formatR(v.plainLower)} to ${formatR(v.plainUpper)}`;
    t.p.value.textContent = formatPValue(v.p);
    t.p.value.setAttribute('data-value', String(v.p));
    t.n.value.textContent = formatCount(v.n);
    t.n.value.setAttribute('data-value', String(v.n));
    t.n.sub.textContent = `${v.controls.length} held fixed`;
    this.partialText.textContent = partialReading(v, { x: x.header, y: y.header });
    fill(this.partialBox, [
      el('div', { class: 'cv-tiles' }, [t.r.root, t.interval.root, t.p.root, t.n.root]),
      this.partialText,
      el('p', { class: 'cv-chart-note', text: 'Pearson\u2019s r between what is left of each column once the ticked columns are fitted by least squares (Fisher\u2019s t test with n \u2212 2 \u2212 k degrees of freedom), on the rows where every one of them holds a number.' }),
    ]);
  }
}

function sameColumn(a: NumericColumnRead, b: NumericColumnRead): boolean {
  return a.sheet === b.sheet && a.column === b.column;
}

/** Where the main pair sits in the heatmap ([x, y] indices), or null when it is not two of its columns. */
function mainInTable(v: OverviewMatrix, main: ReturnType<TableSectionHost['main']>): [number, number] | null {
  if (!main) return null;
  const { x, y } = main.choice;
  if (x.kind !== 'table' || y.kind !== 'table' || x.table !== v.table || y.table !== v.table) return null;
  const xi = v.columns.findIndex((c) => c.name === x.column);
  const yi = v.columns.findIndex((c) => c.name === y.column);
  return xi >= 0 && yi >= 0 ? [xi, yi] : null;
}

/** The key to the colours: the nine steps from strong negative to strong positive, in words beside them. */
function heatLegend(): HTMLElement {
  const steps: HTMLElement[] = [];
  for (let level = 4; level >= 1; level--) steps.push(el('span', { class: `cv-heat-swatch cv-heat-neg-${level}` }));
  steps.push(el('span', { class: 'cv-heat-swatch cv-heat-pos-0' }));
  for (let level = 1; level <= 4; level++) steps.push(el('span', { class: `cv-heat-swatch cv-heat-pos-${level}` }));
  const limits = HEAT_LIMITS.join(', ');
  return el('div', { class: 'cv-heat-legend', testid: 'heatmap-legend' }, [
    el('span', { class: 'cv-heat-scale', attrs: { 'aria-hidden': 'true' } }, [el('span', { text: '\u22121' }), ...steps, el('span', { text: '+1' })]),
    el('span', { class: 'cv-heat-key', text: `The further a cell stands from the background, the stronger (steps at ${limits}); blue-green positive, brown and striped negative; a thick frame marks a Holm-adjusted p below the checks\u2019 alpha.` }),
  ]);
}
