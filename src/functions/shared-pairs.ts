/**
 * Shared work across cell functions: COEF, INTERVAL, PVALUE, FLAGS, CHECKS (and the rest) called on the same
 * x and y in one recalculation read the cells each time (each call receives its own arrays), but they find the
 * same PreparedPairs here, so pairing, sorting, ranking and the assumption checks are done once.
 *
 * Safety: entries are found by a hash of the cell contents and then compared value by value with the new read,
 * so an edited cell can never return an old answer (a hash collision costs a recomputation, nothing else).
 * Memory: at most maxEntries entries and maxValues stored numbers; the least recently used go first. Each entry's
 * columns are read into a Workspace of the core's (src/stats/workspace.ts): an evicted entry releases it and its
 * PreparedPairs, unless a caller still holds the entry: work that spans several host turns pins it (pin) while it
 * runs, and a pinned entry is left to the garbage collector instead.
 */
import { CellRange, assertSameSize, lastNumberIndex, readVector, vectorLength } from '../sheet/cells';
import { PreparedPairs } from '../stats/correlation/prepared';
import { Workspace } from '../stats/workspace';
import { PairedColumns, pairVectors } from './read';

interface Entry {
  xs: Float64Array;
  ys: Float64Array;
  pairs: PairedColumns;
  prepared: PreparedPairs;
  work: Workspace;
  values: number;
  pins: number;
}

/**
 * 32-bit FNV-1a over the bit patterns of the values (NaN, the mark of a cell that does not count, is canonical),
 * in four interleaved lanes folded together at the end: one FNV chain waits on each multiply before the next,
 * four independent chains keep the multiplier busy (about a quarter of the time on a million rows). Only a key:
 * a hit is confirmed value by value, so the hash's quality decides how often a collision costs a recomputation.
 */
function hashValues(h: number, v: Float64Array): number {
  const w = new Uint32Array(v.buffer, v.byteOffset, v.length * 2);
  const P = 0x01000193;
  let h0 = h;
  let h1 = h ^ 0x9e3779b9;
  let h2 = h ^ 0x85ebca6b;
  let h3 = h ^ 0xc2b2ae35;
  const m = w.length - (w.length % 4);
  for (let i = 0; i < m; i += 4) {
    h0 = Math.imul(h0 ^ w[i], P);
    h1 = Math.imul(h1 ^ w[i + 1], P);
    h2 = Math.imul(h2 ^ w[i + 2], P);
    h3 = Math.imul(h3 ^ w[i + 3], P);
  }
  for (let i = m; i < w.length; i++) h0 = Math.imul(h0 ^ w[i], P);
  for (const lane of [h1, h2, h3]) h0 = Math.imul(h0 ^ lane, P);
  return h0 >>> 0;
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  const wa = new Uint32Array(a.buffer, a.byteOffset, a.length * 2);
  const wb = new Uint32Array(b.buffer, b.byteOffset, b.length * 2);
  for (let i = 0; i < wa.length; i++) if (wa[i] !== wb[i]) return false;
  return true;
}

/** A content-addressed store of prepared pairs (see the note at the top). */
export class SharedPairs {
  private readonly entries = new Map<string, Entry>();
  private storedValues = 0;

  constructor(
    private readonly maxEntries = 16,
    private readonly maxValues = 8_000_000,
  ) {}

  /** Reads x and y and returns their complete pairs and the shared prepared columns. */
  get(xRange: CellRange, yRange: CellRange, xName = 'x', yName = 'y'): { pairs: PairedColumns; prepared: PreparedPairs } {
    const total = vectorLength(xRange, xName);
    const ny = vectorLength(yRange, yName);
    assertSameSize(total, ny, xName, yName);
    // Rows after x's last number can never pair, whatever y holds there. That row is found first by a scan that
    // copies nothing, and neither column is read past it: on a whole-column reference (1,048,576 rows, a thousand
    // filled) reading, the cost that dominates, drops to the filled rows plus one pass of type tests.
    const last = lastNumberIndex(xRange, xName);
    const work = new Workspace();
    const xs = readVector(xRange, xName, { limit: last + 1, alloc: work.float64 });
    const ys = readVector(yRange, yName, { limit: last + 1, alloc: work.float64 });
    const hash = hashValues(hashValues(0x811c9dc5, xs), ys);
    const key = `${xName}|${yName}|${total}|${xs.length}|${hash}`;
    const hit = this.entries.get(key);
    if (hit && sameValues(hit.xs, xs) && sameValues(hit.ys, ys)) {
      this.entries.delete(key); // re-insert: most recently used last
      this.entries.set(key, hit);
      work.release(); // this call's reads are not needed: the entry holds the same values
      return hit;
    }
    const pairs = pairVectors(xs, ys, xName, yName, total, work.float64);
    const prepared = new PreparedPairs(pairs.x, pairs.y);
    const values = 2 * xs.length + 3 * pairs.x.length;
    if (hit) this.drop(key, hit);
    if (values <= this.maxValues) {
      while (this.entries.size >= this.maxEntries || this.storedValues + values > this.maxValues) {
        const oldest = this.entries.keys().next();
        if (oldest.done) break;
        this.drop(oldest.value, this.entries.get(oldest.value)!);
      }
      this.entries.set(key, { xs, ys, pairs, prepared, work, values, pins: 0 });
      this.storedValues += values;
    }
    return { pairs, prepared };
  }

  /** Keeps the entry behind `prepared` out of the recycling until the returned function is called. */
  pin(prepared: PreparedPairs): () => void {
    for (const e of this.entries.values()) {
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

  /** How many entries and values are held (tests and the memory check). */
  stats(): { entries: number; values: number } {
    return { entries: this.entries.size, values: this.storedValues };
  }

  /** Forgets every entry (tests). */
  clear(): void {
    this.entries.clear();
    this.storedValues = 0;
  }

  /** Forgets an entry; its arrays are recycled when nobody holds it. */
  private drop(key: string, e: Entry): void {
    this.entries.delete(key);
    this.storedValues -= e.values;
    if (e.pins > 0) return;
    e.work.release();
    e.prepared.release();
  }
}

/** The one store of the functions bundle, shared by every cell function of the workbook. */
const store = new SharedPairs();

export const sharedPairs = (x: CellRange, y: CellRange, xName?: string, yName?: string): { pairs: PairedColumns; prepared: PreparedPairs } =>
  store.get(x, y, xName, yName);
export const pinShared = (prepared: PreparedPairs): (() => void) => store.pin(prepared);
export const sharedPairsStats = (): { entries: number; values: number } => store.stats();
export const clearSharedPairs = (): void => store.clear();
