/**
 * Public imagery and map services the user may choose to load under the lot. None is used until
 * the user picks one after reading its terms; the choice is stored as the project's tile URL and
 * attribution, exactly like an address the user types (settings.tileUrlTemplate), so clearing it
 * stops all loading.
 *
 * The summaries of the terms are our reading of each provider's published policy at the link
 * given (from memory when written; providers change their terms): the terms at the link govern,
 * and the user is asked to read them before choosing.
 */

export interface ImageryPreset {
  id: string;
  name: string;
  /** What the user sees: aerial photographs or a drawn map. */
  kind: 'aerial photographs' | 'street map';
  /** Where it has useful detail. */
  coverage: string;
  /** Leaflet tile URL template; only https. */
  urlTemplate: string;
  /** Shown on the map while the tiles are (as plain text). */
  attribution: string;
  /** The provider's own page of terms. */
  termsUrl: string;
  /** The terms in plain words, for the user to read before choosing. */
  terms: readonly string[];
  /** Deepest zoom the service draws; the map enlarges that level beyond it. */
  maxNativeZoom: number;
}

export const IMAGERY_PRESETS: readonly ImageryPreset[] = [
  {
    id: 'usgs-imagery',
    name: 'USGS National Map orthoimagery',
    kind: 'aerial photographs',
    coverage: 'United States only',
    urlTemplate:
      'https://basemap.nationalmap.gov/arcgis/rest/services/USGSImageryOnly/MapServer/tile/{z}/{y}/{x}',
    attribution: 'Imagery: USGS The National Map',
    termsUrl: 'https://www.usgs.gov/information-policies-and-instructions/copyrights-and-credits',
    terms: [
      'A U.S. Government work: in the public domain, free to use.',
      'USGS asks to be credited as the source (shown on the map).',
      'No promise of availability; detail stops at about 1 m per pixel in many places.',
    ],
    maxNativeZoom: 16,
  },
  {
    id: 'esri-world-imagery',
    name: 'Esri World Imagery',
    kind: 'aerial photographs',
    coverage: 'worldwide, sharpest in towns',
    urlTemplate:
      'https://server.arcgisonline.com/ArcGIS/rest/services/World_Imagery/MapServer/tile/{z}/{y}/{x}',
    attribution: 'Imagery: Esri, Maxar, Earthstar Geographics, and the GIS User Community',
    termsUrl: 'https://www.esri.com/en-us/legal/terms/full-master-agreement',
    terms: [
      "Licensed by Esri, not free data: use is governed by Esri's terms of use and master agreement.",
      'Check that your use is allowed before choosing it; some uses need an Esri (ArcGIS) account.',
      'The sources must be credited (shown on the map); do not copy or store the tiles.',
    ],
    maxNativeZoom: 19,
  },
  {
    id: 'osm-standard',
    name: 'OpenStreetMap standard map',
    kind: 'street map',
    coverage: 'worldwide; streets and often buildings, no photographs',
    urlTemplate: 'https://tile.openstreetmap.org/{z}/{x}/{y}.png',
    attribution: '© OpenStreetMap contributors (ODbL)',
    termsUrl: 'https://operations.osmfoundation.org/policies/tiles/',
    terms: [
      'Run on donated servers for light, interactive use: browsing your own lot is fine; no bulk downloading.',
      'The map data is open (ODbL); "© OpenStreetMap contributors" must be shown (it is, on the map).',
      'No promise of availability; heavy users may be blocked without notice.',
    ],
    maxNativeZoom: 19,
  },
];

/** The preset whose template this is, if any (the project stores only the template). */
export function presetOfTemplate(urlTemplate: string): ImageryPreset | undefined {
  return IMAGERY_PRESETS.find((p) => p.urlTemplate === urlTemplate);
}

/** The host a template's tiles come from (shown before the user chooses), or '' if it has none. */
export function templateHost(urlTemplate: string): string {
  const m = /^https?:\/\/([^/{}]+)/.exec(urlTemplate);
  return m?.[1] ?? '';
}
