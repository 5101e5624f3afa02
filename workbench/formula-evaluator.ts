/**
 * Evaluates a parsed formula the way Excel calls a custom function: each argument is shaped by the function's
 * metadata (functions.json) — a range for a `matrix` parameter arrives as rows of cells with blanks as null (as
 * Excel on the web passes them), a `scalar` parameter gets one value converted to its declared type, an omitted
 * argument is null, and functions that ask for parameter addresses get an invocation object last. An error value
 * in an argument answers the formula without calling the function, as Excel does. The call itself runs in the
 * formula worker, which hosts dist/functions.js.
 */
import { Area, cellName, formatArea, MAX_ROW, quoteSheet } from './a1';
import { CellValue, ErrorValue, errorValue, isErrorValue, Scalar } from './cell-values';
import { FormulaNode } from './formula-parser';
import type { FunctionHost } from './function-host';
import { FUNCTION_NAMESPACE, FunctionMeta, ParameterMeta } from './function-metadata';

/** Where the evaluator reads referenced cells from. */
export interface CellSource {
  /** The cells of an area as rows; an ErrorValue (#REF!) when the sheet does not exist. Whole columns are clipped
   *  to the sheet's used rows. */
  readArea(area: Area): CellValue[][] | ErrorValue;
  /** The cells a table column reference covers now (tables grow), or #REF! when the table or column is gone. */
  tableColumnArea(table: string, column: string, part: 'data' | 'headers' | 'all'): Area | ErrorValue;
  /** Rows and columns in use on a sheet: cells past them are all empty. */
  usedExtent(sheet: string): { rows: number; columns: number };
}

/**
 * Cuts the range arguments of one call to the sheet's used extent before any array is built, keeping ranges of
 * the same nominal height (or width) the same size as each other: the cells cut off are all empty, so the call
 * answers as it would on the full ranges, and =F(A1:XFD1048576, ...) costs what the sheet holds, not 17 billion
 * cells. Every range keeps at least one row and column.
 */
export function clipToUsed(areas: Area[], usedExtent: (sheet: string) => { rows: number; columns: number }): Area[] {
  const height = (a: Area) => (a.bottom === Infinity ? MAX_ROW : a.bottom) - a.top + 1;
  const width = (a: Area) => a.right - a.left + 1;
  const rowsNeeded = new Map<number, number>();
  const columnsNeeded = new Map<number, number>();
  for (const a of areas) {
    const used = usedExtent(a.sheet);
    const h = height(a);
    const w = width(a);
    rowsNeeded.set(h, Math.max(rowsNeeded.get(h) ?? 1, Math.min(h, used.rows - a.top + 1)));
    columnsNeeded.set(w, Math.max(columnsNeeded.get(w) ?? 1, Math.min(w, used.columns - a.left + 1)));
  }
  return areas.map((a) => ({
    ...a,
    bottom: a.top + (rowsNeeded.get(height(a)) ?? 1) - 1,
    right: a.left + (columnsNeeded.get(width(a)) ?? 1) - 1,
  }));
}

/** The cell a formula sits in (for invocation.address). */
export interface FormulaSite {
  sheet: string;
  row: number;
  column: number;
}

/** An evaluated argument: rows of values, where it came from, and whether it was written as a single literal. */
interface ArgumentValue {
  rows: CellValue[][];
  address: string;
  literal: boolean;
  omitted: boolean;
}

/** A formula's answer is always a block of cells; a plain value is a 1 x 1 block. */
export type FormulaResult = CellValue[][];

const single = (v: CellValue): FormulaResult => [[v]];

export class FormulaEvaluator {
  constructor(
    private readonly cells: CellSource,
    private readonly host: FunctionHost,
    private readonly functions: Map<string, FunctionMeta>,
    private readonly registeredIds: Set<string>,
  ) {}

  async evaluate(node: FormulaNode, site: FormulaSite): Promise<FormulaResult> {
    switch (node.kind) {
      case 'literal':
        return single(node.value);
      case 'omitted':
        return single(0);
      case 'array':
        return node.rows.map((r) => [...r]);
      case 'ref':
      case 'tableref': {
        const area = node.kind === 'ref' ? node.area : this.cells.tableColumnArea(node.table, node.column, node.part);
        if (isErrorValue(area)) return single(area);
        const rows = this.cells.readArea(clipToUsed([area], (sheet) => this.cells.usedExtent(sheet))[0]);
        return isErrorValue(rows) ? single(rows) : rows.map((r) => r.map((v) => (v === null ? 0 : v)));
      }
      case 'call':
        return this.call(node.name, node.args, site);
    }
  }

  private async argument(node: FormulaNode, site: FormulaSite, clipped: Map<FormulaNode, Area>): Promise<ArgumentValue | ErrorValue> {
    if (node.kind === 'omitted') return { rows: [[null]], address: '', literal: true, omitted: true };
    if (node.kind === 'literal') return { rows: [[node.value]], address: '', literal: true, omitted: false };
    if (node.kind === 'ref' || node.kind === 'tableref') {
      const area = clipped.get(node) ?? (node.kind === 'ref' ? node.area : this.cells.tableColumnArea(node.table, node.column, node.part));
      if (isErrorValue(area)) return area;
      const rows = this.cells.readArea(area);
      if (isErrorValue(rows)) return rows;
      const shown = { ...area, bottom: area.top + rows.length - 1 };
      return { rows, address: formatArea(shown), literal: false, omitted: false };
    }
    const rows = await this.evaluate(node, site);
    return { rows, address: '', literal: false, omitted: false };
  }

  private async call(name: string, argNodes: FormulaNode[], site: FormulaSite): Promise<FormulaResult> {
    const upper = name.toUpperCase();
    const prefix = FUNCTION_NAMESPACE + '.';
    const id = upper.startsWith(prefix) ? upper.slice(prefix.length) : '';
    const meta = id ? this.functions.get(id) : undefined;
    if (!meta || !this.registeredIds.has(meta.id.toUpperCase())) {
      return single(
        errorValue('#NAME?', upper.startsWith(prefix) ? `${upper} is not one of the add-in's functions` : `the workbench evaluates the ${FUNCTION_NAMESPACE} functions only, not ${upper}`),
      );
    }
    const params = meta.parameters;
    const repeating = params.length > 0 && params[params.length - 1].repeating === true;
    if (!repeating && argNodes.length > params.length) {
      return single(errorValue('#VALUE!', `${FUNCTION_NAMESPACE}.${meta.name} takes at most ${params.length} argument${params.length === 1 ? '' : 's'}`));
    }
    // Excel refuses a formula that leaves out a required argument before calling anything; so does the workbench,
    // naming what is missing.
    const required = params.filter((p) => !p.optional);
    if (argNodes.length < required.length) {
      const missing = required.slice(argNodes.length).map((p) => p.name);
      return single(
        errorValue(
          '#VALUE!',
          `${FUNCTION_NAMESPACE}.${meta.name} needs ${required.length} argument${required.length === 1 ? '' : 's'} (${required.map((p) => p.name).join(', ')}); ` +
            `${missing.join(' and ')} ${missing.length === 1 ? 'is' : 'are'} missing`,
        ),
      );
    }

    // The range arguments, cut together to the used extent (see clipToUsed).
    const refNodes: FormulaNode[] = [];
    const refAreas: Area[] = [];
    for (const node of argNodes) {
      if (node.kind !== 'ref' && node.kind !== 'tableref') continue;
      const area = node.kind === 'ref' ? node.area : this.cells.tableColumnArea(node.table, node.column, node.part);
      if (isErrorValue(area)) continue;
      refNodes.push(node);
      refAreas.push(area);
    }
    const cut = clipToUsed(refAreas, (sheet) => this.cells.usedExtent(sheet));
    const clipped = new Map<FormulaNode, Area>(refNodes.map((n, i) => [n, cut[i]]));

    const evaluated: ArgumentValue[] = [];
    for (const node of argNodes) {
      const arg = await this.argument(node, site, clipped);
      if (isErrorValue(arg)) return single(arg);
      const err = firstError(arg.rows);
      if (err) return single(err);
      evaluated.push(arg);
    }

    const args: unknown[] = [];
    const addresses: string[] = [];
    for (let i = 0; i < params.length; i++) {
      const p = params[i];
      if (p.repeating) {
        const rest = evaluated.slice(i);
        const shaped: unknown[] = [];
        for (const a of rest) {
          const v = shapeArgument(a, p);
          if (isErrorValue(v)) return single(v);
          shaped.push(v);
        }
        args.push(shaped);
        addresses.push(...rest.map((a) => a.address));
        break;
      }
      const a = evaluated[i];
      if (a === undefined) {
        args.push(null);
        addresses.push('');
        continue;
      }
      const v = shapeArgument(a, p);
      if (isErrorValue(v)) return single(v);
      args.push(v);
      addresses.push(a.address);
    }
    const opts = meta.options ?? {};
    if (opts.requiresParameterAddresses || opts.requiresAddress) {
      args.push({
        functionName: `${FUNCTION_NAMESPACE}.${meta.name}`,
        address: `${quoteSheet(site.sheet)}!${cellName(site.row, site.column)}`,
        parameterAddresses: opts.requiresParameterAddresses ? addresses : undefined,
        isInValuePreview: false,
      });
    }

    const reply = await this.host.call(meta.id, args);
    if (!reply.ok) return single(errorValue(reply.error.error, reply.error.message));
    return toResult(reply.value);
  }
}

function firstError(rows: CellValue[][]): ErrorValue | undefined {
  for (const r of rows) for (const v of r) if (isErrorValue(v)) return v;
  return undefined;
}

/** Shapes one argument for one parameter, as Excel does before the call. */
function shapeArgument(a: ArgumentValue, p: ParameterMeta): unknown {
  if (a.omitted) return null;
  if (p.dimensionality === 'matrix') return a.rows.map((r) => r.map((v) => v as Scalar));
  if (a.rows.length !== 1 || a.rows[0].length !== 1) {
    return errorValue('#VALUE!', `${p.name} expects a single value, not a range of ${a.rows.length} x ${a.rows[0]?.length ?? 0} cells`);
  }
  return convertScalar(a.rows[0][0] as Scalar, p);
}

/** Converts a single value to the parameter's declared type (number, string, boolean or any). */
function convertScalar(v: Scalar, p: ParameterMeta): Scalar | ErrorValue {
  if (v === null) return null;
  switch (p.type) {
    case 'number':
      if (typeof v === 'number') return v;
      if (typeof v === 'boolean') return v ? 1 : 0;
      if (typeof v === 'string' && v.trim() !== '' && Number.isFinite(Number(v))) return Number(v);
      return errorValue('#VALUE!', `${p.name} must be a number`);
    case 'string':
      if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
      return String(v);
    case 'boolean':
      if (typeof v === 'boolean') return v;
      if (typeof v === 'number') return v !== 0;
      if (typeof v === 'string' && /^(true|false)$/i.test(v.trim())) return v.trim().toUpperCase() === 'TRUE';
      return errorValue('#VALUE!', `${p.name} must be TRUE or FALSE`);
    default:
      return v;
  }
}

/** One returned cell as the grid shows it: a null inside a returned array shows as 0, as in Excel. */
function toCell(v: unknown): CellValue {
  if (v === null || v === undefined) return 0;
  if (typeof v === 'number') return Number.isFinite(v) ? v : errorValue('#NUM!');
  if (typeof v === 'string' || typeof v === 'boolean') return v;
  if (isErrorValue(v)) return errorValue(v.error, v.message);
  return errorValue('#VALUE!', 'the function returned a value a cell cannot hold');
}

/** Turns what the function returned into a block of cells; ragged rows are padded with #N/A, as Excel pads. */
export function toResult(value: unknown): FormulaResult {
  if (!Array.isArray(value)) return single(toCell(value));
  const rows = value.map((r) => (Array.isArray(r) ? r : [r]));
  const width = rows.reduce((w, r) => Math.max(w, r.length), 0);
  if (rows.length === 0 || width === 0) return single(errorValue('#CALC!', 'the function returned an empty array'));
  return rows.map((r) => {
    const out = r.map(toCell);
    while (out.length < width) out.push(errorValue('#N/A'));
    return out;
  });
}
