/**
 * The aerial image under the drawing. A GeoTIFF in any projected or geographic system is opened
 * from the user's file and read a window at a time, at the level the map shows
 * (lib/aerial.ts); the store keeps only a reference to the file and its georeference, unless the
 * user asks to embed a copy (a PNG of at most FIRST_MAX_SIDE_PX on its longer side). A referenced
 * file must stay where it is; after a restart the user chooses it again and it is recognised by
 * name and size. Opacity is kept per project in localStorage (a view preference, not data).
 */
import { MAX_MESSAGE_BYTES, type ImageOverlay, type YardwireApi } from '../../../core/api/contract.ts';
import { sameFile, type AerialReference } from '../../../core/project/aerialReference.ts';
import {
  AerialImportError,
  AerialSource,
  aerialCanvas,
  aerialToPngDataUrl,
  decodeGeoTiff,
  type LatLngBox,
  type RenderedAerial,
} from '../lib/aerial.ts';

const OPACITY_KEY = 'yardwire.overlayOpacity.';
/** Longest image side tried first when embedding; halved while the PNG would not fit in one API message. */
const FIRST_MAX_SIDE_PX = 2048;
const SMALLEST_MAX_SIDE_PX = 256;
/** Longest side of one rendered view. */
const MAX_VIEW_SIDE_PX = 2048;

export interface OverlayDisplay {
  url: string;
  bounds: LatLngBox;
}

export class OverlayState {
  overlay = $state.raw<ImageOverlay | null>(null);
  /** The image file opened in this session, read on demand. */
  live = $state.raw<AerialSource | null>(null);
  /** What the map shows now. */
  display = $state.raw<OverlayDisplay | null>(null);
  opacity = $state(0.85);
  busy = $state(false);
  progress = $state.raw<{ fraction: number; what: string } | null>(null);
  error = $state<string | null>(null);
  /** The stored overlay refers to a file that is not open in this session. */
  needsFile = $derived(!!this.overlay?.source && !this.overlay.pngDataUrl && !this.live);
  #api: () => YardwireApi;
  #viewSeq = 0;
  #blobUrl: string | null = null;

  constructor(client: () => YardwireApi) {
    this.#api = client;
  }

  async load(projectId: string): Promise<void> {
    this.error = null;
    this.overlay = null;
    this.live = null;
    this.#setDisplay(null);
    const stored = Number(localStorage.getItem(OPACITY_KEY + projectId));
    this.opacity = Number.isFinite(stored) && stored > 0 && stored <= 1 ? stored : 0.85;
    const r = await this.#api().getOverlay({ projectId });
    if (r.ok) {
      this.overlay = r.value;
      if (r.value?.pngDataUrl) this.#setDisplay({ url: r.value.pngDataUrl, bounds: r.value.bounds });
    } else this.error = `Cannot load the aerial image: ${r.error.message}`;
  }

  setOpacity(projectId: string, value: number): void {
    this.opacity = Math.min(1, Math.max(0.05, value));
    localStorage.setItem(OPACITY_KEY + projectId, String(this.opacity));
  }

  #setDisplay(d: OverlayDisplay | null): void {
    if (this.#blobUrl && d?.url !== this.#blobUrl) {
      URL.revokeObjectURL(this.#blobUrl);
      this.#blobUrl = null;
    }
    this.display = d;
  }

  async #open(input: Blob | ArrayBuffer): Promise<AerialSource> {
    return AerialSource.open(input, (fraction, what) => (this.progress = { fraction, what }));
  }

  async #guard(name: string, work: () => Promise<void>): Promise<boolean> {
    this.busy = true;
    this.error = null;
    this.progress = null;
    try {
      await work();
      return true;
    } catch (e) {
      const why = e instanceof AerialImportError ? e.message : `Import failed: ${String(e)}`;
      this.error = `${name}: ${why}`;
      return false;
    } finally {
      this.busy = false;
      this.progress = null;
    }
  }

  /** Open a GeoTIFF file and make it this project's overlay: referenced, or embedded when asked. */
  async importFile(projectId: string, file: File, embed = false): Promise<boolean> {
    return this.#guard(file.name, async () => {
      const source = await this.#open(file);
      const ref: AerialReference = {
        fileName: file.name.slice(0, 260) || 'aerial.tif',
        sizeBytes: file.size,
        modifiedMs: Math.max(0, file.lastModified || 0),
        widthPx: source.georef.widthPx,
        heightPx: source.georef.heightPx,
        crs: source.georef.crs,
        transform: source.georef.transform,
      };
      const overlay: ImageOverlay = {
        projectId,
        name: file.name.slice(0, 200) || 'aerial',
        bounds: source.bounds,
        source: ref,
        ...(embed ? { pngDataUrl: await this.#embedded(source) } : {}),
      };
      await this.#store(overlay);
      this.live = source;
      if (overlay.pngDataUrl) this.#setDisplay({ url: overlay.pngDataUrl, bounds: overlay.bounds });
    });
  }

  /** Open again the file a stored reference points to (after a restart). */
  async reopen(file: File): Promise<boolean> {
    const ref = this.overlay?.source;
    if (!ref) return false;
    return this.#guard(file.name, async () => {
      if (!sameFile(ref, file))
        throw new AerialImportError(
          `This is not the file the project refers to (${ref.fileName}, ${(ref.sizeBytes / 1e6).toFixed(1)} MB).`,
        );
      const source = await this.#open(file);
      const same = source.georef.transform.every(
        (v, i) => Math.abs(v - ref.transform[i]!) < 1e-9 * (1 + Math.abs(v)),
      );
      if (!same)
        throw new AerialImportError(
          'The file has the same name and size but lies elsewhere; import it anew.',
        );
      this.live = source;
    });
  }

  /** Keep a PNG copy of the open file in the project as well as the reference. */
  async embedNow(): Promise<boolean> {
    const source = this.live;
    const o = this.overlay;
    if (!source || !o) return false;
    return this.#guard(o.name, async () => {
      await this.#store({ ...o, pngDataUrl: await this.#embedded(source) });
    });
  }

  async #embedded(source: AerialSource): Promise<string> {
    for (let side = FIRST_MAX_SIDE_PX; ; side /= 2) {
      const [w, h] = source.wholeSize(side);
      const url = aerialToPngDataUrl(await source.render(source.bounds, w, h));
      if (url.length < MAX_MESSAGE_BYTES - 64 * 1024 || side <= SMALLEST_MAX_SIDE_PX) return url;
    }
  }

  async #store(overlay: ImageOverlay): Promise<void> {
    const r = await this.#api().setOverlay(overlay);
    if (!r.ok) throw new AerialImportError(`The host did not store the image: ${r.error.message}`);
    this.overlay = overlay;
  }

  /**
   * Render the live image for the part of the map in view (`view`, `widthPx` × `heightPx` screen
   * pixels); the latest call wins. While the file is open it is drawn from the file (sharper than
   * an embedded copy, which is shown only when the file is not open).
   */
  async showView(view: LatLngBox, widthPx: number, heightPx: number): Promise<void> {
    const source = this.live;
    if (!source) return;
    const seq = ++this.#viewSeq;
    const k = Math.min(1, MAX_VIEW_SIDE_PX / Math.max(widthPx, heightPx, 1));
    let r: RenderedAerial;
    try {
      r = await source.render(view, Math.max(1, widthPx * k), Math.max(1, heightPx * k));
    } catch (e) {
      this.error = e instanceof AerialImportError ? e.message : String(e);
      return;
    }
    if (seq !== this.#viewSeq) return;
    const url = await toBlobUrl(r);
    if (seq !== this.#viewSeq) {
      URL.revokeObjectURL(url);
      return;
    }
    this.#setDisplay({ url, bounds: r.bounds });
    this.#blobUrl = url;
  }

  /** Decode bytes and store them embedded (the demo aerial, small images). */
  async importTiff(projectId: string, name: string, bytes: ArrayBuffer): Promise<boolean> {
    return this.#guard(name, async () => {
      let maxSide = FIRST_MAX_SIDE_PX;
      for (;;) {
        const decoded = await decodeGeoTiff(bytes, maxSide);
        const pngDataUrl = aerialToPngDataUrl(decoded);
        if (pngDataUrl.length < MAX_MESSAGE_BYTES - 64 * 1024 || maxSide <= SMALLEST_MAX_SIDE_PX) {
          const overlay: ImageOverlay = {
            projectId,
            name: name.slice(0, 200) || 'aerial',
            bounds: decoded.bounds,
            pngDataUrl,
          };
          await this.#store(overlay);
          this.live = null;
          this.#setDisplay({ url: pngDataUrl, bounds: overlay.bounds });
          return;
        }
        maxSide /= 2;
      }
    });
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
    if (r.ok) {
      this.overlay = null;
      this.live = null;
      this.#setDisplay(null);
    } else this.error = `Cannot remove the aerial image: ${r.error.message}`;
  }
}

async function toBlobUrl(r: RenderedAerial): Promise<string> {
  const canvas = aerialCanvas(r);
  const blob = await new Promise<Blob | null>((res) => canvas.toBlob(res, 'image/png'));
  if (!blob) throw new AerialImportError('The view could not be drawn.');
  return URL.createObjectURL(blob);
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
