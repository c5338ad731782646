import { describe, expect, it } from 'vitest';
import {
  checkPlacement,
  clipRadial,
  POWER_LINE_MARGIN_M,
  type Element,
} from '../../../core/site/feasibility.ts';
import { expectClose } from '../../helpers/expectClose.ts';
import { box, powerLine, testLot, preparedLot } from './lot.ts';

// The site frame's origin is the centre of the boundary's box; a symmetric lot puts it at (0, 0)
// to within the projection's millimetres, so metre-level test geometry can be written directly.
const TOL = 0.02;

function site(keepOuts = [] as Parameters<typeof testLot>[0]['keepOuts']) {
  return preparedLot({ halfX: 50, halfY: 30, keepOuts });
}

const wire = (label: string, from: [number, number, number], to: [number, number, number]): Element => ({
  kind: 'wire',
  label,
  from,
  to,
});

describe('placement feasibility', () => {
  it('accepts a wire inside the lot and says why it fits', () => {
    const r = checkPlacement(site(), [wire('top wire', [-20, 0, 15], [20, 0, 15])]);
    expect(r.ok).toBe(true);
    expect(r.fits.join(' ')).toMatch(/at least 30\.0 m inside the boundary/);
  });

  it('rejects a wire that comes inside the setback, by how much', () => {
    const r = checkPlacement(site(), [wire('top wire', [-20, 0, 15], [49.6, 0, 15])]);
    expect(r.ok).toBe(false);
    expect(r.violations[0].code).toBe('setback');
    expectClose(
      r.violations[0].byM,
      0.6,
      TOL,
      'setback 1 m, wire end 0.4 m from the boundary by construction',
    );
  });

  it('rejects a wire that leaves the lot', () => {
    const r = checkPlacement(site(), [wire('top wire', [-20, 0, 15], [53, 0, 15])]);
    expect(r.violations[0].code).toBe('outside-lot');
    expect(r.violations[0].message).toMatch(/top wire leaves the lot by 3\.0 m/);
  });

  it('rejects a wire crossing the power-line clearance with the distance it misses by', () => {
    // Line along y = −25; a wire at 14 m needs 14 + margin; it runs along y = −10, 15 m away.
    const s = site([powerLine('Road line', -25, 5)]);
    const r = checkPlacement(s, [wire('top wire', [-20, -10, 14], [20, -10, 14])]);
    expect(r.ok).toBe(false);
    const v = r.violations.find((x) => x.code === 'power-line');
    expect(v).toBeDefined();
    expectClose(
      v?.byM ?? NaN,
      14 + POWER_LINE_MARGIN_M - 15,
      TOL,
      'fall rule: needs z + margin, has 15 m by construction',
    );
    expect(v?.message).toMatch(
      /^top wire crosses the power-line clearance of "Road line" by 2\.0 m \(needs 17\.0 m, has 15\.0 m\)/,
    );
    // The same wire 4 m lower fits, and the reason names the closest approach.
    const ok = checkPlacement(s, [wire('top wire', [-20, -10, 8], [20, -10, 8])]);
    expect(ok.ok).toBe(true);
    expect(ok.fits.join(' ')).toMatch(/closest to "Road line": top wire at 15\.0 m, needs 11\.0 m/);
  });

  it('counts a used support with its full height against a power line', () => {
    const s = site([powerLine('Line', -25, 0)]);
    const r = checkPlacement(s, [
      { kind: 'support', label: 'support A', supportId: 'a', at: [0, -7], heightM: 20 },
    ]);
    expect(r.ok).toBe(false);
    expectClose(
      r.violations[0].byM,
      20 + POWER_LINE_MARGIN_M - 18,
      TOL,
      'support 20 m tall at 18 m from the line',
    );
  });

  it('lets a wire pass high over a building but not low', () => {
    const s = site([
      {
        id: 'house',
        name: 'House',
        kind: 'building',
        geometry: box(-5, -5, 5, 5),
        clearanceM: 2,
        heightM: 8,
      },
    ]);
    expect(checkPlacement(s, [wire('top wire', [-30, 0, 15], [30, 0, 15])]).ok).toBe(true);
    const low = checkPlacement(s, [wire('top wire', [-30, 0, 9], [30, 0, 9])]);
    expect(low.ok).toBe(false);
    expect(low.violations[0].code).toBe('keep-out');
    expect(low.violations[0].message).toMatch(/"House"/);
  });

  it('rejects a wire end below the end-height limit', () => {
    const r = checkPlacement(site(), [{ kind: 'end', label: 'lower end A', at: [0, 0, 1.5] }]);
    expect(r.violations[0].code).toBe('end-height');
    expectClose(r.violations[0].byM, 1, 1e-9, 'limit 2.5 m (default), end at 1.5 m');
  });
});

describe('radial clipping', () => {
  it('clips a radial at the setback where the boundary is near and keeps it full elsewhere', () => {
    const s = site();
    // Base 10 m from the east edge: east radial reaches 10 − 1 (setback) = 9 m; west one is full.
    expectClose(clipRadial(s, [40, 0], 90, 20), 9, 0.25, 'lot edge at x = 50, setback 1 m, step 0.25 m');
    expectClose(clipRadial(s, [40, 0], 270, 20), 20, 1e-9, 'nothing in the way');
  });

  it('checks the last part of a radial shorter than a step at its end', () => {
    const s = site();
    // 9 m of room east of x = 40 (edge at 50, setback 1): a 9.1 m radial stops at 9 m, a 8.9 m one is whole.
    expectClose(clipRadial(s, [40, 0], 90, 9.1), 9, TOL, 'the last 0.1 m would enter the setback');
    expectClose(clipRadial(s, [40, 0], 90, 8.9), 8.9, 1e-9, 'fits whole');
  });

  it('clips a radial at a building with its clearance', () => {
    const s = site([
      {
        id: 'shed',
        name: 'Shed',
        kind: 'building',
        geometry: box(10, -3, 14, 3),
        clearanceM: 1,
        heightM: 3,
      },
    ]);
    expectClose(clipRadial(s, [0, 0], 90, 20), 9, 0.25, 'shed face at x = 10 with 1 m clearance');
  });

  it('answers a clip kept from an earlier plan only for the same lot and keep-outs', () => {
    // clipRadial keeps its results by the site's boundary, keep-outs and settings: a shed added
    // or taken away, or a new prepared site of the same lot, must give what a fresh clip gives.
    const shed = {
      id: 'shed',
      name: 'Shed',
      kind: 'building' as const,
      geometry: box(10, -3, 14, 3),
      clearanceM: 1,
      heightM: 3,
    };
    expectClose(clipRadial(site(), [0, 0], 90, 20), 20, 1e-9, 'open lot');
    expectClose(clipRadial(site([shed]), [0, 0], 90, 20), 9, 0.25, 'with the shed');
    expectClose(clipRadial(site(), [0, 0], 90, 20), 20, 1e-9, 'open lot again');
    expectClose(clipRadial(site([shed]), [0, 0], 90, 20), 9, 0.25, 'with the shed again');
  });
});
