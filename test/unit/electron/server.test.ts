import { request } from 'node:http';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHandlers } from '../../../electron/api/handlers.ts';
import { startBrowserServer, type BrowserServer } from '../../../electron/server/server.ts';
import { ProjectStore } from '../../../data/store.ts';

let dir: string;
let store: ProjectStore;
let srv: BrowserServer;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'yw-srv-'));
  const web = join(dir, 'web');
  mkdirSync(join(web, 'assets'), { recursive: true });
  writeFileSync(join(web, 'index.html'), '<!doctype html><title>Yardwire</title>');
  writeFileSync(join(web, 'assets', 'app.js'), 'console.log(1)');
  writeFileSync(join(dir, 'secret.txt'), 'do not serve me');
  store = new ProjectStore(join(dir, 'db.sqlite'));
  srv = await startBrowserServer({
    handlers: createHandlers(store, { shell: 'browser', version: 't' }),
    staticDir: web,
    port: 0,
  });
});
afterAll(async () => {
  await srv.close();
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

/** Raw HTTP so that Host, Origin and unnormalised paths go out exactly as written. */
function raw(
  path: string,
  opts: { method?: string; headers?: Record<string, string>; body?: string } = {},
): Promise<{ status: number; body: string; headers: Record<string, string | string[] | undefined> }> {
  return new Promise((ok, bad) => {
    const req = request(
      {
        host: '127.0.0.1',
        port: srv.port,
        path,
        method: opts.method ?? 'GET',
        headers: { host: `127.0.0.1:${srv.port}`, ...opts.headers },
      },
      (res) => {
        let body = '';
        res.on('data', (c: Buffer) => (body += c.toString()));
        res.on('end', () => ok({ status: res.statusCode ?? 0, body, headers: res.headers }));
      },
    );
    req.on('error', bad);
    if (opts.body !== undefined) req.write(opts.body);
    req.end();
  });
}

const api = (name: string, body: unknown, headers: Record<string, string> = {}) =>
  raw(`/api/${name}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-yardwire-token': srv.token, ...headers },
    body: JSON.stringify(body),
  });

describe('browser-mode server', () => {
  it('binds to loopback only', () => {
    const addr = srv.server.address();
    expect(typeof addr === 'object' && addr?.address).toBe('127.0.0.1');
    expect(srv.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/#token=[A-Za-z0-9_-]{32}$/);
  });

  it('serves the renderer with a strict CSP and no eval', async () => {
    const r = await raw('/');
    expect(r.status).toBe(200);
    expect(r.body).toContain('Yardwire');
    const csp = String(r.headers['content-security-policy']);
    // Scripts only from the app itself; 'wasm-unsafe-eval' lets WebAssembly compile (the solver's
    // LU kernel) and allows no JavaScript eval (W3C Content Security Policy Level 3, the
    // 'wasm-unsafe-eval' source keyword). Plain 'unsafe-eval' stays forbidden.
    expect(csp).toMatch(/script-src 'self' 'wasm-unsafe-eval'(;|$)/);
    expect(csp.replaceAll("'wasm-unsafe-eval'", '')).not.toContain('unsafe-eval');
    expect((await raw('/assets/app.js')).status).toBe(200);
  });

  it('answers API calls with the right token', async () => {
    const r = await api('openInitialProject', {});
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body).ok).toBe(true);
  });

  it('refuses API calls without the token or with a wrong one', async () => {
    expect((await api('listProjects', {}, { 'x-yardwire-token': '' })).status).toBe(401);
    expect((await api('listProjects', {}, { 'x-yardwire-token': srv.token.slice(1) + 'x' })).status).toBe(
      401,
    );
    expect((await raw('/api/listProjects', { method: 'POST', body: '{}' })).status).toBe(401);
  });

  it('refuses a foreign Origin and a foreign Host (DNS rebinding)', async () => {
    expect((await api('listProjects', {}, { origin: 'http://evil.example' })).status).toBe(403);
    expect((await api('listProjects', {}, { origin: `http://127.0.0.1:${srv.port + 1}` })).status).toBe(403);
    expect((await api('listProjects', {}, { origin: `http://127.0.0.1:${srv.port}` })).status).toBe(200);
    expect((await raw('/', { headers: { host: 'evil.example' } })).status).toBe(421);
  });

  it.each([
    '/../secret.txt',
    '/..%2fsecret.txt',
    '/%2e%2e/secret.txt',
    '/assets/%2e%2e/%2e%2e/secret.txt',
    '/..\\secret.txt',
    '/%00index.html',
    '/%E0%A4%A',
  ])('does not serve %s outside the renderer folder', async (p) => {
    const r = await raw(p);
    expect(r.status).toBe(404);
    expect(r.body).not.toContain('do not serve me');
  });

  it('lists no directories', async () => {
    expect((await raw('/assets/')).status).toBe(404);
    expect((await raw('/assets')).status).toBe(404);
  });

  it('limits request size, methods and call names', async () => {
    const body = JSON.stringify({ project: { name: 'x'.repeat(25 * 1024 * 1024) } });
    const declared = await raw('/api/saveProject', {
      method: 'POST',
      headers: { 'x-yardwire-token': srv.token },
      body,
    });
    expect(declared.status).toBe(413);
    const chunked = await raw('/api/saveProject', {
      method: 'POST',
      headers: { 'x-yardwire-token': srv.token, 'transfer-encoding': 'chunked' },
      body,
    });
    expect(chunked.status).toBe(413);
    expect((await raw('/api/listProjects', { headers: { 'x-yardwire-token': srv.token } })).status).toBe(405);
    expect((await api('dropEverything', {})).status).toBe(404);
    expect((await raw('/', { method: 'DELETE' })).status).toBe(405);
  });

  it('answers malformed JSON with a clear error, not a crash', async () => {
    const r = await raw('/api/listProjects', {
      method: 'POST',
      headers: { 'x-yardwire-token': srv.token },
      body: '{oops',
    });
    expect(r.status).toBe(400);
    expect(JSON.parse(r.body).error.message).toMatch(/not JSON/);
  });
});
