/**
 * The panel's small building blocks: a section with its heading, a statistic tile, a chart frame, the legend of
 * the point charts, and a message box that hides when empty. All DOM through dom.ts (text, never markup).
 */
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

/** A titled chart with its canvas and an optional note under it. */
export function chartBox(testid: string, title: string, note?: string): { root: HTMLElement; canvas: HTMLCanvasElement; frame: HTMLElement } {
  const canvas = el('canvas', { testid, attrs: { role: 'img', 'aria-label': title } });
  const frame = el('div', { class: 'cv-chart-frame', testid: `${testid}-frame` }, [canvas]);
  const root = el('figure', { class: 'cv-chart' }, [
    el('figcaption', { class: 'cv-chart-title', text: title }),
    frame,
    note ? el('div', { class: 'cv-chart-note', text: note }) : null,
  ]);
  return { root, canvas, frame };
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
