/**
 * Task pane entry inside Excel: waits for Office, then mounts the panel on the Excel implementation of the
 * workbook interface. Everything else lives in panel.ts (host-free) and excel-workbook.ts (the only module that
 * calls Office.js).
 */
import { ExcelWorkbook } from './excel-workbook';
import { mountPanel } from './panel';

Office.onReady((info) => {
  const root = document.getElementById('app');
  if (!root) return;
  if (info.host !== Office.HostType.Excel) {
    root.textContent = 'Covary runs inside Excel. To try it without Office, run "npm start" and open the workbench.';
    return;
  }
  mountPanel(root, new ExcelWorkbook());
});
