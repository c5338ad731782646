// @vitest-environment jsdom
// Drawing a real shortlisted candidate on a Leaflet map: everything goes back through the site
// frame to [lon, lat], and the teardown removes it all.
import { describe, expect, it } from 'vitest';
import L from 'leaflet';
import { buildSite } from '../../../core/site/site.ts';
import { candidateFrame, drawCandidate } from './mapDraw.ts';
import { demoPlanProject, demoShortlist } from './testShortlist.ts';

/** The demo plan and an 800 × 600 px SVG-drawn Leaflet map on its station, zoom 18. */
function demoMap() {
  const project = demoPlanProject();
  const shortlist = demoShortlist();
  const el = document.createElement('div');
  Object.defineProperty(el, 'clientWidth', { value: 800 });
  Object.defineProperty(el, 'clientHeight', { value: 600 });
  document.body.append(el);
  const map = L.map(el, { renderer: L.svg() }).setView([project.station![1], project.station![0]], 18);
  return { project, shortlist, el, map };
}

describe('drawCandidate', () => {
  it('draws wires at the lon/lat the core frame gives and removes every layer on teardown', () => {
    const { project, shortlist, map } = demoMap();
    // Layers other than Leaflet's shared vector renderer (which stays once made).
    const drawn = (): number => {
      let n = 0;
      map.eachLayer((l) => void (l instanceof L.Renderer || n++));
      return n;
    };
    const before = drawn();
    const c = shortlist.candidates.find((x) => x.type !== 'vertical')!;
    expect(c.feedPoints[0]).toBeDefined();
    const lotRing = project.boundary!.coordinates[0];
    const teardown = drawCandidate(map, c, { units: 'metric', lotRing });
    const lines: L.Polyline[] = [];
    map.eachLayer((l) => {
      if (l instanceof L.Polyline && !(l instanceof L.Polygon)) lines.push(l);
    });
    const frame = candidateFrame(c);
    expect(frame.origin).toEqual(buildSite(project).frame.origin);
    // The first wire of the candidate appears with both ends where the frame puts them.
    const w = c.wires[0]!;
    const [lonA, latA] = frame.toLonLat([w.from[0], w.from[1]]);
    const hit = lines.find((l) => {
      const ll = l.getLatLngs() as L.LatLng[];
      return ll.length === 2 && Math.abs(ll[0]!.lat - latA) < 1e-9 && Math.abs(ll[0]!.lng - lonA) < 1e-9;
    });
    expect(hit).toBeDefined();
    // One line toward each target region and one per broadside bearing.
    expect(lines.length).toBeGreaterThanOrEqual(c.wires.length + c.regions.length + c.broadsideDeg.length);
    expect(drawn()).toBeGreaterThan(before);
    teardown();
    expect(drawn()).toBe(before);
    map.remove();
  });

  it('shows names as text, never as markup (a region or wire name with HTML in it)', () => {
    const { shortlist, el, map } = demoMap();
    const c = shortlist.candidates[0]!;
    const hostile = '<img src=x onerror="window.__pwned=1">';
    const evil = {
      ...c,
      regions: c.regions.map((r) => ({ ...r, name: hostile })),
      elements: c.elements.map((e) => ({ ...e, label: hostile })),
    };
    const teardown = drawCandidate(map, evil, { units: 'metric', lotRing: null });
    expect(el.querySelector('img[src="x"]')).toBeNull();
    expect(el.textContent).toContain('<img src=x');
    teardown();
    map.remove();
  });
});
