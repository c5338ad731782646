/**
 * Georeferenced aerial images (GeoTIFF) under the map: any projected or geographic system the
 * file's GeoKeys describe (core/project/crs.ts), reprojected onto the map's web-mercator grid,
 * read a window at a time at the overview level the map shows.
 *
 * Georeference: ModelTiepoint + ModelPixelScale or ModelTransformation (GeoTIFF 1.0 §2.6); a
 * PixelIsPoint raster (GTRasterTypeGeoKey = 2) ties pixel centres, shifted here by half a pixel.
 * Reprojection: each output pixel's centre goes map → [lon, lat] → the file's x, y → source pixel
 * (inverse affine); the exact transform is computed on a coarse grid of nodes and interpolated
 * bilinearly between them (error well under a pixel at lot scale; the test checks 0.5 m).
 * Memory: a window is read only at a level where one source pixel is at least half an output
 * pixel, so a view reads at most about 4× its own pixel count; files whose coarsest level is still
 * larger than OVERVIEW_SIDE_PX get one overview built in memory by reading the file in bands of
 * at most BAND_BYTES. Nothing holds the whole image.
 */
import { fromArrayBuffer, fromBlob, type GeoTIFF, type GeoTIFFImage } from 'geotiff';
import type { LonLat } from '../../../core/project/schema.ts';
import {
  CrsError,
  crsFromGeoKeys,
  lonLatToWebMercator,
  projector,
  webMercatorToLonLat,
  type ImageCrs,
  type Projector,
} from '../../../core/project/crs.ts';

export { webMercatorToLonLat };

export class AerialImportError extends Error {
  override name = 'AerialImportError';
}

/** Affine map of pixel corners to the file's own x, y: x = t0 + t1·col + t2·row, y = t3 + t4·col + t5·row. */
export type Affine = [number, number, number, number, number, number];

/** What locates an image: plain data, stored with the overlay's reference. */
export interface AerialGeoref {
  crs: ImageCrs;
  widthPx: number;
  heightPx: number;
  transform: Affine;
}

/** [[south, west], [north, east]] degrees, as the overlay API carries it. */
export type LatLngBox = [[number, number], [number, number]];

export interface RenderedAerial {
  width: number;
  height: number;
  rgba: Uint8ClampedArray;
  bounds: LatLngBox;
}

export interface DecodedAerial extends RenderedAerial {
  /** Label of the image's coordinate system, e.g. "EPSG:32615 (metre)". */
  crs: string;
}

export type Progress = (fraction: number, what: string) => void;

/** Longest side of the coarsest level kept for zoomed-out views. */
export const OVERVIEW_SIDE_PX = 2048;
/** Largest band read at once while building an overview. */
export const BAND_BYTES = 16 * 1024 * 1024;
/** Largest window read for one view (pixels of the chosen level). */
export const MAX_WINDOW_PX = 4096 * 4096;
const GRID_NODES = 16;

function isTiff(head: Uint8Array): boolean {
  if (head.length < 8) return false;
  const b = head;
  const le = b[0] === 0x49 && b[1] === 0x49 && (b[2] === 42 || b[2] === 43) && b[3] === 0;
  const be = b[0] === 0x4d && b[1] === 0x4d && b[2] === 0 && (b[3] === 42 || b[3] === 43);
  return le || be;
}

type GeoKeys = Partial<Record<string, unknown>>;

async function checkComplete(image: GeoTIFFImage, byteLength: number): Promise<void> {
  const fd = image.getFileDirectory();
  const tiled = fd.hasTag('TileOffsets');
  const offsets = (await fd.loadValue(tiled ? 'TileOffsets' : 'StripOffsets')) as
    ArrayLike<number> | undefined;
  const counts = (await fd.loadValue(tiled ? 'TileByteCounts' : 'StripByteCounts')) as
    ArrayLike<number> | undefined;
  if (!offsets || !counts) throw new AerialImportError('The TIFF has no image data (no strips or tiles).');
  const [w, h] = [image.getWidth(), image.getHeight()];
  const [tw, th] = [image.getTileWidth(), image.getTileHeight()];
  if (!(w > 0 && h > 0 && tw > 0 && th > 0))
    throw new AerialImportError(
      `The image size (${w} × ${h}) or its ${tiled ? 'tile' : 'strip'} size is not possible.`,
    );
  const planes = image.planarConfiguration === 2 ? image.getSamplesPerPixel() : 1;
  const needed = Math.ceil(w / tw) * Math.ceil(h / th) * planes;
  if (offsets.length !== needed || counts.length !== needed)
    throw new AerialImportError(
      `The TIFF's ${tiled ? 'tile' : 'strip'} table holds ${offsets.length} entries, but a ${w} × ${h} image needs ${needed}; the file is damaged.`,
    );
  for (let i = 0; i < offsets.length; i++) {
    if ((offsets[i] ?? 0) + (counts[i] ?? 0) > byteLength) {
      throw new AerialImportError(
        `The file is truncated: its image data (${tiled ? 'tile' : 'strip'} ${i}) ends after the end of the file. Copy or export it again.`,
      );
    }
  }
}

/** The affine georeference of an image (GeoTIFF 1.0 §2.6.1), pixel-corner convention. */
export async function affineOf(image: GeoTIFFImage, pixelIsPoint: boolean): Promise<Affine> {
  const fd = image.getFileDirectory();
  const shift = pixelIsPoint ? 0.5 : 0;
  if (fd.hasTag('ModelTransformation')) {
    const t = (await fd.loadValue('ModelTransformation')) as ArrayLike<number>;
    if (t.length < 8) throw new AerialImportError('ModelTransformation: it has fewer than 8 values.');
    const [a, b, , d, e, f, , h] = [t[0]!, t[1]!, t[2]!, t[3]!, t[4]!, t[5]!, t[6]!, t[7]!];
    return [d - shift * (a + b), a, b, h - shift * (e + f), e, f];
  }
  if (fd.hasTag('ModelTiepoint') && fd.hasTag('ModelPixelScale')) {
    const tp = (await fd.loadValue('ModelTiepoint')) as ArrayLike<number>;
    const ps = (await fd.loadValue('ModelPixelScale')) as ArrayLike<number>;
    if (tp.length < 6 || ps.length < 2)
      throw new AerialImportError('ModelTiepoint or ModelPixelScale: too few values.');
    const [i, j, x, y] = [tp[0]!, tp[1]!, tp[3]!, tp[4]!];
    const [sx, sy] = [ps[0]!, ps[1]!];
    if (!(sx > 0) || !(sy > 0))
      throw new AerialImportError(`ModelPixelScale: the pixel size must be positive (it is ${sx} by ${sy}).`);
    return [x - (i + shift) * sx, sx, 0, y + (j + shift) * sy, 0, -sy];
  }
  throw new AerialImportError(
    'This TIFF has no georeference (no ModelTiepoint and ModelPixelScale, nor ModelTransformation), ' +
      'so Yardwire cannot tell where it lies. Export it as a GeoTIFF from your mapping tool.',
  );
}

function invertAffine(t: Affine): (x: number, y: number) => [number, number] {
  const [x0, a, b, y0, c, d] = t;
  const det = a * d - b * c;
  return (x, y) => {
    const dx = x - x0;
    const dy = y - y0;
    return [(d * dx - b * dy) / det, (a * dy - c * dx) / det];
  };
}

/** [lon, lat] of image pixel-corner coordinates (col, row). */
export function lonLatOfPixel(g: AerialGeoref, p: Projector, col: number, row: number): LonLat {
  const t = g.transform;
  return p.toLonLat(t[0] + t[1] * col + t[2] * row, t[3] + t[4] * col + t[5] * row);
}

/** The image's four corners in [lon, lat]: north-west, north-east, south-east, south-west (row 0 is north). */
export function footprintOf(g: AerialGeoref): LonLat[] {
  const p = projector(g.crs);
  return [
    [0, 0],
    [g.widthPx, 0],
    [g.widthPx, g.heightPx],
    [0, g.heightPx],
  ].map(([c, r]) => lonLatOfPixel(g, p, c!, r!));
}

/** The [[south, west], [north, east]] box holding the whole image (edges sampled, so curved edges count). */
export function boundsOf(g: AerialGeoref): LatLngBox {
  const p = projector(g.crs);
  let [s, w, n, e] = [Infinity, Infinity, -Infinity, -Infinity];
  const N = 8;
  for (let k = 0; k <= N; k++) {
    const f = k / N;
    for (const [c, r] of [
      [f * g.widthPx, 0],
      [f * g.widthPx, g.heightPx],
      [0, f * g.heightPx],
      [g.widthPx, f * g.heightPx],
    ] as const) {
      const [lon, lat] = lonLatOfPixel(g, p, c, r);
      s = Math.min(s, lat);
      n = Math.max(n, lat);
      w = Math.min(w, lon);
      e = Math.max(e, lon);
    }
  }
  if (
    ![s, w, n, e].every(Number.isFinite) ||
    w < -180 ||
    e > 180 ||
    s < -85.06 ||
    n > 85.06 ||
    w >= e ||
    s >= n
  ) {
    throw new AerialImportError(
      'The georeference puts the image outside the map (its corners fall outside −180…180° longitude or ' +
        '−85…85° latitude). The image is probably in a system its GeoKeys do not declare.',
    );
  }
  return [
    [s, w],
    [n, e],
  ];
}

interface Level {
  /** Source pixels of full resolution per pixel of this level. */
  factor: number;
  width: number;
  height: number;
  /** RGBA of the window [x0, y0, x1, y1) of this level. */
  read(win: [number, number, number, number]): Promise<Uint8ClampedArray>;
}

function toRgba(data: ArrayLike<number>, pixels: number): Uint8ClampedArray {
  const channels = Math.round(data.length / pixels);
  if (channels !== 3 && channels !== 4) {
    throw new AerialImportError(`Unexpected pixel layout (${channels} channels); export the image as RGB.`);
  }
  const scale = data instanceof Uint16Array ? 1 / 257 : 1;
  const out = new Uint8ClampedArray(pixels * 4);
  for (let p = 0; p < pixels; p++) {
    out[p * 4] = (data[p * channels] ?? 0) * scale;
    out[p * 4 + 1] = (data[p * channels + 1] ?? 0) * scale;
    out[p * 4 + 2] = (data[p * channels + 2] ?? 0) * scale;
    out[p * 4 + 3] = channels === 4 ? (data[p * channels + 3] ?? 0) * scale : 255;
  }
  return out;
}

function fileLevel(image: GeoTIFFImage, factor: number): Level {
  return {
    factor,
    width: image.getWidth(),
    height: image.getHeight(),
    async read(win) {
      const w = win[2] - win[0];
      const h = win[3] - win[1];
      let data: ArrayLike<number>;
      try {
        data = (await image.readRGB({
          window: win,
          interleave: true,
          enableAlpha: true,
        })) as ArrayLike<number>;
      } catch (e) {
        throw new AerialImportError(`The image data cannot be decoded (${String(e)}).`);
      }
      return toRgba(data, w * h);
    },
  };
}

/** An open GeoTIFF: its georeference, levels, and views rendered on demand. */
export class AerialSource {
  readonly georef: AerialGeoref;
  readonly bounds: LatLngBox;
  /** Largest window read so far, in pixels (for the memory figure of the benchmark). */
  maxWindowPx = 0;
  #levels: Level[];
  #proj: Projector;

  private constructor(georef: AerialGeoref, levels: Level[]) {
    this.georef = georef;
    this.bounds = boundsOf(georef);
    this.#levels = levels.sort((a, b) => a.factor - b.factor);
    this.#proj = projector(georef.crs);
  }

  /** Open a GeoTIFF from a file (read lazily, a window at a time) or from bytes in memory. */
  static async open(input: Blob | ArrayBuffer, progress?: Progress): Promise<AerialSource> {
    const byteLength = input instanceof ArrayBuffer ? input.byteLength : input.size;
    const head =
      input instanceof ArrayBuffer
        ? new Uint8Array(input, 0, Math.min(8, byteLength))
        : new Uint8Array(await input.slice(0, 8).arrayBuffer());
    if (!isTiff(head))
      throw new AerialImportError('This file is not a TIFF image (it does not start like one).');
    try {
      return await AerialSource.#openTiff(input, byteLength, progress);
    } catch (e) {
      if (e instanceof AerialImportError) throw e;
      if (e instanceof CrsError) throw new AerialImportError(`GeoKeys, ${e.message}`);
      throw new AerialImportError(`The TIFF cannot be read; it may be truncated or damaged (${String(e)}).`);
    }
  }

  static async #openTiff(
    input: Blob | ArrayBuffer,
    byteLength: number,
    progress?: Progress,
  ): Promise<AerialSource> {
    const tiff: GeoTIFF = input instanceof ArrayBuffer ? await fromArrayBuffer(input) : await fromBlob(input);
    const image = await tiff.getImage(0);
    const count = await tiff.getImageCount();
    const keys = image.getGeoKeys() as GeoKeys | null;
    const transform = await affineOf(image, keys?.['GTRasterTypeGeoKey'] === 2);
    const crs: ImageCrs = crsFromGeoKeys(keys ?? {});
    await checkComplete(image, byteLength);
    const georef: AerialGeoref = { crs, widthPx: image.getWidth(), heightPx: image.getHeight(), transform };
    if (!(georef.widthPx > 0 && georef.heightPx > 0))
      throw new AerialImportError(
        `The image is ${georef.widthPx} × ${georef.heightPx} pixels; there is nothing to show.`,
      );
    const levels: Level[] = [fileLevel(image, 1)];
    // Reduced-resolution images of the same file (overviews), when they cover the same extent.
    for (let i = 1; i < Math.min(count, 16); i++) {
      const sub = await tiff.getImage(i);
      const f = georef.widthPx / sub.getWidth();
      if (f > 1 && Math.abs(georef.heightPx / sub.getHeight() - f) / f < 0.05) levels.push(fileLevel(sub, f));
    }
    const source = new AerialSource(georef, levels);
    await source.#ensureOverview(progress);
    return source;
  }

  /** Builds one overview in memory when the coarsest level is still larger than OVERVIEW_SIDE_PX. */
  async #ensureOverview(progress?: Progress): Promise<void> {
    const coarse = this.#levels[this.#levels.length - 1]!;
    const side = Math.max(coarse.width, coarse.height);
    if (side <= OVERVIEW_SIDE_PX) return;
    const k = Math.ceil(side / OVERVIEW_SIDE_PX);
    const ow = Math.ceil(coarse.width / k);
    const oh = Math.ceil(coarse.height / k);
    const out = new Uint8ClampedArray(ow * oh * 4);
    const rowsPerBand = Math.max(k, Math.floor(BAND_BYTES / (coarse.width * 4) / k) * k);
    for (let y0 = 0; y0 < coarse.height; y0 += rowsPerBand) {
      const y1 = Math.min(coarse.height, y0 + rowsPerBand);
      progress?.(y0 / coarse.height, 'Building an overview of the image');
      const band = await coarse.read([0, y0, coarse.width, y1]);
      this.maxWindowPx = Math.max(this.maxWindowPx, coarse.width * (y1 - y0));
      for (let oy = y0 / k; oy < Math.ceil(y1 / k); oy++) {
        for (let ox = 0; ox < ow; ox++) {
          let r = 0;
          let g = 0;
          let b = 0;
          let a = 0;
          let n = 0;
          for (let sy = oy * k - y0; sy < Math.min(oy * k + k, y1) - y0; sy++) {
            for (let sx = ox * k; sx < Math.min(ox * k + k, coarse.width); sx++) {
              const i = (sy * coarse.width + sx) * 4;
              r += band[i]!;
              g += band[i + 1]!;
              b += band[i + 2]!;
              a += band[i + 3]!;
              n++;
            }
          }
          const o = (oy * ow + ox) * 4;
          out[o] = r / n;
          out[o + 1] = g / n;
          out[o + 2] = b / n;
          out[o + 3] = a / n;
        }
      }
    }
    progress?.(1, 'Overview built');
    this.#levels.push({
      factor: coarse.factor * k,
      width: ow,
      height: oh,
      read: async ([x0, y0, x1, y1]) => {
        const w = x1 - x0;
        const res = new Uint8ClampedArray(w * (y1 - y0) * 4);
        for (let y = y0; y < y1; y++)
          res.set(out.subarray((y * ow + x0) * 4, (y * ow + x1) * 4), (y - y0) * w * 4);
        return res;
      },
    });
  }

  /** The level files offer (factors of full resolution), coarsest last; for tests and the panel. */
  get levelFactors(): number[] {
    return this.#levels.map((l) => l.factor);
  }

  /**
   * Renders the part of the image inside `view` onto a web-mercator grid of `widthPx` × `heightPx`
   * covering `view` exactly (transparent where the image is not). Reads one window, at the
   * coarsest level that still has at least one source pixel per two output pixels.
   */
  async render(view: LatLngBox, widthPx: number, heightPx: number): Promise<RenderedAerial> {
    const W = Math.max(1, Math.round(widthPx));
    const H = Math.max(1, Math.round(heightPx));
    const [mx0, my0] = lonLatToWebMercator(view[0][1], view[0][0]);
    const [mx1, my1] = lonLatToWebMercator(view[1][1], view[1][0]);
    const toPixel = invertAffine(this.georef.transform);
    // Exact source pixel (full resolution) at grid nodes over the output.
    const G = GRID_NODES;
    const nodes = new Float64Array((G + 1) * (G + 1) * 2);
    let [c0, r0, c1, r1] = [Infinity, Infinity, -Infinity, -Infinity];
    for (let j = 0; j <= G; j++) {
      for (let i = 0; i <= G; i++) {
        const mx = mx0 + ((mx1 - mx0) * i) / G;
        const my = my1 - ((my1 - my0) * j) / G;
        const [lon, lat] = webMercatorToLonLat(mx, my);
        const [x, y] = this.#proj.fromLonLat(lon, lat);
        const [c, r] = toPixel(x, y);
        nodes[(j * (G + 1) + i) * 2] = c;
        nodes[(j * (G + 1) + i) * 2 + 1] = r;
        c0 = Math.min(c0, c);
        c1 = Math.max(c1, c);
        r0 = Math.min(r0, r);
        r1 = Math.max(r1, r);
      }
    }
    const rgba = new Uint8ClampedArray(W * H * 4);
    const result = { width: W, height: H, rgba, bounds: view };
    const gw = this.georef.widthPx;
    const gh = this.georef.heightPx;
    if (!(c1 > 0 && r1 > 0 && c0 < gw && r0 < gh)) return result;
    // Source pixels per output pixel, and the level to read.
    const ratio = Math.min((c1 - c0) / W, (r1 - r0) / H);
    let level = this.#levels[0]!;
    for (const l of this.#levels) if (l.factor <= Math.max(1, ratio * 2)) level = l;
    const f = level.factor;
    const wx0 = Math.max(0, Math.floor(Math.max(0, c0) / f));
    const wy0 = Math.max(0, Math.floor(Math.max(0, r0) / f));
    const wx1 = Math.min(level.width, Math.ceil(Math.min(gw, c1) / f) + 1);
    const wy1 = Math.min(level.height, Math.ceil(Math.min(gh, r1) / f) + 1);
    const ww = wx1 - wx0;
    const wh = wy1 - wy0;
    if (ww <= 0 || wh <= 0) return result;
    if (ww * wh > MAX_WINDOW_PX)
      throw new AerialImportError(`The view needs a window of ${ww} × ${wh} pixels; zoom in.`);
    this.maxWindowPx = Math.max(this.maxWindowPx, ww * wh);
    let src: Uint8ClampedArray;
    try {
      src = await level.read([wx0, wy0, wx1, wy1]);
    } catch (e) {
      throw e instanceof AerialImportError
        ? e
        : new AerialImportError(`The image data cannot be read (${String(e)}).`);
    }
    for (let y = 0; y < H; y++) {
      const gy = ((y + 0.5) / H) * G;
      const j = Math.min(G - 1, Math.floor(gy));
      const v = gy - j;
      for (let x = 0; x < W; x++) {
        const gx = ((x + 0.5) / W) * G;
        const i = Math.min(G - 1, Math.floor(gx));
        const u = gx - i;
        const n00 = (j * (G + 1) + i) * 2;
        const n10 = n00 + 2;
        const n01 = n00 + (G + 1) * 2;
        const n11 = n01 + 2;
        const c =
          (1 - v) * ((1 - u) * nodes[n00]! + u * nodes[n10]!) + v * ((1 - u) * nodes[n01]! + u * nodes[n11]!);
        const r =
          (1 - v) * ((1 - u) * nodes[n00 + 1]! + u * nodes[n10 + 1]!) +
          v * ((1 - u) * nodes[n01 + 1]! + u * nodes[n11 + 1]!);
        if (c < 0 || r < 0 || c >= gw || r >= gh) continue;
        const sx = Math.min(ww - 1, Math.floor(c / f) - wx0);
        const sy = Math.min(wh - 1, Math.floor(r / f) - wy0);
        if (sx < 0 || sy < 0) continue;
        const si = (sy * ww + sx) * 4;
        const o = (y * W + x) * 4;
        rgba[o] = src[si]!;
        rgba[o + 1] = src[si + 1]!;
        rgba[o + 2] = src[si + 2]!;
        rgba[o + 3] = src[si + 3]!;
      }
    }
    return result;
  }

  /** Size in output pixels of the whole image on the web-mercator grid, its longer side `maxSidePx`. */
  wholeSize(maxSidePx: number): [number, number] {
    const [mx0, my0] = lonLatToWebMercator(this.bounds[0][1], this.bounds[0][0]);
    const [mx1, my1] = lonLatToWebMercator(this.bounds[1][1], this.bounds[1][0]);
    const [dx, dy] = [mx1 - mx0, my1 - my0];
    const native = Math.max(this.georef.widthPx, this.georef.heightPx);
    const side = Math.min(maxSidePx, native);
    return dx >= dy
      ? [side, Math.max(1, Math.round((side * dy) / dx))]
      : [Math.max(1, Math.round((side * dx) / dy)), side];
  }
}

/** Decode a whole GeoTIFF onto the map grid; the longer side is limited to `maxSidePx`. */
export async function decodeGeoTiff(input: ArrayBuffer | Blob, maxSidePx = 2048): Promise<DecodedAerial> {
  const source = await AerialSource.open(input);
  const [w, h] = source.wholeSize(maxSidePx);
  const r = await source.render(source.bounds, w, h);
  return { ...r, crs: source.georef.crs.label };
}

/** Paint decoded pixels onto a new canvas (browser only). */
export function aerialCanvas(a: Pick<RenderedAerial, 'width' | 'height' | 'rgba'>): HTMLCanvasElement {
  const canvas = document.createElement('canvas');
  canvas.width = a.width;
  canvas.height = a.height;
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new AerialImportError('This window cannot draw images (no 2D canvas).');
  const pixels = new Uint8ClampedArray(a.rgba.length);
  pixels.set(a.rgba);
  ctx.putImageData(new ImageData(pixels, a.width, a.height), 0, 0);
  return canvas;
}

/** Paint decoded pixels to a canvas and return a PNG data URL (browser only). */
export function aerialToPngDataUrl(a: Pick<RenderedAerial, 'width' | 'height' | 'rgba'>): string {
  return aerialCanvas(a).toDataURL('image/png');
}
