/**
 * Browser mode: a small HTTP server bound to 127.0.0.1 only that serves the built renderer and
 * the same typed API the Electron preload exposes (the shared handlers).
 *
 * Security: every API call must carry the random per-run token in the `x-yardwire-token` header;
 * requests with a foreign Origin or Host header are refused; static paths are resolved inside the
 * renderer folder only (no `..`, no encoded variants, no directory listing); request bodies are
 * limited to the contract's message size.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { createReadStream, statSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join, resolve, sep } from 'node:path';
import { API_NAMES, MAX_MESSAGE_BYTES, type ApiName } from '../../core/api/contract.ts';
import type { HandlerTable } from '../api/handlers.ts';
import { CONTENT_SECURITY_POLICY } from '../security.ts';

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.tif': 'image/tiff',
  '.map': 'application/json; charset=utf-8',
  '.woff2': 'font/woff2',
  '.ico': 'image/x-icon',
};

/** Time allowed for a request's headers, and for the whole request (body included), ms. */
export const HEADERS_TIMEOUT_MS = 10_000;
export const REQUEST_TIMEOUT_MS = 20_000;

export interface BrowserServer {
  server: Server;
  port: number;
  token: string;
  url: string;
  close(): Promise<void>;
}

export interface BrowserServerOptions {
  handlers: HandlerTable;
  /** Folder of the built renderer (index.html and assets). */
  staticDir: string;
  port?: number;
  token?: string;
}

function send(res: ServerResponse, status: number, body: string, type = 'text/plain; charset=utf-8'): void {
  res.writeHead(status, {
    'content-type': type,
    'x-content-type-options': 'nosniff',
    'cache-control': 'no-store',
    'referrer-policy': 'no-referrer',
  });
  res.end(body);
}

function sendJson(res: ServerResponse, status: number, value: unknown): void {
  send(res, status, JSON.stringify(value), 'application/json; charset=utf-8');
}

function tokenMatches(given: string | string[] | undefined, token: string): boolean {
  if (typeof given !== 'string') return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** Resolve a URL path to a file inside `root`, or null if it escapes or is not a plain file. */
export function resolveStaticPath(root: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0') || decoded.includes('\\') || decoded.split('/').some((p) => p === '..'))
    return null;
  const rel = decoded === '/' ? 'index.html' : decoded.replace(/^\/+/, '');
  const rootAbs = resolve(root);
  const file = resolve(join(rootAbs, rel));
  if (file !== rootAbs && !file.startsWith(rootAbs + sep)) return null;
  try {
    return statSync(file).isFile() ? file : null;
  } catch {
    return null;
  }
}

/** Refuse an oversized body: answer at once, discard the rest, and close the connection. */
function tooLarge(req: IncomingMessage, res: ServerResponse): void {
  res.setHeader('connection', 'close');
  send(res, 413, 'request too large');
  req.resume();
}

async function readBody(req: IncomingMessage, limit: number): Promise<string | null> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    const buf = chunk as Buffer;
    size += buf.length;
    if (size > limit) {
      req.resume();
      return null;
    }
    chunks.push(buf);
  }
  return Buffer.concat(chunks).toString('utf8');
}

export async function startBrowserServer(options: BrowserServerOptions): Promise<BrowserServer> {
  const token = options.token ?? randomBytes(24).toString('base64url');
  const names = new Set<string>(API_NAMES);
  let port = 0;

  const server = createServer((req, res) => {
    void (async () => {
      const allowedHosts = [`127.0.0.1:${port}`, `localhost:${port}`];
      if (!allowedHosts.includes(req.headers.host ?? ''))
        return send(res, 421, 'foreign Host header refused');
      const origin = req.headers.origin;
      if (origin !== undefined && !allowedHosts.map((h) => `http://${h}`).includes(origin)) {
        return send(res, 403, 'foreign Origin refused');
      }
      const url = new URL(req.url ?? '/', `http://127.0.0.1:${port}`);

      if (url.pathname.startsWith('/api/')) {
        if (req.method !== 'POST') return send(res, 405, 'API calls are POST only');
        if (!tokenMatches(req.headers['x-yardwire-token'], token))
          return send(res, 401, 'missing or wrong token');
        const name = url.pathname.slice('/api/'.length);
        if (!names.has(name)) return send(res, 404, 'no such call');
        const contentLength = Number(req.headers['content-length'] ?? 0);
        if (contentLength > MAX_MESSAGE_BYTES) return tooLarge(req, res);
        const body = await readBody(req, MAX_MESSAGE_BYTES);
        if (body === null) return tooLarge(req, res);
        let request: unknown;
        try {
          request = body === '' ? {} : JSON.parse(body);
        } catch {
          return sendJson(res, 400, {
            ok: false,
            error: { code: 'invalid-request', message: 'body is not JSON' },
          });
        }
        return sendJson(res, 200, options.handlers[name as ApiName](request));
      }

      if (req.method !== 'GET' && req.method !== 'HEAD') return send(res, 405, 'method not allowed');
      const file = resolveStaticPath(options.staticDir, url.pathname);
      if (!file) return send(res, 404, 'not found');
      const type = MIME[extname(file).toLowerCase()] ?? 'application/octet-stream';
      const headers: Record<string, string> = {
        'content-type': type,
        'x-content-type-options': 'nosniff',
        'cache-control': 'no-store',
        'referrer-policy': 'no-referrer',
      };
      if (type.startsWith('text/html')) {
        headers['content-security-policy'] = CONTENT_SECURITY_POLICY;
        headers['x-frame-options'] = 'DENY';
      }
      res.writeHead(200, headers);
      if (req.method === 'HEAD') return res.end();
      createReadStream(file).pipe(res);
    })().catch((e: unknown) => {
      if (!res.headersSent) send(res, 500, 'internal error');
      void e;
    });
  });

  // A request whose body trickles in is bounded like an idle connection: headers within
  // HEADERS_TIMEOUT_MS, the whole request within REQUEST_TIMEOUT_MS (Node's default is 300 s).
  server.headersTimeout = HEADERS_TIMEOUT_MS;
  server.requestTimeout = REQUEST_TIMEOUT_MS;
  await new Promise<void>((ok, bad) => {
    server.once('error', bad);
    server.listen(options.port ?? 0, '127.0.0.1', () => ok());
  });
  port = (server.address() as AddressInfo).port;
  return {
    server,
    port,
    token,
    url: `http://127.0.0.1:${port}/#token=${token}`,
    // Stop accepting; let requests in flight finish for up to a second, then drop what is left
    // (a page that stays open keeps connections alive, and stopping must not wait on it).
    close: () =>
      new Promise<void>((ok) => {
        server.close(() => ok());
        server.closeIdleConnections();
        setTimeout(() => server.closeAllConnections(), 1000).unref();
      }),
  };
}
