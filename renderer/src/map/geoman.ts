// The drawing and vertex-editing plug-in, loaded after Leaflet has been made global.
import './leaflet.ts';
import '@geoman-io/leaflet-geoman-free';
import '@geoman-io/leaflet-geoman-free/dist/leaflet-geoman.css';
