/**
 * The renderer's API client, built from the one contract. In the Electron window the preload
 * bridge provides `window.yardwire`; in browser mode every call is an HTTP POST to the loopback
 * server carrying the per-run token (taken from the URL fragment `#token=…` on first load and
 * kept in sessionStorage, so a reload keeps working).
 */
import {
  API_NAMES,
  httpPathOf,
  type ApiName,
  type ApiResponse,
  type YardwireApi,
} from '../../../core/api/contract.ts';

declare global {
  interface Window {
    yardwire?: YardwireApi;
  }
}

const TOKEN_KEY = 'yardwire.token';

export function browserToken(): string | null {
  const m = /(?:^#|&)token=([A-Za-z0-9_-]+)/.exec(window.location.hash);
  if (m?.[1]) {
    sessionStorage.setItem(TOKEN_KEY, m[1]);
    history.replaceState(null, '', window.location.pathname + window.location.search);
    return m[1];
  }
  return sessionStorage.getItem(TOKEN_KEY);
}

function httpClient(token: string | null): YardwireApi {
  const client: Partial<Record<ApiName, (req: unknown) => Promise<ApiResponse<unknown>>>> = {};
  for (const name of API_NAMES) {
    client[name] = async (req: unknown) => {
      try {
        const res = await fetch(httpPathOf(name), {
          method: 'POST',
          headers: { 'content-type': 'application/json', 'x-yardwire-token': token ?? '' },
          body: JSON.stringify(req ?? {}),
        });
        return (await res.json()) as ApiResponse<unknown>;
      } catch (e) {
        return {
          ok: false,
          error: { code: 'internal', message: `cannot reach the Yardwire host: ${String(e)}` },
        };
      }
    };
  }
  return client as unknown as YardwireApi;
}

let cached: YardwireApi | null = null;

export function api(): YardwireApi {
  if (cached) return cached;
  cached = window.yardwire ?? httpClient(browserToken());
  return cached;
}

/**
 * The desktop-only bridge, `window.yardwireDesktop`, set by the Electron preload beside the data
 * API (electron/desktopBridge.ts; browser mode has none). Its presence is how the renderer knows
 * it runs in the desktop app.
 */
export interface DesktopBridge {
  savePdf(request: {
    fileBase: string;
  }): Promise<{ ok: true; path: string } | { ok: false; error: { code: string; message: string } }>;
}

declare global {
  interface Window {
    yardwireDesktop?: DesktopBridge;
  }
}

/** The desktop bridge, or null in browser mode. */
export function desktopBridge(): DesktopBridge | null {
  const d = window.yardwireDesktop;
  return d && typeof d.savePdf === 'function' ? d : null;
}
