/**
 * Electron main process: startup is a short list of setup steps, each in its own module.
 * The store lives in Electron's userData folder. Logic lives in plain modules (handlers, ipc,
 * window) that unit tests call with `electron` mocked.
 */
import { app, BrowserWindow, ipcMain, Menu, session, shell, dialog } from 'electron';
import { writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { createHandlers } from './api/handlers.ts';
import { setupIpc } from './ipc.ts';
import { setupPdfIpc } from './pdf.ts';
import { buildMenuTemplate } from './menu.ts';
import { createMainWindow, setupContentSecurityPolicy } from './window.ts';
import { openStoreWithRecovery, type ProjectStore, StoreError } from '../data/store.ts';
import { databasePath } from './server/dataDir.ts';

let mainWindow: BrowserWindow | null = null;

function openStore(): ProjectStore | null {
  const file = databasePath(app.getPath('userData'));
  try {
    // The Electron-ABI build of better-sqlite3, kept apart from Node's (see electron/build/electron-sqlite.mjs).
    const nativeBinding = process.env.YARDWIRE_SQLITE_BINDING;
    const binding = nativeBinding ? { nativeBinding } : {};
    try {
      return openStoreWithRecovery(file, { ...binding, recover: false }).store;
    } catch (e) {
      if (!(e instanceof StoreError) || (e.code !== 'corrupt' && e.code !== 'newer-schema')) throw e;
      // Never overwrite it: offer to keep a copy and start afresh, or quit.
      const choice = dialog.showMessageBoxSync({
        type: 'warning',
        title: 'Yardwire cannot open its project database',
        message: e.message,
        buttons: ['Keep a copy and start a fresh database', 'Quit'],
        defaultId: 1,
        cancelId: 1,
      });
      if (choice !== 0) return null;
      const opened = openStoreWithRecovery(file, { ...binding, recover: true });
      if (opened.keptCopy)
        dialog.showMessageBoxSync({
          type: 'info',
          message: `The old database was kept as ${opened.keptCopy}`,
        });
      return opened.store;
    }
  } catch (e) {
    dialog.showErrorBox(
      'Yardwire cannot open its project database',
      e instanceof StoreError ? e.message : String(e),
    );
    return null;
  }
}

async function start(): Promise<void> {
  app.enableSandbox();
  await app.whenReady();
  const store = openStore();
  if (!store) {
    app.quit();
    return;
  }
  const indexHtml = join(__dirname, '..', 'renderer', 'index.html');
  setupContentSecurityPolicy(session.defaultSession);
  const trusted = () => mainWindow?.webContents ?? null;
  const appUrl = pathToFileURL(indexHtml).href;
  setupIpc(ipcMain, createHandlers(store, { shell: 'electron', version: app.getVersion() }), trusted, appUrl);
  setupPdfIpc(ipcMain, {
    dialog,
    trusted,
    window: () => mainWindow,
    appUrlPrefix: appUrl,
    documentsDir: () => app.getPath('documents'),
    countryCode: () => app.getLocaleCountryCode(),
    writeFile: (path, data) => writeFile(path, data),
  });
  Menu.setApplicationMenu(Menu.buildFromTemplate(buildMenuTemplate(process.platform)));
  mainWindow = createMainWindow({ BrowserWindow, shell }, join(__dirname, 'preload.cjs'), indexHtml);
  app.on('web-contents-created', (_e, contents) => {
    contents.on('will-navigate', (event) => event.preventDefault());
    contents.setWindowOpenHandler(() => ({ action: 'deny' }));
  });
  app.on('window-all-closed', () => {
    store.close();
    app.quit();
  });
}

void start();
