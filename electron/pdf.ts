/**
 * Save as PDF (desktop only): the renderer opens its print view (which makes the app's print
 * styles show only the report), then asks over `SAVE_PDF_CHANNEL`; the main process checks the
 * sender, asks where to save, prints the main window to PDF with print media and writes the file.
 * Plain module: the Electron pieces come in as arguments, so unit tests call it with fakes.
 */
import type { BaseWindow, Dialog, IpcMain, WebContents } from 'electron';
import { join } from 'node:path';
import { isTrustedSender } from './ipc.ts';
import { SAVE_PDF_CHANNEL, type SavePdfRequest, type SavePdfResult } from './desktopBridge.ts';

/**
 * Countries whose usual office paper is US Letter (common practice, no source); everywhere else
 * A4. An unknown country (empty code) gets A4.
 */
const LETTER_COUNTRIES = new Set([
  'US',
  'PR',
  'CA',
  'MX',
  'PH',
  'CL',
  'CO',
  'VE',
  'CR',
  'GT',
  'PA',
  'DO',
  'SV',
  'NI',
]);

/** 14 mm on every side, in inches (what printToPDF takes), matching the report's own print margin. */
export const PDF_MARGIN_IN = 14 / 25.4;

/** The longest file base accepted; longer names are refused rather than cut. */
export const MAX_FILE_BASE_CHARS = 120;

export function pageSizeFor(countryCode: string): 'A4' | 'Letter' {
  return LETTER_COUNTRIES.has(countryCode.trim().toUpperCase()) ? 'Letter' : 'A4';
}

/**
 * The request's file base as a safe file name (letters, digits, dot, dash, underscore; anything
 * else becomes a dash; no leading dots), or null when the request is not `{ fileBase: string }`.
 */
export function safeFileBase(request: unknown): string | null {
  if (typeof request !== 'object' || request === null) return null;
  const raw = (request as Partial<SavePdfRequest>).fileBase;
  if (typeof raw !== 'string' || raw.length === 0 || raw.length > MAX_FILE_BASE_CHARS) return null;
  const base = raw
    .replace(/[^A-Za-z0-9._-]+/g, '-')
    .replace(/^[.-]+/, '')
    .replace(/\.pdf$/i, '');
  return base.length > 0 ? base : null;
}

export interface PdfDeps {
  dialog: Pick<Dialog, 'showSaveDialog'>;
  /** The main window's web contents (null while there is none). */
  trusted: () => WebContents | null;
  /** The parent of the save dialog. */
  window: () => BaseWindow | null;
  /** URL prefix of our own pages (as for the data API). */
  appUrlPrefix: string;
  /** Where the save dialog starts. */
  documentsDir: () => string;
  /** The system's two-letter country code, or '' when unknown. */
  countryCode: () => string;
  writeFile: (path: string, data: Uint8Array) => Promise<void>;
}

const fail = (
  code: Extract<SavePdfResult, { ok: false }>['error']['code'],
  message: string,
): SavePdfResult => ({
  ok: false,
  error: { code, message },
});

/** One save-as-PDF request, start to end; never throws. */
export async function savePdf(
  sender: { trusted: boolean },
  request: unknown,
  deps: PdfDeps,
): Promise<SavePdfResult> {
  if (!sender.trusted) return fail('invalid-request', 'message from an unknown sender dropped');
  const base = safeFileBase(request);
  if (!base)
    return fail('invalid-request', `fileBase must be a file name of 1 to ${MAX_FILE_BASE_CHARS} characters`);
  const wc = deps.trusted();
  const win = deps.window();
  if (!wc || !win) return fail('no-window', 'the Yardwire window is not open');
  let path: string;
  try {
    const choice = await deps.dialog.showSaveDialog(win, {
      title: 'Save the build sheet as PDF',
      defaultPath: join(deps.documentsDir(), `${base}.pdf`),
      filters: [{ name: 'PDF document', extensions: ['pdf'] }],
      properties: ['createDirectory', 'showOverwriteConfirmation'],
    });
    if (choice.canceled || !choice.filePath)
      return fail('cancelled', 'not saved: the save dialog was cancelled');
    path = choice.filePath;
  } catch (e) {
    return fail('write-failed', `the save dialog failed: ${String(e)}`);
  }
  let pdf: Uint8Array;
  try {
    pdf = await wc.printToPDF({
      printBackground: true,
      pageSize: pageSizeFor(deps.countryCode()),
      margins: { top: PDF_MARGIN_IN, bottom: PDF_MARGIN_IN, left: PDF_MARGIN_IN, right: PDF_MARGIN_IN },
    });
  } catch (e) {
    return fail('print-failed', `the window could not be printed to PDF: ${String(e)}`);
  }
  try {
    await deps.writeFile(path, pdf);
  } catch (e) {
    return fail('write-failed', `could not write ${path}: ${String(e)}`);
  }
  return { ok: true, path };
}

/** Register the desktop-only save-as-PDF channel. */
export function setupPdfIpc(ipcMain: Pick<IpcMain, 'handle'>, deps: PdfDeps): void {
  ipcMain.handle(SAVE_PDF_CHANNEL, (event, request: unknown) =>
    savePdf({ trusted: isTrustedSender(event, deps.trusted, deps.appUrlPrefix) }, request, deps),
  );
}
