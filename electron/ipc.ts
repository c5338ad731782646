/**
 * IPC: one `ipcMain.handle` per contract call, each delegating to the shared handlers. Messages
 * from any sender other than our own main window's top frame, loaded from our own files, are dropped.
 */
import type { IpcMain, IpcMainInvokeEvent, WebContents } from 'electron';
import { API_NAMES, channelOf } from '../core/api/contract.ts';
import type { HandlerTable } from './api/handlers.ts';

export function isTrustedSender(
  event: IpcMainInvokeEvent,
  trusted: () => WebContents | null,
  appUrlPrefix: string,
): boolean {
  const wc = trusted();
  if (!wc || event.sender !== wc) return false;
  const frame = event.senderFrame;
  if (!frame || frame !== wc.mainFrame) return false;
  return frame.url.startsWith(appUrlPrefix);
}

export function setupIpc(
  ipcMain: IpcMain,
  handlers: HandlerTable,
  trusted: () => WebContents | null,
  appUrlPrefix: string,
): void {
  for (const name of API_NAMES) {
    ipcMain.handle(channelOf(name), (event, request: unknown) => {
      if (!isTrustedSender(event, trusted, appUrlPrefix)) {
        return {
          ok: false,
          error: { code: 'invalid-request', message: 'message from an unknown sender dropped' },
        };
      }
      return handlers[name](request);
    });
  }
}
