/**
 * Picking a pair of columns: from the current selection (one block two columns wide, two columns picked with
 * Ctrl, or one column at a time), or by header from a table (the pick then follows the table as it grows).
 */
import { formatBlock } from '../src/sheet/a1';
import { oneColumnOf, twoColumnsOf } from './address';
import { button, el, fill, select, setOptions } from './dom';
import type { ColumnSource, TableInfo, Workbook } from './workbook';

export interface PairChoice {
  x: ColumnSource;
  y: ColumnSource;
}

/** A short description of a column source for the pair label, e.g. "Branches[Visits]" or "Staff!B2:B49". */
export function describeSource(s: ColumnSource): string {
  return s.kind === 'table' ? `${s.table}[${s.column}]` : s.address;
}

/**
 * The picker holds no pick of its own: the panel's state does, and the picker reads it through `current` (so the
 * two can never disagree) and reports a new pick through `onChoose`.
 */
export class PairPicker {
  readonly element: HTMLElement;
  private pendingX: ColumnSource | null = null;
  private tables: TableInfo[] = [];
  private readonly modeSelection: HTMLButtonElement;
  private readonly modeTable: HTMLButtonElement;
  private readonly selectionPane: HTMLElement;
  private readonly tablePane: HTMLElement;
  private readonly tableSelect: HTMLSelectElement;
  private readonly xSelect: HTMLSelectElement;
  private readonly ySelect: HTMLSelectElement;
  private readonly label: HTMLElement;
  private readonly message: HTMLElement;

  constructor(
    private readonly wb: Workbook,
    prefix: string,
    private readonly names: { x: string; y: string },
    private readonly current: () => PairChoice | null,
    private readonly onChoose: (choice: PairChoice) => void,
    /** A pick that cannot be used (the same column twice): the panel must not go on showing the last result. */
    private readonly onUnusable: (message: string) => void = () => undefined,
  ) {
    this.modeSelection = el('button', { class: 'cv-seg cv-seg-on', text: 'Selected cells', testid: `${prefix}-mode-selection`, attrs: { type: 'button', 'aria-pressed': 'true' } });
    this.modeTable = el('button', { class: 'cv-seg', text: 'Table columns', testid: `${prefix}-mode-table`, attrs: { type: 'button', 'aria-pressed': 'false' } });
    const useSel = button('Use selected two columns', `${prefix}-use-selection`, 'primary');
    const setX = button(`Selected column as ${names.x}`, `${prefix}-set-x`);
    const setY = button(`Selected column as ${names.y}`, `${prefix}-set-y`);
    this.selectionPane = el('div', { class: 'cv-pick-pane' }, [
      el('p', { class: 'cv-hint', text: 'Select two columns of numbers in the sheet (headers may be included), or one column at a time.' }),
      el('div', { class: 'cv-row cv-wrap' }, [useSel, setX, setY]),
    ]);
    this.tableSelect = select(`${prefix}-table`, [], 'Table');
    this.xSelect = select(`${prefix}-x-column`, [], `${names.x} column`);
    this.ySelect = select(`${prefix}-y-column`, [], `${names.y} column`);
    this.tablePane = el('div', { class: 'cv-pick-pane cv-hidden' }, [
      el('div', { class: 'cv-field-grid' }, [
        el('label', { class: 'cv-field-label', text: 'Table' }), this.tableSelect,
        el('label', { class: 'cv-field-label', text: names.x }), this.xSelect,
        el('label', { class: 'cv-field-label', text: names.y }), this.ySelect,
      ]),
    ]);
    this.label = el('div', { class: 'cv-pair-label', testid: `${prefix}-pair-label`, text: 'No columns picked yet.' });
    this.message = el('div', { class: 'cv-inline-message', attrs: { role: 'status' } });
    this.element = el('div', { class: 'cv-picker' }, [
      el('div', { class: 'cv-segmented', attrs: { role: 'group', 'aria-label': 'Where the columns come from' } }, [this.modeSelection, this.modeTable]),
      this.selectionPane,
      this.tablePane,
      this.label,
      this.message,
    ]);

    this.modeSelection.addEventListener('click', () => this.setMode('selection'));
    this.modeTable.addEventListener('click', () => {
      this.setMode('table');
      void this.loadTables();
    });
    useSel.addEventListener('click', () => void this.useSelection());
    setX.addEventListener('click', () => void this.useSingle('x'));
    setY.addEventListener('click', () => void this.useSingle('y'));
    this.tableSelect.addEventListener('change', () => {
      this.fillColumns(true);
      this.chooseFromTable();
    });
    this.xSelect.addEventListener('change', () => this.chooseFromTable());
    this.ySelect.addEventListener('change', () => this.chooseFromTable());
  }

  /** Shows a pair set without a user action (the initial pick); does not call onChoose. */
  show(choice: PairChoice): void {
    if (choice.x.kind === 'table' && choice.y.kind === 'table' && choice.x.table === choice.y.table) {
      this.setMode('table');
      void this.loadTables().then(() => {
        if (choice.x.kind !== 'table' || choice.y.kind !== 'table') return;
        this.tableSelect.value = choice.x.table;
        this.fillColumns(false);
        this.xSelect.value = choice.x.column;
        this.ySelect.value = choice.y.column;
      });
    }
    this.showSources(choice);
  }

  /** Shows what was actually read, e.g. "x: Visits (Branches!C2:C49)". */
  showResolved(x: { header: string; where: string }, y: { header: string; where: string }): void {
    // A column without a header is named by its address: shown once, not as "B2:B49 (B2:B49)".
    const part = (axis: string, c: { header: string; where: string }) =>
      el('span', { class: 'cv-pair-part' }, [
        el('span', { class: 'cv-pair-axis', text: `${axis}: ` }),
        el('span', { text: c.header }),
        ...(c.header === c.where ? [] : [el('span', { class: 'cv-muted', text: ` (${c.where})` })]),
      ]);
    fill(this.label, [part(this.names.x, x), part(this.names.y, y)]);
  }

  private showSources(choice: PairChoice): void {
    this.showResolved({ header: describeSource(choice.x), where: 'reading…' }, { header: describeSource(choice.y), where: 'reading…' });
  }

  private say(text: string): void {
    this.message.textContent = text;
  }

  private setMode(mode: 'selection' | 'table'): void {
    const table = mode === 'table';
    this.modeTable.classList.toggle('cv-seg-on', table);
    this.modeSelection.classList.toggle('cv-seg-on', !table);
    this.modeTable.setAttribute('aria-pressed', String(table));
    this.modeSelection.setAttribute('aria-pressed', String(!table));
    this.tablePane.classList.toggle('cv-hidden', !table);
    this.selectionPane.classList.toggle('cv-hidden', table);
  }

  private async loadTables(): Promise<void> {
    try {
      this.tables = await this.wb.listTables();
    } catch (e) {
      this.say(`Could not list the tables: ${e instanceof Error ? e.message : String(e)}`);
      return;
    }
    if (this.tables.length === 0) {
      this.say('This workbook has no tables with headers. Format a block as a table, or use selected cells.');
    } else this.say('');
    setOptions(this.tableSelect, this.tables.map((t) => ({ value: t.name, label: `${t.name} (${t.sheet})` })));
    this.fillColumns(false);
  }

  private fillColumns(resetPicks: boolean): void {
    const t = this.tables.find((k) => k.name === this.tableSelect.value);
    const cols = t ? t.columns.map((c) => ({ value: c, label: c })) : [];
    setOptions(this.xSelect, cols, !resetPicks);
    setOptions(this.ySelect, cols, !resetPicks);
    if (cols.length > 1 && (resetPicks || this.xSelect.value === this.ySelect.value)) {
      // The first two columns of numbers (a table usually starts with a label column: names, months).
      const numeric = t!.columns.map((_, i) => i).filter((i) => t!.numeric?.[i] !== false);
      const [a, b] = numeric.length >= 2 ? numeric : [0, 1];
      this.xSelect.value = cols[a].value;
      this.ySelect.value = cols[b].value;
    }
  }

  private chooseFromTable(): void {
    const table = this.tableSelect.value;
    if (!table || !this.xSelect.value || !this.ySelect.value) return;
    if (this.xSelect.value === this.ySelect.value) {
      const text = `${this.names.x} and ${this.names.y} are the same column (${this.xSelect.value}): pick two different columns.`;
      this.say(text);
      this.onUnusable(text);
      return;
    }
    this.say('');
    const columns = this.tables.find((k) => k.name === table)?.columns ?? [];
    const at = (c: string) => {
      const i = columns.indexOf(c);
      return i >= 0 ? i : undefined;
    };
    this.commit({
      x: { kind: 'table', table, column: this.xSelect.value, position: at(this.xSelect.value) },
      y: { kind: 'table', table, column: this.ySelect.value, position: at(this.ySelect.value) },
    });
  }

  private commit(choice: PairChoice): void {
    this.showSources(choice);
    this.onChoose(choice);
  }

  private async selection(): Promise<string | null> {
    try {
      return await this.wb.getSelection();
    } catch (e) {
      this.say(`Could not read the selection: ${e instanceof Error ? e.message : String(e)}`);
      return null;
    }
  }

  private async useSelection(): Promise<void> {
    const address = await this.selection();
    if (address === null) return;
    const two = twoColumnsOf(address);
    if (!two) {
      this.say(`The selection ${address} is not two columns. Select a block two columns wide, or use the one-column buttons.`);
      return;
    }
    this.say('');
    this.pendingX = null;
    this.commit({ x: { kind: 'range', address: formatBlock(two[0]) }, y: { kind: 'range', address: formatBlock(two[1]) } });
  }

  private async useSingle(axis: 'x' | 'y'): Promise<void> {
    const address = await this.selection();
    if (address === null) return;
    const one = oneColumnOf(address);
    if (!one) {
      this.say(`The selection ${address} is not a single column.`);
      return;
    }
    const source: ColumnSource = { kind: 'range', address: formatBlock(one) };
    const choice = this.current();
    const other = axis === 'x' ? choice?.y ?? null : choice?.x ?? this.pendingX;
    if (axis === 'x' && !choice) {
      this.pendingX = source;
      this.say(`${this.names.x} set to ${source.address}. Now select the ${this.names.y} column.`);
      return;
    }
    if (!other) {
      this.say(`Select the ${this.names.x} column first.`);
      return;
    }
    this.say('');
    this.pendingX = null;
    this.commit(axis === 'x' ? { x: source, y: other } : { x: other, y: source });
  }
}
