/**
 * Shared work across cell functions: COEF, INTERVAL, PVALUE, FLAGS, CHECKS (and the rest) called on the same
 * x and y in one recalculation read the cells each time (each call receives its own arrays), but they find the
 * same PreparedPairs here, so pairing, sorting, ranking and the assumption checks are done once.
 *
 * Safety: entries are found by a hash of the cell contents and then compared value by value with the new read,
 * so an edited cell can never return an old answer (a hash collision costs a recomputation, nothing else).
 * Memory: at most MAX_ENTRIES entries and MAX_VALUES stored numbers; the least recently used go first. An evicted
 * entry's arrays go back to the scratch pool (src/stats/scratch.ts) unless a caller still holds the entry: work
 * that spans several host turns pins it (pinShared) while it runs, and a pinned entry is left to the garbage
 * collector instead.
 */
import { PreparedPairs } from '../stats/correlation/prepared';
import { giveBack } from '../stats/internal/scratch';
import { assertSameSize, CellRange, lastNumberIndex, PairedColumns, readPairsFromVectors, readVector, vectorLength } from './cells';

const MAX_ENTRIES = 16;
const MAX_VALUES = 8_000_000;

interface Entry {
  hash: number;
  xs: Float64Array;
  ys: Float64Array;
  pairs: PairedColumns;
  prepared: PreparedPairs;
  values: number;
  pins: number;
}

const entries = new Map<string, Entry>();
let storedValues = 0;

/** 32-bit FNV-1a over the bit patterns of the values (NaN, the mark of a cell that does not count, is canonical). */
function hashValues(h: number, v: Float64Array): number {
  const w = new Uint32Array(v.buffer, v.byteOffset, v.length * 2);
  for (let i = 0; i < w.length; i++) h = Math.imul(h ^ w[i], 0x01000193);
  return h >>> 0;
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  const wa = new Uint32Array(a.buffer, a.byteOffset, a.length * 2);
  const wb = new Uint32Array(b.buffer, b.byteOffset, b.length * 2);
  for (let i = 0; i < wa.length; i++) if (wa[i] !== wb[i]) return false;
  return true;
}

/** Forgets an entry; its arrays are recycled when nobody holds it. */
function drop(key: string, e: Entry): void {
  entries.delete(key);
  storedValues -= e.values;
  if (e.pins > 0) return;
  const { xs, ys, pairs, prepared } = e;
  giveBack(xs, ys, pairs.x !== xs ? pairs.x : null, pairs.y !== ys ? pairs.y : null, pairs.index);
  prepared.release();
}

/** Keeps the entry behind `prepared` out of the recycling until the returned function is called. */
export function pinShared(prepared: PreparedPairs): () => void {
  for (const e of entries.values()) {
    if (e.prepared === prepared) {
      e.pins++;
      let done = false;
      return () => {
        if (!done) e.pins--;
        done = true;
      };
    }
  }
  return () => undefined;
}

/** Reads x and y and returns their complete pairs and the shared prepared columns. */
export function sharedPairs(
  xRange: CellRange,
  yRange: CellRange,
  xName = 'x',
  yName = 'y',
): { pairs: PairedColumns; prepared: PreparedPairs } {
  const total = vectorLength(xRange, xName);
  const ny = vectorLength(yRange, yName);
  assertSameSize(total, ny, xName, yName);
  // Rows after x's last number can never pair, whatever y holds there. That row is found first by a scan that
  // copies nothing, and neither column is read past it: on a whole-column reference (1,048,576 rows, a thousand
  // filled) reading, the cost that dominates, drops to the filled rows plus one pass of type tests.
  const last = lastNumberIndex(xRange, xName);
  const xs = readVector(xRange, xName, last + 1);
  const ys = readVector(yRange, yName, last + 1);
  const hash = hashValues(hashValues(0x811c9dc5, xs), ys);
  const key = `${xName}|${yName}|${total}|${xs.length}|${hash}`;
  const hit = entries.get(key);
  if (hit && sameValues(hit.xs, xs) && sameValues(hit.ys, ys)) {
    entries.delete(key); // re-insert: most recently used last
    entries.set(key, hit);
    giveBack(xs, ys); // this call's reads are not needed: the entry holds the same values
    return hit;
  }
  const pairs = readPairsFromVectors(xs, ys, xName, yName, total);
  const prepared = new PreparedPairs(pairs.x, pairs.y);
  const values = 2 * xs.length + 3 * pairs.x.length;
  if (hit) drop(key, hit);
  if (values <= MAX_VALUES) {
    while (entries.size >= MAX_ENTRIES || storedValues + values > MAX_VALUES) {
      const oldest = entries.keys().next();
      if (oldest.done) break;
      drop(oldest.value, entries.get(oldest.value)!);
    }
    entries.set(key, { hash, xs, ys, pairs, prepared, values, pins: 0 });
    storedValues += values;
  }
  return { pairs, prepared };
}

/** For tests and the memory check: how many entries and values are held. */
export function sharedPairsStats(): { entries: number; values: number } {
  return { entries: entries.size, values: storedValues };
}

/** Empties the store (tests). */
export function clearSharedPairs(): void {
  entries.clear();
  storedValues = 0;
}
