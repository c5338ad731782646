import { describe, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { makeSiteFrame } from '../../../core/site/frame.ts';
import { expectClose } from '../../helpers/expectClose.ts';

const GL = 'geographiclib-geodesic 2.2 Geodesic.WGS84 called directly in the test';

describe('site frame (azimuthal equidistant from geodesics)', () => {
  const origin: [number, number] = [12.34, -41.2];
  const frame = makeSiteFrame(origin);

  it('puts a point at its geodesic distance and bearing from the origin', () => {
    const p: [number, number] = [12.3412, -41.1991];
    const [x, y] = frame.toLocal(p);
    const ref = geodesic.Geodesic.WGS84.Inverse(origin[1], origin[0], p[1], p[0]);
    expectClose(Math.hypot(x, y), ref.s12 ?? NaN, 1e-9, GL);
    expectClose((Math.atan2(x, y) * 180) / Math.PI, ref.azi1 ?? NaN, 1e-9, GL);
  });

  it('round-trips lot-sized offsets to better than a micrometre', () => {
    for (const [x, y] of [
      [0, 0],
      [150, 0],
      [-80, 95],
      [3, -240],
      [400, 400],
    ] as [number, number][]) {
      const back = frame.toLocal(frame.toLonLat([x, y]));
      expectClose(back[0], x, 1e-6, 'round trip, exact inverse by construction (GeographicLib ~15 nm)');
      expectClose(back[1], y, 1e-6, 'round trip, exact inverse by construction (GeographicLib ~15 nm)');
    }
  });

  it('keeps distances between two non-origin points geodesic to a millimetre over a lot', () => {
    const a = frame.toLonLat([-90, 60]);
    const b = frame.toLonLat([110, -70]);
    const ref = geodesic.Geodesic.WGS84.Inverse(a[1], a[0], b[1], b[0]).s12 ?? NaN;
    expectClose(Math.hypot(200, -130), ref, 1e-3, GL);
  });
});
