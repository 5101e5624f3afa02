/** Section 4, Cautions: what to weigh before acting on a correlation (the same lines as the report sheet). */
import { el, fill } from '../dom';
import { REPORT_CAUTIONS } from '../sheet-output';
import { section } from '../widgets';

export function cautionsSection(): HTMLElement {
  const { root, body } = section('4', 'Cautions', 'section-cautions');
  fill(body, [el('ul', { class: 'cv-cautions', testid: 'cautions' }, REPORT_CAUTIONS.map((c) => el('li', { text: c })))]);
  return root;
}
