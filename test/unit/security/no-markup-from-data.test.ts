/**
 * Cell text is data, never markup: the panel (taskpane/) and the workbench (workbench/) never hand a non-constant
 * string to an API that parses HTML or runs code. Checked statically on the TypeScript sources with the
 * compiler's own parser (so comments and strings cannot hide or fake a hit):
 * - assignments to innerHTML / outerHTML / srcdoc, and calls of insertAdjacentHTML, document.write / writeln,
 *   createContextualFragment, DOMParser.parseFromString, setHTMLUnsafe: only with a string literal;
 * - eval, new Function, and setTimeout / setInterval with a string: never;
 * - setAttribute of an event-handler attribute (on...) or of href/src/action/formaction/srcdoc: only with
 *   literals (a computed value there could be "javascript:..." or a beacon URL); the panel's el(tag, { attrs })
 *   helper only with attribute names written in code, none of them a handler or URL attribute; and a URL
 *   property (a.href = ..., .src, ...) only from a literal, or in a reviewed place (REVIEWED_URLS).
 * The browser tests of the workbench check the live behaviour (markup typed into headers and cells shows as text).
 */
import * as fs from 'fs';
import * as path from 'path';
import ts from 'typescript';

const ROOT = path.resolve(__dirname, '../../..');
const SOURCE_DIRS = ['taskpane', 'workbench', 'src'];

function sourceFiles(dir: string): string[] {
  const abs = path.join(ROOT, dir);
  if (!fs.existsSync(abs)) return [];
  return fs.readdirSync(abs, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(p);
    return /\.ts$/.test(e.name) && !/\.d\.ts$/.test(e.name) ? [p] : [];
  });
}

const isLiteral = (n: ts.Node | undefined): boolean => !!n && (ts.isStringLiteral(n) || ts.isNoSubstitutionTemplateLiteral(n));
const HTML_SINKS = new Set(['innerHTML', 'outerHTML', 'srcdoc']);
const HTML_CALLS = new Set(['insertAdjacentHTML', 'write', 'writeln', 'createContextualFragment', 'parseFromString', 'setHTMLUnsafe']);
const URL_ATTRIBUTES = /^(href|src|action|formaction|srcdoc|xlink:href)$/i;

/** Every place in one file where data could become markup or code. */
export function markupSinks(file: string, text: string): string[] {
  const sf = ts.createSourceFile(file, text, ts.ScriptTarget.ES2020, true);
  const found: string[] = [];
  const where = (n: ts.Node) => `${file}:${sf.getLineAndCharacterOfPosition(n.getStart()).line + 1}`;
  const visit = (n: ts.Node): void => {
    // x.innerHTML = value (also +=)
    if (ts.isBinaryExpression(n) && ts.isPropertyAccessExpression(n.left) && HTML_SINKS.has(n.left.name.text)) {
      if (!isLiteral(n.right) || n.operatorToken.kind !== ts.SyntaxKind.EqualsToken) found.push(`${where(n)} ${n.left.name.text} = ${n.right.getText(sf).slice(0, 60)}`);
    }
    if (ts.isCallExpression(n)) {
      const callee = n.expression;
      const name = ts.isPropertyAccessExpression(callee) ? callee.name.text : ts.isIdentifier(callee) ? callee.text : '';
      if (ts.isPropertyAccessExpression(callee) && HTML_CALLS.has(name)) {
        // document.write(...), el.insertAdjacentHTML(pos, html), range.createContextualFragment(html), parser.parseFromString(html, type)
        const markupArg = name === 'insertAdjacentHTML' ? n.arguments[1] : n.arguments[0];
        const isDocumentWrite = (name === 'write' || name === 'writeln') && /document$/.test(callee.expression.getText(sf));
        if ((name !== 'write' && name !== 'writeln') || isDocumentWrite) {
          if (!isLiteral(markupArg)) found.push(`${where(n)} ${name}(${markupArg?.getText(sf).slice(0, 60)})`);
        }
      }
      if (ts.isIdentifier(callee) && callee.text === 'eval') found.push(`${where(n)} eval`);
      if ((name === 'setTimeout' || name === 'setInterval') && n.arguments[0] && (isLiteral(n.arguments[0]) || ts.isTemplateExpression(n.arguments[0]))) {
        found.push(`${where(n)} ${name} with a string`);
      }
      if (name === 'setAttribute' && n.arguments.length >= 2) {
        const attr = n.arguments[0];
        const value = n.arguments[1];
        if (!isLiteral(attr)) {
          // A computed attribute name is fine only when the value is a literal too.
          if (!isLiteral(value)) found.push(`${where(n)} setAttribute(${attr.getText(sf)}, ${value.getText(sf).slice(0, 40)}) with a computed name and value`);
        } else {
          const a = (attr as ts.StringLiteral).text;
          if ((/^on/i.test(a) || URL_ATTRIBUTES.test(a)) && !isLiteral(value)) found.push(`${where(n)} setAttribute('${a}', ${value.getText(sf).slice(0, 40)})`);
        }
      }
    }
    if (ts.isNewExpression(n) && ts.isIdentifier(n.expression) && n.expression.text === 'Function') found.push(`${where(n)} new Function`);
    // a.href = value (and src, action, ...): a URL set from anything but a literal.
    if (ts.isBinaryExpression(n) && n.operatorToken.kind === ts.SyntaxKind.EqualsToken && ts.isPropertyAccessExpression(n.left) && URL_ATTRIBUTES.test(n.left.name.text) && !isLiteral(n.right)) {
      found.push(`${where(n)} URL property .${n.left.name.text} = ${n.right.getText(sf).slice(0, 40)}`);
    }
    // el(tag, { attrs: { ... } }) in the panel: attribute names written in code, none of them a handler or URL.
    if (ts.isPropertyAssignment(n) && n.name.getText(sf) === 'attrs') {
      if (!ts.isObjectLiteralExpression(n.initializer)) found.push(`${where(n)} attrs computed: ${n.initializer.getText(sf).slice(0, 40)}`);
      else {
        for (const p of n.initializer.properties) {
          const name = p.name ? p.name.getText(sf).replace(/^['"]|['"]$/g, '') : '';
          if (!ts.isPropertyAssignment(p) || ts.isComputedPropertyName(p.name) || /^on/i.test(name) || URL_ATTRIBUTES.test(name)) {
            found.push(`${where(p)} attrs entry ${p.getText(sf).slice(0, 40)}`);
          }
        }
      }
    }
    ts.forEachChild(n, visit);
  };
  visit(sf);
  return found;
}

/**
 * Reviewed places where a computed attribute name and value are set, with why they cannot carry markup or a URL.
 * Keyed by file; the count is the number of such calls in the file.
 */
const REVIEWED: Record<string, { count: number; reason: string }> = {
  'taskpane/dom.ts': {
    count: 1,
    reason:
      "el() sets the attributes of a spec's attrs object; every attrs object in the sources is a literal whose names are written in code and are neither handlers nor URL attributes (checked above), and el() refuses style and on* itself.",
  },
};

/** Reviewed places where a URL property is set from a value, with why it cannot carry a URL from the data. */
const REVIEWED_URLS: Record<string, { count: number; reason: string }> = {
  'taskpane/widgets.ts': {
    count: 1,
    reason: "Save PNG: a blob: URL that URL.createObjectURL makes from the chart's own canvas, revoked after the download; no cell text reaches it.",
  },
};

describe('no markup or code from data in the panel and workbench sources', () => {
  const files = SOURCE_DIRS.flatMap(sourceFiles);

  test('the sources are there', () => {
    expect(files.some((f) => f.startsWith('taskpane'))).toBe(true);
    expect(files.some((f) => f.startsWith('workbench'))).toBe(true);
  });

  test('the checker itself finds each kind of sink (self-test on a made-up file)', () => {
    const sample = [
      'el.innerHTML = cell;',
      "el.innerHTML = '';",
      'el.outerHTML += x;',
      "el.insertAdjacentHTML('beforeend', `<b>${h}</b>`);",
      'document.write(s);',
      'eval(code);',
      'new Function(body);',
      "setTimeout('go()', 5);",
      "a.setAttribute('href', url);",
      "a.setAttribute('onclick', handler);",
      "a.setAttribute('title', text);",
      "el('a', { attrs: { href: link } });",
      "el('b', { attrs: { 'aria-label': label } });",
      'a.href = link;',
      "a.href = 'about:blank';",
      "// el.innerHTML = commented",
      "const s = 'el.innerHTML = x';",
    ].join('\n');
    const hits = markupSinks('sample.ts', sample);
    expect(hits.map((h) => h.replace(/^sample\.ts:(\d+).*$/, '$1'))).toEqual(['1', '3', '4', '5', '6', '7', '8', '9', '10', '12', '14']);
  });

  test.each(SOURCE_DIRS)('%s/: no HTML parsing or code evaluation of a non-constant string', (dir) => {
    const problems: string[] = [];
    for (const file of files.filter((f) => f.startsWith(dir + path.sep) || f.startsWith(dir + '/'))) {
      const key = file.split(path.sep).join('/');
      const hits = markupSinks(key, fs.readFileSync(path.join(ROOT, file), 'utf8'));
      const reviewed = REVIEWED[key];
      const computedAttributes = hits.filter((h) => /with a computed name and value/.test(h));
      const urls = hits.filter((h) => / URL property /.test(h));
      const others = hits.filter((h) => !/with a computed name and value/.test(h) && !/ URL property /.test(h));
      problems.push(...others);
      if (computedAttributes.length > (reviewed?.count ?? 0)) problems.push(...computedAttributes);
      if (urls.length > (REVIEWED_URLS[key]?.count ?? 0)) problems.push(...urls);
    }
    expect(problems).toEqual([]);
  });
});
