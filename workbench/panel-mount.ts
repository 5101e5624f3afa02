/**
 * Mounts the real panel (taskpane/panel.ts) on the grid's workbook, starting on the demo pair (North: mechanics
 * against repairs, picked by table header) with the same pair in the South region ready in Compare.
 */
import { mountPanel, PanelHandle } from '../taskpane/panel';
import type { PanelTheme } from '../taskpane/theme';
import type { Workbook } from '../taskpane/workbook';

export const DEMO_PAIR = {
  x: { kind: 'table', table: 'NorthWorkshops', column: 'Mechanics (FTE)', position: 1 },
  y: { kind: 'table', table: 'NorthWorkshops', column: 'Repairs per week', position: 2 },
} as const;

export const DEMO_COMPARE_PAIR = {
  x: { kind: 'table', table: 'SouthWorkshops', column: 'Mechanics (FTE)', position: 1 },
  y: { kind: 'table', table: 'SouthWorkshops', column: 'Repairs per week', position: 2 },
} as const;

export function mountPanelInWorkbench(root: HTMLElement, workbook: Workbook, theme: PanelTheme = 'light'): PanelHandle | null {
  try {
    return mountPanel(root, workbook, { initial: DEMO_PAIR, initialCompare: DEMO_COMPARE_PAIR, theme });
  } catch (e) {
    const note = document.createElement('div');
    note.className = 'wb-panel-placeholder';
    note.textContent = `The panel could not start: ${e instanceof Error ? e.message : String(e)}`;
    root.replaceChildren(note);
    return null;
  }
}
