/**
 * The development server (scripts/serve-dist.js) that `npm start` runs: it answers only requests addressed to
 * localhost (a rebinding host name gets 421 Misdirected Request, RFC 9110 section 15.5.20), closes a connection
 * whose headers do not arrive within its limit (a client sending partial headers held one open for over 70 s),
 * and keeps the workbench from being framed by other sites.
 */
import * as fs from 'fs';
import * as net from 'net';
import * as os from 'os';
import * as path from 'path';

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { serveDist, hostAllowed, LIMITS } = require('../../../scripts/serve-dist.js');

let dir: string;
let server: { port: number; close: () => Promise<unknown> };

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'covary-dist-'));
  const policy = "default-src 'self'";
  fs.writeFileSync(path.join(dir, 'workbench.html'), `<html><head><meta http-equiv="Content-Security-Policy" content="${policy}"></head></html>`);
  fs.writeFileSync(path.join(dir, 'taskpane.html'), `<html><head><meta http-equiv="Content-Security-Policy" content="${policy}"></head></html>`);
  server = await serveDist({ dist: dir, port: 0 });
});

afterAll(async () => {
  await server.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** One raw HTTP/1.1 exchange with the given Host; resolves with the status line and headers. */
function request(host: string, pathName = '/'): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = net.connect(server.port, '127.0.0.1', () => {
      socket.write(`GET ${pathName} HTTP/1.1\r\nHost: ${host}\r\nConnection: close\r\n\r\n`);
    });
    let data = '';
    socket.on('data', (d) => (data += d.toString('latin1')));
    socket.on('end', () => resolve(data));
    socket.on('error', reject);
  });
}

test('only requests addressed to localhost are served; others get 421', async () => {
  expect((await request(`localhost:${server.port}`)).split('\r\n')[0]).toBe('HTTP/1.1 200 OK');
  expect((await request(`127.0.0.1:${server.port}`)).split('\r\n')[0]).toBe('HTTP/1.1 200 OK');
  expect((await request('evil.example')).split('\r\n')[0]).toBe('HTTP/1.1 421 Misdirected Request');
  expect((await request(`evil.example:${server.port}`)).split('\r\n')[0]).toBe('HTTP/1.1 421 Misdirected Request');
  expect([hostAllowed(undefined, 80), hostAllowed('localhost:81', 80), hostAllowed('[::1]:80', 80)]).toEqual([false, false, true]);
});

test('the workbench may be framed only by itself; the task pane stays framable for Office on the web', async () => {
  const wb = (await request(`localhost:${server.port}`, '/workbench.html')).toLowerCase();
  expect(wb).toMatch(/x-frame-options: sameorigin/);
  expect(wb).toMatch(/content-security-policy: default-src 'self'; frame-ancestors 'self'/);
  const pane = (await request(`localhost:${server.port}`, '/taskpane.html')).toLowerCase();
  expect(pane).not.toMatch(/frame-ancestors|x-frame-options/);
});

test('a connection that sends only part of its headers is closed within the header limit', async () => {
  const started = Date.now();
  const closedAfter = await new Promise<number>((resolve) => {
    const socket = net.connect(server.port, '127.0.0.1', () => socket.write(`GET / HTTP/1.1\r\nHost: localhost:${server.port}\r\nX-Slow: `));
    socket.on('data', () => undefined);
    socket.on('close', () => resolve(Date.now() - started));
    socket.on('error', () => undefined);
  });
  expect(closedAfter).toBeGreaterThanOrEqual(LIMITS.headersTimeout - 100);
  expect(closedAfter).toBeLessThan(LIMITS.headersTimeout + 3 * LIMITS.connectionsCheckingInterval);
}, 20000);
