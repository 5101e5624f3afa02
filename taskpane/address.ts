/**
 * Columns from a selection: what the panel accepts as "the selected two columns" or "the selected column". The
 * address rules themselves are src/sheet/a1.ts. Pure: no host, no DOM.
 */
import { CellBlock, parseAddress } from '../src/sheet/a1';

/** The single columns of a block, left to right. */
export function splitColumns(b: CellBlock): CellBlock[] {
  const out: CellBlock[] = [];
  for (let c = b.firstColumn; c <= b.lastColumn; c++) out.push({ ...b, firstColumn: c, lastColumn: c });
  return out;
}

/** Number of rows and columns of a block. */
export function blockSize(b: CellBlock): { rows: number; columns: number } {
  return { rows: b.lastRow - b.firstRow + 1, columns: b.lastColumn - b.firstColumn + 1 };
}

/**
 * Two single columns from a selection: a block two columns wide, or two areas one column wide each (picked with
 * Ctrl). Returns null when the selection is anything else.
 */
export function twoColumnsOf(address: string): [CellBlock, CellBlock] | null {
  const blocks = parseAddress(address);
  if (!blocks) return null;
  if (blocks.length === 1 && blockSize(blocks[0]).columns === 2) {
    const [a, b] = splitColumns(blocks[0]);
    return [a, b];
  }
  if (blocks.length === 2 && blocks.every((b) => blockSize(b).columns === 1)) return [blocks[0], blocks[1]];
  return null;
}

/** One single column from a selection, or null. */
export function oneColumnOf(address: string): CellBlock | null {
  const blocks = parseAddress(address);
  if (!blocks || blocks.length !== 1 || blockSize(blocks[0]).columns !== 1) return null;
  return blocks[0];
}
