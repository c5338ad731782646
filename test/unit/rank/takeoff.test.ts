/**
 * The take-off distribution in a plan: every path and region carries it in the plan's JSON with
 * weights summing to 1, the region gain is the power average over it, and a region's own window
 * is honoured. Planning mechanics over the test double of the solver (testEvaluator: not physics).
 */
import { describe, expect, it } from 'vitest';
import { planPaths } from '../../../core/paths/index.ts';
import { distributionGainDbi } from '../../../core/rank/pattern.ts';
import { planSite, type Shortlist } from '../../../core/rank/plan.ts';
import { buildDemoProject } from '../../../data/demo/demoProject.ts';
import { testEvaluator } from '../../helpers/testEvaluator.ts';

const ev = () => testEvaluator();
const sum = (xs: readonly { weight: number }[]): number => xs.reduce((s, x) => s + x.weight, 0);

describe('take-off distribution in a plan', () => {
  const project = buildDemoProject();
  const plan = (p = project): Shortlist =>
    planSite(p, { evaluator: ev(), bands: ['80m', '40m'], types: ['dipole', 'vertical'] });

  it('is in the JSON of every path and region, weights summing to 1', () => {
    const s = plan();
    const json = JSON.parse(JSON.stringify(s)) as Shortlist;
    expect(json.paths.length).toBe(project.targets.length);
    for (const p of json.paths) {
      expect(p.takeoff.model).toBe('hop-modes-1');
      expect(p.takeoff.band).toBe('80m');
      expect(Object.keys(p.takeoffByBand).sort()).toEqual(['40m', '80m']);
      for (const t of [p.takeoff, ...Object.values(p.takeoffByBand)]) {
        expect(Math.abs(sum(t.weights) - 1)).toBeLessThan(1e-9);
        expect(t.p10Deg).toBeLessThanOrEqual(t.medianDeg);
        expect(t.medianDeg).toBeLessThanOrEqual(t.p90Deg);
      }
    }
    expect(json.candidates.length).toBeGreaterThan(0);
    for (const c of json.candidates) {
      for (const r of c.regions) {
        expect(r.takeoff.band).toBe(c.band);
        expect(Math.abs(sum(r.takeoff.weights) - 1)).toBeLessThan(1e-9);
        expect(r.elevationWindowDeg).toEqual({ min: r.takeoff.p10Deg, max: r.takeoff.p90Deg });
      }
    }
  });

  it('gives each region the power average of the gain over its distribution', () => {
    const s = plan();
    const paths = planPaths(project.station!, project.targets);
    for (const c of s.candidates.slice(0, 5)) {
      const g = s.patterns[c.evaluationKey];
      c.regions.forEach((r, k) => {
        const expected = distributionGainDbi(g, c.rotationDeg, paths[k].takeoff[c.band].directions);
        expect(Math.abs(r.gainDbi - expected)).toBeLessThan(1e-9);
      });
    }
  });

  it("honours a region's own window: the region gain is read over that window", () => {
    const own = {
      ...project,
      targets: project.targets.map((t, i) =>
        i === 0 ? { ...t, takeoffWindowDeg: [25, 35] as [number, number] } : t,
      ),
    };
    const base = plan();
    const s = plan(own);
    const eu = s.paths[0];
    expect(eu.takeoff.model).toBe('user-window');
    expect(eu.takeoff.p10Deg).toBeGreaterThanOrEqual(25);
    expect(eu.takeoff.p90Deg).toBeLessThanOrEqual(35);
    const c = s.candidates[0];
    const g = s.patterns[c.evaluationKey];
    const windowDirs = planPaths(own.station!, own.targets)[0].takeoff[c.band].directions;
    expect(windowDirs.every((d) => d.elevationDeg >= 25 && d.elevationDeg <= 35)).toBe(true);
    expect(Math.abs(c.regions[0].gainDbi - distributionGainDbi(g, c.rotationDeg, windowDirs))).toBeLessThan(
      1e-9,
    );
    // The other regions keep the computed distribution.
    expect(s.paths[1].takeoff.model).toBe('hop-modes-1');
    // And the window changes the European gain of the same candidate.
    const same = base.candidates.find((x) => x.id === c.id);
    expect(same).toBeDefined();
    expect(Math.abs(same!.regions[0].gainDbi - c.regions[0].gainDbi)).toBeGreaterThan(0.01);
  });
});
