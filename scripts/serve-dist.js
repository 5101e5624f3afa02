/* A small static file server for dist/, on the loopback interface only. It serves the workbench at "/", sends
 * each file with its content type, and gives an HTML page the same Content-Security-Policy header as the page's
 * own <meta> policy (the header also covers what a meta tag cannot, such as the policy being in force before the
 * page's first byte is parsed, and frame-ancestors). Only GET and HEAD; only requests addressed to localhost
 * (421 otherwise); headers within 5 s; no directory listings; no file outside dist/; no dotfiles.
 * Written here rather than taken from a package so that `npm start` has no server dependency to audit. */
'use strict';
const fs = require('fs');
const path = require('path');
const http = require('http');
const https = require('https');

const CONTENT_TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.xml': 'application/xml; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.ico': 'image/x-icon',
  '.woff': 'font/woff',
  '.woff2': 'font/woff2',
};

/** The policy in an HTML page's <meta http-equiv="Content-Security-Policy" content="...">, or null. */
function metaPolicy(html) {
  const tags = html.match(/<meta\b[^>]*>/gi) || [];
  for (const tag of tags) {
    if (!/http-equiv\s*=\s*["']?content-security-policy["']?/i.test(tag)) continue;
    const m = /\bcontent\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>]+))/i.exec(tag);
    if (!m) continue;
    const raw = m[1] ?? m[2] ?? m[3] ?? '';
    return raw
      .replace(/&quot;/g, '"')
      .replace(/&#39;|&apos;/g, "'")
      .replace(/&lt;/g, '<')
      .replace(/&gt;/g, '>')
      .replace(/&amp;/g, '&')
      .trim();
  }
  return null;
}

/** Maps a request path to a file inside dist, or null when it would leave dist or name a dotfile. */
function fileFor(dist, urlPath) {
  let decoded;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0')) return null;
  const rel = decoded === '/' ? 'workbench.html' : decoded.replace(/^\/+/, '');
  if (rel.split(/[\\/]/).some((part) => part.startsWith('.'))) return null;
  const file = path.resolve(dist, rel);
  const inside = path.relative(dist, file);
  if (inside === '' || inside.startsWith('..') || path.isAbsolute(inside)) return null;
  return file;
}

function send(res, status, headers, body) {
  res.writeHead(status, { 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-cache', ...headers });
  res.end(body);
}

/**
 * True when the Host header names this server on the loopback interface. Anything else is refused (421), so a
 * page elsewhere cannot reach the server by pointing its own host name at 127.0.0.1 (DNS rebinding).
 */
function hostAllowed(host, port) {
  if (typeof host !== 'string') return false;
  const h = host.toLowerCase();
  return ['localhost', '127.0.0.1', '[::1]'].some((name) => h === name || h === `${name}:${port}`);
}

/** Pages that only the project itself frames (the workbench embeds nothing of Office): not framable elsewhere. */
const OWN_PAGES = new Set(['workbench.html']);

/** The request handler for a dist folder. */
function distHandler(dist, portOf) {
  return (req, res) => {
    if (!hostAllowed(req.headers.host, portOf())) {
      send(res, 421, { 'Content-Type': 'text/plain; charset=utf-8', Connection: 'close' }, 'Misdirected request: this server answers only as localhost\n');
      return;
    }
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      send(res, 405, { Allow: 'GET, HEAD', 'Content-Type': 'text/plain; charset=utf-8' }, 'Method not allowed\n');
      return;
    }
    const urlPath = (req.url || '/').split(/[?#]/)[0];
    const file = fileFor(dist, urlPath);
    if (!file) {
      send(res, 404, { 'Content-Type': 'text/plain; charset=utf-8' }, 'Not found\n');
      return;
    }
    fs.readFile(file, (err, body) => {
      if (err) {
        send(res, 404, { 'Content-Type': 'text/plain; charset=utf-8' }, 'Not found\n');
        return;
      }
      const ext = path.extname(file).toLowerCase();
      const headers = {
        'Content-Type': CONTENT_TYPES[ext] || 'application/octet-stream',
        'Content-Length': body.length,
        'Referrer-Policy': 'no-referrer',
      };
      if (ext === '.html') {
        const own = OWN_PAGES.has(path.basename(file));
        const policy = metaPolicy(body.toString('utf8'));
        // frame-ancestors cannot be set by a <meta> policy, only by the header. The task pane is left framable:
        // Office on the web shows it in a frame of its own pages.
        if (policy) headers['Content-Security-Policy'] = own ? `${policy}; frame-ancestors 'self'` : policy;
        if (own) headers['X-Frame-Options'] = 'SAMEORIGIN';
      }
      res.writeHead(200, { 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-cache', ...headers });
      res.end(req.method === 'HEAD' ? undefined : body);
    });
  };
}

/**
 * Serves dist on 127.0.0.1 (and on ::1 too when the machine has it, so "localhost" works whichever address a
 * browser tries first). Port 0 picks a free port. Resolves with the port and a close function.
 * @param {{ dist: string, port: number, tls?: { key: Buffer, cert: Buffer, ca?: Buffer } }} options
 */
/**
 * Time limits that keep a client from holding a connection open by sending its headers slowly: headers within
 * 5 s, the whole request within 10 s, checked every second (Node's default check runs every 30 s).
 */
const LIMITS = { headersTimeout: 5000, requestTimeout: 10000, connectionsCheckingInterval: 1000, keepAliveTimeout: 5000 };

function serveDist({ dist, port, tls }) {
  let bound = port;
  const handler = distHandler(dist, () => bound);
  const make = () => {
    const server = tls ? https.createServer({ ...tls, ...LIMITS }, handler) : http.createServer(LIMITS, handler);
    server.keepAliveTimeout = LIMITS.keepAliveTimeout;
    return server;
  };
  const servers = [];
  const listen = (server, p, host) =>
    new Promise((resolve, reject) => {
      server.once('error', reject);
      server.listen(p, host, () => {
        server.off('error', reject);
        resolve(server.address().port);
      });
    });
  return (async () => {
    const v4 = make();
    const actual = await listen(v4, port, '127.0.0.1');
    bound = actual;
    servers.push(v4);
    const v6 = make();
    try {
      await listen(v6, actual, '::1');
      servers.push(v6);
    } catch {
      // No IPv6 loopback here (or the port is taken there): 127.0.0.1 alone serves "localhost".
    }
    const close = () => Promise.all(servers.map((s) => new Promise((resolve) => s.close(() => resolve()))));
    return { port: actual, close, servers };
  })();
}

module.exports = { serveDist, metaPolicy, fileFor, hostAllowed, CONTENT_TYPES, LIMITS };
