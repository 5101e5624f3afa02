/**
 * The add-in manifest (manifest.xml): least permission, a stable Id and a well-formed Version, the shared-runtime
 * wiring, and validity against a schema, offline.
 *
 * Schema: Microsoft's online validator (office-addin-manifest validate) needs the network, and the XSD copies
 * published with the add-in documentation predate the <Runtimes> element a shared runtime needs, so they reject
 * every shared-runtime manifest. The test therefore validates with xmllint (Debian's libxml2-utils) against
 * test/fixtures/manifest-schema/, a structural schema written for this project from the documented element order
 * (its README names the sources); it allows only the elements Covary uses, in that order.
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';

const ROOT = path.resolve(__dirname, '../../..');
const MANIFEST = path.join(ROOT, 'manifest.xml');
const SCHEMA = path.join(ROOT, 'test/fixtures/manifest-schema/covary-manifest.xsd');
const xml = fs.readFileSync(MANIFEST, 'utf8');

/** The add-in's identity: fixed for its lifetime (changing it makes Office treat it as another add-in). */
const COVARY_ID = 'd9f20a99-7c3d-400c-93d4-749bcc7686e8';

/** Permission levels of content and task pane add-ins, least to most (Microsoft, "Requesting permissions for
 * API use in add-ins"; the Permissions enumeration of the manifest schema). */
const PERMISSION_LEVELS = ['Restricted', 'ReadDocument', 'ReadAllDocument', 'WriteDocument', 'ReadWriteDocument'];

function xmllint(args: string[]): { status: number | null; out: string } {
  const r = spawnSync('xmllint', args, { encoding: 'utf8' });
  if (r.error) throw new Error(`xmllint is not available (${r.error.message}): install Debian's libxml2-utils`);
  return { status: r.status, out: `${r.stdout}${r.stderr}` };
}

function validate(text: string): { status: number | null; out: string } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'covary-manifest-'));
  const file = path.join(dir, 'manifest.xml');
  fs.writeFileSync(file, text);
  try {
    return xmllint(['--noout', '--nonet', '--schema', SCHEMA, file]);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** Text content of the first element with this local name (namespace prefixes ignored). */
function first(name: string, text = xml): string | undefined {
  return new RegExp(`<(?:\\w+:)?${name}\\b[^>]*>([^<]*)</(?:\\w+:)?${name}>`).exec(text)?.[1].trim();
}

describe('manifest.xml', () => {
  test('is valid against the structural schema (xmllint, offline)', () => {
    const r = validate(xml);
    expect(r.out).toMatch(/validates/);
    expect(r.status).toBe(0);
  });

  test.each([
    ['Runtimes after AllFormFactors (it must come first in Host)', (s: string) => s.replace(/(\s*<Runtimes>[\s\S]*?<\/Runtimes>)([\s\S]*?<\/AllFormFactors>)/, '$2$1')],
    ['a five-part Version', (s: string) => s.replace(/<Version>[^<]*<\/Version>/, '<Version>1.0.0.0.1</Version>')],
    ['a mail permission', (s: string) => s.replace(/<Permissions>[^<]*</, '<Permissions>ReadWriteMailbox<')],
    ['an http:// resource URL', (s: string) => s.replace('https://localhost:3000/functions.js', 'http://localhost:3000/functions.js')],
    ['an AppDomains entry (another origin the add-in could open)', (s: string) => s.replace('<Hosts>', '<AppDomains><AppDomain>https://example.invalid</AppDomain></AppDomains>\n  <Hosts>')],
    ['a resource id longer than 32 characters', (s: string) => s.split('Covary.Namespace').join('Covary.Namespace.Of.The.Functions.X')],
  ])('the schema rejects %s', (_label, mutate) => {
    const bad = mutate(xml);
    expect(bad).not.toBe(xml);
    expect(validate(bad).status).not.toBe(0);
  });

  test('asks for ReadWriteDocument and nothing higher (the panel writes formulas and a report sheet when asked)', () => {
    const permission = first('Permissions');
    expect(permission).toBe('ReadWriteDocument');
    expect(PERMISSION_LEVELS.indexOf(permission!)).toBeLessThanOrEqual(PERMISSION_LEVELS.indexOf('ReadWriteDocument'));
    // No single sign-on or web-application access to other services.
    expect(xml).not.toMatch(/<WebApplicationInfo|<AppDomains|<Authorizations/);
  });

  test('keeps its Id and a well-formed Version', () => {
    expect(first('Id')).toBe(COVARY_ID);
    expect(first('Version')).toMatch(/^\d{1,5}(\.\d{1,5}){0,3}$/);
  });

  test('shared runtime: one resource id for the runtime, the functions page, the function file and the task pane', () => {
    const runtime = /<Runtime\s+resid="([^"]+)"\s+lifetime="long"/.exec(xml)?.[1];
    expect(runtime).toBeDefined();
    const page = /<Page>\s*<SourceLocation resid="([^"]+)"/.exec(xml)?.[1];
    const functionFile = /<FunctionFile resid="([^"]+)"/.exec(xml)?.[1];
    const taskpane = /<Action xsi:type="ShowTaskpane">[\s\S]*?<SourceLocation resid="([^"]+)"/.exec(xml)?.[1];
    expect([page, functionFile, taskpane]).toEqual([runtime, runtime, runtime]);
    expect(xml).toMatch(/<Set Name="SharedRuntime" MinVersion="1\.1"\/>/);
  });

  test('every resource reference resolves, and the functions live under the namespace COVARY', () => {
    const defined = new Set([...xml.matchAll(/<bt:(?:Image|Url|String) id="([^"]+)"/g)].map((m) => m[1]));
    const used = [...xml.matchAll(/resid="([^"]+)"/g)].map((m) => m[1]);
    expect(used.filter((r) => !defined.has(r))).toEqual([]);
    const ns = /<Namespace resid="([^"]+)"/.exec(xml)?.[1];
    expect(new RegExp(`<bt:String id="${ns}" DefaultValue="COVARY"/>`).test(xml)).toBe(true);
  });

  test('every URL is https and points at the add-in host only (one origin for pages, scripts and icons)', () => {
    const urls = [...xml.matchAll(/DefaultValue="(\w+:\/\/[^"]+)"/g)].map((m) => m[1]);
    expect(urls.length).toBeGreaterThan(5);
    const origins = new Set(urls.map((u) => new URL(u).origin));
    expect([...origins].every((o) => o.startsWith('https://'))).toBe(true);
    expect(origins.size).toBe(1);
  });

  test('ribbon icons in the sizes Office requires (16, 32, 80)', () => {
    for (const icon of xml.matchAll(/<Icon>([\s\S]*?)<\/Icon>/g)) {
      const sizes = [...icon[1].matchAll(/size="(\d+)"/g)].map((m) => Number(m[1]));
      expect(sizes).toEqual(expect.arrayContaining([16, 32, 80]));
    }
  });
});
