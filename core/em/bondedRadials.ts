/**
 * Ground loss of several verticals whose radial fields meet: the Wait–Pope surface-impedance
 * integration (radials.ts) over the union of the radial fields, with the total surface magnetic
 * field of all elements.
 *
 * Where two radial fields meet, builders cut the radials at the meeting line and bond them to a
 * wire along it (common practice, no source). The model follows that: the union of the
 * integration disks (radius ρmax,i = max(0.5 λ, longest radial) about each ground connection i)
 * is partitioned into cells, each point belonging to the nearest connection (the meeting lines
 * are the perpendicular bisectors between connections), and inside cell i the surface impedance
 * is that of connection i's radial screen (Wait & Pope 1954) in parallel with the soil. The loss
 *     P_g = ½ ∫_union Re Zs(r) |H_t(r)|² dA,   H_t the tangential field of all the currents,
 * is the sum of the cells' parts P_i, and each is referred to its connection's current I_i as a
 * series resistance Rg,i = 2 P_i / |I_i|² (so Σ ½ Rg,i |I_i|² = P_g: nothing is counted twice,
 * unlike integrating every connection's full disk). With one connection the cell is the whole
 * disk and the result is radials.ts's, by the same quadrature (test/unit/em/bonded-radials.test.ts).
 *
 * Quadrature: per cell, `BONDED_AZIMUTHS` rays (midpoint rule in azimuth, one ray when a single
 * connection's field is azimuthally symmetric) and on each ray the radial rule of
 * `groundLossResistance` from the inner limit to the ray's exit from the cell,
 * min(ρmax,i, distance to the nearest bisector). Points of another connection's disk that are
 * nearer to a connection whose own disk does not reach them are left out (only when the disks
 * differ in radius; builders' arrays use equal radials).
 *
 * References: Wait & Pope, Appl. Sci. Res. B4 (1954) 177 (core/REFERENCES.md §6).
 */
import { groundLossResistance, type RadialScreen } from './radials.ts';
import type { Complex } from '../numeric/complex.ts';

/** Rays per cell when the field is not azimuthally symmetric. */
export const BONDED_AZIMUTHS = 24;

export interface BondedConnection {
  x: number;
  y: number;
  screen: RadialScreen;
  /** Inner limit ρmin (wire radius with radials, the stake radius without). */
  rhoMinM: number;
  /** Outer limit ρmax of this connection's disk. */
  rhoMaxM: number;
  /** Current into the ground at this connection. */
  current: Complex;
}

export interface BondedGroundInput {
  freqHz: number;
  zg: Complex;
  connections: readonly BondedConnection[];
  /** |H_t|² at the surface point (x, y), in A²/m², from all the currents. */
  hAbs2: (x: number, y: number) => number;
  /** One connection whose field is azimuthally symmetric about it: one ray suffices. */
  symmetric?: boolean;
  /** Rays per cell (default BONDED_AZIMUTHS); for convergence checks. */
  azimuths?: number;
}

export interface BondedGroundLoss {
  /** Series loss resistance of each connection, Rg,i = 2 P_i/|I_i|² (0 when I_i = 0). */
  lossResistanceOhm: number[];
  /** The power P_i lost in each cell, in watts for the given currents. */
  cellLossW: number[];
  totalLossW: number;
}

/** Distance along the ray from connection i in direction (ux, uy) to its cell's boundary. */
function cellExit(cs: readonly BondedConnection[], i: number, ux: number, uy: number): number {
  let cut = Infinity;
  for (let j = 0; j < cs.length; j++) {
    if (j === i) continue;
    const dx = cs[j].x - cs[i].x;
    const dy = cs[j].y - cs[i].y;
    const along = ux * dx + uy * dy;
    if (along <= 0) continue;
    cut = Math.min(cut, (dx * dx + dy * dy) / (2 * along));
  }
  return cut;
}

/** P_g over the union of the radial fields, split by cell (module note). */
export function bondedGroundLoss(inp: BondedGroundInput): BondedGroundLoss {
  const cs = inp.connections;
  const nAz = inp.symmetric && cs.length === 1 ? 1 : (inp.azimuths ?? BONDED_AZIMUTHS);
  const cellLossW = cs.map((ci, i) => {
    let sum = 0;
    for (let a = 0; a < nAz; a++) {
      const phi = (2 * Math.PI * (a + 0.5)) / nAz;
      // bearing convention of the site frame: x east = sin φ, y north = cos φ
      const ux = Math.sin(phi);
      const uy = Math.cos(phi);
      const up = Math.min(ci.rhoMaxM, cellExit(cs, i, ux, uy));
      if (!(up > ci.rhoMinM)) continue;
      // ∫ Re Zs |H|² 2πρ dρ along this ray; with unit "current" the function returns that integral
      sum += groundLossResistance({
        freqHz: inp.freqHz,
        screen: ci.screen,
        zg: inp.zg,
        rhoMinM: ci.rhoMinM,
        rhoMaxM: up,
        hAbs2PerI0: (rho) => inp.hAbs2(ci.x + rho * ux, ci.y + rho * uy),
      });
    }
    // average over the rays gives ∫ Re Zs |H|² dA; the power is half of it
    return (0.5 * sum) / nAz;
  });
  const lossResistanceOhm = cs.map((ci, i) => {
    const i2 = ci.current.re * ci.current.re + ci.current.im * ci.current.im;
    return i2 > 0 ? (2 * cellLossW[i]) / i2 : 0;
  });
  return { lossResistanceOhm, cellLossW, totalLossW: cellLossW.reduce((s, v) => s + v, 0) };
}
