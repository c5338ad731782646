/**
 * Electron main process: startup is a short list of setup steps, each in its own module.
 * The store lives in Electron's userData folder (or YARDWIRE_DATA_DIR when set); a start-up
 * problem is one line saying what to change (startFailure.ts), never a stack trace. Logic lives in plain modules (handlers, ipc,
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
import { desktopDataDir, failStartup } from './startFailure.ts';

let mainWindow: BrowserWindow | null = null;

/**
 * The project database, or null when the user chose to quit rather than start afresh. Problems
 * the user must fix (a data folder that is a file or cannot be written) are thrown to `start`.
 */
function openStore(dir: string): ProjectStore | null {
  const file = databasePath(dir);
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
}

async function start(): Promise<void> {
  app.enableSandbox();
  await app.whenReady();
  const store = openStore(dataDir());
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

/** YARDWIRE_DATA_DIR when set, else Electron's userData folder. */
const dataDir = (): string => desktopDataDir(process.env, app.getPath('userData'));

start().catch((e: unknown) =>
  failStartup(e, {
    env: process.env,
    dataDir: dataDir(),
    stderr: (line) => process.stderr.write(line),
    showErrorBox: (title, content) => dialog.showErrorBox(title, content),
    exit: (code) => app.exit(code),
  }),
);
