/**
 * Entry of browser mode (`npm run serve`, and `npm start` when the Electron binary is absent).
 * Environment: YARDWIRE_PORT (default 5719; 0 picks a free port), YARDWIRE_DATA_DIR.
 * Prints exactly one line on stdout: `Yardwire is running at <url with token>`.
 */
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createHandlers } from '../api/handlers.ts';
import { openStoreWithRecovery, type ProjectStore, StoreError } from '../../data/store.ts';
import { databasePath, defaultDataDir } from './dataDir.ts';
import { portFromEnv, startupMessage } from './startup.ts';
import { startBrowserServer } from './server.ts';

const here = dirname(fileURLToPath(import.meta.url));

async function main(): Promise<void> {
  const port = portFromEnv(process.env.YARDWIRE_PORT);
  if (typeof port === 'string') {
    process.stderr.write(`Yardwire cannot start: ${port}\n`);
    process.exit(2);
  }
  let file: string;
  try {
    file = databasePath(defaultDataDir());
  } catch (e) {
    process.stderr.write(`Yardwire cannot start: ${startupMessage(e)}\n`);
    process.exit(2);
  }
  let store: ProjectStore;
  try {
    // YARDWIRE_RECOVER=copy-out: keep a copy of a damaged or newer database and start a fresh one.
    const opened = openStoreWithRecovery(file, { recover: process.env.YARDWIRE_RECOVER === 'copy-out' });
    store = opened.store;
    if (opened.keptCopy) process.stderr.write(`The old project database was kept as ${opened.keptCopy}\n`);
  } catch (e) {
    process.stderr.write(
      `Yardwire cannot start: ${e instanceof StoreError ? e.message : startupMessage(e)}\n`,
    );
    if (e instanceof StoreError && (e.code === 'corrupt' || e.code === 'newer-schema')) {
      process.stderr.write(
        'To keep a copy of it and start with a fresh database, run again with YARDWIRE_RECOVER=copy-out,\n' +
          'or point YARDWIRE_DATA_DIR at another folder.\n',
      );
    }
    process.exit(2);
  }
  const version = process.env.npm_package_version ?? '0.1.0';
  const handlers = createHandlers(store, { shell: 'browser', version });
  const staticDir = process.env.YARDWIRE_RENDERER_DIR ?? join(here, '..', 'renderer');
  let srv: Awaited<ReturnType<typeof startBrowserServer>>;
  try {
    srv = await startBrowserServer({ handlers, staticDir, port });
  } catch (e) {
    store.close();
    process.stderr.write(`Yardwire cannot start: ${startupMessage(e)}\n`);
    process.exit(2);
  }
  process.stdout.write(`Yardwire is running at ${srv.url}\n`);
  process.stderr.write(
    `Project database: ${file}\nOpen the address above in a browser; press Ctrl+C to stop.\n`,
  );
  const stop = (): void => {
    void srv.close().then(() => {
      store.close();
      process.exit(0);
    });
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((e: unknown) => {
  process.stderr.write(`Yardwire cannot start: ${startupMessage(e)}\n`);
  process.exit(2);
});
