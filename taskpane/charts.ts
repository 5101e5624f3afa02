/**
 * The panel's charts, drawn with Chart.js.
 *
 * Why Chart.js: it renders to a canvas, so thousands of points redraw in milliseconds where an SVG library
 * would build thousands of DOM nodes; tooltips, hover and click hit-testing are built in (hover shows a
 * point's row, click selects it); it needs no eval or inline styles, so it runs under the pane's strict
 * Content-Security-Policy; it is MIT-licensed, widely used and actively maintained; and it is tree-shakable:
 * only the scatter and line controllers, the point and line elements, the linear scale and the tooltip are
 * registered below, nothing else is bundled. Text on a canvas is painted, never parsed, so a header holding
 * markup shows as text.
 *
 * Point highlight: a flagged point (outlier, influential, or setting the slope) is a larger filled diamond in
 * an orange-brown with a dark outline; ordinary points are small translucent teal dots. Shape and size differ as
 * well as colour, so the highlight does not depend on seeing colour. The same style is used in every plot.
 */
import { onIdle } from './dom';
import {
  Chart,
  ChartConfiguration,
  ChartDataset,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  ScatterController,
  Tooltip,
  TooltipItem,
} from 'chart.js';

Chart.register(ScatterController, LineController, PointElement, LineElement, LinearScale, Tooltip);

/** The colours a chart paints with. */
export interface Palette {
  accent: string;
  point: string;
  flagFill: string;
  flagEdge: string;
  smooth: string;
  reference: string;
  grid: string;
  text: string;
  /** The fill inside hollow markers: the surface the chart sits on. */
  surface: string;
}

/** The light theme's colours, kept equal to the custom properties at the top of panel.css (used where the page
 *  gives none, e.g. a canvas not in the document). */
export const PALETTE: Palette = {
  accent: '#0f6b73',
  // 75% opaque: 3.7:1 against white on its own (WCAG 2.1 non-text contrast asks 3:1; at 50% it was 2.2:1).
  point: 'rgba(15, 107, 115, 0.75)',
  flagFill: '#d9611c',
  flagEdge: '#5c2208',
  smooth: '#3d3d3d',
  reference: '#8a8a8a',
  grid: '#ececec',
  text: '#3b3b3b',
  surface: '#ffffff',
};

const PALETTE_PROPERTIES: Record<keyof Palette, string> = {
  accent: '--cv-accent',
  point: '--cv-chart-point',
  flagFill: '--cv-flag',
  flagEdge: '--cv-flag-edge',
  smooth: '--cv-chart-smooth',
  reference: '--cv-chart-reference',
  grid: '--cv-chart-grid',
  text: '--cv-chart-text',
  surface: '--cv-surface',
};

/** The colours where a canvas sits, from the panel's custom properties (so a chart follows the light or dark
 *  theme of its pane), each falling back to the light palette. */
export function paletteOf(canvas: HTMLCanvasElement): Palette {
  const style = canvas.isConnected ? getComputedStyle(canvas) : null;
  const out = { ...PALETTE };
  if (!style) return out;
  for (const key of Object.keys(PALETTE_PROPERTIES) as (keyof Palette)[]) {
    const v = style.getPropertyValue(PALETTE_PROPERTIES[key]).trim();
    if (v) out[key] = v;
  }
  return out;
}

type AxisOptions = { ticks?: { color?: string }; title?: { color?: string }; grid?: { color?: string } };

/** Sets the text and grid colours of a chart's axes (Chart.js keeps them in the options). */
function paintAxes(chart: Chart, c: Palette): void {
  (chart.options as { color?: string }).color = c.text;
  for (const axis of Object.values(chart.options.scales ?? {}) as AxisOptions[]) {
    if (axis.ticks) axis.ticks.color = c.text;
    if (axis.title) axis.title.color = c.text;
    if (axis.grid && axis.grid.color !== undefined) axis.grid.color = c.grid;
  }
}

const FONT_STACK = "'Segoe UI', 'Segoe UI Web (West European)', -apple-system, BlinkMacSystemFont, Roboto, 'Helvetica Neue', sans-serif";

/** What every chart here shares: no animation (a redraw is instant), sized by its frame, data handed over already
 *  in Chart.js's own {x, y} form (so it is not parsed again), and the panel's type and text colour. Set on each
 *  chart, never on Chart.js's global defaults, so importing this module changes nothing for anyone else. */
const STATIC_CHART = {
  animation: false,
  responsive: true,
  maintainAspectRatio: false,
  parsing: false,
  font: { family: FONT_STACK, size: 11 },
  color: PALETTE.text,
} as const;

/** Tick and title text of an axis, in the panel's type (per chart, as above). */
const AXIS_TEXT = { font: { family: FONT_STACK, size: 11 }, color: PALETTE.text } as const;

/** A drawn point: its position, its sheet row, and why it is highlighted (0 = not). */
export interface PlotPoint {
  x: number;
  y: number;
  row: number;
  flags: number;
}

/** A line through given points: the fitted line, the smooth, or a reference line. */
export interface PlotLine {
  kind: 'fit' | 'smooth' | 'reference';
  label: string;
  points: { x: number; y: number }[];
}

export interface PlotContent {
  points: PlotPoint[];
  lines: PlotLine[];
  xTitle: string;
  yTitle: string;
  /** Tooltip lines for a point (text only). */
  describe: (p: PlotPoint) => string[];
}

type XY = { x: number; y: number };
type PointDataset = ChartDataset<'scatter', PlotPoint[]>;
type LineDataset = ChartDataset<'line', XY[]>;

/** Point radius by how many points share the plot: smaller when crowded. */
export function pointRadius(count: number): number {
  return count > 1000 ? 2 : count > 200 ? 2.6 : 3.6;
}

function lineDataset(l: PlotLine, c: Palette): LineDataset {
  const style =
    l.kind === 'fit'
      ? { borderColor: c.accent, borderWidth: 2, borderDash: [] as number[] }
      : l.kind === 'smooth'
        ? { borderColor: c.smooth, borderWidth: 1.6, borderDash: [6, 4] }
        : { borderColor: c.reference, borderWidth: 1, borderDash: [3, 3] };
  return {
    type: 'line',
    label: l.label,
    data: l.points,
    ...style,
    pointRadius: 0,
    pointHitRadius: 0,
    pointHoverRadius: 0,
    fill: false,
    tension: 0,
    order: 2,
  };
}

function pointDatasets(points: PlotPoint[], c: Palette): PointDataset[] {
  const plain = points.filter((p) => p.flags === 0);
  const flagged = points.filter((p) => p.flags !== 0);
  const r = pointRadius(points.length);
  return [
    {
      type: 'scatter',
      label: 'points',
      data: plain,
      pointStyle: 'circle',
      pointRadius: r,
      pointHoverRadius: r + 2,
      pointHitRadius: 3,
      backgroundColor: c.point,
      borderWidth: 0,
      order: 3,
    },
    {
      type: 'scatter',
      label: 'flagged',
      data: flagged,
      pointStyle: 'rectRot',
      pointRadius: 6,
      pointHoverRadius: 8,
      pointHitRadius: 4,
      backgroundColor: c.flagFill,
      borderColor: c.flagEdge,
      borderWidth: 1.5,
      order: 1,
    },
  ];
}

/**
 * A scatter of points with lines over it; hover shows `describe`, click reports the point's row.
 *
 * Viewport first: a chart that is on screen (or within 300 px of it) repaints at once on update; one scrolled out
 * of view keeps the new content and repaints when it comes into view or when the page is next idle, whichever is
 * first. So a redraw lands on what the user is looking at without waiting for the charts below the fold, and
 * those are current by the time anyone scrolls to them. `stale` tells whether a repaint is owed.
 */
export class PointPlot {
  private readonly chart: Chart;
  private content: PlotContent | null = null;
  private onScreen = true;
  private owed = false;
  private readonly observer: IntersectionObserver | null = null;

  constructor(canvas: HTMLCanvasElement, onPick: (row: number) => void) {
    const config: ChartConfiguration<'scatter', PlotPoint[] | XY[]> = {
      type: 'scatter',
      data: { datasets: [] },
      options: {
        ...STATIC_CHART,
        interaction: { mode: 'nearest', intersect: true },
        layout: { padding: 2 },
        scales: {
          x: { type: 'linear', title: { display: true, text: '', ...AXIS_TEXT }, ticks: { ...AXIS_TEXT }, grid: { color: PALETTE.grid } },
          // Every tick of the value axis is labelled (no automatic skipping, which could drop the 0 of a residual
          // axis and keep -1 and 1), and at most six of them so the labels never crowd: ticks fall on multiples of
          // one step, so an axis that spans zero always labels 0.
          y: { type: 'linear', title: { display: true, text: '', ...AXIS_TEXT }, ticks: { ...AXIS_TEXT, autoSkip: false, maxTicksLimit: 6 }, grid: { color: PALETTE.grid } },
        },
        plugins: {
          tooltip: {
            displayColors: false,
            bodyFont: { family: FONT_STACK, size: 11 },
            filter: (item: TooltipItem<'scatter'>) => item.dataset.type === 'scatter',
            callbacks: {
              title: () => '',
              label: (item: TooltipItem<'scatter'>) => (this.content ? this.content.describe(item.raw as PlotPoint) : ''),
            },
          },
        },
        onClick: (_event, elements) => {
          for (const el of elements) {
            const ds = this.chart.data.datasets[el.datasetIndex];
            if (ds.type !== 'scatter') continue;
            const p = (ds.data as PlotPoint[])[el.index];
            if (p) {
              onPick(p.row);
              return;
            }
          }
        },
        onHover: (event, elements) => {
          const target = event.native?.target as HTMLElement | undefined;
          if (target) target.style.cursor = elements.some((e) => this.chart.data.datasets[e.datasetIndex].type === 'scatter') ? 'pointer' : 'default';
        },
      },
    };
    this.chart = new Chart(canvas, config as ChartConfiguration);
    if (typeof IntersectionObserver !== 'undefined') {
      this.observer = new IntersectionObserver(
        (entries) => {
          for (const e of entries) this.onScreen = e.isIntersecting;
          if (this.onScreen) this.flush();
        },
        { rootMargin: '300px 0px' },
      );
      this.observer.observe(canvas);
    }
  }

  /** New content: painted now when on screen, else owed (see the class note). */
  update(content: PlotContent): void {
    this.content = content;
    if (this.onScreen) {
      this.paint();
      return;
    }
    if (!this.owed) {
      this.owed = true;
      onIdle(() => this.flush());
    }
  }

  /** True while new content waits to be painted. */
  get stale(): boolean {
    return this.owed;
  }

  /** Paints owed content now. */
  flush(): void {
    if (this.owed) this.paint();
  }

  private paint(): void {
    this.owed = false;
    const content = this.content;
    if (!content) return;
    const data = this.chart.data as { datasets: (PointDataset | LineDataset)[] };
    const c = paletteOf(this.chart.canvas);
    paintAxes(this.chart, c);
    data.datasets = [...pointDatasets(content.points, c), ...content.lines.map((l) => lineDataset(l, c))];
    const scales = this.chart.options.scales as Record<'x' | 'y', { title: { text: string } }>;
    scales.x.title.text = content.xTitle;
    scales.y.title.text = content.yTitle;
    this.chart.update('none');
  }

  /** The values of the ticks labelled on an axis, as drawn. */
  axisTicks(axis: 'x' | 'y'): number[] {
    this.flush();
    return this.chart.scales[axis].ticks.map((t) => t.value);
  }

  /** Page coordinates (client pixels) of the drawn point of a sheet row, or null when it is not drawn. */
  screenPosition(row: number): { x: number; y: number } | null {
    this.flush();
    const box = this.chart.canvas.getBoundingClientRect();
    for (let d = this.chart.data.datasets.length - 1; d >= 0; d--) {
      const ds = this.chart.data.datasets[d];
      if (ds.type !== 'scatter') continue;
      const p = (ds.data as PlotPoint[]).find((q) => q.row === row);
      if (p) {
        return { x: box.left + this.chart.scales.x.getPixelForValue(p.x), y: box.top + this.chart.scales.y.getPixelForValue(p.y) };
      }
    }
    return null;
  }

  destroy(): void {
    this.observer?.disconnect();
    this.owed = false;
    this.chart.destroy();
  }
}

/** One row of the interval plot: an estimate with its interval. */
export interface IntervalRow {
  label: string;
  estimate: number;
  lower: number;
  upper: number;
  /** The difference row is drawn with a square marker to set it apart from the two correlations. */
  kind: 'correlation' | 'difference';
}

/** Horizontal intervals, one per row, top to bottom, with a dashed line at zero. */
export class IntervalPlot {
  private readonly chart: Chart;
  private labels: string[] = [];

  constructor(canvas: HTMLCanvasElement) {
    this.chart = new Chart(canvas, {
      type: 'scatter',
      data: { datasets: [] },
      options: {
        ...STATIC_CHART,
        events: [],
        layout: { padding: { left: 2, right: 8, top: 2, bottom: 2 } },
        scales: {
          x: { type: 'linear', title: { display: true, text: 'correlation (difference: A − B)', ...AXIS_TEXT }, ticks: { ...AXIS_TEXT }, grid: { color: PALETTE.grid } },
          y: {
            type: 'linear',
            reverse: true,
            grid: { display: false },
            // One tick per row, labelled with the row's name (the default ticks would fall between rows).
            afterBuildTicks: (axis) => {
              axis.ticks = this.labels.map((_, i) => ({ value: i }));
            },
            ticks: { ...AXIS_TEXT, autoSkip: false, callback: (v) => this.labels[Number(v)] ?? '' },
          },
        },
        plugins: { tooltip: { enabled: false } },
      },
    } as ChartConfiguration);
  }

  update(rows: IntervalRow[]): void {
    this.labels = rows.map((r) => r.label);
    const c = paletteOf(this.chart.canvas);
    paintAxes(this.chart, c);
    const datasets: ChartDataset<'line', XY[]>[] = [];
    const finite = rows.filter((r) => Number.isFinite(r.lower) && Number.isFinite(r.upper));
    const lo = Math.min(-0.1, ...finite.map((r) => r.lower));
    const hi = Math.max(0.1, ...finite.map((r) => r.upper));
    datasets.push({
      type: 'line', label: 'zero', data: [{ x: 0, y: -0.5 }, { x: 0, y: rows.length - 0.5 }],
      borderColor: c.reference, borderWidth: 1, borderDash: [3, 3], pointRadius: 0,
    });
    rows.forEach((r, i) => {
      const colour = r.kind === 'difference' ? c.smooth : c.accent;
      datasets.push({
        type: 'line', label: `${r.label} interval`, data: [{ x: r.lower, y: i }, { x: r.upper, y: i }],
        borderColor: colour, borderWidth: 2, pointStyle: 'line', pointRotation: 90, pointRadius: 5,
        pointBorderColor: colour, pointBorderWidth: 2,
      });
      datasets.push({
        type: 'line', label: r.label, data: [{ x: r.estimate, y: i }], showLine: false,
        pointStyle: r.kind === 'difference' ? 'rect' : 'circle', pointRadius: 5,
        pointBackgroundColor: c.surface, pointBorderColor: colour, pointBorderWidth: 2,
      });
    });
    this.chart.data.datasets = datasets as ChartDataset[];
    const scales = this.chart.options.scales as Record<'x' | 'y', { min?: number; max?: number }>;
    // Limits on a 0.1 grid so the ticks read evenly.
    const pad = (hi - lo) * 0.04;
    scales.x.min = Math.max(-2, Math.floor((lo - pad) * 10) / 10);
    scales.x.max = Math.min(2, Math.ceil((hi + pad) * 10) / 10);
    scales.y.min = -0.5;
    scales.y.max = rows.length - 0.5;
    this.chart.update('none');
  }

  destroy(): void {
    this.chart.destroy();
  }
}
