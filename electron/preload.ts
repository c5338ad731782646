/**
 * The preload bridge: exposes one typed API, built from the contract's list of calls, to the
 * sandboxed renderer as `window.yardwire`. Nothing else crosses: no ipcRenderer, no Node.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { API_NAMES, channelOf } from '../core/api/contract.ts';

const bridge: Record<string, (request: unknown) => Promise<unknown>> = {};
for (const name of API_NAMES) {
  const channel = channelOf(name);
  bridge[name] = (request: unknown) => ipcRenderer.invoke(channel, request);
}
contextBridge.exposeInMainWorld('yardwire', Object.freeze(bridge));
