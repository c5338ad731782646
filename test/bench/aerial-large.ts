/**
 * Large aerial benchmark (issue 18 point 2; not part of `npm test`):
 *
 *   npx tsx test/bench/aerial-large.ts [--mb 400] [--keep]
 *
 * Writes a tiled, uncompressed RGB GeoTIFF of about 400 MB in UTM zone 15N (EPSG:32615, 0.1 m
 * pixels, no overviews) into a temporary directory, one tile at a time, then opens it the way the
 * app does (a file-backed Blob, read a window at a time by lib/aerial.ts): the overview is built
 * once by reading the file in bands, then a lot-sized view at full resolution and the whole image
 * are rendered. Prints the time of each step, the largest window read, and the peak resident and
 * heap memory sampled every 20 ms, against the file size. The file is deleted unless --keep.
 */
import { openAsBlob, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { AerialSource, BAND_BYTES, OVERVIEW_SIDE_PX } from '../../renderer/src/lib/aerial.ts';
import { epsgProjectedKeys, writeTiledGeoTiff } from '../helpers/geotiffWriter.ts';

// The GeoTIFF library reads a Blob through the browser's FileReader, one slice per tile; Node has
// Blob but no FileReader, so this bench supplies the few members the library uses.
class SliceReader {
  result: ArrayBuffer | null = null;
  onload: (() => void) | null = null;
  onerror: ((e: unknown) => void) | null = null;
  onabort: ((e: unknown) => void) | null = null;
  readAsArrayBuffer(blob: Blob): void {
    blob.arrayBuffer().then(
      (r) => {
        this.result = r;
        this.onload?.();
      },
      (e: unknown) => this.onerror?.(e),
    );
  }
  abort(): void {}
}
const g = globalThis as unknown as { FileReader?: unknown };
g.FileReader ??= SliceReader;

const arg = (name: string, fallback: number): number => {
  const i = process.argv.indexOf(name);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const targetMb = arg('--mb', 400);
const TILE = 256;
const side = Math.ceil(Math.sqrt((targetMb * 1e6) / 3) / TILE) * TILE;

const MB = 1024 * 1024;
let peakRss = 0;
let peakHeap = 0;
const sample = (): void => {
  const m = process.memoryUsage();
  peakRss = Math.max(peakRss, m.rss);
  peakHeap = Math.max(peakHeap, m.heapUsed + m.arrayBuffers);
};
const timer = setInterval(sample, 20);

const dir = mkdtempSync(join(tmpdir(), 'yw-aerial-bench-'));
const file = join(dir, 'large.tif');
try {
  let t = performance.now();
  const bytes = writeTiledGeoTiff(file, {
    width: side,
    height: side,
    tile: TILE,
    geo: { tiepoint: [440_000, 4_975_000], pixelScale: [0.1, 0.1], keys: epsgProjectedKeys(32615) },
    fill(tx, ty, rgb) {
      for (let y = 0; y < TILE; y++)
        for (let x = 0; x < TILE; x++) {
          const i = (y * TILE + x) * 3;
          const grid = x === 0 || y === 0;
          rgb[i] = grid ? 255 : (tx * 7) & 255;
          rgb[i + 1] = grid ? 255 : (ty * 5) & 255;
          rgb[i + 2] = (x ^ y) & 255;
        }
    },
  });
  const writeS = (performance.now() - t) / 1000;
  sample();
  const baseRss = process.memoryUsage().rss;
  peakRss = baseRss;
  peakHeap = 0;

  t = performance.now();
  let lastShown = -1;
  const source = await AerialSource.open(await openAsBlob(file), (f) => {
    const pct = Math.floor(f * 10) * 10;
    if (pct !== lastShown) {
      lastShown = pct;
      process.stdout.write(`  overview ${pct} %\r`);
    }
  });
  const openS = (performance.now() - t) / 1000;

  // A lot-sized view (200 m × 150 m) near the middle, on a 1000 × 750 px map: full resolution.
  const b = source.bounds;
  const midLat = (b[0][0] + b[1][0]) / 2;
  const midLon = (b[0][1] + b[1][1]) / 2;
  const dLat = 75 / 111_000;
  const dLon = 100 / (111_000 * Math.cos((midLat * Math.PI) / 180));
  t = performance.now();
  await source.render(
    [
      [midLat - dLat, midLon - dLon],
      [midLat + dLat, midLon + dLon],
    ],
    1000,
    750,
  );
  const lotS = (performance.now() - t) / 1000;
  t = performance.now();
  const [w, h] = source.wholeSize(1024);
  await source.render(source.bounds, w, h);
  const wholeS = (performance.now() - t) / 1000;
  sample();

  console.log(
    `Large aerial: ${side} × ${side} px tiled RGB GeoTIFF, ${(bytes / MB).toFixed(0)} MB (EPSG:32615, no overviews)`,
  );
  console.log(`  write ${writeS.toFixed(1)} s`);
  console.log(
    `  open + build one ${OVERVIEW_SIDE_PX}-px overview (bands of at most ${BAND_BYTES / MB} MB): ${openS.toFixed(1)} s`,
  );
  console.log(`  lot view 200 m × 150 m at full resolution, 1000 × 750 px: ${(lotS * 1000).toFixed(0)} ms`);
  console.log(`  whole image from the overview, ${w} × ${h} px: ${(wholeS * 1000).toFixed(0)} ms`);
  console.log(`  levels (factors of full resolution): ${source.levelFactors.join(', ')}`);
  console.log(`  largest window read: ${(source.maxWindowPx / 1e6).toFixed(1)} Mpx`);
  console.log(
    `  peak resident memory ${(peakRss / MB).toFixed(0)} MB (${((peakRss - baseRss) / MB).toFixed(0)} MB above the ${(baseRss / MB).toFixed(0)} MB before opening); peak JS heap + array buffers ${(peakHeap / MB).toFixed(0)} MB; file ${(bytes / MB).toFixed(0)} MB`,
  );
} finally {
  clearInterval(timer);
  if (!process.argv.includes('--keep')) rmSync(dir, { recursive: true, force: true });
  else console.log(`  kept ${file}`);
}
