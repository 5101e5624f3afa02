/**
 * What the panel promises to the outside: its options, the handle mountPanel returns, the read-only debug handle
 * the tests and troubleshooting use, and the data-testid values that stay stable.
 */
import type { Design } from './design';
import type { PairChoice } from './pair-picker';
import type { Method } from '../src/stats/types';
import type { PanelTheme } from './theme';

export interface PanelOptions {
  /** Pair to show at once (e.g. the workbench's demo pair). Without it the panel tries the current selection. */
  initial?: PairChoice;
  /** Second pair for the Compare section. */
  initialCompare?: PairChoice;
  method?: Method;
  /** Confidence level, default 0.95. */
  level?: number;
  /** Significance level of the checks, default 0.05. */
  alpha?: number;
  /** The most points a chart draws, default 2000; flagged points are always among them. */
  drawLimit?: number;
  /** Changes arriving within this many ms of a refresh are merged into one trailing refresh; default 200. */
  debounceMs?: number;
  /** URL of dist/panel-worker.js; default "panel-worker.js" next to the page; null computes on the main thread. */
  workerUrl?: string | null;
  /** Pairs from which the analysis runs in the worker, default 250,000. */
  workerThreshold?: number;
  /** Write A1 references even for table columns (for hosts without structured references). */
  a1References?: boolean;
  /** Light or dark (default light): the host's theme (theme.ts). */
  theme?: PanelTheme;
  /** Publish the read-only debug handle as window.__covaryPanel (default true). */
  publishDebugHandle?: boolean;
}

/** Charts that show points, by name. */
export type PointChartName = 'scatter' | 'residuals' | 'qq' | 'order';

/** Read-only facts about what the panel shows, for tests and troubleshooting. */
export interface PanelDebug {
  /** Sheet rows of the drawn points (scatter), ascending. */
  drawnRows(): number[];
  /** Sheet rows of every flagged point (drawn or not), ascending. */
  flaggedRows(): number[];
  /** Client-pixel position of the point of a sheet row on a chart, or null when not drawn. */
  pointOnScreen(chart: PointChartName, row: number): { x: number; y: number } | null;
  /** The values of the labelled ticks on an axis of a point chart, as drawn. */
  axisTicks(chart: PointChartName, axis: 'x' | 'y'): number[];
  /** The figures shown in the Relationship section, or null before the first result. */
  summary(): { sheet: string; r: number; lower: number; upper: number; p: number; n: number; name: string; flags: string[] } | null;
  /** The figures shown in the Compare section, or null. */
  comparison(): { design: Design; difference: number; lower: number; upper: number; p: number } | null;
  lastRenderMs(): number;
  lastLatencyMs(): number;
  /** Milliseconds by phase of the last refresh: read, pair, compute, draw, compare. */
  lastPhases(): Record<string, number>;
  renderCount(): number;
  /** Resolves once no refresh is running or waiting. */
  whenIdle(): Promise<void>;
}

export interface PanelHandle {
  debug: PanelDebug;
  /** Changes the theme and repaints the charts in it. */
  setTheme(theme: PanelTheme): void;
  /** Re-reads and redraws now. */
  refresh(): Promise<void>;
  /** Stops watching, removes the panel's DOM and charts. */
  destroy(): void;
}

/** The data-testid values the panel promises to keep. */
export const PANEL_TEST_IDS = {
  coefficientName: 'coefficient-name',
  r: 'r-value',
  interval: 'interval',
  p: 'p-value',
  pairs: 'pairs',
  flags: 'flags',
  flaggedRows: 'flagged-rows',
  reading: 'reading',
  advice: 'advice',
  checksTable: 'checks-table',
  method: 'method-select',
  level: 'level-select',
  scatter: 'chart-scatter',
  residuals: 'chart-residuals',
  qq: 'chart-qq',
  order: 'chart-order',
  compareChart: 'chart-compare',
  compareR1: 'compare-r1',
  compareR2: 'compare-r2',
  compareDifference: 'compare-difference',
  compareInterval: 'compare-interval',
  compareP: 'compare-p',
  compareMethod: 'compare-method',
  compareCautions: 'compare-cautions',
  design: 'design-select',
  designDetected: 'design-detected',
  formulasButton: 'btn-formulas',
  reportButton: 'btn-report',
  actionStatus: 'action-status',
  status: 'status',
  progress: 'progress',
  hostNote: 'host-note',
  /** Pickers: prefixes "main" and "second" with -mode-selection, -mode-table, -use-selection, -set-x, -set-y,
   *  -table, -x-column, -y-column, -pair-label. */
} as const;
