// Switched pairs (core/rank/pairs.ts, core/antennas/switchedPair.ts): two half-squares at 90° on
// four supports of an invented lot, 40 m (for speed), through the real field solver. Physical
// checks: one half-square covers only its two broadside directions, so it takes two to cover
// both target regions (common practice, no source); the idle antenna couples to the driven one
// (its presence changes the pattern a little, not nothing), and at a separation of 0.1 λ or more
// the driven antenna's beam stays close to its pattern alone.
import { beforeAll, describe, expect, it } from 'vitest';
import { builderFor } from '../../../core/antennas/registry.ts';
import { bandPlan } from '../../../core/antennas/common.ts';
import { parseProject, type Project } from '../../../core/project/schema.ts';
import { PAIR_MIN_SEPARATION_WAVELENGTHS, pairCollision } from '../../../core/rank/pairs.ts';
import {
  candidateGainAt,
  enumeratePlan,
  memoryCache,
  planFromSetup,
  pairJobs,
  planSite,
  rankPlan,
  soilRangeKey,
  soilRangeOf,
  type Shortlist,
} from '../../../core/rank/plan.ts';
import { PATTERN_GRID } from '../../../core/rank/pattern.ts';
import { solverEvaluator } from '../../../core/rank/solver.ts';
import { arrayBom, arrayWiring } from '../../../core/report/arrayWiring.ts';
import { materialsOf } from '../../../core/report/bom.ts';
import { sheetLengths } from '../../../core/report/format.ts';
import { feedLineOf } from '../../../core/report/feedRun.ts';
import { statePatterns } from '../../../core/rank/candidateStates.ts';
import { stationReport } from '../../../core/report/stationReport.ts';
import { testLot } from '../site/lot.ts';
import type { EvaluationRecord } from '../../../core/rank/evaluate.ts';
import { COAX_LINE } from '../../../core/antennas/verticalPair.ts';
import { c, cAdd, cDiv, cMul } from '../../../core/numeric/complex.ts';

/** Two 25 m spans: w1–w2 along x (broadside north–south), n1–n2 along y (broadside east–west). */
const lot = (settings: Partial<Project['settings']> = {}): Project =>
  testLot({
    halfX: 60,
    halfY: 45,
    station: [0, 0],
    bands: ['40m'],
    supports: [
      { id: 'w1', x: -35, y: -25, h: 16 },
      { id: 'w2', x: -10, y: -25, h: 16 },
      { id: 'n1', x: 25, y: -5, h: 16 },
      { id: 'n2', x: 25, y: 20, h: 16 },
    ],
    // one region to the east (about 88°), one to the south (about 177°) of the test origin
    targets: [
      { regionId: 'asia-south', weight: 1 },
      { regionId: 'antarctica', weight: 1 },
    ],
    // short ropes: only the two spans of 25 m hold a half-square, no diagonal
    settings: { maxRopeM: 10, ...settings },
  });

const cache = memoryCache();
const plan = (p: Project, arrays = true): Shortlist =>
  planSite(p, { evaluator: solverEvaluator, types: ['half-square'], arrays, cache });

describe('switched pair of two half-squares at 90°', () => {
  let s: Shortlist;
  beforeAll(() => {
    s = plan(lot());
  }, 120_000);

  it('is listed first, with two states, two elements, and beats every single by more than the margin', () => {
    const pair = s.candidates[0];
    expect(pair.type).toBe('switched-pair');
    expect(pair.rank).toBe(1);
    expect(pair.elementCount).toBe(2);
    expect(pair.states).toHaveLength(2);
    const singles = s.candidates.filter((c) => c.type === 'half-square');
    expect(singles.length).toBeGreaterThanOrEqual(2);
    for (const c of singles) expect(pair.score - c.score).toBeGreaterThan(1);
    // the singles keep their order behind it
    expect(singles.map((c) => c.rank)).toEqual(singles.map((_, i) => i + 2));
  });

  it('serves each region from the state whose half-square faces it (one half-square covers only its broadside)', () => {
    const pair = s.candidates[0];
    const [east, south] = [0, 1].map((k) => pair.states.map((st) => st.regions[k].gainDbi));
    // each region's best state is a different one, and the pair's region gain is that best
    const bestEast = east[0] > east[1] ? 0 : 1;
    const bestSouth = south[0] > south[1] ? 0 : 1;
    expect(bestEast).not.toBe(bestSouth);
    expect(pair.regions[0].gainDbi).toBeCloseTo(Math.max(...east), 9);
    expect(pair.regions[1].gainDbi).toBeCloseTo(Math.max(...south), 9);
    // the other state is far weaker there (the half-square's end-on null side): > 5 dB
    expect(Math.abs(east[0] - east[1])).toBeGreaterThan(5);
    expect(Math.abs(south[0] - south[1])).toBeGreaterThan(5);
  });

  it('the idle half-square changes the driven one’s pattern a little, not nothing (coupling)', () => {
    const pair = s.candidates[0];
    const a = pair.design.parts![0];
    const single = s.candidates.find(
      (c) =>
        c.type === 'half-square' &&
        c.placement.originXY[0] === pair.placement.originXY[0] &&
        c.placement.originXY[1] === pair.placement.originXY[1] &&
        c.placement.rotationDeg === a.placement.rotationDeg,
    );
    expect(single).toBeDefined();
    const el = 10;
    let maxDiff = 0;
    let peakAz = 0;
    let peak = -Infinity;
    for (const az of PATTERN_GRID.azimuthsDeg) {
      const g = candidateGainAt(s, single!.id, az, el);
      if (g > peak) [peak, peakAz] = [g, az];
      maxDiff = Math.max(maxDiff, Math.abs(candidateGainAt(s, pair.id, az, el) - g));
    }
    expect(maxDiff).toBeGreaterThan(0.01);
    expect(Math.abs(candidateGainAt(s, pair.id, peakAz, el) - peak)).toBeLessThan(1.5);
  });

  it('keeps the two antennas apart: no shared support, wires at least 0.1 λ apart', () => {
    const singles = s.candidates.filter((c) => c.type === 'half-square');
    const lambda = bandPlan('40m').wavelengthM;
    const pair = s.candidates[0];
    expect(pair.fits.some((f) => f.includes('apart'))).toBe(true);
    // any two singles that share a support are refused
    const n1w2 = singles.find(
      (c) => c.supports.some((x) => x.id === 'n1') && c.supports.some((x) => x.id === 'w2'),
    );
    const n1n2 = singles.find(
      (c) => c.supports.some((x) => x.id === 'n1') && c.supports.some((x) => x.id === 'n2'),
    );
    if (n1w2 && n1n2) expect(pairCollision(n1w2, n1n2, lambda).reason).toMatch(/share a support/);
    const w1w2 = singles.find(
      (c) => c.supports.some((x) => x.id === 'w1') && c.supports.some((x) => x.id === 'w2'),
    )!;
    const r = pairCollision(w1w2, n1n2!, lambda);
    expect(r.reason).toBeNull();
    expect(r.separationM).toBeGreaterThanOrEqual(PAIR_MIN_SEPARATION_WAVELENGTHS * lambda);
    // and with a separation bound larger than the lot allows, the same two would be refused
    expect(
      pairCollision(w1w2, n1n2!, r.separationM / (PAIR_MIN_SEPARATION_WAVELENGTHS * 0.99)).reason,
    ).toMatch(/come within/);
  });

  it('gives the plots each state’s own solved pattern', () => {
    const pair = s.candidates[0];
    const st = statePatterns(s, pair);
    expect(st).toHaveLength(2);
    expect(st[0].p.gainDbi).not.toEqual(st[1].p.gainDbi);
    expect(st.map((x) => x.name)).toEqual(pair.states.map((x) => x.name));
  });

  it('rebuilds from its design like any candidate: both antennas’ wires, both feeds, the coax run in the cut list', () => {
    const pair = s.candidates[0];
    const m = builderFor(pair.type).model(pair.design, pair.trim.valueM);
    expect(m.feeds).toHaveLength(2);
    expect(pair.feedPoints).toHaveLength(2);
    expect(m.wires.length).toBe(pair.wires.length);
    expect(pair.cutList.filter((c) => c.kind === 'coax')).toHaveLength(2);
    expect(pair.cutList.filter((c) => c.label.startsWith('antenna A')).length).toBeGreaterThan(0);
    expect(pair.cutList.filter((c) => c.label.startsWith('antenna B')).length).toBeGreaterThan(0);
  });

  it('its bill of materials lists the extra wire, the two relays, the box, the coax and the control cable', () => {
    const pair = s.candidates[0];
    const single = s.candidates.find((c) => c.type === 'half-square')!;
    const L = sheetLengths('metric');
    const supports = lot().supports.map((x) => ({
      id: x.id,
      name: x.name,
      xy: [0, 0] as [number, number],
      heightM: 16,
    }));
    const feed = feedLineOf([0, 0], [], pair.feedPoints[0].xyz, lot().settings.station.coax, 7.05);
    const wireOf = (c: typeof pair) => materialsOf(c, supports, feed, L).wire.totalM;
    expect(wireOf(pair)).toBeGreaterThan(1.9 * wireOf(single));
    const w = arrayWiring(pair, new Map(), 100);
    expect(w?.relays).toHaveLength(2);
    const bom = arrayBom(pair, w, 40, L);
    const relays = bom.find((b) => b.item.startsWith('Relays'));
    expect(relays?.quantity).toBe(2);
    expect(bom.some((b) => b.item.startsWith('Coaxial cable'))).toBe(true);
    expect(bom.some((b) => b.item.startsWith('Relay box'))).toBe(true);
    // K2 sits at B's feed: a second box there, and the control cable runs on along the coax run
    expect(bom.find((b) => b.item.startsWith('Relay box'))?.quantity).toBe(2);
    const run = pair.cutList.find((i) => /relay box to B/.test(i.label))!.cutLengthM;
    expect(bom.find((b) => b.item.startsWith('Control cable'))?.quantity).toBeCloseTo(40 + run, 6);
    expect(w?.controlRuns.map((r) => r.conductors)).toEqual([2, 2]);
  });

  it('its build sheet draws both directions toward each region, the serving one facing it', () => {
    const pair = s.candidates[0];
    const { sheet, html } = stationReport({ project: lot(), shortlist: s, candidate: pair });
    const dirs = sheet.pattern?.directions;
    expect(dirs?.states.map((d) => d.name)).toEqual(pair.states.map((x) => x.name));
    expect(dirs?.toward.map((t) => t.name)).toEqual(pair.regions.map((r) => r.name));
    for (const t of dirs!.toward) {
      expect(t.elevation).toHaveLength(2);
      expect(t.azimuth).toHaveLength(2);
      // A half-square radiates broadside, little off its ends (common practice, no source): at the
      // region's bearing and median take-off the serving half-square (broadside to it) is ahead
      // of the other (end-on to it) by several dB.
      const at = (k: number) =>
        t.azimuth[k]!.reduce((best, p) =>
          Math.abs(((p.deg - t.bearingDeg.center + 540) % 360) - 180) <
          Math.abs(((best.deg - t.bearingDeg.center + 540) % 360) - 180)
            ? p
            : best,
        ).gainDbi;
      const other = t.servedBy === 1 ? 1 : 0;
      expect(at(t.servedBy - 1) - at(other)).toBeGreaterThan(3);
    }
    // both regions are served, by different directions
    expect(new Set(dirs!.toward.map((t) => t.servedBy))).toEqual(new Set([1, 2]));
    expect(html).toContain('class="trace d2 serving"');
    // the antenna detail draws the relay box and K2's box at B's feed
    const b = pair.feedPoints[1].xyz;
    expect(sheet.array!.boxes[1]!.xy).toEqual([b[0], b[1]]);
    const detail = html.match(/<svg class="lot detail"[\s\S]*?<\/svg>/)?.[0] ?? '';
    expect(detail.match(/class="relay-box"/g)).toHaveLength(2);
    expect(html).not.toContain('The patterns drawn are direction 1');
  });

  it('shows direction 2’s feed: B’s drive impedance carried along its coax run to the relay box', () => {
    const pair = s.candidates[0];
    const st = pair.arrayFeed?.states;
    expect(st?.map((x) => x.state)).toEqual([2]);
    const b = st![0];
    // B driven: its current is the reference, A's (open at its feed) next to nothing
    expect(b.elements[1].currentRatio).toBe(1);
    expect(b.elements[0].currentRatio).toBeLessThan(0.05);
    // the box sees Z_B through the run: Zin = Z0 (Z_L cosh γℓ + Z0 sinh γℓ)/(Z0 cosh γℓ + Z_L sinh γℓ)
    // (Pozar, Microwave Engineering, 4th ed., §2.7, the lossy line; written here apart from the solver)
    const f = pair.design.designFreqHz;
    const len = pair.design.params.runM as number;
    const alpha =
      (COAX_LINE.lossDbPer100m * Math.sqrt(f / (COAX_LINE.lossReferenceMHz * 1e6))) / 100 / (20 / Math.LN10);
    const beta = (2 * Math.PI * f) / (COAX_LINE.velocityFactor * 299792458);
    const [ga, gb] = [alpha * len, beta * len];
    const ch = c(Math.cosh(ga) * Math.cos(gb), Math.sinh(ga) * Math.sin(gb));
    const sh = c(Math.sinh(ga) * Math.cos(gb), Math.cosh(ga) * Math.sin(gb));
    const z0 = c(COAX_LINE.z0Ohm);
    const zl = c(...b.elements[1].driveImpedanceOhm);
    const zin = cMul(z0, cDiv(cAdd(cMul(zl, ch), cMul(z0, sh)), cAdd(cMul(z0, ch), cMul(zl, sh))));
    expect(Math.hypot(zin.re - b.feedZOhm[0], zin.im - b.feedZOhm[1])).toBeLessThan(
      1e-3 * Math.hypot(zin.re, zin.im),
    );
    // the run's loss is real: the share of the power it takes is above zero, and state A has no line
    expect(b.networkLossShare).toBeGreaterThan(0);
    expect(pair.arrayFeed!.networkLossShare).toBe(0);
    // the app's detail and the sheet show it as direction 2's own table
    const w = arrayWiring(pair, new Map(), 100)!;
    expect(w.otherPhasings.map((o) => [o.n, o.name])).toEqual([[2, pair.states[1].name]]);
    expect(w.otherPhasings[0].feedText).toContain(`SWR ${b.swr.toFixed(2)}`);
    const { html } = stationReport({ project: lot(), shortlist: s, candidate: pair });
    expect(html).toContain(`What the feed network achieves (direction 2: ${pair.states[1].name})`);
  });

  it('is scored over the soil range like the singles, and ranked with them over each soil', () => {
    const pair = s.candidates[0];
    const r = pair.soilRange;
    expect(r.soils).toEqual(['average', 'poor', 'very-good']);
    expect(r.scores.map((x) => x.soil)).toEqual(r.soils);
    expect(r.scores[0].scoreDbi).toBe(pair.score);
    // Physical trend (common practice, no source): two half-squares radiate vertically polarised
    // at low angles, which very good (wet, conductive) soil reflects best.
    const at = (soil: string) => r.scores.find((x) => x.soil === soil)!.scoreDbi;
    expect(at('very-good')).toBeGreaterThan(at('average') + 1);
    expect(at('very-good')).toBeGreaterThan(at('poor') + 1);
    expect(r.highDbi).toBe(at('very-good'));
    expect(r.lowDbi).toBe(Math.min(...r.scores.map((x) => x.scoreDbi)));
    // the states were solved over the other soils, not copied: the spread is real
    expect(new Set(r.scores.map((x) => x.scoreDbi)).size).toBe(3);
    // each soil's rank is the place among all of the band's candidates over that soil
    for (const soil of r.soils) {
      const score = (c: (typeof s.candidates)[number]) =>
        c.soilRange.scores.find((x) => x.soil === soil)!.scoreDbi;
      for (const c of s.candidates) {
        const rank = c.soilRange.scores.find((x) => x.soil === soil)!.rank;
        expect(rank).toBe(1 + s.candidates.filter((o) => score(o) > score(c)).length);
      }
    }
    expect(r.rankHolds).toBe(r.scores.every((x) => x.rank === 1));
    expect(pair.diagnostics.some((d) => /soil range/.test(d))).toBe(false);
  });

  it('says "not computed" when a pair was not solved over the soil range, instead of a one-soil range', () => {
    const p = lot();
    const setup = enumeratePlan(p, { types: ['half-square'], arrays: true });
    // the plan's cache (memoryCache is a Map) without the pair's records over the other soils
    const partial = new Map(cache as Map<string, EvaluationRecord>);
    pairJobs(setup, partial, p);
    for (const k of s.candidates[0].stateKeys!) partial.delete(soilRangeKey(k, soilRangeOf(p)));
    const r = rankPlan(setup, partial, p);
    const pair = r.candidates[0];
    expect(pair.type).toBe('switched-pair');
    expect(pair.soilRange.notComputed).toBe(true);
    expect(pair.soilRange.soils).toEqual(['average']);
    expect(pair.diagnostics).toContain(
      'not scored over the soil range (the pair was not solved over the other soils)',
    );
    // the singles keep their own range, ranked behind the pair
    const single = r.candidates[1];
    expect(single.soilRange.soils).toHaveLength(3);
    expect(single.soilRange.scores[0].rank).toBe(2);
    expect(s.candidates[0].soilRange.notComputed).toBeUndefined();
  });

  it('respects the margin: a margin above the pair’s lead removes it; no pair without arrays', () => {
    const pair = s.candidates[0];
    const lead =
      pair.score - Math.max(...s.candidates.filter((c) => c.type !== 'switched-pair').map((c) => c.score));
    const higher = plan(lot({ pairMarginDb: Math.ceil(lead) + 0.5 }));
    expect(higher.candidates.some((c) => c.type === 'switched-pair')).toBe(false);
    expect(higher.candidates[0].rank).toBe(1);
    const lower = plan(lot({ pairMarginDb: Math.max(0, lead - 0.5) }));
    expect(lower.candidates[0].type).toBe('switched-pair');
    expect(plan(lot(), false).candidates.some((c) => c.type === 'switched-pair')).toBe(false);
  }, 120_000);
});

describe('a half-square and a ground-mounted vertical as a pair', () => {
  it('solves both states with the vertical idle and open at its base (radials in the model)', () => {
    const p = lot();
    const c = memoryCache();
    const setup = enumeratePlan(p, { types: ['half-square', 'vertical'], arrays: true });
    planFromSetup(setup, p, { evaluator: solverEvaluator, cache: c });
    const mixed = (setup.pairs ?? []).filter(
      (pr) => [pr.a.type, pr.b.type].includes('vertical') && [pr.a.type, pr.b.type].includes('half-square'),
    );
    expect(mixed.length).toBeGreaterThan(0);
    for (const pr of mixed)
      for (const k of pr.keys) {
        const r = c.get(k)!;
        expect(r.unsolvable).toBeUndefined();
        // energy balance: what goes in is radiated or lost in the wires, the soil, the loads or the
        // coax run (a check, not a definition: the solver computes each apart, core/em/solver.ts)
        const p = r.power;
        const lost =
          p.radiatedW + p.conductorLossW + p.groundLossW + (p.loadLossW ?? 0) + (p.networkLossW ?? 0);
        expect(Math.abs(p.inputW - lost)).toBeLessThan(0.02 * p.inputW);
        // the power split's feed-network line is the array feed report's share
        expect(p.networkLossW ?? 0).toBeCloseTo((r.arrayFeed?.networkLossShare ?? 0) * p.inputW, 9);
      }
  }, 120_000);
});

describe('settings.pairMarginDb', () => {
  it('defaults to 1 dB for a project saved before it existed, and refuses a value out of range naming the field', () => {
    const p = lot();
    const old = JSON.parse(JSON.stringify(p));
    delete old.settings.pairMarginDb;
    const r = parseProject(old);
    expect(r.ok && r.value.settings.pairMarginDb).toBe(1);
    const bad = { ...old, settings: { ...old.settings, pairMarginDb: 20 } };
    const rb = parseProject(bad);
    expect(rb.ok).toBe(false);
    if (!rb.ok) expect(JSON.stringify(rb.errors)).toContain('pairMarginDb');
  });
});
