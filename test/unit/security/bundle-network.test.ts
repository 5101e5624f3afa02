/**
 * Nothing leaves the workbook: the built bundles (dist/*.js) contain no network call. Office.js itself is loaded
 * from Microsoft's CDN by the task pane page and is not bundled, so it is not scanned here.
 *
 * Every occurrence of a network API or of an absolute URL must match an allow-list entry below, each with its
 * reason; an entry allows at most `count` occurrences in its file, so a new call is caught even where an old one
 * is allowed. Needs `npm run build` first.
 */
import * as fs from 'fs';
import * as path from 'path';
import { distFile } from '../../helpers/bare-host';

interface Rule {
  name: string;
  pattern: RegExp;
}

/** Ways a page or worker can send data or load code from elsewhere. */
const NETWORK_APIS: Rule[] = [
  { name: 'fetch(', pattern: /\bfetch\s*\(/g },
  { name: 'XMLHttpRequest', pattern: /XMLHttpRequest/g },
  { name: 'WebSocket', pattern: /WebSocket/g },
  { name: 'EventSource', pattern: /EventSource/g },
  { name: 'sendBeacon', pattern: /sendBeacon/g },
  { name: 'WebTransport', pattern: /WebTransport/g },
  { name: 'RTCPeerConnection', pattern: /RTCPeerConnection|RTCDataChannel/g },
  { name: 'new Image (image beacon)', pattern: /new\s+Image\s*\(/g },
  { name: 'createElement("img"|"script"|"iframe"|"link"|"form")', pattern: /createElement\(\s*["'`](img|script|iframe|link|form|object|embed)["'`]/gi },
  { name: '.src = (beacon or remote script)', pattern: /\.src\s*=[^=]/g },
  { name: '.href = / location.assign (navigation carries data in the URL)', pattern: /location\.(assign|replace)\s*\(|location\.href\s*=[^=]|\.href\s*=[^=]/g },
  { name: 'window.open', pattern: /window\.open\s*\(/g },
  { name: 'form submit', pattern: /\.submit\s*\(/g },
  { name: 'serviceWorker / SharedWorker', pattern: /serviceWorker|SharedWorker/g },
  { name: 'dynamic import()', pattern: /\bimport\s*\(/g },
  { name: 'eval / new Function (code from strings)', pattern: /\beval\s*\(|new\s+Function\s*\(/g },
];

interface Allowed {
  file: string;
  rule: string;
  count: number;
  reason: string;
}

/** Occurrences that are not network calls, or only reach the page's own origin; each says why. */
const ALLOWED: Allowed[] = [
  {
    file: 'workbench.js',
    rule: 'fetch(',
    count: 1,
    reason:
      "workbench/function-metadata.ts reads functions.json from beside the page (a relative URL, same origin; the workbench's CSP has connect-src 'self'). The workbench is a development page, not part of the add-in.",
  },
  ...(['taskpane.js', 'workbench.js'] as const).map((file) => ({
    file,
    rule: '.href = / location.assign (navigation carries data in the URL)',
    count: 1,
    reason:
      "a chart's Save PNG (taskpane/widgets.ts): the link's href is a blob: URL that URL.createObjectURL makes in the page from the chart's own canvas; following it downloads that picture, and nothing leaves the page.",
  })),
];

/** Absolute URLs that may appear in a bundle, with why. */
const ALLOWED_URLS: { pattern: RegExp; reason: string }[] = [
  { pattern: /^https:\/\/appsforoffice\.microsoft\.com\/lib\/1\/hosted\/office\.js$/, reason: 'the Office.js CDN, which Microsoft requires add-ins to load Office.js from' },
  { pattern: /^http:\/\/www\.w3\.org\/(2000\/svg|1999\/xhtml|1999\/xlink|XML\/1998\/namespace|2000\/xmlns\/?)$/, reason: 'XML namespace names (identifiers, never fetched)' },
  { pattern: /^https?:\/\/(opensource\.org\/licenses\/MIT|www\.apache\.org\/licenses\/LICENSE-2\.0|github\.com\/chartjs\/Chart\.js|www\.chartjs\.org)\/?$/, reason: 'licence and project links kept in third-party licence comments (text, never fetched)' },
];

const bundles = fs.existsSync(distFile('.'))
  ? fs.readdirSync(distFile('.')).filter((f) => f.endsWith('.js') && !/^office(\.debug)?\.js$/i.test(f))
  : [];

describe('built bundles make no network call', () => {
  test('dist/ holds the bundles (run `npm run build` first)', () => {
    expect(bundles).toEqual(expect.arrayContaining(['functions.js', 'taskpane.js']));
  });

  test.each(bundles)('%s: no network API beyond the allow-list', (file) => {
    const source = fs.readFileSync(path.join(distFile('.'), file), 'utf8');
    const problems: string[] = [];
    for (const rule of NETWORK_APIS) {
      const hits = [...source.matchAll(rule.pattern)];
      if (hits.length === 0) continue;
      const allowed = ALLOWED.find((a) => a.file === file && a.rule === rule.name)?.count ?? 0;
      if (hits.length > allowed) {
        const where = hits.slice(0, 3).map((h) => JSON.stringify(source.slice(Math.max(0, h.index! - 60), h.index! + 60)));
        problems.push(`${rule.name}: ${hits.length} found, ${allowed} allowed; e.g. ${where.join(' | ')}`);
      }
    }
    expect(problems).toEqual([]);
  });

  test.each(bundles)('%s: every absolute URL is on the allow-list', (file) => {
    const source = fs.readFileSync(path.join(distFile('.'), file), 'utf8');
    const urls = [...source.matchAll(/(?:https?:)?\/\/[a-z0-9.-]+\.[a-z]{2,}[^\s"'`)<>\\]*/gi)]
      .map((m) => m[0])
      // `//` also starts comments and regular expressions in minified code: keep only scheme-qualified URLs and
      // protocol-relative ones that name a host with a dot.
      .filter((u) => /^https?:/i.test(u) || /^\/\/[a-z0-9-]+(\.[a-z0-9-]+)+\//i.test(u));
    const unexpected = urls.filter((u) => !ALLOWED_URLS.some((a) => a.pattern.test(u)));
    expect(unexpected).toEqual([]);
  });

  test.each(bundles)('%s: importScripts loads only local files', (file) => {
    const source = fs.readFileSync(path.join(distFile('.'), file), 'utf8');
    for (const m of source.matchAll(/importScripts\(([^)]*)\)/g)) {
      // Only a constant, relative script name: nothing from another origin, nothing computed.
      expect(m[1]).toMatch(/^\s*["'][\w./-]+\.js["']\s*$/);
      expect(m[1]).not.toMatch(/\/\/|:/);
    }
  });

  test('the allow-list has a reason for every entry', () => {
    for (const a of ALLOWED) expect(a.reason.length).toBeGreaterThan(20);
    for (const a of ALLOWED_URLS) expect(a.reason.length).toBeGreaterThan(10);
  });
});
