/**
 * The panel's small building blocks: a section with its heading, a statistic tile, a chart frame, the legend of
 * the point charts, and a message box that hides when empty. All DOM through dom.ts (text, never markup).
 */
import { paletteOf } from './charts';
import { el } from './dom';

/** A numbered section: the root to place and the body to fill. */
export function section(number: string, title: string, testid: string): { root: HTMLElement; body: HTMLElement } {
  const body = el('div', { class: 'cv-section-body' });
  const root = el('section', { class: 'cv-section', testid, attrs: { 'aria-label': title } }, [
    el('h2', { class: 'cv-section-title' }, [el('span', { class: 'cv-section-number', text: number }), el('span', { text: title })]),
    body,
  ]);
  return { root, body };
}

export interface Tile {
  root: HTMLElement;
  value: HTMLElement;
  caption: HTMLElement;
  sub: HTMLElement;
}

/** A statistic tile: a small caption over a large value, with a line below for detail. */
export function tile(caption: string, testid: string, captionTestid?: string): Tile {
  const cap = el('div', { class: 'cv-tile-caption', text: caption, testid: captionTestid });
  const value = el('div', { class: 'cv-tile-value', text: '–', testid });
  const sub = el('div', { class: 'cv-tile-sub' });
  return { root: el('div', { class: 'cv-tile' }, [cap, value, sub]), value, caption: cap, sub };
}

/** The numbers a chart shows, for its text alternative: a one-line summary and a table built on request. */
export interface ChartData {
  summary: string;
  columns: string[];
  rows: () => (string | number)[][];
}

/** A titled chart and what comes with every chart: its note, a text alternative, and a picture to take away. */
export interface ChartBox {
  root: HTMLElement;
  canvas: HTMLCanvasElement;
  frame: HTMLElement;
  /** Sets what the chart shows in words and numbers (the summary the canvas is described by, and the table). */
  describeData(data: ChartData): void;
}

/** The canvas on the pane's own surface colour (the panel's charts draw on a transparent canvas; the light theme's
 *  white, the dark theme's dark grey, so the axis text keeps its contrast), as a PNG. */
export function chartPicture(canvas: HTMLCanvasElement): Promise<Blob> {
  const out = document.createElement('canvas');
  out.width = canvas.width;
  out.height = canvas.height;
  const g = out.getContext('2d');
  if (!g) return Promise.reject(new Error('this browser cannot draw the picture'));
  g.fillStyle = paletteOf(canvas).surface;
  g.fillRect(0, 0, out.width, out.height);
  g.drawImage(canvas, 0, 0);
  return new Promise((resolve, reject) => out.toBlob((b) => (b ? resolve(b) : reject(new Error('the picture could not be made'))), 'image/png'));
}

/**
 * A titled chart with its canvas and an optional note under it; below them "Save PNG" and "Copy picture" (so the
 * picture can go into a slide or a mail), and a fold "Numbers behind this chart" holding a table of what is
 * plotted, built when opened (a text alternative reachable by keyboard; the canvas is described by the summary).
 */
export function chartBox(testid: string, title: string, note?: string): ChartBox {
  const summary = el('p', { class: 'cv-visually-hidden', testid: `${testid}-summary`, attrs: { id: `${testid}-summary` } });
  const canvas = el('canvas', { testid, attrs: { role: 'img', 'aria-label': title, 'aria-describedby': `${testid}-summary` } });
  const frame = el('div', { class: 'cv-chart-frame', testid: `${testid}-frame` }, [canvas]);
  const said = el('span', { class: 'cv-chart-said', attrs: { role: 'status' } });
  const save = el('button', { class: 'cv-link', text: 'Save PNG', testid: `${testid}-save`, attrs: { type: 'button' } });
  const copy = el('button', { class: 'cv-link', text: 'Copy picture', testid: `${testid}-copy`, attrs: { type: 'button' } });
  // Focusable, so a keyboard can scroll a long table (the region scrolls within the panel).
  const tableHolder = el('div', { class: 'cv-chart-table', testid: `${testid}-table`, attrs: { tabindex: '0', role: 'region', 'aria-label': `Numbers behind: ${title}` } });
  const details = el('details', { class: 'cv-chart-data' }, [el('summary', { text: 'Numbers behind this chart' }), tableHolder]);
  let data: ChartData | null = null;
  let built = false;
  const build = () => {
    if (!data || built) return;
    built = true;
    const head = el('tr', {}, data.columns.map((c) => el('th', { text: c, attrs: { scope: 'col' } })));
    const body = data.rows().map((r) => el('tr', {}, r.map((v) => el('td', { text: typeof v === 'number' ? String(Number(v.toPrecision(6))) : v }))));
    tableHolder.replaceChildren(el('table', {}, [el('caption', { class: 'cv-visually-hidden', text: title }), el('thead', {}, [head]), el('tbody', {}, body)]));
  };
  details.addEventListener('toggle', () => {
    if (details.open) build();
  });
  save.addEventListener('click', () => {
    chartPicture(canvas).then(
      (blob) => {
        const url = URL.createObjectURL(blob);
        // The href is a blob: URL made just above from the chart's own canvas, never text from a cell (reviewed in
        // test/unit/security/no-markup-from-data.test.ts).
        const a = el('a', { attrs: { download: `covary-${testid}.png` } });
        a.href = url;
        document.body.appendChild(a);
        a.click();
        a.remove();
        setTimeout(() => URL.revokeObjectURL(url), 10000);
        said.textContent = 'Saved.';
      },
      (e: unknown) => (said.textContent = `Could not save: ${e instanceof Error ? e.message : String(e)}`),
    );
  });
  copy.addEventListener('click', () => {
    const clip = (globalThis as { navigator?: Navigator }).navigator?.clipboard;
    const Item = (globalThis as { ClipboardItem?: typeof ClipboardItem }).ClipboardItem;
    if (!clip || !Item) {
      said.textContent = 'This host does not allow copying pictures: use Save PNG.';
      return;
    }
    clip.write([new Item({ 'image/png': chartPicture(canvas) })]).then(
      () => (said.textContent = 'Copied: paste it into a slide or a mail.'),
      () => (said.textContent = 'This host did not allow copying the picture: use Save PNG.'),
    );
  });
  const root = el('figure', { class: 'cv-chart' }, [
    el('figcaption', { class: 'cv-chart-title', text: title }),
    frame,
    note ? el('div', { class: 'cv-chart-note', text: note }) : null,
    summary,
    el('div', { class: 'cv-chart-tools' }, [save, copy, said]),
    details,
  ]);
  return {
    root,
    canvas,
    frame,
    describeData(d: ChartData) {
      data = d;
      built = false;
      summary.textContent = d.summary;
      if (details.open) build();
      else tableHolder.replaceChildren();
    },
  };
}

/** The key to the point charts' marks. */
export function legend(): HTMLElement {
  const item = (cls: string, text: string): HTMLElement => el('span', { class: 'cv-legend-item' }, [el('span', { class: `cv-key ${cls}` }), el('span', { text })]);
  return el('div', { class: 'cv-legend', attrs: { 'aria-hidden': 'true' } }, [
    item('cv-key-point', 'rows'),
    item('cv-key-flag', 'flagged row'),
    item('cv-key-fit', 'straight line'),
    item('cv-key-smooth', 'LOWESS smooth'),
  ]);
}

/** A message box (an alert): shows `text`, or hides when there is none. */
export function showMessage(box: HTMLElement, text: string | null): void {
  box.textContent = text ?? '';
  box.classList.toggle('cv-hidden', !text);
}
