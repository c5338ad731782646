// Issue 15 point 6 for the desktop shell: a start-up problem is one line saying what to change (on
// stderr and in a dialog), exit code 2, never a stack trace. Electron itself is mocked: the main
// module runs with an `electron` stand-in whose data folder is a file.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { databasePath } from '../../../electron/server/dataDir.ts';
import { desktopDataDir, failStartup, START_FAILURE_TITLE } from '../../../electron/startFailure.ts';

const dir = mkdtempSync(join(tmpdir(), 'yw-desk-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const aFile = join(dir, 'a-file');
writeFileSync(aFile, 'x');

const electron = vi.hoisted(() => ({
  app: {
    enableSandbox: vi.fn(),
    whenReady: vi.fn(() => Promise.resolve()),
    getPath: vi.fn((_name: string) => ''),
    exit: vi.fn(),
    quit: vi.fn(),
    on: vi.fn(),
  },
  dialog: { showErrorBox: vi.fn(), showMessageBoxSync: vi.fn() },
}));
vi.mock('electron', () => ({
  ...electron,
  BrowserWindow: class {},
  ipcMain: {},
  Menu: {},
  session: {},
  shell: {},
}));

function failure(e: unknown, dataDir = aFile) {
  const out = { err: '', box: [] as string[], code: -1 };
  failStartup(e, {
    env: {},
    dataDir,
    stderr: (l) => void (out.err += l),
    showErrorBox: (title, content) => void out.box.push(title, content),
    exit: (c) => void (out.code = c),
  });
  return out;
}

function expectOneLine(out: ReturnType<typeof failure>, what: RegExp): void {
  expect(out.code).toBe(2);
  expect(out.err.endsWith('\n')).toBe(true);
  expect(out.err.trim().split('\n')).toHaveLength(1);
  expect(out.err).toMatch(what);
  expect(out.err).not.toMatch(/\n\s+at /);
  expect(out.box).toEqual([START_FAILURE_TITLE, out.err.trim().slice(START_FAILURE_TITLE.length + 2)]);
}

describe('desktop shell start-up failures', () => {
  it('a data folder that is a file says to point YARDWIRE_DATA_DIR at a folder', () => {
    let thrown: unknown;
    try {
      databasePath(join(aFile, 'sub'));
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(Error);
    expectOneLine(failure(thrown), /is a file, not a folder: point YARDWIRE_DATA_DIR at a folder/);
  });

  it('a folder that cannot be written names it and says what to change', () => {
    const e = Object.assign(new Error('EACCES: permission denied'), { code: 'EACCES', syscall: 'mkdir' });
    expectOneLine(failure(e, '/somewhere'), /cannot write in the data folder \/somewhere \(EACCES\): point/);
  });

  it('anything else is its message alone, first line only, without the stack', () => {
    expectOneLine(failure(new Error('something broke\nsecond line')), /cannot start: something broke$/m);
  });

  it('YARDWIRE_DATA_DIR, when set, overrides the userData folder', () => {
    expect(desktopDataDir({ YARDWIRE_DATA_DIR: '/d' }, '/u')).toBe('/d');
    expect(desktopDataDir({}, '/u')).toBe('/u');
    expect(desktopDataDir({ YARDWIRE_DATA_DIR: '' }, '/u')).toBe('/u');
  });

  it('the main process reports a data folder that is a file and exits 2', async () => {
    electron.app.getPath.mockImplementation(() => aFile);
    const stderr = vi.spyOn(process.stderr, 'write').mockImplementation(() => true);
    try {
      await import('../../../electron/main.ts');
      await vi.waitFor(() => expect(electron.app.exit).toHaveBeenCalledWith(2));
      const [title, line] = electron.dialog.showErrorBox.mock.calls[0] as [string, string];
      expect(title).toBe(START_FAILURE_TITLE);
      expect(line).toMatch(/is a file, not a folder: point YARDWIRE_DATA_DIR at a folder/);
      expect(stderr).toHaveBeenCalledWith(`${START_FAILURE_TITLE}: ${line}\n`);
    } finally {
      stderr.mockRestore();
    }
  });
});
