/**
 * The one application window: security settings written out, navigation and new windows denied
 * (external http(s) links go to the system browser after a check), a strict CSP on every response.
 */
import type { BrowserWindow as BrowserWindowType, Session, Shell } from 'electron';
import { CONTENT_SECURITY_POLICY, isSafeExternalUrl, SECURE_WEB_PREFERENCES } from './security.ts';

export interface WindowDeps {
  BrowserWindow: typeof BrowserWindowType;
  shell: Pick<Shell, 'openExternal'>;
}

export function setupContentSecurityPolicy(session: Session): void {
  session.webRequest.onHeadersReceived((details, callback) => {
    callback({
      responseHeaders: { ...details.responseHeaders, 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] },
    });
  });
  session.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
}

export function createMainWindow(
  deps: WindowDeps,
  preloadPath: string,
  indexHtml: string,
): BrowserWindowType {
  const win = new deps.BrowserWindow({
    width: 1440,
    height: 900,
    minWidth: 960,
    minHeight: 600,
    title: 'Yardwire',
    show: false,
    webPreferences: { ...SECURE_WEB_PREFERENCES, preload: preloadPath },
  });
  const appUrl = `file://${indexHtml}`;
  win.webContents.on('will-navigate', (event, url) => {
    if (url !== appUrl) event.preventDefault();
  });
  win.webContents.on('will-attach-webview', (event) => event.preventDefault());
  win.webContents.setWindowOpenHandler(({ url }) => {
    if (isSafeExternalUrl(url)) void deps.shell.openExternal(url);
    return { action: 'deny' };
  });
  win.once('ready-to-show', () => win.show());
  void win.loadFile(indexHtml);
  return win;
}
