/**
 * The panel's read-only debug handle (PanelDebug): what it shows, drawn where, and how long the last refresh took,
 * for the browser tests and for troubleshooting. It reads the controller and changes nothing.
 */
import type { PanelController } from './controller';
import type { PanelDebug, PointChartName } from './panel-api';

export function debugHandle(c: PanelController): PanelDebug {
  const plots = { scatter: c.relationship.scatter, ...c.residuals.plots };
  const debug: PanelDebug = {
    drawnRows: () => (c.current ? Array.from(c.current.drawn.rows) : []),
    flaggedRows: () => (c.current ? c.current.flaggedRows.slice() : []),
    pointOnScreen: (chart: PointChartName, row: number) => plots[chart].screenPosition(row),
    axisTicks: (chart: PointChartName, axis: 'x' | 'y') => plots[chart].axisTicks(axis),
    summary: () => {
      const v = c.current;
      if (!v) return null;
      const r = v.correlation;
      return { sheet: v.sheet, r: r.statistic, lower: r.interval.lower, upper: r.interval.upper, p: r.pValue, n: v.n, name: r.name, flags: v.flags.slice() };
    },
    comparison: () => {
      const v = c.compare.shown;
      return v ? { design: v.design, difference: v.result.statistic, lower: v.result.interval.lower, upper: v.result.interval.upper, p: v.result.pValue } : null;
    },
    lastRenderMs: () => c.lastRenderMs,
    lastLatencyMs: () => c.lastLatencyMs,
    lastPhases: () => ({ ...c.lastPhases }),
    renderCount: () => c.renders,
    whenIdle: () =>
      new Promise<void>((resolve) => {
        const check = (): void => {
          if (c.destroyed || (!c.busy && !c.warmUp.warming && c.scheduler.idle && !Object.values(plots).some((pl) => pl.stale))) resolve();
          else setTimeout(check, 10);
        };
        check();
      }),
  };
  return debug;
}
