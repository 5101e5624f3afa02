/**
 * What a workbench cell holds once evaluated: a number, text, TRUE/FALSE, blank (null) or an error such as
 * #VALUE! with the message the function gave (shown as the cell's tooltip, as Excel does).
 */

/** An error shown in a cell, e.g. { error: "#VALUE!", message: "y is constant" }. */
export interface ErrorValue {
  error: string;
  message?: string;
}

export type Scalar = number | string | boolean | null;
export type CellValue = Scalar | ErrorValue;

export function isErrorValue(v: unknown): v is ErrorValue {
  return typeof v === 'object' && v !== null && typeof (v as ErrorValue).error === 'string';
}

export function errorValue(error: string, message?: string): ErrorValue {
  return message ? { error, message } : { error };
}

/**
 * What a typed entry means, as a spreadsheet reads it: "=..." is a formula, numbers become numbers, TRUE/FALSE
 * become booleans ("5%", "$5" and "1,234" become the numbers Excel makes of them), an empty entry clears the cell, anything else stays text (so "<b>" is text, never markup).
 * A leading apostrophe marks the rest as text whatever it looks like ("'=1+1" is the text "=1+1"), as in Excel;
 * the panel enters every text it writes that way (src/sheet/entries.ts).
 */
export type Entry = { kind: 'formula'; text: string } | { kind: 'value'; value: Scalar };

export function readEntry(typed: string | number | boolean | null): Entry {
  if (typed === null) return { kind: 'value', value: null };
  if (typeof typed !== 'string') return { kind: 'value', value: typed };
  if (typed.startsWith("'")) return { kind: 'value', value: typed.length > 1 ? typed.slice(1) : null };
  if (typed.startsWith('=') && typed.length > 1) return { kind: 'formula', text: typed };
  const trimmed = typed.trim();
  if (trimmed === '') return { kind: 'value', value: null };
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(trimmed)) return { kind: 'value', value: Number(trimmed) };
  // As Excel (en-US) reads typed numbers with a percent sign, a currency sign or thousands separators: "5%" is
  // 0.05, "$1,234.50" is 1234.5, "-€5" is -5. (It also keeps a display format; the workbench shows the number.)
  const dressed = /^([+-]?)([$€£]?)(\d{1,3}(?:,\d{3})+|\d+)?(\.\d*)?(%?)$/.exec(trimmed);
  if (dressed) {
    const [, sign, currency, whole, fraction, percent] = dressed;
    const hasDigits = whole !== undefined || (fraction !== undefined && fraction.length > 1);
    const isDressed = currency !== '' || percent !== '' || (whole ?? '').includes(',');
    if (hasDigits && isDressed) {
      const digits = (whole ?? '0').replace(/,/g, '') + (fraction ?? '');
      const magnitude = percent ? Number(digits) / 100 : Number(digits);
      return { kind: 'value', value: sign === '-' ? -magnitude : magnitude };
    }
  }
  const upper = trimmed.toUpperCase();
  if (upper === 'TRUE' || upper === 'FALSE') return { kind: 'value', value: upper === 'TRUE' };
  return { kind: 'value', value: typed };
}

/** Two cell values are the same for recalculation purposes. */
export function sameValue(a: CellValue, b: CellValue): boolean {
  if (isErrorValue(a) || isErrorValue(b)) {
    return isErrorValue(a) && isErrorValue(b) && a.error === b.error && a.message === b.message;
  }
  return Object.is(a, b);
}
