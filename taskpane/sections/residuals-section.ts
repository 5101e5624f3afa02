/**
 * Section 2, Residual diagnostics: residuals against fitted values, the normal Q-Q plot of the residuals and the
 * residuals in sheet row order, all from the same RelationshipView as section 1, with the same point marks.
 */
import { PointPlot } from '../charts';
import { el, fill } from '../dom';
import { PANEL_TEST_IDS } from '../panel-api';
import { RelationshipView } from '../relationship';
import { ChartBox, chartBox, section } from '../widgets';
import { describer, markFrame, pointsOf, pointTable } from './plot-points';

export type ResidualChartName = 'residuals' | 'qq' | 'order';

export class ResidualsSection {
  readonly root: HTMLElement;
  readonly plots: Record<ResidualChartName, PointPlot>;
  private readonly frames: Record<ResidualChartName, HTMLElement>;
  private readonly boxes: Record<ResidualChartName, ChartBox>;
  private readonly waiting: HTMLElement;
  private readonly results: HTMLElement;

  constructor(pick: (row: number) => void) {
    const { root, body } = section('2', 'Residual diagnostics', 'section-residuals');
    this.root = root;
    const residuals = chartBox(PANEL_TEST_IDS.residuals, 'Residuals against fitted values', 'A band of even width around zero is good; a curve or a funnel is not.');
    const qq = chartBox(PANEL_TEST_IDS.qq, 'Normal Q-Q plot of the residuals', 'Points near the dashed line: residuals close to normal.');
    const order = chartBox(PANEL_TEST_IDS.order, 'Residuals in sheet row order', 'Runs of same-sign residuals suggest neighbouring rows are alike.');
    this.plots = { residuals: new PointPlot(residuals.canvas, pick), qq: new PointPlot(qq.canvas, pick), order: new PointPlot(order.canvas, pick) };
    this.frames = { residuals: residuals.frame, qq: qq.frame, order: order.frame };
    this.boxes = { residuals, qq, order };
    this.waiting = el('p', { class: 'cv-hint', text: 'The residual plots appear once a pair of columns gives a result.' });
    this.results = el('div', { class: 'cv-results cv-hidden' }, [
      el('p', { class: 'cv-hint', text: 'Hover a point to see its sheet row; click it to select that row.' }),
      residuals.root,
      qq.root,
      order.root,
    ]);
    fill(body, [this.waiting, this.results]);
  }

  /** Shows the plots (true) or the note that they come with a result (false). */
  show(on: boolean): void {
    this.results.classList.toggle('cv-hidden', !on);
    this.waiting.classList.toggle('cv-hidden', on);
  }

  render(v: RelationshipView): void {
    this.show(true);
    const d = v.drawn;
    const describe = describer(v);
    let fMin = Infinity;
    let fMax = -Infinity;
    let rowMin = Infinity;
    let rowMax = -Infinity;
    let zMin = Infinity;
    let zMax = -Infinity;
    for (let k = 0; k < d.fitted.length; k++) {
      fMin = Math.min(fMin, d.fitted[k]);
      fMax = Math.max(fMax, d.fitted[k]);
      rowMin = Math.min(rowMin, d.rows[k]);
      rowMax = Math.max(rowMax, d.rows[k]);
      zMin = Math.min(zMin, d.normalScore[k]);
      zMax = Math.max(zMax, d.normalScore[k]);
    }
    this.plots.residuals.update({
      points: pointsOf(v, d.fitted, d.residuals),
      lines: [{ kind: 'reference', label: 'zero', points: [{ x: fMin, y: 0 }, { x: fMax, y: 0 }] }],
      xTitle: `fitted ${v.yHeader}`,
      yTitle: 'residual',
      describe,
    });
    this.plots.qq.update({
      points: pointsOf(v, d.normalScore, d.residuals),
      lines: [{ kind: 'reference', label: 'quartile line', points: [zMin, zMax].map((z) => ({ x: z, y: v.qqLine.intercept + v.qqLine.slope * z })) }],
      xTitle: 'normal quantile',
      yTitle: 'residual (sorted)',
      describe,
    });
    this.plots.order.update({
      points: pointsOf(v, d.rows, d.residuals),
      lines: [{ kind: 'reference', label: 'zero', points: [{ x: rowMin, y: 0 }, { x: rowMax, y: 0 }] }],
      xTitle: 'sheet row',
      yTitle: 'residual',
      describe,
    });
    for (const name of Object.keys(this.frames) as ResidualChartName[]) markFrame(this.frames[name], v);
    this.boxes.residuals.describeData(pointTable(v, 'Residuals against fitted values', `fitted ${v.yHeader}`, 'residual', d.fitted, d.residuals));
    this.boxes.qq.describeData(pointTable(v, 'Normal Q-Q plot of the residuals', 'normal quantile', 'residual', d.normalScore, d.residuals));
    this.boxes.order.describeData(pointTable(v, 'Residuals in sheet row order', 'sheet row', 'residual', d.rows, d.residuals));
  }

  destroy(): void {
    for (const p of Object.values(this.plots)) p.destroy();
  }
}
