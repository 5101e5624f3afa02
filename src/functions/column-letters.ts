/**
 * Spreadsheet column letters, shared by the cell functions (naming sheet positions), the panel (addresses it
 * writes) and the workbench grid.
 */

/** The widest sheet Excel allows: column XFD. */
export const MAX_COLUMNS = 16384;

/** Column letters for a 1-based column number: 1 -> "A", 28 -> "AB" (bijective base 26). */
export function columnLetters(column: number): string {
  let s = '';
  let c = column;
  while (c > 0) {
    const r = (c - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    c = (c - 1 - r) / 26;
  }
  return s;
}

/** 1-based column number for letters: "A" -> 1, "ab" -> 28; NaN for anything else or past XFD. */
export function columnNumber(letters: string): number {
  if (!/^[A-Za-z]{1,3}$/.test(letters)) return NaN;
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n <= MAX_COLUMNS ? n : NaN;
}
