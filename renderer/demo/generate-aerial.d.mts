// Types for generate-aerial.mjs (a plain Node script, also imported by the unit tests).
export declare const DEMO_ORIGIN: [number, number];
export declare const M_PER_DEG_LON: number;
export declare const LAYOUT: {
  boundary: [number, number][];
  house: [number, number, number, number];
  supports: { id: string; kind: 'tree' | 'mast' | 'tower'; e: number; n: number; h: number }[];
  powerLineNorthM: number;
  road: [number, number];
};
export declare const EXTENT: { west: number; east: number; south: number; north: number; mPerPx: number };
export declare function lonLatOf(e: number, n: number): [number, number];
export declare function renderDemoAerial(): { width: number; height: number; rgb: Uint8Array };
export declare const GEOKEYS_4326: number[];
export declare function geoKeysProjected(epsg: number): number[];
export declare function tiffLayout(
  tags: [number, 3 | 4 | 12, number[]][],
  patch: (dataOffset: number) => void,
): { head: Uint8Array; dataOffset: number };
export declare function encodeRgbTiff(
  width: number,
  height: number,
  rgb: Uint8Array,
  geo: { tiepoint: [number, number]; pixelScale: [number, number]; geoKeys: number[] } | null,
): Uint8Array;
export declare function demoAerialTiff(): Uint8Array;
export declare const OUTPUT: string;
