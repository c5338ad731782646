/**
 * The aerial image under the drawing: load it with the project, import a GeoTIFF (decoded in the
 * renderer, stored as a PNG through the API), clear it, and its opacity (kept per project in
 * localStorage, since it is a view preference, not project data).
 */
import { MAX_MESSAGE_BYTES, type ImageOverlay, type YardwireApi } from '../../../core/api/contract.ts';
import { AerialImportError, aerialToPngDataUrl, decodeGeoTiff } from '../lib/aerial.ts';

const OPACITY_KEY = 'yardwire.overlayOpacity.';
/** Longest image side tried first; halved while the PNG would not fit in one API message. */
const FIRST_MAX_SIDE_PX = 2048;
const SMALLEST_MAX_SIDE_PX = 256;

export class OverlayState {
  overlay = $state.raw<ImageOverlay | null>(null);
  opacity = $state(0.85);
  busy = $state(false);
  error = $state<string | null>(null);
  #api: () => YardwireApi;

  constructor(client: () => YardwireApi) {
    this.#api = client;
  }

  async load(projectId: string): Promise<void> {
    this.error = null;
    this.overlay = null;
    const stored = Number(localStorage.getItem(OPACITY_KEY + projectId));
    this.opacity = Number.isFinite(stored) && stored > 0 && stored <= 1 ? stored : 0.85;
    const r = await this.#api().getOverlay({ projectId });
    if (r.ok) this.overlay = r.value;
    else this.error = `Cannot load the aerial image: ${r.error.message}`;
  }

  setOpacity(projectId: string, value: number): void {
    this.opacity = Math.min(1, Math.max(0.05, value));
    localStorage.setItem(OPACITY_KEY + projectId, String(this.opacity));
  }

  /** Decode a GeoTIFF and store it as this project's overlay. True when it worked. */
  async importTiff(projectId: string, name: string, bytes: ArrayBuffer): Promise<boolean> {
    this.busy = true;
    this.error = null;
    try {
      let maxSide = FIRST_MAX_SIDE_PX;
      for (;;) {
        const decoded = await decodeGeoTiff(bytes, maxSide);
        const pngDataUrl = aerialToPngDataUrl(decoded);
        if (pngDataUrl.length < MAX_MESSAGE_BYTES - 4096 || maxSide <= SMALLEST_MAX_SIDE_PX) {
          const overlay: ImageOverlay = {
            projectId,
            name: name.slice(0, 200) || 'aerial',
            bounds: decoded.bounds,
            pngDataUrl,
          };
          const r = await this.#api().setOverlay(overlay);
          if (!r.ok) throw new AerialImportError(`The host did not store the image: ${r.error.message}`);
          this.overlay = overlay;
          return true;
        }
        maxSide /= 2;
      }
    } catch (e) {
      const why = e instanceof AerialImportError ? e.message : `Import failed: ${String(e)}`;
      this.error = `${name}: ${why}`;
      return false;
    } finally {
      this.busy = false;
    }
  }

  async importFile(projectId: string, file: File): Promise<boolean> {
    return this.importTiff(projectId, file.name, await file.arrayBuffer());
  }

  /** The invented demo aerial, served by the app itself (no network beyond its own origin). */
  async importDemo(projectId: string): Promise<boolean> {
    try {
      const bytes = await loadBytes('./demo/demo-aerial.tif');
      return await this.importTiff(projectId, 'Demo aerial (invented)', bytes);
    } catch (e) {
      this.error = `The demo aerial could not be loaded: ${String(e)}`;
      return false;
    }
  }

  async clear(projectId: string): Promise<void> {
    const r = await this.#api().clearOverlay({ projectId });
    if (r.ok) this.overlay = null;
    else this.error = `Cannot remove the aerial image: ${r.error.message}`;
  }
}

/** Read a file of the app itself; XHR as a fallback where fetch refuses file: URLs (desktop shell). */
async function loadBytes(url: string): Promise<ArrayBuffer> {
  try {
    const res = await fetch(url);
    if (!res.ok) throw new Error(`HTTP ${res.status}`);
    return await res.arrayBuffer();
  } catch (fetchError) {
    if (location.protocol !== 'file:') throw fetchError;
    return new Promise((resolve, reject) => {
      const xhr = new XMLHttpRequest();
      xhr.open('GET', url);
      xhr.responseType = 'arraybuffer';
      xhr.onload = () => resolve(xhr.response as ArrayBuffer);
      xhr.onerror = () => reject(new Error(`cannot read ${url}`));
      xhr.send();
    });
  }
}
