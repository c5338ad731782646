/**
 * Verticals on supports shorter than a quarter wave (issue 19 point 2): a wire hung from the
 * support, fed at its base against buried radials (as the plain vertical, core/antennas/vertical.ts),
 * brought to resonance by
 *  - a top hat ('top-hat-vertical'): wires from the top, drooping like an umbrella, each insulated
 *    at its end and tied on by a rope that runs on in the same line to a ground anchor. The first
 *    of HAT_LAYOUTS (four or three wires all round, three in a fan, two opposite) and HAT_DROOPS_DEG
 *    that fits the lot at some turn is proposed, at the turn with the most room for radials.
 *    Trim: the length of each hat wire. The hat adds no loss beyond its conductor's;
 *  - a T top ('t-top-vertical'): two wires from the top toward two other supports (the widest
 *    angle the lot's supports give), roped to them. Trim: the length of each top wire (equal);
 *  - a loading coil ('loaded-vertical') at the base or halfway up (both proposed, the planner
 *    keeps the better): a series inductance with loss R = ωL/Q at Q COIL_Q (core/em loads, its
 *    dissipation reported as the loading-coil loss). The wire stays the support's full height;
 *    the trim is the wire wound on the coil's former (turns added or taken off), its inductance
 *    from Wheeler's formula (shortLoading.ts).
 * The nominal of each trim comes from a line model (shortLoading.ts); the planner's trim routine
 * finds the resonance with the field solver.
 *
 * Canonical frame: base at the origin, the wire straight up to the support's attachment height H.
 * Top hat: n wires `hatSpacingDeg` apart, centred on canonical north. T top: the first top wire toward +x
 * (support B), the second toward support C at its canonical position.
 */
import { checkPlacement, clipRadial, type Element, type PreparedSite } from '../site/feasibility.ts';
import { whereToChange } from '../project/settingLimits.ts';
import type { SiteSupport } from '../site/site.ts';
import type { XY } from '../site/frame.ts';
import { bearingOf, dist2, type XYZ } from '../site/geometry.ts';
import {
  arr,
  cut,
  lambdaOf,
  num,
  placeElements,
  proposalList,
  round,
  wire,
  type ProposalList,
} from './common.ts';
import { baseFedModel, clippedRadials, radialCuts, radialElements } from './radials.ts';
import {
  COIL_FORMER_DIAMETER_M,
  COIL_PITCH_M,
  COIL_Q,
  coilInductanceH,
  coilLossOhm,
  coilReactanceEstimateOhm,
  coilTurns,
  hatArmEstimateM,
  windingForInductanceM,
} from './shortLoading.ts';
import type { BandPlan, Builder, BuildContext, Design, Placement, WireModel } from './types.ts';
import { VERTICAL_NOMINAL_FRACTION } from './vertical.ts';
import { INVERTED_L_MAX_VERTICAL_FRACTION } from './invertedL.ts';

/** Shortest support a loaded vertical is proposed on, as a fraction of the wavelength (a chosen bound: below it the radiation resistance is a fraction of an ohm). */
export const SHORT_VERTICAL_MIN_FRACTION = 0.05;
/**
 * Tallest support, as a fraction of the wavelength, given a top hat or a T top (the inverted-L's
 * bound, core/antennas/invertedL.ts): on a taller one the top wires would be stubs of a metre or
 * two, each with its rope, where the loading coil (or the plain vertical, from 0.245 λ) is simpler.
 */
export const TOP_LOADING_MAX_FRACTION = INVERTED_L_MAX_VERTICAL_FRACTION;

/**
 * Layouts of the top hat, in order of preference: wires and the angle between neighbours (four or
 * three all round; three in a 120° fan and two opposite, for a support near the lot's edge or a
 * house). More wires load more for their length (common practice, no source).
 */
export const HAT_LAYOUTS = [
  { wires: 4, spacingDeg: 90 },
  { wires: 3, spacingDeg: 120 },
  { wires: 3, spacingDeg: 60 },
  { wires: 2, spacingDeg: 180 },
] as const;
/** Droop of the hat wires below horizontal, tried in order (shallower is better, steeper fits a smaller lot; common practice, no source). */
export const HAT_DROOPS_DEG = [30, 45] as const;
/** Turns of the hat tried for each layout and droop, degrees (up to the layout's symmetry). */
export const HAT_TURN_STEP_DEG = 15;
/** Shortest rope between a wire end and what it is tied to, metres (an insulator and a knot). */
export const MIN_ROPE_M = 0.5;
/** Narrowest angle between the two arms of a T top at the support, degrees (a chosen bound: narrower, the top wires' horizontal currents add more than they cancel; at 60° their sum is 1.7 times one wire's). */
export const T_MIN_ANGLE_DEG = 60;
/**
 * Least share of the estimated arm length the lot must allow (below it, no resonance is expected
 * within the limits). The line model's estimate came out 5–15 % short of the solver's resonant
 * length on the cases tried (T top and drooping hats, 15 m and 11 m trees, 160 m and 80 m), so the
 * whole estimate is asked for.
 */
export const MIN_ARM_SHARE = 1;
/** Coil heights tried, as a fraction of the support height: base and centre. */
export const COIL_POSITIONS = [0, 0.5] as const;

/** Types that are proposed only on supports too short for a plain quarter-wave vertical. */
export const SHORT_SUPPORT_TYPES: ReadonlySet<string> = new Set([
  'top-hat-vertical',
  't-top-vertical',
  'loaded-vertical',
  'sloping-vertical',
]);

/** Whether a builder of `type` (one of SHORT_SUPPORT_TYPES) is proposed on a support of this height. */
export function isShortSupport(type: string, heightM: number, wavelengthM: number): boolean {
  const top =
    type === 'top-hat-vertical' || type === 't-top-vertical'
      ? TOP_LOADING_MAX_FRACTION
      : VERTICAL_NOMINAL_FRACTION;
  return heightM < top * wavelengthM && heightM >= SHORT_VERTICAL_MIN_FRACTION * wavelengthM;
}

/** The supports too short for a plain quarter-wave vertical and tall enough for a loaded one; the others too short are rejected with their number. */
function shortSupports(
  site: PreparedSite,
  band: BandPlan,
  out: ProposalList,
  what: string,
  maxFraction: number = VERTICAL_NOMINAL_FRACTION,
): SiteSupport[] {
  const lambda = band.wavelengthM;
  const minH = SHORT_VERTICAL_MIN_FRACTION * lambda;
  return site.site.supports.filter((s) => {
    // The plain vertical is proposed on a support of a quarter wave; a hat or T top only below
    // maxFraction (nearer a quarter wave its wires would be stubs, and a small coil does it).
    if (s.heightM >= maxFraction * lambda) return false;
    if (s.heightM < minH) {
      out.rejectBy(
        1 - s.heightM / minH,
        [s.id],
        `${what} on ${s.name}`,
        `${s.name} at ${s.heightM.toFixed(1)} m is too short for a loaded vertical on this band (at least ${minH.toFixed(1)} m, ${(SHORT_VERTICAL_MIN_FRACTION * 100).toFixed(0)} % of a wavelength)`,
      );
      return false;
    }
    return true;
  });
}

const radialsAt = (site: PreparedSite, xy: XY, rotationDeg: number, lambda: number): number[] =>
  clippedRadials(
    (b, n) => clipRadial(site, xy, b, n),
    rotationDeg,
    site.site.settings.radialCount,
    0.25 * lambda,
  );

const hungElements = (H: number, radials: number[]): Element[] => [
  { kind: 'wire', label: 'vertical wire', from: [0, 0, 0], to: [0, 0, H] },
  { kind: 'support', label: 'support', supportId: 'S', at: [0, 0], heightM: H },
  ...radialElements(radials),
];

// ───────────────────────────── top hat ─────────────────────────────

function hatShape(d: Design, ell: number): { top: XYZ; ends: XYZ[]; anchors: XYZ[] } {
  const H = num(d, 'heightM');
  const n = num(d, 'hatWires');
  const sp = num(d, 'hatSpacingDeg');
  const dr = (num(d, 'droopDeg') * Math.PI) / 180;
  const reach = H / Math.sin(dr);
  const top: XYZ = [0, 0, H];
  const ends: XYZ[] = [];
  const anchors: XYZ[] = [];
  for (let k = 0; k < n; k++) {
    const b = ((k - (n - 1) / 2) * sp * Math.PI) / 180;
    const u: XYZ = [Math.sin(b) * Math.cos(dr), Math.cos(b) * Math.cos(dr), -Math.sin(dr)];
    ends.push([ell * u[0], ell * u[1], H + ell * u[2]]);
    anchors.push([reach * u[0], reach * u[1], 0]);
  }
  return { top, ends, anchors };
}

function hatElements(d: Design, ell: number): Element[] {
  const { top, ends, anchors } = hatShape(d, ell);
  return [
    ...hungElements(num(d, 'heightM'), arr(d, 'radialLengthsM')),
    ...ends.flatMap((e, k): Element[] => [
      { kind: 'wire', label: `top-hat wire ${k + 1}`, role: 'top-wire', from: top, to: e },
      { kind: 'end', label: `end of top-hat wire ${k + 1}`, at: e },
      { kind: 'rope', label: `rope of top-hat wire ${k + 1}`, from: e, to: anchors[k] },
      { kind: 'anchor', label: `anchor of top-hat wire ${k + 1}`, at: anchors[k] },
    ]),
  ];
}

const fitsAt = (
  check: NonNullable<BuildContext['check']>,
  site: PreparedSite,
  els: Element[],
  p: Placement,
): boolean => check(site, placeElements(els, p)).ok;

export const topHatVerticalBuilder: Builder = {
  type: 'top-hat-vertical',
  label: 'Vertical on a short support with a top hat of drooping wires',
  propose({ site, band, check = checkPlacement }) {
    const out = proposalList('top-hat-vertical', band);
    const lambda = band.wavelengthM;
    const minEnd = site.site.settings.minEndHeightM;
    for (const s of shortSupports(site, band, out, 'top-hat vertical', TOP_LOADING_MAX_FRACTION)) {
      const H = s.heightM;
      const where = `wire hung from ${s.name} with a top hat`;
      let best: { design: Design; rot: number; droop: number; wires: number; room: number } | null = null;
      let closest = 0;
      let closestEst = Infinity;
      for (const layout of HAT_LAYOUTS) {
        const flat = hatArmEstimateM(H, lambda, layout.wires);
        // A turn repeats after the layout's symmetry (all round: the spacing; a fan: 360°).
        const period = layout.wires * layout.spacingDeg === 360 ? layout.spacingDeg : 360;
        for (const droop of HAT_DROOPS_DEG) {
          const sin = Math.sin((droop * Math.PI) / 180);
          // A drooping wire loads less than a level one (its downward part carries current against
          // the vertical's): the level estimate over cos(droop), a chosen correction that the solver
          // bears out on the cases above (80 m, 15 m tree, two wires at 45°: 3.9 m resonant, 4.5 m estimated).
          const est = flat / Math.cos((droop * Math.PI) / 180);
          // Rounded down to the millimetre, so that the longest trim keeps the end-height limit.
          const maxM =
            Math.floor(1000 * Math.min((H - minEnd) / sin, H / sin - MIN_ROPE_M, 0.3 * lambda)) / 1000;
          if (maxM / est > closest / closestEst) {
            closest = maxM;
            closestEst = est;
          }
          if (maxM < MIN_ARM_SHARE * est) continue;
          for (let rot = 0; rot < period; rot += HAT_TURN_STEP_DEG) {
            const radials = radialsAt(site, s.xy, rot, lambda);
            const design = out.design(
              {
                heightM: H,
                hatWires: layout.wires,
                hatSpacingDeg: layout.spacingDeg,
                droopDeg: droop,
                radialLengthsM: radials,
              },
              {
                name: 'length of each top-hat wire',
                nominalM: round(Math.min(est, 0.95 * maxM), 3),
                minM: round(Math.min(0.3 * est, 0.5 * maxM), 3),
                maxM: round(maxM, 3),
              },
            );
            if (!fitsAt(check, site, hatElements(design, maxM), { originXY: s.xy, rotationDeg: rot }))
              continue;
            const room = radials.reduce((p, q) => p + q, 0);
            if (!best || room > best.room) best = { design, rot, droop, wires: layout.wires, room };
          }
          if (best) break;
        }
        if (best) break;
      }
      if (closest < MIN_ARM_SHARE * closestEst) {
        out.rejectBy(
          1 - closest / closestEst,
          [s.id],
          where,
          `from ${H.toFixed(1)} m the hat wires can be at most ${closest.toFixed(1)} m long before their ends fall below the ${minEnd.toFixed(1)} m end-height limit${whereToChange('minEndHeightM')}; about ${closestEst.toFixed(1)} m are needed`,
        );
        continue;
      }
      if (!best) {
        const steep = HAT_DROOPS_DEG[HAT_DROOPS_DEG.length - 1];
        out.reject(
          [s.id],
          where,
          `no top hat long enough to bring it to resonance (${HAT_LAYOUTS.map((l) => `${l.wires} wires ${l.spacingDeg}° apart`).join(', ')}; drooping ${HAT_DROOPS_DEG.join('° or ')}°, turned every ${HAT_TURN_STEP_DEG}°) keeps its wires, ropes and anchors on the lot and clear of every keep-out; at ${steep}° each anchor is ${(H / Math.tan((steep * Math.PI) / 180)).toFixed(1)} m out from ${s.name}`,
        );
        continue;
      }
      out.proposals.push({
        design: best.design,
        placement: { originXY: s.xy, rotationDeg: best.rot },
        supports: [s.id],
        groupKey: `top-hat-vertical:${s.id}`,
        where,
        adaptations: [
          `top hat of ${best.wires} wires ${num(best.design, 'hatSpacingDeg')}° apart, drooping ${best.droop}° to ground anchors, on a ${H.toFixed(1)} m vertical (their length trimmed to resonance: see the cut list)`,
        ],
        broadsideDeg: [],
      });
    }
    return out.result();
  },
  model(d, ell): WireModel {
    const lambda = lambdaOf(d);
    const { top, ends } = hatShape(d, ell);
    return baseFedModel(
      [
        wire([0, 0, 0], top, lambda, 'vertical wire'),
        ...ends.map((e, k) => wire(top, e, lambda, `top-hat wire ${k + 1}`)),
      ],
      arr(d, 'radialLengthsM'),
    );
  },
  elements: hatElements,
  heights(d, ell) {
    const { ends } = hatShape(d, ell);
    return [
      { label: 'feed point (base)', heightM: 0 },
      { label: 'top of vertical', heightM: num(d, 'heightM') },
      { label: 'top-hat wire ends', heightM: ends[0][2] },
    ];
  },
  cutList(d, ell) {
    return [
      cut('vertical wire', 1, num(d, 'heightM')),
      cut('top-hat wire', num(d, 'hatWires'), ell),
      ...radialCuts(arr(d, 'radialLengthsM')),
    ];
  },
};

// ───────────────────────────── T top ─────────────────────────────

function tShape(d: Design, ell: number): { top: XYZ; ends: XYZ[]; far: XYZ[] } {
  const H = num(d, 'heightM');
  const top: XYZ = [0, 0, H];
  const far: XYZ[] = [
    [num(d, 'spanBM'), 0, num(d, 'heightBM')],
    [num(d, 'cxM'), num(d, 'cyM'), num(d, 'heightCM')],
  ];
  const ends = far.map((f): XYZ => {
    const run = Math.hypot(f[0], f[1], f[2] - H);
    const t = ell / run;
    return [t * f[0], t * f[1], H + t * (f[2] - H)];
  });
  return { top, ends, far };
}

function tElements(d: Design, ell: number): Element[] {
  const { top, ends, far } = tShape(d, ell);
  const names = ['B', 'C'];
  return [
    ...hungElements(num(d, 'heightM'), arr(d, 'radialLengthsM')),
    ...ends.flatMap((e, k): Element[] => [
      { kind: 'wire', label: `top wire toward ${names[k]}`, role: 'top-wire', from: top, to: e },
      { kind: 'end', label: `end of the top wire toward ${names[k]}`, at: e },
      { kind: 'rope', label: `rope to support ${names[k]}`, from: e, to: far[k] },
      {
        kind: 'support',
        label: `support ${names[k]}`,
        supportId: names[k],
        at: [far[k][0], far[k][1]],
        heightM: far[k][2],
      },
    ]),
  ];
}

/** Angle at a between the directions to b and c, degrees (0..180). */
function angleAt(a: XY, b: XY, c: XY): number {
  const d = Math.abs(bearingOf(a, b) - bearingOf(a, c)) % 360;
  return d > 180 ? 360 - d : d;
}

export const tTopVerticalBuilder: Builder = {
  type: 't-top-vertical',
  label: 'Vertical on a short support with a T top toward two other supports',
  propose({ site, band }) {
    const out = proposalList('t-top-vertical', band);
    const lambda = band.wavelengthM;
    const maxRope = site.site.settings.maxRopeM;
    const sup = site.site.supports;
    for (const a of shortSupports(site, band, out, 'T-top vertical', TOP_LOADING_MAX_FRACTION)) {
      const H = a.heightM;
      const est = hatArmEstimateM(H, lambda, 2);
      const run = (b: SiteSupport): number => Math.hypot(dist2(a.xy, b.xy), b.heightM - H);
      let best: { b: SiteSupport; c: SiteSupport; angle: number; maxM: number } | null = null;
      let widest = -1;
      let longest = 0;
      const others = sup.filter((s) => s !== a);
      for (let i = 0; i < others.length; i++)
        for (let j = i + 1; j < others.length; j++) {
          const [b, c] = run(others[i]) >= run(others[j]) ? [others[i], others[j]] : [others[j], others[i]];
          const angle = angleAt(a.xy, b.xy, c.xy);
          const maxM = Math.min(run(b), run(c)) - MIN_ROPE_M;
          // Ropes no longer than the limit with the arms at their estimated length.
          if (Math.max(run(b), run(c)) - Math.min(est, maxM) > maxRope) continue;
          widest = Math.max(widest, angle);
          if (angle < T_MIN_ANGLE_DEG) continue;
          longest = Math.max(longest, maxM);
          if (maxM < MIN_ARM_SHARE * est) continue;
          if (!best || angle > best.angle) best = { b, c, angle, maxM };
        }
      const where = `wire hung from ${a.name} with a T top`;
      if (!best) {
        if (others.length < 2)
          out.reject([a.id], where, 'a T top needs two other supports; the lot has fewer');
        else if (widest < 0)
          out.reject(
            [a.id],
            where,
            `no two other supports are near enough for ropes of at most ${maxRope} m${whereToChange('maxRopeM')} from top wires of about ${est.toFixed(1)} m`,
          );
        else if (widest < T_MIN_ANGLE_DEG)
          out.rejectBy(
            1 - widest / T_MIN_ANGLE_DEG,
            [a.id],
            where,
            `no two other supports lie at least ${T_MIN_ANGLE_DEG}° apart as seen from ${a.name} with their ropes no longer than ${maxRope} m${whereToChange('maxRopeM')}; the widest is ${widest.toFixed(0)}°`,
          );
        else
          out.rejectBy(
            1 - longest / est,
            [a.id],
            where,
            `the top wires could be at most ${longest.toFixed(1)} m long toward the nearer support; about ${est.toFixed(1)} m each are needed`,
          );
        continue;
      }
      const { b, c, maxM } = best;
      const rot = bearingOf(a.xy, b.xy) - 90;
      const cb = ((bearingOf(a.xy, c.xy) - rot) * Math.PI) / 180;
      const sc = dist2(a.xy, c.xy);
      out.proposals.push({
        design: out.design(
          {
            heightM: H,
            heightBM: b.heightM,
            heightCM: c.heightM,
            spanBM: round(dist2(a.xy, b.xy), 3),
            cxM: round(sc * Math.sin(cb), 3),
            cyM: round(sc * Math.cos(cb), 3),
            radialLengthsM: radialsAt(site, a.xy, rot, lambda),
          },
          {
            name: 'length of each top wire',
            nominalM: round(Math.min(est, 0.95 * maxM), 3),
            minM: round(Math.min(0.3 * est, 0.5 * maxM), 3),
            maxM: round(Math.min(maxM, 0.3 * lambda), 3),
          },
        ),
        placement: { originXY: a.xy, rotationDeg: rot },
        supports: [a.id, b.id, c.id],
        groupKey: `t-top-vertical:${a.id}:${b.id}:${c.id}`,
        where: `wire hung from ${a.name}, T top toward ${b.name} and ${c.name}`,
        adaptations: [
          `T top of two wires toward ${b.name} and ${c.name} (${best.angle.toFixed(0)}° apart) on a ${H.toFixed(1)} m vertical (their length trimmed to resonance: see the cut list)`,
        ],
        broadsideDeg: [],
      });
    }
    return out.result();
  },
  model(d, ell): WireModel {
    const lambda = lambdaOf(d);
    const { top, ends } = tShape(d, ell);
    return baseFedModel(
      [
        wire([0, 0, 0], top, lambda, 'vertical wire'),
        wire(top, ends[0], lambda, 'top wire toward B'),
        wire(top, ends[1], lambda, 'top wire toward C'),
      ],
      arr(d, 'radialLengthsM'),
    );
  },
  elements: tElements,
  heights(d, ell, names) {
    const { ends } = tShape(d, ell);
    // Proposal.supports is [vertical's support, B, C].
    const [b, c] = [names?.[1] ?? 'support B', names?.[2] ?? 'support C'];
    return [
      { label: 'feed point (base)', heightM: 0 },
      { label: 'top of vertical', heightM: num(d, 'heightM') },
      { label: `end of the top wire toward ${b}`, heightM: ends[0][2] },
      { label: `end of the top wire toward ${c}`, heightM: ends[1][2] },
    ];
  },
  cutList(d, ell) {
    return [
      cut('vertical wire', 1, num(d, 'heightM')),
      cut('top wire', 2, ell),
      ...radialCuts(arr(d, 'radialLengthsM')),
    ];
  },
};

// ───────────────────────────── loading coil ─────────────────────────────

/** The coil of a loaded vertical at winding w: inductance and loss resistance at the design frequency. */
export function loadingCoil(d: Design, windingM: number): { lH: number; rOhm: number } {
  const lH = coilInductanceH(windingM);
  return { lH, rOhm: coilLossOhm(lH, d.designFreqHz) };
}

const coilWords = (hc: number): string => (hc > 0 ? `${hc.toFixed(1)} m above the base` : 'at the base');

export const loadedVerticalBuilder: Builder = {
  type: 'loaded-vertical',
  label: 'Vertical on a short support with a loading coil',
  propose({ site, band }) {
    const out = proposalList('loaded-vertical', band);
    const lambda = band.wavelengthM;
    for (const s of shortSupports(site, band, out, 'coil-loaded vertical')) {
      const H = s.heightM;
      const radials = radialsAt(site, s.xy, 0, lambda);
      for (const share of COIL_POSITIONS) {
        const hc = round(share * H, 2);
        const xL = coilReactanceEstimateOhm(H, hc, lambda);
        const nominal = windingForInductanceM(xL / (2 * Math.PI * band.designFreqHz));
        out.proposals.push({
          design: out.design(
            { heightM: H, coilHeightM: hc, radialLengthsM: radials },
            {
              name: 'wire wound on the loading coil',
              nominalM: round(nominal, 3),
              minM: round(0.4 * nominal, 3),
              maxM: round(2.5 * nominal, 3),
            },
          ),
          placement: { originXY: s.xy, rotationDeg: 0 },
          supports: [s.id],
          groupKey: `loaded-vertical:${s.id}`,
          where: `wire hung from ${s.name}, coil ${coilWords(hc)}`,
          adaptations: [
            `loading coil ${coilWords(hc)}, wound at ${COIL_PITCH_M} m pitch on a ${COIL_FORMER_DIAMETER_M} m former, Q ${COIL_Q}, on a ${H.toFixed(1)} m vertical (turns and inductance trimmed to resonance: see the cut list)`,
          ],
          broadsideDeg: [],
        });
      }
    }
    return out.result();
  },
  model(d, w): WireModel {
    const H = num(d, 'heightM');
    const hc = num(d, 'coilHeightM');
    const m = baseFedModel(
      [wire([0, 0, 0], [0, 0, H], lambdaOf(d), 'vertical wire', hc > 0)],
      arr(d, 'radialLengthsM'),
    );
    const { lH, rOhm } = loadingCoil(d, w);
    return { ...m, loads: [{ wire: 0, position: hc / H, kind: 'series-rlc', lH, rOhm }] };
  },
  elements(d) {
    return hungElements(num(d, 'heightM'), arr(d, 'radialLengthsM'));
  },
  heights(d) {
    const hc = num(d, 'coilHeightM');
    return [
      { label: 'feed point (base)', heightM: 0 },
      ...(hc > 0 ? [{ label: 'loading coil', heightM: hc }] : []),
      { label: 'top of vertical', heightM: num(d, 'heightM') },
    ];
  },
  cutList(d, w) {
    const H = num(d, 'heightM');
    const hc = num(d, 'coilHeightM');
    const turns = coilTurns(w);
    return [
      ...(hc > 0
        ? [cut('vertical wire below the coil', 1, hc), cut('vertical wire above the coil', 1, H - hc)]
        : [cut('vertical wire', 1, H)]),
      cut(
        `loading-coil winding (${turns.toFixed(1)} turns, ${(coilInductanceH(w) * 1e6).toFixed(1)} µH)`,
        1,
        w,
      ),
      ...radialCuts(arr(d, 'radialLengthsM')),
    ];
  },
};
