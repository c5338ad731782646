/**
 * The lot map, for the planning views to draw on. Leaflet calls every init hook when a map is
 * made, so the planning views learn of the lot map without the map module knowing of them; the
 * reference is dropped when that map is removed.
 */
import L from '../map/leaflet.ts';

class MapRef {
  map = $state.raw<L.Map | null>(null);
}

export const lotMapRef = new MapRef();

function register(map: L.Map): void {
  // The bearing map is SVG; the only Leaflet map in the window is the lot map.
  lotMapRef.map = map;
  map.on('unload', () => {
    if (lotMapRef.map === map) lotMapRef.map = null;
  });
}

L.Map.addInitHook(function (this: L.Map) {
  register(this);
});
