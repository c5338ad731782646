// Save as PDF (desktop only) with `electron` mocked: the channel answers only our own window,
// refuses bad requests, reports a cancelled dialog as its own code, prints with print media
// settings and writes the bytes where the user chose; the preload exposes it as one frozen
// function apart from the data API.
import { describe, expect, it, vi } from 'vitest';
import type { IpcMainInvokeEvent, WebContents } from 'electron';

const exposed = new Map<string, unknown>();
const invoke = vi.fn((..._args: unknown[]) => Promise.resolve({ ok: true, path: '/x.pdf' }));
vi.mock('electron', () => ({
  contextBridge: { exposeInMainWorld: (key: string, api: unknown) => exposed.set(key, api) },
  ipcRenderer: { invoke: (...args: unknown[]) => invoke(...args) },
}));

const { savePdf, setupPdfIpc, pageSizeFor, safeFileBase, PDF_MARGIN_IN } =
  await import('../../../electron/pdf.ts');
const { SAVE_PDF_CHANNEL } = await import('../../../electron/desktopBridge.ts');
const { API_NAMES, channelOf } = await import('../../../core/api/contract.ts');
type PdfDeps = import('../../../electron/pdf.ts').PdfDeps;

const APP = 'file:///app/renderer/index.html';
const PDF_BYTES = new Uint8Array([0x25, 0x50, 0x44, 0x46]); // "%PDF"

function setup(over: Partial<PdfDeps> & { chosen?: string | null; country?: string } = {}) {
  const mainFrame = { url: APP };
  const printToPDF = vi.fn((_o: unknown) => Promise.resolve(PDF_BYTES));
  const wc = { mainFrame, printToPDF } as unknown as WebContents;
  const win = { id: 1 };
  const showSaveDialog = vi.fn((_w: unknown, _o: { defaultPath?: string }) =>
    Promise.resolve(
      over.chosen === null
        ? { canceled: true, filePath: '' }
        : { canceled: false, filePath: over.chosen ?? '/home/u/out.pdf' },
    ),
  );
  const writeFile = vi.fn((_p: string, _d: Uint8Array) => Promise.resolve());
  const deps: PdfDeps = {
    dialog: { showSaveDialog } as never,
    trusted: () => wc,
    window: () => win as never,
    appUrlPrefix: 'file:///app/renderer/',
    documentsDir: () => '/home/u/Documents',
    countryCode: () => over.country ?? 'DE',
    writeFile,
    ...over,
  };
  const registered = new Map<string, (e: IpcMainInvokeEvent, r: unknown) => Promise<unknown>>();
  setupPdfIpc({ handle: (ch: string, fn: never) => registered.set(ch, fn) } as never, deps);
  const handler = registered.get(SAVE_PDF_CHANNEL)!;
  const own = { sender: wc, senderFrame: mainFrame } as unknown as IpcMainInvokeEvent;
  return { handler, own, wc, deps, printToPDF, showSaveDialog, writeFile, registered };
}

describe('save as PDF', () => {
  it('registers one channel that is not a data API channel', () => {
    const { registered } = setup();
    expect([...registered.keys()]).toEqual([SAVE_PDF_CHANNEL]);
    expect(API_NAMES.map(channelOf)).not.toContain(SAVE_PDF_CHANNEL);
  });

  it('asks where to save, prints the window and writes the PDF there', async () => {
    const t = setup({ chosen: '/home/u/sheet.pdf' });
    const r = await t.handler(t.own, { fileBase: 'build-sheet-40m-dipole' });
    expect(r).toEqual({ ok: true, path: '/home/u/sheet.pdf' });
    expect(t.showSaveDialog).toHaveBeenCalledOnce();
    const opts = t.showSaveDialog.mock.calls[0]![1] as { defaultPath: string; filters: unknown };
    expect(opts.defaultPath).toBe('/home/u/Documents/build-sheet-40m-dipole.pdf');
    expect(opts.filters).toEqual([{ name: 'PDF document', extensions: ['pdf'] }]);
    expect(t.printToPDF).toHaveBeenCalledWith({
      printBackground: true,
      pageSize: 'A4',
      margins: { top: PDF_MARGIN_IN, bottom: PDF_MARGIN_IN, left: PDF_MARGIN_IN, right: PDF_MARGIN_IN },
    });
    expect(t.writeFile).toHaveBeenCalledWith('/home/u/sheet.pdf', PDF_BYTES);
    // The dialog comes first: nothing prints before the user has chosen.
    expect(t.showSaveDialog.mock.invocationCallOrder[0]!).toBeLessThan(
      t.printToPDF.mock.invocationCallOrder[0]!,
    );
  });

  it('takes Letter paper where that is the usual office size', async () => {
    const t = setup({ country: 'US' });
    await t.handler(t.own, { fileBase: 'x' });
    expect((t.printToPDF.mock.calls[0]![0] as { pageSize: string }).pageSize).toBe('Letter');
    expect(pageSizeFor('ca')).toBe('Letter');
    expect(pageSizeFor('')).toBe('A4');
    expect(pageSizeFor('JP')).toBe('A4');
    expect(PDF_MARGIN_IN * 25.4).toBeCloseTo(14, 10);
  });

  it('reports a cancelled dialog as cancelled and prints nothing', async () => {
    const t = setup({ chosen: null });
    const r = await t.handler(t.own, { fileBase: 'x' });
    expect(r).toMatchObject({ ok: false, error: { code: 'cancelled' } });
    expect(t.printToPDF).not.toHaveBeenCalled();
    expect(t.writeFile).not.toHaveBeenCalled();
  });

  it('drops messages from other windows, sub-frames and foreign pages', async () => {
    const t = setup();
    const other = { mainFrame: { url: APP } };
    const events = [
      { sender: other, senderFrame: other.mainFrame },
      { sender: t.wc, senderFrame: { url: APP } },
      { sender: t.wc, senderFrame: null },
    ];
    for (const e of events)
      expect(await t.handler(e as never, { fileBase: 'x' })).toMatchObject({
        ok: false,
        error: { code: 'invalid-request' },
      });
    const foreign = { url: 'https://evil.example/' };
    const wc2 = { mainFrame: foreign, printToPDF: t.printToPDF } as unknown as WebContents;
    const t2 = setup({ trusted: () => wc2 });
    expect(await t2.handler({ sender: wc2, senderFrame: foreign } as never, { fileBase: 'x' })).toMatchObject(
      {
        ok: false,
        error: { code: 'invalid-request' },
      },
    );
    expect(t.showSaveDialog).not.toHaveBeenCalled();
    expect(t2.showSaveDialog).not.toHaveBeenCalled();
    expect(t.printToPDF).not.toHaveBeenCalled();
  });

  it('refuses malformed requests and keeps the offered name a plain file name', async () => {
    const t = setup();
    for (const bad of [
      null,
      'x',
      {},
      { fileBase: 3 },
      { fileBase: '' },
      { fileBase: '...' },
      { fileBase: 'a'.repeat(121) },
    ])
      expect(await t.handler(t.own, bad)).toMatchObject({ ok: false, error: { code: 'invalid-request' } });
    expect(t.showSaveDialog).not.toHaveBeenCalled();
    expect(safeFileBase({ fileBase: '../../etc/passwd' })).toBe('etc-passwd');
    expect(safeFileBase({ fileBase: 'sheet.PDF' })).toBe('sheet');
    expect(safeFileBase({ fileBase: 'a b/c\\d' })).toBe('a-b-c-d');
  });

  it('answers errors from printing, writing and a missing window without throwing', async () => {
    const t = setup();
    t.printToPDF.mockRejectedValueOnce(new Error('renderer gone'));
    expect(await t.handler(t.own, { fileBase: 'x' })).toMatchObject({
      ok: false,
      error: { code: 'print-failed', message: expect.stringContaining('renderer gone') },
    });
    t.writeFile.mockRejectedValueOnce(new Error('EACCES'));
    expect(await t.handler(t.own, { fileBase: 'x' })).toMatchObject({
      ok: false,
      error: { code: 'write-failed', message: expect.stringContaining('EACCES') },
    });
    const none = setup();
    expect(
      await savePdf({ trusted: true }, { fileBase: 'x' }, { ...none.deps, window: () => null }),
    ).toMatchObject({
      ok: false,
      error: { code: 'no-window' },
    });
    expect(none.showSaveDialog).not.toHaveBeenCalled();
  });
});

describe('preload', () => {
  it('exposes the data API and, apart from it, one frozen desktop function', async () => {
    await import('../../../electron/preload.ts');
    expect([...exposed.keys()].sort()).toEqual(['yardwire', 'yardwireDesktop']);
    const desktop = exposed.get('yardwireDesktop') as Record<string, unknown>;
    expect(Object.isFrozen(desktop)).toBe(true);
    expect(Object.keys(desktop)).toEqual(['savePdf']);
    expect(typeof desktop.savePdf).toBe('function');
    const api = exposed.get('yardwire') as Record<string, unknown>;
    expect(Object.isFrozen(api)).toBe(true);
    expect(Object.keys(api).sort()).toEqual([...API_NAMES].sort());
    expect(api).not.toHaveProperty('savePdf');

    const hostile = { fileBase: 'sheet', extra: { toString: () => 'x' } };
    const r = await (desktop.savePdf as (r: unknown) => Promise<unknown>)(hostile);
    expect(r).toEqual({ ok: true, path: '/x.pdf' });
    expect(invoke).toHaveBeenCalledWith(SAVE_PDF_CHANNEL, { fileBase: 'sheet' });
  });
});
