/**
 * Regression guard, not a reference check: the solver's own recorded answer for the half-square
 * example (test/fixtures/em/half-square-golden.json; see the README there). It catches
 * unintended changes. Regenerate on purpose, after a reviewed change, the one way every golden
 * file is regenerated: YARDWIRE_UPDATE_GOLDEN=1 npx vitest run test/regression
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { evaluateAntenna } from '../../../core/em/evaluate.ts';
import { parseAntennaInput } from '../../../core/em/input.ts';

const EXAMPLE = 'data/examples/half-square-average.json';
const GOLDEN = 'test/fixtures/em/half-square-golden.json';

interface GoldenRow {
  frequencyMHz: number;
  impedanceOhm: [number, number];
  swr: number;
  peakGainDbi: number;
  peakElevationDeg: number;
  averageGainDb: number;
}

function compute(): GoldenRow[] {
  const parsed = parseAntennaInput(JSON.parse(readFileSync(EXAMPLE, 'utf8')));
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return evaluateAntenna(parsed.model, {
    ...parsed.options,
    pattern: { elevationsDeg: [], azimuthsDeg: [] },
  }).frequencies.map((f) => ({
    frequencyMHz: f.frequencyHz / 1e6,
    impedanceOhm: [f.feeds[0].impedanceOhm[0], f.feeds[0].impedanceOhm[1]],
    swr: f.feeds[0].swr,
    peakGainDbi: f.peak.gainDbi,
    peakElevationDeg: f.peak.elevationDeg,
    averageGainDb: f.averageGainDb,
  }));
}

/** Tolerances: relative impedance, and dB of gain (the solver may change in its last digits between platforms). */
const TOL = { impedanceRel: 1e-3, gainDb: 0.01 };

describe('half-square golden output (regression guard)', () => {
  if (process.env.YARDWIRE_UPDATE_GOLDEN)
    writeFileSync(
      GOLDEN,
      JSON.stringify({ source: `solver output for ${EXAMPLE}`, rows: compute() }, null, 2) + '\n',
    );
  it('matches the recorded answer', () => {
    const golden = JSON.parse(readFileSync(GOLDEN, 'utf8')) as { rows: GoldenRow[] };
    const now = compute();
    expect(now.length).toBe(golden.rows.length);
    now.forEach((r, i) => {
      const g = golden.rows[i];
      const zmag = Math.hypot(...g.impedanceOhm);
      expect(
        Math.hypot(r.impedanceOhm[0] - g.impedanceOhm[0], r.impedanceOhm[1] - g.impedanceOhm[1]) / zmag,
      ).toBeLessThan(TOL.impedanceRel);
      expect(Math.abs(r.peakGainDbi - g.peakGainDbi)).toBeLessThan(TOL.gainDb);
      expect(Math.abs(r.averageGainDb - g.averageGainDb)).toBeLessThan(TOL.gainDb);
    });
  });
});
