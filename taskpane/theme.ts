/**
 * The panel's light and dark themes. Inside Excel the pane follows the host: Office.context.officeTheme gives the
 * colours of the Office theme in use (Office.js requirement set: the OfficeTheme object of Office.context), and a
 * body background darker than mid-grey means a dark theme. Everything the panel paints takes its colours from
 * custom properties (panel.css), so a theme is one class on the root the panel is mounted on.
 */
export type PanelTheme = 'light' | 'dark';

/** The part of Office's OfficeTheme this reads (hosts differ in which fields they fill). */
export interface HostTheme {
  bodyBackgroundColor?: string;
  isDarkTheme?: boolean;
}

/** Relative luminance of a "#rrggbb" or "#rgb" colour (WCAG 2.1 definition), or null when it is not one. */
export function luminance(colour: string): number | null {
  const m = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(colour.trim());
  if (!m) return null;
  const hex = m[1].length === 3 ? m[1].replace(/./g, (c) => c + c) : m[1];
  const [r, g, b] = [0, 2, 4].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** The theme for a host's theme: its own word when it gives one, else dark when its background is darker than
 *  mid-grey (luminance below 0.18, the luminance of #767676), else light. No host theme: light. */
export function themeOf(host: HostTheme | null | undefined): PanelTheme {
  if (!host) return 'light';
  if (typeof host.isDarkTheme === 'boolean') return host.isDarkTheme ? 'dark' : 'light';
  const l = host.bodyBackgroundColor ? luminance(host.bodyBackgroundColor) : null;
  return l !== null && l < 0.18 ? 'dark' : 'light';
}

/** Puts a theme on the element the panel is mounted on. */
export function applyTheme(root: HTMLElement, theme: PanelTheme): void {
  root.classList.toggle('cv-theme-dark', theme === 'dark');
  root.setAttribute('data-theme', theme);
}
