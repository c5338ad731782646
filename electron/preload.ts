/**
 * The preload bridge: exposes one typed API, built from the contract's list of calls, to the
 * sandboxed renderer as `window.yardwire`, and the desktop-only calls (`desktopBridge.ts`: save
 * as PDF) as a separate `window.yardwireDesktop`. Nothing else crosses: no ipcRenderer, no Node.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { API_NAMES, channelOf } from '../core/api/contract.ts';
import { SAVE_PDF_CHANNEL, type SavePdfResult, type YardwireDesktop } from './desktopBridge.ts';

const bridge: Record<string, (request: unknown) => Promise<unknown>> = {};
for (const name of API_NAMES) {
  const channel = channelOf(name);
  bridge[name] = (request: unknown) => ipcRenderer.invoke(channel, request);
}
contextBridge.exposeInMainWorld('yardwire', Object.freeze(bridge));

const desktop: YardwireDesktop = {
  // Only the file base crosses, copied into a fresh object (no caller object reaches the main process).
  savePdf: (request) =>
    ipcRenderer.invoke(SAVE_PDF_CHANNEL, {
      fileBase: String(request?.fileBase ?? ''),
    }) as Promise<SavePdfResult>,
};
contextBridge.exposeInMainWorld('yardwireDesktop', Object.freeze(desktop));
