/**
 * Leaflet, prepared once for this renderer: exposed as the global `L` (the drawing plug-in
 * expects it), the default marker icon pointed at bundled images (bundlers break Leaflet's own
 * guess of its image path), then the drawing plug-in loaded on top.
 */
import L from 'leaflet';
import iconUrl from 'leaflet/dist/images/marker-icon.png';
import iconRetinaUrl from 'leaflet/dist/images/marker-icon-2x.png';
import shadowUrl from 'leaflet/dist/images/marker-shadow.png';
import 'leaflet/dist/leaflet.css';

(globalThis as unknown as { L: typeof L }).L = L;

delete (L.Icon.Default.prototype as unknown as { _getIconUrl?: unknown })._getIconUrl;
L.Icon.Default.mergeOptions({ iconUrl, iconRetinaUrl, shadowUrl });

export default L;
