/**
 * What the host lets a cell function receive, said in the panel when the picked columns pass it. Excel on the web
 * passes a custom function at most about 5 MB of arguments per call (reported by the platform's maintainers; the
 * reference documentation states the 5 MB limit for the task pane's requests, Microsoft Learn, "Resource limits
 * and performance optimization for Office Add-ins", Excel add-ins). Past it the formula fails before Covary's
 * code runs, with a bare #VALUE!, so the panel, which reads any length in blocks, is where the user can learn it.
 * Pure.
 */
import { formatCount } from '../src/stats/format';

/** About 5 MB of arguments per custom-function call on Excel on the web. */
export const WEB_FUNCTION_ARGUMENT_BYTES = 5 * 1024 * 1024;

/** The bytes one cell's value takes as JSON, as the host sends it: a number as its shortest text, text quoted and
 *  escaped, 5 for TRUE / FALSE / null (the longest of them). Separators are the caller's to add. */
export function cellJsonBytes(v: unknown): number {
  if (typeof v === 'number') return String(v).length;
  if (typeof v === 'string') return JSON.stringify(v).length;
  return 5;
}

/** Average JSON bytes per cell of the columns, from up to 2,000 evenly spread cells of each (a blank is 3). */
export function bytesPerCell(columns: ArrayLike<number>[]): number {
  let bytes = 0;
  let cells = 0;
  for (const c of columns) {
    const step = Math.max(1, Math.floor(c.length / 2000));
    for (let i = 0; i < c.length; i += step) {
      const v = c[i];
      bytes += cellJsonBytes(v === v ? v : '') + 3; // the number or "" with the row's brackets and separator
      cells++;
    }
  }
  return cells === 0 ? 0 : bytes / cells;
}

/**
 * A sentence for the panel when one formula over these columns would pass the host's argument limit, else null.
 * @param limitBytes the host's limit per call, or null when it has none known (desktop Excel).
 */
export function functionCallNote(limitBytes: number | null, columns: ArrayLike<number>[]): string | null {
  if (limitBytes === null || columns.length === 0) return null;
  const rows = columns[0].length;
  const perCell = bytesPerCell(columns);
  const bytes = perCell * rows * columns.length;
  if (bytes <= limitBytes) return null;
  const fit = Math.floor(limitBytes / (perCell * columns.length) / 1000) * 1000;
  return (
    `Excel on the web hands a cell function about ${Math.round(limitBytes / 1024 / 1024)} MB of cells per call: ` +
    `a COVARY formula over all ${formatCount(rows)} rows of these ${columns.length} columns would fail there with #VALUE! ` +
    `(about ${formatCount(fit)} rows fit). This panel reads any length in blocks; desktop Excel has no such limit.`
  );
}
