/**
 * Which comparison of two correlations fits two picked pairs of columns, read from where they sit in the
 * workbook. The statistics differ by design (independent groups; one variable in common on the same rows; two
 * separate pairs on the same rows), so the panel proposes one and the user may override it. Pure.
 */
import { CellBlock, formatBlock } from '../src/sheet/a1';
import type { ComparisonDesign } from '../src/stats/compare/comparison';

/** The designs are the core's (one type for the statistics and the panel). */
export type Design = ComparisonDesign;

export const DESIGN_LABELS: Record<Design, string> = {
  independent: 'Two separate groups (different rows)',
  shared: 'Same rows, one column in common',
  separate: 'Same rows, four different columns',
};

export interface DesignDetection {
  /** The detected design, or null when the two pairs cannot be compared (the same two columns twice). */
  design: Design | null;
  /** One sentence saying what was seen in the addresses. */
  why: string;
  /** For "shared": the position (0 = first, 1 = second column) of the common column in pair A and in pair B. */
  common?: { a: 0 | 1; b: 0 | 1 };
  /** Something the user should check before trusting the design. */
  caution?: string;
}

function columnKey(b: CellBlock): string {
  return `${b.sheet}\u0000${b.firstColumn}`;
}

function sameRows(a: CellBlock, b: CellBlock): boolean {
  return a.sheet === b.sheet && a.firstRow === b.firstRow && a.lastRow === b.lastRow;
}

function rowsOverlap(a: CellBlock, b: CellBlock): boolean {
  return a.sheet === b.sheet && a.firstRow <= b.lastRow && b.firstRow <= a.lastRow;
}

/**
 * Detects the design from the blocks of pair A (a[0], a[1]) and pair B (b[0], b[1]).
 * - Different rows (another sheet, or other row numbers) → independent groups.
 * - Same rows and exactly one column in both pairs → shared variable.
 * - Same rows and four distinct columns → separate pairs.
 * @example detectDesign([B2:B49, C2:C49], [B2:B49, D2:D49]).design // 'shared'
 */
export function detectDesign(a: [CellBlock, CellBlock], b: [CellBlock, CellBlock]): DesignDetection {
  const all = [a[0], a[1], b[0], b[1]];
  const aligned = all.every((blk) => sameRows(blk, all[0]));
  const keysA = a.map(columnKey);
  const keysB = b.map(columnKey);
  if (!aligned) {
    const overlap = a.some((p) => b.some((q) => rowsOverlap(p, q)));
    return {
      design: 'independent',
      why: `${formatBlock(a[0])} and ${formatBlock(b[0])} are different rows, read as two separate groups of people or items.`,
      caution: overlap
        ? 'The two pairs share some rows. If the same people or items appear in both, the groups are not independent.'
        : undefined,
    };
  }
  const shared = keysA.filter((k) => keysB.includes(k));
  if (keysA[0] === keysA[1] || keysB[0] === keysB[1]) {
    return { design: null, why: 'A pair uses the same column twice; pick two different columns for each pair.' };
  }
  if (shared.length === 2) {
    return { design: null, why: 'Both pairs are the same two columns: there is nothing to compare.' };
  }
  if (shared.length === 1) {
    const ia = keysA.indexOf(shared[0]) as 0 | 1;
    const ib = keysB.indexOf(shared[0]) as 0 | 1;
    return {
      design: 'shared',
      why: `${formatBlock(a[ia])} is in both pairs.`,
      common: { a: ia, b: ib },
    };
  }
  return { design: 'separate', why: 'Both pairs are measured on the same rows, with no column in common.' };
}

/**
 * Whether a design the user chose can run on these pairs; returns the reason when it cannot.
 * Independent groups always can (the user knows the rows are different people); the same-rows designs need
 * aligned rows, and "shared" needs one common column.
 */
export function designProblem(choice: Design, a: [CellBlock, CellBlock], b: [CellBlock, CellBlock]): string | null {
  if (choice === 'independent') return null;
  const all = [a[0], a[1], b[0], b[1]];
  if (!all.every((blk) => blk.firstRow === all[0].firstRow && blk.lastRow === all[0].lastRow)) {
    return 'This design needs both pairs on the same rows.';
  }
  const keysA = a.map(columnKey);
  const common = keysA.filter((k) => b.map(columnKey).includes(k)).length;
  if (choice === 'shared' && common !== 1) return 'This design needs exactly one column in both pairs.';
  if (choice === 'separate' && common !== 0) return 'This design needs four different columns.';
  return null;
}
