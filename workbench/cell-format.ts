/**
 * How a cell's value reads in the grid, close to a spreadsheet's General format: numbers with up to about ten
 * significant digits (exponent form when very large or small), TRUE/FALSE in capitals, errors by their code with
 * the function's message as the tooltip. The text is always set with textContent: cell text is data, never markup.
 */
import { CellValue, isErrorValue } from './cell-values';

export interface CellDisplay {
  text: string;
  kind: 'blank' | 'number' | 'text' | 'boolean' | 'error';
  /** Tooltip: the error's message, or the full-precision number when the text is rounded. */
  title?: string;
}

/** Widest number text in a default-width column. */
const MAX_NUMBER_CHARS = 11;

/** A number in General format: "0.8734126553", "12", "1.2346E-07". */
export function formatGeneral(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  // Below 1e-4 fixed notation would spend the width on zeros: scientific keeps the significant digits.
  if (a < 1e11 && a >= 1e-4) {
    for (let digits = 10; digits >= 1; digits--) {
      const s = String(Number(v.toPrecision(digits)));
      if (!s.includes('e') && s.length <= MAX_NUMBER_CHARS) return s;
    }
  }
  const [mantissa, exponent] = v.toExponential(4).split('e');
  const m = mantissa.replace(/\.?0+$/, '');
  const e = Number(exponent);
  return `${m}E${e < 0 ? '-' : '+'}${String(Math.abs(e)).padStart(2, '0')}`;
}

export function displayValue(v: CellValue): CellDisplay {
  if (v === null || v === '') return { text: '', kind: 'blank' };
  if (isErrorValue(v)) return { text: v.error, kind: 'error', title: v.message || undefined };
  if (typeof v === 'boolean') return { text: v ? 'TRUE' : 'FALSE', kind: 'boolean' };
  if (typeof v === 'number') {
    const text = formatGeneral(v);
    return { text, kind: 'number', title: String(v) !== text ? String(v) : undefined };
  }
  return { text: v, kind: 'text' };
}
