/** Comparing two answers cell by cell with a tolerance, for invariance properties. */

/** |a - b| <= rel * max(|a|, |b|) + abs. */
export function close(a: number, b: number, rel: number, abs = 0): boolean {
  if (a === b) return true;
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b)) + abs;
}

/** The cells of an answer in reading order (a scalar is one cell). */
export function cellsOf(v: unknown): unknown[] {
  return Array.isArray(v) ? (v as unknown[]).flatMap((row) => (Array.isArray(row) ? row : [row])) : [v];
}

/** Differences between two answers of the same shape: numbers within tolerance, other cells equal. */
export function answerDifferences(a: unknown, b: unknown, rel: number, abs = 0): string[] {
  const ca = cellsOf(a);
  const cb = cellsOf(b);
  if (ca.length !== cb.length) return [`shapes differ: ${JSON.stringify(a)} vs ${JSON.stringify(b)}`];
  const out: string[] = [];
  ca.forEach((x, i) => {
    const y = cb[i];
    if (typeof x === 'number' && typeof y === 'number') {
      if (!close(x, y, rel, abs)) out.push(`cell ${i}: ${x} vs ${y}`);
    } else if (x !== y) out.push(`cell ${i}: ${JSON.stringify(x)} vs ${JSON.stringify(y)}`);
  });
  return out;
}
