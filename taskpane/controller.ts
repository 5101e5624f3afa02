/**
 * The panel's controller: one state object (the picks and the options; the controls write to it and nothing reads
 * them back from the DOM), the refresh pipeline (read both pairs, pair A once, analyse, render the sections,
 * compare), live updates through the workbook's change notifications, and the header's status and progress.
 * The sections draw; the workbook is reached only through the Workbook interface (workbook.ts).
 */
import { CellBlock, formatBlock } from '../src/sheet/a1';
import { formatCount } from '../src/stats/format';
import { functionCallNote } from './host-limits';
import type { Method } from '../src/stats/types';
import { twoColumnsOf } from './address';
import { computeComparison, isCompareFailure } from './compare-view';
import { ComputeClient } from './compute-client';
import { Design, designProblem, detectDesign } from './design';
import { clear, el } from './dom';
import { LiveScheduler, RefreshCause } from './live-scheduler';
import { PANEL_TEST_IDS, PanelOptions } from './panel-api';
import { PairChoice, PairPicker } from './pair-picker';
import { dataBlock, pairColumns, PairedRows, PairingError, readNumericColumn } from './pairs';
import { DEFAULT_RELATIONSHIP_OPTIONS, isFailure, RelationshipOptions, RelationshipView } from './relationship';
import { cautionsSection } from './sections/cautions-section';
import { CompareSection, DesignChoice } from './sections/compare-section';
import { RelationshipSection } from './sections/relationship-section';
import { ResidualsSection } from './sections/residuals-section';
import { TableSection } from './sections/table-section';
import { applyTheme, PanelTheme } from './theme';
import { EngineWarmUp } from './warm-up';
import { WriteSubject, writeActions } from './write-actions';
import type { ColumnSource, NumericColumnRead, Workbook } from './workbook';

/** Everything the user has chosen; the one place it is kept. */
export interface PanelState {
  main: PairChoice | null;
  second: PairChoice | null;
  method: Method;
  level: number;
  alpha: number;
  design: DesignChoice;
  drawLimit: number;
  a1References: boolean;
}

type Reads = [NumericColumnRead, NumericColumnRead];

const now = (): number => performance.now();

/** The core's messages call the columns x and y; say which columns those are. */
export function nameAxes(message: string, xHeader: string, yHeader: string): string {
  return message.replace(/^(x|y)\b/, (axis) => `${axis === 'x' ? xHeader : yHeader} (${axis})`);
}

export class PanelController {
  readonly state: PanelState;
  readonly relationship: RelationshipSection;
  readonly residuals: ResidualsSection;
  readonly compare: CompareSection;
  readonly table: TableSection;
  readonly compute: ComputeClient;
  readonly warmUp: EngineWarmUp;
  readonly scheduler: LiveScheduler;
  /** The relationship on screen, or null. */
  current: RelationshipView | null = null;
  renders = 0;
  lastRenderMs = NaN;
  lastLatencyMs = NaN;
  lastPhases: Record<string, number> = {};
  busy = false;
  destroyed = false;
  private readonly picker: PairPicker;
  private readonly secondPicker: PairPicker;
  private readonly status: HTMLElement;
  private readonly progress: HTMLElement;
  /** What the host lets a cell function receive, when the picked columns pass it (host-limits.ts). */
  private readonly hostNote: HTMLElement;
  private mainReads: Reads | null = null;
  private unwatch: (() => void) | null = null;
  private generation = 0;
  /** Cancels the reads of the refresh in progress when a newer one starts. */
  private readAbort = new AbortController();
  /** The comparison on screen, for the report sheet; null when there is none (or it failed). */
  private lastComparison: WriteSubject['comparison'] | null = null;

  constructor(private readonly root: HTMLElement, private readonly wb: Workbook, private readonly opts: PanelOptions) {
    this.state = {
      main: null,
      second: null,
      method: opts.method ?? 'pearson',
      level: opts.level ?? 0.95,
      alpha: opts.alpha ?? 0.05,
      design: 'auto',
      drawLimit: opts.drawLimit ?? DEFAULT_RELATIONSHIP_OPTIONS.drawLimit,
      a1References: opts.a1References ?? false,
    };
    const workerUrl = opts.workerUrl === undefined ? new URL('panel-worker.js', document.baseURI).href : opts.workerUrl;
    this.compute = new ComputeClient(workerUrl, opts.workerThreshold ?? 250000);
    this.scheduler = new LiveScheduler((cause) => this.refresh(cause), opts.debounceMs ?? 200);
    this.warmUp = new EngineWarmUp({
      options: () => this.options(),
      reads: () => this.mainReads,
      busy: () => this.busy || !this.scheduler.idle,
      memory: this.compute.memory,
    });

    clear(root);
    applyTheme(root, opts.theme ?? 'light');
    this.status = el('div', { class: 'cv-status', testid: PANEL_TEST_IDS.status, attrs: { role: 'status', 'aria-live': 'polite' } });
    this.progress = el('div', { class: 'cv-progress cv-hidden', testid: PANEL_TEST_IDS.progress, attrs: { role: 'progressbar', 'aria-label': 'Computing' } }, [
      el('div', { class: 'cv-progress-bar' }),
      el('div', { class: 'cv-progress-text' }),
    ]);
    this.hostNote = el('p', { class: 'cv-host-note cv-hidden', testid: PANEL_TEST_IDS.hostNote, attrs: { role: 'note' } });
    const panel = el('div', { class: 'cv-panel' }, [
      el('header', { class: 'cv-header' }, [
        el('div', { class: 'cv-brand' }, [el('span', { class: 'cv-brand-mark', attrs: { 'aria-hidden': 'true' } }), el('span', { class: 'cv-brand-name', text: 'Covary' })]),
        this.status,
      ]),
      this.progress,
      this.hostNote,
    ]);
    root.appendChild(panel);

    const pick = (row: number): void => this.selectRow(row);
    this.picker = new PairPicker(wb, 'main', { x: 'X', y: 'Y' }, () => this.state.main, (c) => this.choose('main', c), (m) => this.unusable('main', m));
    this.secondPicker = new PairPicker(wb, 'second', { x: 'X₂', y: 'Y₂' }, () => this.state.second, (c) => this.choose('second', c), (m) => this.unusable('second', m));
    const actions = writeActions(wb, () => this.writeSubject());
    this.relationship = new RelationshipSection(this.picker.element, actions, this.state, {
      method: (m) => this.set({ method: m }),
      level: (level) => this.set({ level }),
      pick,
    });
    this.residuals = new ResidualsSection(pick);
    this.compare = new CompareSection(this.secondPicker.element, this.state.design, (design) => this.set({ design }));
    this.table = new TableSection({
      wb,
      main: () => (this.state.main && this.mainReads ? { choice: this.state.main, reads: this.mainReads } : null),
      method: () => this.state.method,
      level: () => this.state.level,
      alpha: () => this.state.alpha,
      pickPair: (c) => this.pickPair(c),
    });
    panel.append(this.relationship.root, this.residuals.root, this.compare.root, this.table.root, cautionsSection());
    this.setState('empty');
  }

  /** The analysis options the state holds now. */
  options(): RelationshipOptions {
    const { method, level, alpha, drawLimit } = this.state;
    return { method, level, alpha, drawLimit };
  }

  /** A new theme: the colours change with the class; the charts, painted on canvases, are drawn again. */
  setTheme(theme: PanelTheme): void {
    applyTheme(this.root, theme);
    this.scheduler.now();
  }

  /** Starts from the options' pairs, or from the current selection, and begins following the workbook. */
  async start(): Promise<void> {
    if (this.opts.initial) {
      this.state.main = this.opts.initial;
      this.picker.show(this.opts.initial);
    } else {
      try {
        const two = twoColumnsOf(await this.wb.getSelection());
        if (two && two.every((b) => b.lastRow - b.firstRow >= 2)) {
          this.state.main = { x: { kind: 'range', address: formatBlock(two[0]) }, y: { kind: 'range', address: formatBlock(two[1]) } };
          this.picker.show(this.state.main);
        }
      } catch {
        // No selection to start from: the user picks.
      }
    }
    if (this.opts.initialCompare) {
      this.state.second = this.opts.initialCompare;
      this.secondPicker.show(this.opts.initialCompare);
    }
    await this.rewatch();
    this.scheduler.now();
  }

  destroy(): void {
    this.destroyed = true;
    this.readAbort.abort();
    this.warmUp.stop();
    this.scheduler.stop();
    if (this.unwatch) this.unwatch();
    this.compute.dispose();
    this.relationship.destroy();
    this.residuals.destroy();
    this.compare.destroy();
    this.table.destroy();
    clear(this.root);
    this.root.classList.remove('cv-theme-dark');
    this.root.removeAttribute('data-theme');
  }

  // ---- choices ------------------------------------------------------------------------------------------------

  private set(change: Partial<Pick<PanelState, 'method' | 'level' | 'design'>>): void {
    Object.assign(this.state, change);
    if (change.method) this.relationship.showMethod(change.method);
    this.scheduler.now();
  }

  private choose(which: 'main' | 'second', c: PairChoice): void {
    this.state[which] = c;
    if (which === 'main') this.relationship.say(null);
    void this.rewatch();
    this.scheduler.now();
  }

  /** A pair picked elsewhere in the panel (a heatmap cell): shown in the picker and analysed at once. */
  private pickPair(c: PairChoice): void {
    this.picker.show(c);
    this.choose('main', c);
    // Where the answer appears: the Relationship heading takes the focus (and so scrolls into view).
    const heading = this.relationship.root.querySelector('h2');
    if (heading) {
      heading.setAttribute('tabindex', '-1');
      heading.focus();
    }
  }

  /** A pick that cannot be used: the pair is dropped, and the result it replaced is cleared with the reason. */
  private unusable(which: 'main' | 'second', message: string): void {
    ++this.generation;
    this.readAbort.abort();
    this.state[which] = null;
    void this.rewatch();
    if (which === 'main') {
      this.mainReads = null;
      this.showFailure(message);
    } else this.compare.render({ error: message }, null);
  }

  /**
   * A table column renamed since the pick was read at its place (ColumnSource.position) under its new name: the
   * pick takes the new name, so the dropdowns, labels, axes and the next reads all use it.
   */
  private followRenames(which: 'main' | 'second', choice: PairChoice, reads: Reads): void {
    const renamed = (s: ColumnSource, read: NumericColumnRead): ColumnSource =>
      s.kind === 'table' && read.header !== s.column ? { ...s, column: read.header } : s;
    const x = renamed(choice.x, reads[0]);
    const y = renamed(choice.y, reads[1]);
    if (x === choice.x && y === choice.y) return;
    const next = { x, y };
    this.state[which] = next;
    (which === 'main' ? this.picker : this.secondPicker).show(next);
  }

  private writeSubject(): WriteSubject | null {
    const { main, method, level, alpha, a1References } = this.state;
    if (!this.mainReads || !main) return null;
    return { reads: this.mainReads, choice: main, options: { method, level, alpha, a1: a1References }, comparison: this.lastComparison ?? undefined };
  }

  private selectRow(row: number): void {
    if (!this.current) return;
    this.wb.selectRow(this.current.sheet, row).catch((e: unknown) => this.say(`Could not select row ${row}: ${e instanceof Error ? e.message : String(e)}`));
  }

  private async rewatch(): Promise<void> {
    if (this.unwatch) {
      this.unwatch();
      this.unwatch = null;
    }
    const sources: ColumnSource[] = [];
    if (this.state.main) sources.push(this.state.main.x, this.state.main.y);
    if (this.state.second) sources.push(this.state.second.x, this.state.second.y);
    if (sources.length === 0) return;
    try {
      const stop = await this.wb.watch(sources, () => this.scheduler.changed());
      if (this.destroyed) stop();
      else this.unwatch = stop;
    } catch (e) {
      this.say(`Live updates are off: ${e instanceof Error ? e.message : String(e)}`);
    }
  }

  // ---- header -------------------------------------------------------------------------------------------------

  private say(text: string): void {
    this.status.textContent = text;
  }

  private setState(s: 'empty' | 'busy' | 'ready' | 'error'): void {
    this.root.setAttribute('data-state', s);
  }

  private showProgress(text: string | null): void {
    this.progress.classList.toggle('cv-hidden', text === null);
    (this.progress.lastChild as HTMLElement).textContent = text ?? '';
  }

  // ---- refresh ------------------------------------------------------------------------------------------------

  /**
   * Reads both columns of a pair. A read that the host makes in several requests (a long column on Excel on the
   * web) shows its progress, and is cancelled as soon as a newer refresh starts: its cells are stale.
   */
  private async readPair(c: PairChoice, label: string): Promise<Reads> {
    const signal = this.readAbort.signal;
    const done = [0, 0];
    const total = [0, 0];
    const progress = (i: number) => (d: number, t: number) => {
      done[i] = d;
      total[i] = t;
      if (signal.aborted) return;
      const all = total[0] + total[1];
      this.showProgress(`Reading ${label} from the sheet in blocks: ${formatCount(done[0] + done[1])} of ${formatCount(all)} cells (${Math.floor((100 * (done[0] + done[1])) / Math.max(1, all))}%)…`);
    };
    const [x, y] = await Promise.all([
      readNumericColumn(this.wb, c.x, { signal, onProgress: progress(0) }),
      readNumericColumn(this.wb, c.y, { signal, onProgress: progress(1) }),
    ]);
    return [x, y];
  }

  private showFailure(raw: string): void {
    // Messages from the core start in lower case, as cell errors do; on the panel they start a sentence.
    const text = raw.charAt(0).toUpperCase() + raw.slice(1);
    // The header's live region says it too, so a screen reader hears the problem, and no earlier count stays.
    this.say(`Not computed: ${text}`);
    this.current = null;
    this.relationship.clear();
    this.residuals.show(false);
    this.setState('error');
    this.relationship.say(text);
  }

  private async refresh(cause: RefreshCause): Promise<void> {
    const gen = ++this.generation;
    this.readAbort.abort();
    this.readAbort = new AbortController();
    const started = now();
    const phases: Record<string, number> = {};
    let mark = started;
    const lap = (name: string): void => {
      const t = now();
      phases[name] = Math.round((t - mark) * 10) / 10;
      mark = t;
    };
    this.busy = true;
    try {
      const main = this.state.main;
      if (!main) {
        this.setState('empty');
        this.say('Pick two columns to begin.');
        return;
      }
      this.setState('busy');
      let reads: Reads;
      try {
        reads = await this.readPair(main, 'the pair');
      } catch (e) {
        if (gen !== this.generation) return;
        this.showFailure(`Could not read the columns: ${e instanceof Error ? e.message : String(e)}`);
        return;
      }
      if (gen !== this.generation) return;
      lap('read');
      this.followRenames('main', main, reads);
      const note = functionCallNote(this.wb.functionArgumentLimit?.() ?? null, [reads[0].numbers, reads[1].numbers]);
      this.hostNote.textContent = note ?? '';
      this.hostNote.classList.toggle('cv-hidden', note === null);
      if (!this.compute.usesWorker(reads[0].numbers.length) && this.warmUp.primeFor(reads, reads[0].numbers.length)) lap('prime');
      this.mainReads = reads;
      this.picker.showResolved({ header: reads[0].header, where: whereOf(reads[0]) }, { header: reads[1].header, where: whereOf(reads[1]) });
      let pairs: PairedRows;
      try {
        pairs = pairColumns(reads[0], reads[1]);
      } catch (e) {
        if (!(e instanceof PairingError)) throw e;
        this.showFailure(e.message);
        return;
      }
      lap('pair');
      const n = pairs.x.length;
      const inWorker = this.compute.usesWorker(n);
      const long = inWorker || n >= this.compute.workerThreshold;
      const progressText = `Computing on ${formatCount(n)} rows${inWorker ? ' in the background; the sheet stays usable' : ''}`;
      if (long) this.showProgress(`${progressText}…`);
      // The compute client says where the work stands (sent to the background thread, computing).
      const view = await this.compute.analyse(pairs, this.options(), (stage) => {
        if (long && gen === this.generation) this.showProgress(`${progressText}: ${stage}…`);
      });
      if (gen !== this.generation) return;
      lap('compute');
      this.showProgress(null);
      if (isFailure(view)) {
        this.showFailure(nameAxes(view.error, pairs.xHeader, pairs.yHeader));
      } else {
        this.relationship.say(null);
        this.current = view;
        this.relationship.render(view);
        this.residuals.render(view);
        if (!this.compute.usesWorker(view.n)) this.warmUp.afterRedraw(view.n);
      }
      lap('draw');

      if (!(await this.refreshComparison(gen, reads, pairs))) return;
      lap('compare');
      this.table.mainChanged();

      const ended = now();
      this.renders++;
      this.lastRenderMs = ended - started;
      this.lastLatencyMs = ended - cause.firstChangeAt;
      this.root.setAttribute('data-last-render-ms', this.lastRenderMs.toFixed(1));
      this.root.setAttribute('data-last-latency-ms', this.lastLatencyMs.toFixed(1));
      this.root.setAttribute('data-render-count', String(this.renders));
      this.root.setAttribute('data-last-phases', JSON.stringify(phases));
      this.lastPhases = phases;
      try {
        performance.clearMeasures('covary-redraw'); // keep one entry, not one per redraw of a long session
        performance.measure('covary-redraw', { start: cause.firstChangeAt, end: ended });
      } catch {
        // performance.measure with options is missing in old engines; the attributes above still hold the figure.
      }
      if (!isFailure(view)) {
        this.setState('ready');
        // The live region says what a listener needs: the rows behind the figures. (The time each redraw took is
        // developer information: it stays in data-last-render-ms.)
        this.say(`${formatCount(view.n)} pairs${pairs.skipped > 0 ? `, ${formatCount(pairs.skipped)} ${pairs.skipped === 1 ? 'row' : 'rows'} skipped` : ''}`);
      }
    } finally {
      if (gen === this.generation) this.showProgress(null);
      this.busy = false;
    }
  }

  /** Reads pair B and renders the comparison with pair A (already paired); false when a newer refresh took over. */
  private async refreshComparison(gen: number, reads: Reads, pairsA: PairedRows): Promise<boolean> {
    const second = this.state.second;
    this.lastComparison = null;
    if (!second) {
      this.compare.render(null, null);
      return true;
    }
    let readsB: Reads;
    try {
      readsB = await this.readPair(second, 'pair B');
    } catch (e) {
      if (gen !== this.generation) return false;
      this.compare.render({ error: `Could not read pair B: ${e instanceof Error ? e.message : String(e)}` }, null);
      return true;
    }
    if (gen !== this.generation) return false;
    this.followRenames('second', second, readsB);
    this.secondPicker.showResolved({ header: readsB[0].header, where: whereOf(readsB[0]) }, { header: readsB[1].header, where: whereOf(readsB[1]) });
    const blocksA: [CellBlock, CellBlock] = [dataBlock(reads[0]), dataBlock(reads[1])];
    const blocksB: [CellBlock, CellBlock] = [dataBlock(readsB[0]), dataBlock(readsB[1])];
    const detection = detectDesign(blocksA, blocksB);
    const chosen: Design | null = this.state.design === 'auto' ? detection.design : this.state.design;
    if (!chosen) this.compare.render({ error: detection.why }, detection);
    else {
      const problem = designProblem(chosen, blocksA, blocksB);
      if (problem) this.compare.render({ error: problem }, detection);
      else {
        const view = computeComparison(reads, readsB, chosen, detection, this.state.level, pairsA, this.state.method);
        if (!isCompareFailure(view)) this.lastComparison = { reads: readsB, choice: this.state.second ?? second, design: chosen, common: detection.common };
        this.compare.render(view, detection);
      }
    }
    return true;
  }
}

function whereOf(read: NumericColumnRead): string {
  return formatBlock(dataBlock(read));
}
