/** The rows where both columns hold a number, as the cell layer hands complete pairs to the core (null: blank). */
export function pairsWithoutBlanks(xs: readonly (number | null)[], ys: readonly (number | null)[]): { x: number[]; y: number[] } {
  const x: number[] = [];
  const y: number[] = [];
  xs.forEach((v, i) => {
    const w = ys[i];
    if (v !== null && w !== null) {
      x.push(v);
      y.push(w);
    }
  });
  return { x, y };
}
