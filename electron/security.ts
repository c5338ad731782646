/**
 * Security settings shared by the Electron window and browser mode, written out rather than left
 * to defaults. The Content-Security-Policy allows scripts only from the app itself (no eval, no
 * inline scripts); images also from data:/blob: (overlays, exports) and https: (the user's own
 * imagery tile server, when one is set; nothing loads by default).
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  // 'wasm-unsafe-eval' lets WebAssembly compile (the solver's LU kernel); it allows no JavaScript eval.
  "script-src 'self' 'wasm-unsafe-eval'",
  "worker-src 'self' blob:",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob: https:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join('; ');

/** The BrowserWindow web preferences, every security-relevant one written out. */
export const SECURE_WEB_PREFERENCES = {
  contextIsolation: true,
  sandbox: true,
  nodeIntegration: false,
  nodeIntegrationInWorker: false,
  nodeIntegrationInSubFrames: false,
  webSecurity: true,
  allowRunningInsecureContent: false,
  webviewTag: false,
  spellcheck: false,
} as const;

/** External links open only in the system browser, and only http(s). */
export function isSafeExternalUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return (u.protocol === 'https:' || u.protocol === 'http:') && u.username === '' && u.password === '';
  } catch {
    return false;
  }
}
