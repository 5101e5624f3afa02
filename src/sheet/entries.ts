/**
 * What Covary types into a cell when it writes to a workbook. A host that is given a string through
 * `range.formulas` (or `range.values`) reads it as a user's typing: "=…" becomes a live formula, "+1" or "-1"
 * a number, "1-2" perhaps a date, "@…" a function call. Text that comes from the sheet (a header) or from us (a
 * label) must stay text, so every text is entered with a leading apostrophe, the spreadsheet's own "this is
 * text" mark: the apostrophe is not part of the cell's value and is not shown. Only formulas Covary composes
 * itself are entered as formulas, through `formulaEntry`, which refuses anything but a COVARY call.
 *
 * Pure: no host.
 */

/** One entry for `range.formulas`: text marked as text, a number, or a formula Covary composed. */
export type Entry = string | number;

/** The entry for a text: always stored as that text, whatever it begins with. Blank stays blank. */
export function textEntry(text: string): Entry {
  return text === '' ? '' : `'${text}`;
}

/** The entry for a formula Covary composed: must be one call of a COVARY function. */
export function formulaEntry(formula: string): Entry {
  if (!/^=COVARY\.[A-Z_]+\(/.test(formula)) throw new Error(`not a Covary formula: ${formula.slice(0, 40)}`);
  return formula;
}

/** Whether an entry will be read by the host as a formula. */
export function isFormulaEntry(e: Entry): boolean {
  return typeof e === 'string' && e.startsWith('=');
}

/** What a cell shows for an entry (the text without its apostrophe), as a host would store it. */
export function shownText(e: Entry): string | number {
  return typeof e === 'string' && e.startsWith("'") ? e.slice(1) : e;
}
