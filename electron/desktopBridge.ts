/**
 * The desktop-only bridge: calls that only the Electron shell can serve (browser mode has no
 * equivalent), kept apart from the data API contract (`core/api/contract.ts`), which lists the
 * calls both shells serve. The preload exposes it as `window.yardwireDesktop`; the renderer takes
 * its presence as the sign that it runs in the desktop app. No imports: the preload bundles this.
 */

/** The IPC channel of `savePdf` (contract channels are `yardwire:<camelCaseName>`; a hyphen never is). */
export const SAVE_PDF_CHANNEL = 'yardwire:save-pdf';

export interface SavePdfRequest {
  /** The file name without extension, offered in the save dialog as `<fileBase>.pdf`. */
  fileBase: string;
}

export type SavePdfErrorCode =
  'cancelled' | 'invalid-request' | 'no-window' | 'print-failed' | 'write-failed';

export type SavePdfResult =
  { ok: true; path: string } | { ok: false; error: { code: SavePdfErrorCode; message: string } };

/** What `window.yardwireDesktop` holds: one function. */
export interface YardwireDesktop {
  /** Ask where to save, print the window (print media) to PDF and write it there. */
  savePdf(request: SavePdfRequest): Promise<SavePdfResult>;
}
