/**
 * The built pages carry a Content-Security-Policy that lets only the add-in's own scripts run (plus Office.js
 * from Microsoft's CDN in the task pane), forbids inline and string-evaluated code, and limits connections to the
 * page's own origin (plus the Office.js host, which Office.js itself talks to). Checked on dist/taskpane.html and
 * dist/workbench.html as built (`npm run build` first), following CSP Level 3 (W3C): a directive that is absent
 * falls back to default-src for fetch directives (script-src, connect-src, ...), while base-uri, form-action and
 * the like do not fall back and must be given.
 */
import * as fs from 'fs';
import { distFile } from '../../helpers/bare-host';

const OFFICE_JS_HOST = 'https://appsforoffice.microsoft.com';
const OFFICE_JS = `${OFFICE_JS_HOST}/lib/1/hosted/office.js`;

type Policy = Map<string, string[]>;

function policyOf(html: string): Policy | undefined {
  const meta = [...html.matchAll(/<meta\b[^>]*>/gi)].map((m) => m[0]).find((m) => /http-equiv\s*=\s*["']?Content-Security-Policy/i.test(m));
  if (!meta) return undefined;
  const content = /content\s*=\s*"([^"]*)"|content\s*=\s*'([^']*)'/i.exec(meta);
  const text = content ? (content[1] ?? content[2]) : '';
  const policy: Policy = new Map();
  for (const part of text.split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) policy.set(name.toLowerCase(), values);
  }
  return policy;
}

/** The sources a fetch directive allows, after falling back to default-src. */
function effective(policy: Policy, directive: string): string[] | undefined {
  return policy.get(directive) ?? policy.get('default-src');
}

const PAGES = [
  { file: 'taskpane.html', scriptHosts: [OFFICE_JS_HOST], connectHosts: [OFFICE_JS_HOST] },
  { file: 'workbench.html', scriptHosts: [] as string[], connectHosts: [] as string[] },
];

describe.each(PAGES)('$file', ({ file, scriptHosts, connectHosts }) => {
  const html = fs.existsSync(distFile(file)) ? fs.readFileSync(distFile(file), 'utf8') : '';
  const policy = policyOf(html);

  test('is built and carries a Content-Security-Policy meta element in its head', () => {
    expect(html).not.toBe('');
    expect(policy).toBeDefined();
    const head = html.split(/<body\b/i)[0];
    expect(head).toMatch(/Content-Security-Policy/i);
  });

  test("scripts: only 'self' (and the Office.js host in the task pane); no inline, no eval", () => {
    const scripts = effective(policy!, 'script-src') ?? [];
    expect(scripts.length).toBeGreaterThan(0);
    expect(scripts.filter((s) => s !== "'self'").sort()).toEqual([...scriptHosts].sort());
    for (const directive of ['script-src-elem', 'script-src-attr', 'worker-src']) {
      const extra = policy!.get(directive);
      if (extra) expect(extra.every((s) => s === "'self'" || s === "'none'" || scriptHosts.includes(s))).toBe(true);
    }
  });

  test("no 'unsafe-inline', 'unsafe-eval', 'unsafe-hashes', 'wasm-unsafe-eval', wildcard or scheme-wide source anywhere", () => {
    for (const [directive, values] of policy!) {
      for (const v of values) {
        expect(`${directive} ${v}`).not.toMatch(/'unsafe-|'wasm-unsafe-eval'|\*/);
        // data: only for images (inline icons); blob: only for images/workers of the page itself.
        if (/^(data|blob|https?|wss?|filesystem):$/i.test(v)) expect(`${directive} ${v}`).toMatch(/^img-src (data|blob):$/);
      }
    }
  });

  test('connections: only the page itself (and the Office.js host in the task pane)', () => {
    const connect = effective(policy!, 'connect-src') ?? [];
    expect(connect.filter((s) => s !== "'self'" && s !== "'none'").sort()).toEqual([...connectHosts].sort());
  });

  test("no plugins, no <base> rewriting, no form posting elsewhere (directives without a default-src fallback)", () => {
    expect(effective(policy!, 'object-src')).toEqual(["'none'"]);
    expect(policy!.get('base-uri')).toEqual(expect.arrayContaining([expect.stringMatching(/^'(none|self)'$/)]));
    expect(policy!.get('form-action')).toEqual(expect.arrayContaining([expect.stringMatching(/^'(none|self)'$/)]));
  });

  test('every script is the bundle of this page or Office.js from the CDN; no inline script or handler', () => {
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attrs, body] of scripts) {
      const src = /\bsrc\s*=\s*["']?([^"'\s>]+)/i.exec(attrs)?.[1];
      expect(src).toBeDefined();
      expect(body.trim()).toBe('');
      if (/^https?:|^\/\//i.test(src!)) expect(src).toBe(OFFICE_JS);
    }
    expect(html).not.toMatch(/\son[a-z]+\s*=/i);
    expect(html).not.toMatch(/javascript:/i);
    for (const [, href] of html.matchAll(/<link\b[^>]*\bhref\s*=\s*["']?([^"'\s>]+)/gi)) expect(href).not.toMatch(/^https?:|^\/\//i);
  });
});
