/**
 * The only way the panel builds DOM: elements with classes, text content and attributes. Text from cells
 * (headers, sheet names, values) goes in as textContent, never as markup; no innerHTML anywhere in the panel.
 */
export interface ElementSpec {
  class?: string;
  text?: string;
  testid?: string;
  attrs?: Record<string, string>;
}

export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  spec: ElementSpec = {},
  children: (Node | null | undefined)[] = [],
): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  if (spec.class) node.className = spec.class;
  if (spec.text !== undefined) node.textContent = spec.text;
  if (spec.testid) node.setAttribute('data-testid', spec.testid);
  if (spec.attrs) {
    for (const [k, v] of Object.entries(spec.attrs)) {
      // Inline styles and event-handler attributes are never set from here (strict CSP; text is data).
      if (k === 'style' || /^on/i.test(k)) throw new Error(`attribute ${k} is not allowed`);
      node.setAttribute(k, v);
    }
  }
  for (const c of children) if (c) node.appendChild(c);
  return node;
}

/** Removes every child of a node. */
export function clear(node: Node): void {
  while (node.firstChild) node.removeChild(node.firstChild);
}

/** Replaces a node's children with the given ones. */
export function fill(node: Node, children: (Node | null | undefined)[]): void {
  clear(node);
  for (const c of children) if (c) node.appendChild(c);
}

/** A <select> whose options are built from text (never markup). */
export function select(testid: string, options: { value: string; label: string }[], label: string): HTMLSelectElement {
  const s = el('select', { class: 'cv-select', testid, attrs: { 'aria-label': label } });
  setOptions(s, options);
  return s;
}

export function setOptions(s: HTMLSelectElement, options: { value: string; label: string }[], keep = true): void {
  const previous = s.value;
  clear(s);
  for (const o of options) {
    const opt = document.createElement('option');
    opt.value = o.value;
    opt.textContent = o.label;
    s.appendChild(opt);
  }
  if (keep && options.some((o) => o.value === previous)) s.value = previous;
}

export function button(text: string, testid: string, kind: 'primary' | 'secondary' = 'secondary'): HTMLButtonElement {
  return el('button', { class: `cv-button cv-button-${kind}`, text, testid, attrs: { type: 'button' } });
}

/** Runs `fn` when the page is idle (soon in any case), or after a short delay where idle callbacks are missing. */
export function onIdle(fn: () => void): void {
  const w = globalThis as unknown as { requestIdleCallback?: (cb: () => void, o?: { timeout: number }) => number };
  if (typeof w.requestIdleCallback === 'function') w.requestIdleCallback(fn, { timeout: 300 });
  else setTimeout(fn, 50);
}
