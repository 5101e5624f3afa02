/**
 * Where the real panel (taskpane/panel.ts) is mounted on the grid's workbook.
 * PANEL MOUNT POINT: until taskpane/panel.ts exports mountPanel, this shows a placeholder so the page still works.
 */
import type { Workbook } from '../taskpane/workbook';

export function mountPanelInWorkbench(root: HTMLElement, workbook: Workbook): void {
  void workbook;
  const note = document.createElement('div');
  note.className = 'wb-panel-placeholder';
  note.dataset.testid = 'panel-placeholder';
  note.textContent = 'The Covary panel mounts here (taskpane/panel.ts).';
  root.replaceChildren(note);
}
