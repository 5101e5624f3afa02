/**
 * Task pane entry inside Excel: waits for Office, then mounts the panel on the Excel implementation of the
 * workbook interface, in the light or dark theme of the Office theme in use. Everything else lives in panel.ts
 * (host-free) and excel-workbook.ts (the only module that calls Office.js).
 */
import { ExcelWorkbook } from './excel-workbook';
import { mountPanel } from './panel';
import { HostTheme, themeOf } from './theme';

/** The Office theme now (read again when the pane regains focus: Excel sends no theme-change event). */
function hostTheme(): HostTheme | null {
  return (Office.context as unknown as { officeTheme?: HostTheme }).officeTheme ?? null;
}

Office.onReady((info) => {
  const root = document.getElementById('app');
  if (!root) return;
  if (info.host !== Office.HostType.Excel) {
    root.textContent = 'Covary runs inside Excel. To try it without Office, run "npm start" and open the workbench.';
    return;
  }
  let theme = themeOf(hostTheme());
  document.body.classList.toggle('cv-theme-dark', theme === 'dark');
  const panel = mountPanel(root, new ExcelWorkbook(), { theme });
  const follow = (): void => {
    const now = themeOf(hostTheme());
    if (now === theme) return;
    theme = now;
    document.body.classList.toggle('cv-theme-dark', theme === 'dark');
    panel.setTheme(theme);
  };
  window.addEventListener('focus', follow);
  document.addEventListener('visibilitychange', follow);
});
