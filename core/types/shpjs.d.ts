// Types for the parts of shpjs (npm registry, 6.2.0) that Yardwire uses; the package ships none.
declare module 'shpjs' {
  /** Shapes of a .shp as GeoJSON geometries, reprojected to WGS84 when `prj` (WKT) is given. */
  export function parseShp(shp: ArrayBuffer | ArrayBufferView, prj?: string | false): unknown[];
  /** Records of a .dbf, one object per record; `cpg` names the code page. */
  export function parseDbf(dbf: ArrayBuffer | ArrayBufferView, cpg?: string): Record<string, unknown>[];
}
