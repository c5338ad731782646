/**
 * Four-square hung from supports (issue 16): four quarter-wave verticals, each a wire hung by a
 * rope from one of four supports that stand near a square, with the self-supporting
 * four-square's hybrid-coupler feed (core/antennas/fourSquare.ts: `fourSquareNetwork`, reused,
 * and its reasons there) and four directions switched by relays in the box at the centre.
 *
 * Which supports: four whose least-squares square (centre, turn and size fitted to the four
 * positions, `fitSquare`) has a side of HUNG_SIDE_WAVELENGTHS (0.2–0.3 λ, a chosen bound around
 * the λ/4 the feed is built for) and puts every support within PLACEMENT_TOL_WAVELENGTHS
 * (0.025 λ, the bound the half-square arrays use; core/antennas/halfSquareArrays.ts) of its
 * corner. The model does not idealise: each vertical hangs at its support's real position (in
 * the canonical frame of the fitted square), so what an imperfect square does to the pattern and
 * the currents is what the solver shows. The feed network makes no correction for it: its
 * quarter-wave (here odd-quarter-wave) lines force equal currents in quadrature whatever the
 * drive impedances (Pozar §2.5), so the currents stay near their targets while the spacings
 * differ; the phase of the field at a distance then differs from the square's, which lowers the
 * front-to-back ratio a little. Because the four directions are not turns of one another on an
 * imperfect square, each is solved on its own (`design.states`: direction 1 the model's network,
 * directions 2–4 its `stateNetworks`, the same box with the lines routed round; three more
 * pattern solves per design).
 *
 * Each vertical is the plain hung vertical of core/antennas/vertical.ts: a wire of the nominal
 * resonant height (0.245 λ, common practice, no source) from its base up to a rope to its
 * support, fed at its base against the user's radials, cut where they meet the neighbours' and
 * bonded (core/em/bondedRadials.ts). Not trimmed through the box, as for the self-supporting
 * four-square. When a support is shorter than that (down to HUNG_MIN_HEIGHT_WAVELENGTHS), all
 * four are cut alike to the lowest support's height and each gets a loading coil at its base
 * (the adaptation of the single coil-loaded vertical, core/antennas/shortVerticals.ts, at its
 * simplest place): a coil in series at the feed adds its reactance to the vertical's, so its
 * reactance is minus that of one such vertical alone over perfect ground (`baseCoilH`, one solve
 * of the field solver, cached), and its loss ωL/Q at LOADING_COIL_Q is in the model. A top hat
 * or bent top is not offered: the four tops would reach toward one another over the square. The coax from the box at the fitted centre to each base
 * is the smallest odd number of electrical quarter waves that reaches the farthest base
 * (`oddQuarterWaveM` of core/antennas/fourSquare.ts).
 */
import type { Element, PreparedSite } from '../site/feasibility.ts';
import type { XY } from '../site/frame.ts';
import { bearingOf, dist2, placeXY } from '../site/geometry.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';
import { evaluateAntenna } from '../em/evaluate.ts';
import { arr, num, proposalList, round, wire } from './common.ts';
import { coilLoad, LOADING_COIL_Q } from './loading.ts';
import {
  FOUR_SQUARE_NAMES as NAMES,
  forcingLineCut,
  fourSquareNetwork,
  oddQuarterWaveM,
} from './fourSquare.ts';
import { PLACEMENT_TOL_WAVELENGTHS } from './halfSquareArrays.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import { groupCuts, groupHeights, groupRadials, verticalParts, verticalsModel } from './verticals.ts';
import type { BandPlan, Builder, Design, Proposal, WireModel } from './types.ts';

export const FOUR_SQUARE_HUNG_TYPE = 'four-square-hung';
/** Side of the fitted square, wavelengths (a chosen bound around the λ/4 the feed is built for). */
export const HUNG_SIDE_WAVELENGTHS = { min: 0.2, max: 0.3 } as const;
/**
 * Shortest support a loaded element is hung from, wavelengths (a chosen bound: at 0.15 λ a
 * base-loaded vertical's radiation resistance is some 8 Ω, already near the loss of a radial
 * field; value from memory, common practice, no source).
 */
export const HUNG_MIN_HEIGHT_WAVELENGTHS = 0.15;
/** Proposals kept per band, the nearest to a square first. */
export const HUNG_PROPOSALS_PER_BAND = 3;

/** The least-squares square through four points taken clockwise: centre, corner 0's offset, worst miss. */
export interface SquareFit {
  centre: XY;
  /** Corner 0 of the fitted square relative to the centre (site frame); the others turn by 90° clockwise. */
  corner0: XY;
  sideM: number;
  /** Largest distance from a point to its fitted corner, metres. */
  worstM: number;
}

/**
 * Fit a square to four points given in clockwise order (x east, y north): the centre is their
 * mean, and corner k is c·u_k with u_k = (−i)^k in complex numbers (a quarter turn clockwise per
 * corner), c = mean of z_k·conj(u_k), the linear least-squares solution for the turn and size.
 */
export function fitSquare(pts: readonly XY[]): SquareFit {
  const o: XY = [
    (pts[0][0] + pts[1][0] + pts[2][0] + pts[3][0]) / 4,
    (pts[0][1] + pts[1][1] + pts[2][1] + pts[3][1]) / 4,
  ];
  // u_k = (−i)^k: 1, −i, −1, i
  const u: XY[] = [
    [1, 0],
    [0, -1],
    [-1, 0],
    [0, 1],
  ];
  let re = 0;
  let im = 0;
  pts.forEach((p, k) => {
    const z: XY = [p[0] - o[0], p[1] - o[1]];
    // z · conj(u)
    re += (z[0] * u[k][0] + z[1] * u[k][1]) / 4;
    im += (z[1] * u[k][0] - z[0] * u[k][1]) / 4;
  });
  const corner = (k: number): XY => [re * u[k][0] - im * u[k][1], re * u[k][1] + im * u[k][0]];
  const worstM = Math.max(...pts.map((p, k) => dist2([p[0] - o[0], p[1] - o[1]], corner(k))));
  return { centre: o, corner0: corner(0), sideM: Math.hypot(re, im) * Math.SQRT2, worstM };
}

const basesOf = (d: Design): XY[] => {
  const xy = arr(d, 'basesXY');
  return NAMES.map((_, i) => [xy[2 * i], xy[2 * i + 1]]);
};

/**
 * Inductance of the base coil that brings a vertical of height H (wire radius of
 * core/antennas/common.ts) to resonance at f over perfect ground: X_coil = −Im Z(H), Z solved by
 * the field solver (a series element at the feed adds its impedance; cached per (f, H)).
 */
const coilCache = new Map<string, number>();
export function baseCoilH(freqHz: number, heightM: number): number {
  const key = `${freqHz}|${heightM.toFixed(4)}`;
  const hit = coilCache.get(key);
  if (hit !== undefined) return hit;
  const w = wire([0, 0, 0], [0, 0, heightM], SPEED_OF_LIGHT_M_PER_S / freqHz, 'v');
  const r = evaluateAntenna(
    {
      wires: [{ from: w.from, to: w.to, radiusM: w.radiusM, segments: w.segments, material: w.material }],
      feeds: [{ wire: 0, position: 0 }],
      ground: { kind: 'perfect' },
    },
    { frequenciesHz: [freqHz], pattern: { elevationsDeg: [], azimuthsDeg: [] } },
  ).frequencies[0];
  const lH = Math.max(0, -r.feeds[0].impedanceOhm[1]) / (2 * Math.PI * freqHz);
  coilCache.set(key, lH);
  return lH;
}

function hungModel(d: Design, H: number): WireModel {
  const lH = num(d, 'coilUH') * 1e-6;
  return {
    ...verticalsModel(d, H, basesOf(d), NAMES),
    ...(lH > 0 ? { loads: NAMES.map((_, i) => coilLoad(i, 0, lH, d.designFreqHz)) } : {}),
    network: fourSquareNetwork(d),
    stateNetworks: [1, 2, 3].map((k) => fourSquareNetwork(d, k)),
    radialsBonded: true,
    referenceFeed: 2,
  };
}

function hungElements(d: Design, H: number): Element[] {
  const heights = arr(d, 'supportHeightsM');
  return basesOf(d).flatMap((b, i): Element[] => {
    const v = verticalParts(d, H, b, NAMES[i]);
    return [
      v.wire,
      {
        kind: 'support',
        label: `support of vertical ${NAMES[i]}`,
        supportId: NAMES[i],
        at: b,
        heightM: heights[i],
      },
      {
        kind: 'rope',
        label: `rope from vertical ${NAMES[i]} to its support`,
        from: [b[0], b[1], H],
        to: [b[0], b[1], heights[i]],
      },
      { kind: 'coax', label: `coax, box to vertical ${NAMES[i]}`, from: [b[0], b[1], 0], to: [0, 0, 0] },
      ...v.radials,
    ];
  });
}

/** Unordered pairs of supports far enough apart to be a diagonal of the square. */
function diagonals(site: PreparedSite, lambda: number): { i: number; j: number; mid: XY; len: number }[] {
  const sup = site.site.supports;
  const tol = PLACEMENT_TOL_WAVELENGTHS * lambda;
  const lo = HUNG_SIDE_WAVELENGTHS.min * lambda * Math.SQRT2 - 2 * tol;
  const hi = HUNG_SIDE_WAVELENGTHS.max * lambda * Math.SQRT2 + 2 * tol;
  const out: { i: number; j: number; mid: XY; len: number }[] = [];
  for (let i = 0; i < sup.length; i++)
    for (let j = i + 1; j < sup.length; j++) {
      const len = dist2(sup[i].xy, sup[j].xy);
      if (len >= lo && len <= hi)
        out.push({ i, j, len, mid: [(sup[i].xy[0] + sup[j].xy[0]) / 2, (sup[i].xy[1] + sup[j].xy[1]) / 2] });
    }
  return out;
}

function proposeHung(site: PreparedSite, band: BandPlan): ReturnType<Builder['propose']> {
  const type = FOUR_SQUARE_HUNG_TYPE;
  const out = proposalList(type, band);
  const { supports: sup, settings: st } = site.site;
  const lambda = band.wavelengthM;
  const [tol, H] = [PLACEMENT_TOL_WAVELENGTHS * lambda, VERTICAL_NOMINAL_FRACTION * lambda];
  const diag = diagonals(site, lambda);
  const seen = new Set<string>();
  const fits: { p: Proposal; worstM: number; lowM: number }[] = [];
  for (let a = 0; a < diag.length; a++)
    for (let b = a + 1; b < diag.length; b++) {
      const P = diag[a];
      const Q = diag[b];
      if (new Set([P.i, P.j, Q.i, Q.j]).size < 4) continue;
      // the two diagonals of a near-square cross near their midpoints, of about equal length
      if (dist2(P.mid, Q.mid) > 2 * tol || Math.abs(P.len - Q.len) > 4 * tol) continue;
      const four = [P.i, Q.i, P.j, Q.j].sort(
        (x, y) => bearingOf(P.mid, sup[x].xy) - bearingOf(P.mid, sup[y].xy),
      );
      const key = four
        .map((k) => sup[k].id)
        .sort()
        .join(':');
      if (seen.has(key)) continue;
      seen.add(key);
      const s4 = four.map((k) => sup[k]);
      const ids = s4.map((s) => s.id);
      const where = `on ${s4.map((s) => s.name).join(', ')}`;
      const fit = fitSquare(s4.map((s) => s.xy));
      const sideWl = fit.sideM / lambda;
      if (sideWl < HUNG_SIDE_WAVELENGTHS.min || sideWl > HUNG_SIDE_WAVELENGTHS.max) {
        const bound =
          sideWl < HUNG_SIDE_WAVELENGTHS.min ? HUNG_SIDE_WAVELENGTHS.min : HUNG_SIDE_WAVELENGTHS.max;
        out.rejectBy(
          Math.abs(sideWl - bound) / bound,
          ids,
          where,
          `they stand near a square of side ${fit.sideM.toFixed(1)} m (${sideWl.toFixed(2)} λ), outside the ${HUNG_SIDE_WAVELENGTHS.min}–${HUNG_SIDE_WAVELENGTHS.max} λ a four-square is built at`,
        );
        continue;
      }
      if (fit.worstM > tol) {
        out.rejectBy(
          (fit.worstM - tol) / tol,
          ids,
          where,
          `a support stands ${fit.worstM.toFixed(1)} m from the corner of the nearest square (more than ${tol.toFixed(1)} m, ${PLACEMENT_TOL_WAVELENGTHS} λ)`,
        );
        continue;
      }
      const low = Math.min(...s4.map((s) => s.heightM));
      const minH = HUNG_MIN_HEIGHT_WAVELENGTHS * lambda;
      const short = s4.find((s) => s.heightM === low)!;
      if (low < minH) {
        out.rejectBy(
          (minH - low) / minH,
          ids,
          where,
          `${short.name} at ${low.toFixed(1)} m is too short even for a base-loaded vertical in the array (at least ${minH.toFixed(1)} m, ${HUNG_MIN_HEIGHT_WAVELENGTHS} λ)`,
        );
        continue;
      }
      const h = round(Math.min(H, low), 2);
      const coilUH = h < H ? round(baseCoilH(band.designFreqHz, h) * 1e6, 2) : 0;
      const rot = bearingOf([0, 0], fit.corner0);
      const bases = s4.map((s) => placeXY([s.xy[0] - fit.centre[0], s.xy[1] - fit.centre[1]], -rot, [0, 0]));
      const spot = { xy: fit.centre, rotationDeg: rot };
      const farthest = Math.max(...bases.map((p) => Math.hypot(p[0], p[1])));
      const design = out.design(
        {
          sideM: round(fit.sideM, 2),
          offSquareM: round(fit.worstM, 2),
          basesXY: bases.flatMap((p) => [round(p[0], 3), round(p[1], 3)]),
          supportHeightsM: s4.map((s) => s.heightM),
          coilUH,
          lineLengthM: round(oddQuarterWaveM(farthest, band.designFreqHz), 2),
          ...groupRadials(site, spot, bases, NAMES, st.radialCount, 0.25 * lambda),
        },
        coilUH
          ? { name: 'height of the four verticals (the lowest support)', nominalM: h, minM: h, maxM: h }
          : {
              name: "height of the four verticals (a single vertical's resonant height)",
              nominalM: H,
              minM: H,
              maxM: H,
            },
        NAMES.map((n, k) => ({
          name: `beam toward vertical ${n} (on ${s4[k].name})`,
          rotationDeg: 0,
          ...(k ? { variant: k } : {}),
          beamDeg: round(bearingOf([0, 0], bases[k]), 1),
        })),
      );
      const norm = (x: number) => ((x % 360) + 360) % 360;
      fits.push({
        worstM: fit.worstM,
        lowM: low,
        p: {
          design,
          placement: { originXY: fit.centre, rotationDeg: rot },
          supports: ids,
          groupKey: `${type}:${key}`,
          where: `${where} (a ${fit.sideM.toFixed(1)} m square within ${fit.worstM.toFixed(1)} m), box at the centre`,
          broadsideDeg: bases.map((p) => norm(rot + bearingOf([0, 0], p))),
          ...(coilUH
            ? {
                adaptations: [
                  `all four cut to ${h.toFixed(1)} m (${short.name}, the lowest support), each with a ${coilUH.toFixed(1)} µH loading coil at its base (Q ${LOADING_COIL_Q})`,
                ],
              }
            : {}),
        },
      });
    }
  if (fits.length === 0 && out.rejections.length === 0)
    out.reject(
      [],
      'four supports near a square',
      `no four supports stand near a square of side ${(HUNG_SIDE_WAVELENGTHS.min * lambda).toFixed(1)}–${(HUNG_SIDE_WAVELENGTHS.max * lambda).toFixed(1)} m (${HUNG_SIDE_WAVELENGTHS.min}–${HUNG_SIDE_WAVELENGTHS.max} λ)`,
    );
  fits.sort((x, y) => x.worstM - y.worstM || y.lowM - x.lowM);
  for (const f of fits.slice(0, HUNG_PROPOSALS_PER_BAND)) out.proposals.push(f.p);
  return out.result();
}

export const fourSquareHungBuilder: Builder = {
  type: FOUR_SQUARE_HUNG_TYPE,
  label: 'Four-square of quarter-wave verticals hung from four supports (hybrid-coupler feed)',
  array: true,
  elementCount: 4,
  propose: ({ site, band }) => proposeHung(site, band),
  model: hungModel,
  elements: hungElements,
  heights: (_d, H) => groupHeights(H),
  cutList: (d, H) => [
    ...groupCuts(d, H, NAMES, 'vertical wire (four, each hung from its support)'),
    forcingLineCut(d),
  ],
};
