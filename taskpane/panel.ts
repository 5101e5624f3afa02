/**
 * The Covary panel: Relationship, Residual diagnostics, Compare and Cautions, live from the workbook.
 *
 * mountPanel(root, wb, opts) builds the whole panel inside `root` and talks to the workbook only through the
 * small Workbook interface (workbook.ts): inside Excel that is excel-workbook.ts, in the workbench the grid's own
 * implementation. Rendering never calls a host directly. Where things live:
 * - controller.ts: the state, the refresh pipeline, live updates, the header;
 * - sections/: one module per section; write-actions.ts: the two buttons that write; widgets.ts, dom.ts: DOM;
 * - warm-up.ts: engine priming and idle warm-up; debug-handle.ts: the read-only debug handle;
 * - panel-api.ts: options, handles and the stable test ids.
 *
 * Test hooks (stable): data-testid attributes listed in PANEL_TEST_IDS; on the root element
 * data-last-render-ms (read + compute + draw of the last refresh), data-last-latency-ms (from the first change
 * notification it answered to the end of drawing), data-render-count and data-state ("empty", "busy", "ready",
 * "error"); each point chart's wrapper carries data-drawn-count and data-flagged-rows; a read-only debug handle
 * is returned and also published as window.__covaryPanel.
 */
import { PanelController } from './controller';
import { debugHandle } from './debug-handle';
import type { PanelDebug, PanelHandle, PanelOptions } from './panel-api';
import type { Workbook } from './workbook';

export { PANEL_TEST_IDS } from './panel-api';
export type { PanelDebug, PanelHandle, PanelOptions, PointChartName } from './panel-api';

/** Mounts the panel into `root` and starts following the workbook. */
export function mountPanel(root: HTMLElement, wb: Workbook, opts: PanelOptions = {}): PanelHandle {
  const controller = new PanelController(root, wb, opts);
  void controller.start();
  const debug = debugHandle(controller);
  if (opts.publishDebugHandle !== false) (window as unknown as { __covaryPanel?: PanelDebug }).__covaryPanel = Object.freeze(debug);
  return {
    debug,
    refresh: async () => {
      controller.scheduler.now();
      await debug.whenIdle();
    },
    setTheme: (theme) => controller.setTheme(theme),
    destroy: () => controller.destroy(),
  };
}
