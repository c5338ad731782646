// The Electron main-process modules with `electron` mocked: window security settings,
// navigation and new windows denied, CSP on every response, IPC from unknown senders dropped.
import { describe, expect, it, vi } from 'vitest';
import type { IpcMain, IpcMainInvokeEvent, WebContents } from 'electron';

vi.mock('electron', () => ({ app: {}, BrowserWindow: class {}, ipcMain: {}, shell: {} }));

const { createMainWindow, setupContentSecurityPolicy } = await import('../../../electron/window.ts');
const { setupIpc } = await import('../../../electron/ipc.ts');
const { CONTENT_SECURITY_POLICY, isSafeExternalUrl } = await import('../../../electron/security.ts');
const { buildMenuTemplate } = await import('../../../electron/menu.ts');

type Listener = (...args: unknown[]) => void;

class FakeWindow {
  static last: FakeWindow | null = null;
  readonly options: { webPreferences: Record<string, unknown> };
  readonly listeners = new Map<string, Listener>();
  openHandler: ((d: { url: string }) => { action: string }) | null = null;
  loaded = '';
  webContents = {
    on: (ev: string, fn: Listener) => this.listeners.set(ev, fn),
    setWindowOpenHandler: (fn: (d: { url: string }) => { action: string }) => (this.openHandler = fn),
  };
  constructor(options: { webPreferences: Record<string, unknown> }) {
    this.options = options;
    FakeWindow.last = this;
  }
  once(): void {}
  show(): void {}
  loadFile(f: string): Promise<void> {
    this.loaded = f;
    return Promise.resolve();
  }
}

describe('Electron window', () => {
  const openExternal = vi.fn(() => Promise.resolve());
  const win = createMainWindow(
    { BrowserWindow: FakeWindow as never, shell: { openExternal } },
    '/app/preload.cjs',
    '/app/renderer/index.html',
  ) as unknown as FakeWindow;

  it('writes out contextIsolation, sandbox and nodeIntegration', () => {
    const wp = win.options.webPreferences;
    expect(wp.contextIsolation).toBe(true);
    expect(wp.sandbox).toBe(true);
    expect(wp.nodeIntegration).toBe(false);
    expect(wp.webviewTag).toBe(false);
    expect(wp.preload).toBe('/app/preload.cjs');
    expect(win.loaded).toBe('/app/renderer/index.html');
  });

  it('denies navigation away from the app', () => {
    const prevent = vi.fn();
    win.listeners.get('will-navigate')!({ preventDefault: prevent }, 'https://evil.example/');
    expect(prevent).toHaveBeenCalledOnce();
    const keep = vi.fn();
    win.listeners.get('will-navigate')!({ preventDefault: keep }, 'file:///app/renderer/index.html');
    expect(keep).not.toHaveBeenCalled();
  });

  it('denies new windows; only http(s) links go to the system browser', () => {
    expect(win.openHandler!({ url: 'https://example.org/help' })).toEqual({ action: 'deny' });
    expect(openExternal).toHaveBeenCalledWith('https://example.org/help');
    openExternal.mockClear();
    expect(win.openHandler!({ url: 'file:///etc/passwd' })).toEqual({ action: 'deny' });
    expect(win.openHandler!({ url: 'javascript:alert(1)' })).toEqual({ action: 'deny' });
    expect(openExternal).not.toHaveBeenCalled();
    expect(isSafeExternalUrl('https://user:pw@example.org')).toBe(false);
  });

  it('puts the strict CSP on every response and refuses permission requests', () => {
    let hook: ((d: { responseHeaders: Record<string, string[]> }, cb: (r: unknown) => void) => void) | null =
      null;
    let perm: ((wc: unknown, p: string, cb: (ok: boolean) => void) => void) | null = null;
    setupContentSecurityPolicy({
      webRequest: { onHeadersReceived: (fn: typeof hook) => (hook = fn) },
      setPermissionRequestHandler: (fn: typeof perm) => (perm = fn),
    } as never);
    const cb = vi.fn();
    hook!({ responseHeaders: { a: ['b'] } }, cb);
    expect(cb).toHaveBeenCalledWith({
      responseHeaders: { a: ['b'], 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] },
    });
    // Only the WebAssembly keyword (W3C CSP Level 3 'wasm-unsafe-eval'); never JavaScript eval.
    expect(CONTENT_SECURITY_POLICY.replaceAll("'wasm-unsafe-eval'", '')).not.toMatch(/unsafe-eval/);
    const pcb = vi.fn();
    perm!({}, 'geolocation', pcb);
    expect(pcb).toHaveBeenCalledWith(false);
  });

  it('has native menus with the usual edit roles', () => {
    const edit = buildMenuTemplate('linux').find((m) => m.label === 'Edit');
    expect(JSON.stringify(edit)).toContain('undo');
  });
});

describe('IPC', () => {
  const handlers: Record<string, (r: unknown) => unknown> = {};
  const registered = new Map<string, (e: IpcMainInvokeEvent, r: unknown) => unknown>();
  const ipcMain = {
    handle: (ch: string, fn: (e: IpcMainInvokeEvent, r: unknown) => unknown) => registered.set(ch, fn),
  } as unknown as IpcMain;
  const mainFrame = { url: 'file:///app/renderer/index.html' };
  const wc = { mainFrame } as unknown as WebContents;
  handlers.listProjects = vi.fn(() => ({ ok: true, value: [] }));
  setupIpc(
    ipcMain,
    new Proxy(handlers, { get: (t, k: string) => t[k] ?? (() => ({ ok: true, value: null })) }) as never,
    () => wc,
    'file:///app/renderer/',
  );

  it('registers one channel per contract call', () => {
    expect(registered.has('yardwire:listProjects')).toBe(true);
    expect(registered.has('yardwire:saveProject')).toBe(true);
  });

  it('answers our own window', () => {
    const r = registered.get('yardwire:listProjects')!({ sender: wc, senderFrame: mainFrame } as never, {});
    expect(r).toEqual({ ok: true, value: [] });
  });

  it('drops messages from unknown senders, sub-frames and foreign pages', () => {
    const fn = registered.get('yardwire:listProjects')!;
    const other = { mainFrame: { url: 'file:///app/renderer/index.html' } };
    expect(fn({ sender: other, senderFrame: other.mainFrame } as never, {})).toMatchObject({ ok: false });
    expect(
      fn({ sender: wc, senderFrame: { url: 'file:///app/renderer/index.html' } } as never, {}),
    ).toMatchObject({ ok: false });
    const foreign = { url: 'https://evil.example/' };
    const wc2 = { mainFrame: foreign } as unknown as WebContents;
    const reg2 = new Map<string, (e: IpcMainInvokeEvent, r: unknown) => unknown>();
    setupIpc(
      { handle: (c: string, f: never) => reg2.set(c, f) } as unknown as IpcMain,
      handlers as never,
      () => wc2,
      'file:///app/renderer/',
    );
    expect(
      reg2.get('yardwire:listProjects')!({ sender: wc2, senderFrame: foreign } as never, {}),
    ).toMatchObject({ ok: false });
    expect(handlers.listProjects).toHaveBeenCalledTimes(1);
  });
});
