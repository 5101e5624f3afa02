/**
 * F6 and Shift+F6 move the keyboard between the page's regions, as spreadsheet users expect: the name box and
 * formula bar, the grid, the sheet tabs, the panel. Inside the grid Tab moves the active cell (as in a
 * spreadsheet), so without these keys a keyboard user could not leave it.
 */
export interface Region {
  name: string;
  /** Everything that belongs to the region (focus inside it counts as being there). */
  contains(el: Element | null): boolean;
  /** Where focus lands when the region is entered. */
  entry(): HTMLElement | null;
}

/** The first element in `root` that takes focus from the keyboard, or null. */
export function firstFocusable(root: HTMLElement): HTMLElement | null {
  const candidates = root.querySelectorAll<HTMLElement>('button, select, input, textarea, a[href], summary, [tabindex]:not([tabindex="-1"])');
  for (const c of candidates) {
    if ((c as HTMLButtonElement).disabled) continue;
    if (c.offsetParent === null && getComputedStyle(c).position !== 'fixed') continue; // hidden
    return c;
  }
  return null;
}

export function installRegionKeys(doc: Document, regions: Region[]): void {
  doc.addEventListener('keydown', (e) => {
    if (e.key !== 'F6' || e.ctrlKey || e.altKey || e.metaKey) return;
    const n = regions.length;
    const at = regions.findIndex((r) => r.contains(doc.activeElement));
    const step = e.shiftKey ? -1 : 1;
    // From outside every region, F6 enters the first and Shift+F6 the last.
    const from = at >= 0 ? at : e.shiftKey ? n : -1;
    for (let k = 1; k <= n; k++) {
      const next = regions[(((from + step * k) % n) + n) % n];
      const target = next.entry();
      if (target) {
        e.preventDefault();
        target.focus();
        return;
      }
    }
  });
}
