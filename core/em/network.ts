/**
 * Non-radiating networks between feed ports, solved together with the wires.
 *
 * An array is fed through coax lines, transformers, hybrid couplers and relays. Its pattern
 * follows the currents that network actually produces, so the network is part of the solution,
 * not an ideal set of feed voltages. Method:
 *
 *  1. The wires seen from their ports (delta gaps, solver.ts) form an m-port whose short-circuit
 *     admittance matrix is Y_w = Eᵀ Z⁻¹ E, with E the port excitation vectors (one column per
 *     port) and Z the moment-method matrix (Harrington, Field Computation by Moment Methods, 1968,
 *     ch. 4, "generalized network parameters"; Harrington, Proc. IEEE 55 (1967) 136, eq. for the
 *     port admittance of an N-port scatterer; core/REFERENCES.md §15). It costs m solves with the
 *     factorisation the solver already has.
 *  2. The network is written as a modified-nodal system (Ho, Ruehli & Brennan, IEEE Trans.
 *     Circuits Syst. CAS-22 (1975) 504; core/REFERENCES.md §15): node voltages U and, for each
 *     element that fixes a voltage (voltage source, closed switch, ideal transformer), one branch
 *     current. Elements with an admittance matrix (line, impedance, hybrid) are stamped into the
 *     nodal block; Y_w is stamped at the port nodes like any other admittance: the current that
 *     leaves port node p into the wires is (Y_w U)_p.
 *  3. The port voltages V = U[port nodes] give the wire currents I = Z⁻¹E V.
 *
 * Every feed (port) is a gap between its node and the common return (the coax shields): the
 * network is unbalanced and common-mode current on the shields is not modelled.
 *
 * Elements (node 'common' is the return; a line whose far end is 'common' is a shorted stub):
 *  - line: coax of length ℓ, characteristic impedance Z0 (real: the low-loss approximation),
 *    velocity factor v, loss α in dB per 100 m (optionally given at a reference frequency and
 *    scaled as √f, the skin-effect law of conductor loss; common practice, no source for the
 *    scaling being dominant in coax at HF). γ = α + jω/(v c0); two-port admittance
 *    Y11 = Y22 = coth(γℓ)/Z0, Y12 = Y21 = −csch(γℓ)/Z0 (from the line's ABCD matrix, Pozar,
 *    Microwave Engineering, 4th ed., 2012, Table 4.2 and §2.7; core/REFERENCES.md §15);
 *  - impedance: R + jX between two nodes;
 *  - transformer: ideal, Vp = n·Vs, n·Ip = −Is (lossless), windings between node pairs;
 *  - hybrid: ideal 90° (quadrature) hybrid of reference impedance Z0, S from Pozar §7.5,
 *    Y = (1/Z0)(I − S)(I + S)⁻¹ (Pozar §4.3);
 *  - switch: a relay contact, closed (a zero-volt branch) or open (nothing).
 * Sources: ideal voltage sources (node to common) or current sources (into a node).
 *
 * Accuracy: the network equations are exact for the stated elements; the result's accuracy is
 * that of the wires' moment-method solution. Powers: each element's dissipation is computed from
 * its own terminal quantities, so P_sources = P_ports + network loss is a check, not a definition
 * (test/reference/em/network.test.ts).
 */
import { luFactor, luSolve, SingularMatrixError } from '../numeric/lu.ts';
import { c, cAbs2, cDiv, cMul, cSub, type Complex } from '../numeric/complex.ts';
import { ModelError } from './errors.ts';
import type { ComplexPair } from './types.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

/** The shared return (coax shields, the station ground of the feed system). */
export const COMMON_NODE = 'common';

/** Impedance reported for a port that carries no current (open in the network), in ohms. */
export const OPEN_PORT_IMPEDANCE_OHM = 1e12;

export type NetworkElement =
  | {
      kind: 'line';
      a: string;
      b: string;
      lengthM: number;
      z0Ohm: number;
      velocityFactor: number;
      /** Matched loss in dB per 100 m; default 0 (lossless). */
      lossDbPer100m?: number;
      /** Frequency at which the loss is given; the loss scales as √f. Absent: the same at every frequency. */
      lossReferenceMHz?: number;
    }
  | { kind: 'impedance'; a: string; b: string; rOhm: number; xOhm: number }
  | {
      kind: 'transformer';
      /** Primary winding (+, −) and secondary winding (+, −); Vp = turnsRatio · Vs. */
      primary: readonly [string, string];
      secondary: readonly [string, string];
      turnsRatio: number;
    }
  | {
      kind: 'hybrid';
      /** Ports 1…4 of a 90° hybrid (1 input, 2 through at −90°, 3 coupled at −180°, 4 isolated). */
      ports: readonly [string, string, string, string];
      z0Ohm: number;
    }
  | { kind: 'switch'; a: string; b: string; closed: boolean };

export interface NetworkSource {
  node: string;
  kind: 'voltage' | 'current';
  /** Volts (voltage source, node to common) or amperes (current into the node), [re, im]. */
  value: ComplexPair;
}

export interface NetworkSpec {
  /** Node of each feed: model.feeds[i] is a gap between portNodes[i] and the common return. */
  portNodes: readonly string[];
  elements: readonly NetworkElement[];
  sources: readonly NetworkSource[];
}

/** A network checked against the model and indexed (node numbers, branch numbers). */
export interface PreparedNetwork {
  spec: NetworkSpec;
  nodes: string[];
  /** Node index of each port. */
  portIndex: number[];
  /** Number of branch unknowns (voltage sources, closed switches, transformers). */
  branches: number;
}

export interface SourceResult {
  node: string;
  kind: 'voltage' | 'current';
  voltage: Complex;
  /** Current delivered by the source into its node. */
  current: Complex;
  /** Voltage over current: the impedance the source sees. */
  impedance: Complex;
  powerW: number;
}

export interface NetworkSolution {
  portVoltages: Complex[];
  portCurrents: Complex[];
  sources: SourceResult[];
  /** Sum of the elements' own dissipation (lines and impedances; ideal elements dissipate none). */
  lossW: number;
  nodeVoltages: Map<string, Complex>;
}

const finite = (v: number) => Number.isFinite(v);

/** Validate a network spec against a model with `nFeeds` feeds. Throws ModelError. */
export function prepareNetwork(spec: NetworkSpec, nFeeds: number): PreparedNetwork {
  const nodes: string[] = [];
  const index = new Map<string, number>();
  const node = (name: unknown, field: string): void => {
    if (typeof name !== 'string' || name.length === 0 || name.length > 64)
      throw new ModelError(field, 'a node name is a string of 1 to 64 characters');
    if (name !== COMMON_NODE && !index.has(name)) {
      index.set(name, nodes.length);
      nodes.push(name);
    }
  };
  if (spec.portNodes.length !== nFeeds)
    throw new ModelError('network.portNodes', `${spec.portNodes.length} port nodes for ${nFeeds} feeds`);
  spec.portNodes.forEach((p, i) => {
    node(p, `network.portNodes[${i}]`);
    if (p === COMMON_NODE)
      throw new ModelError(
        `network.portNodes[${i}]`,
        'a feed cannot connect to the common return only (that is a short)',
      );
  });
  if (spec.elements.length > 200) throw new ModelError('network.elements', 'at most 200 elements');
  let branches = 0;
  spec.elements.forEach((e, i) => {
    const f = `network.elements[${i}]`;
    switch (e.kind) {
      case 'line':
        node(e.a, `${f}.a`);
        node(e.b, `${f}.b`);
        if (!(e.lengthM > 0 && finite(e.lengthM)))
          throw new ModelError(`${f}.lengthM`, 'must be a positive length');
        if (!(e.z0Ohm > 0 && finite(e.z0Ohm))) throw new ModelError(`${f}.z0Ohm`, 'must be positive');
        if (!(e.velocityFactor > 0 && e.velocityFactor <= 1))
          throw new ModelError(`${f}.velocityFactor`, 'must be in (0, 1]');
        if (e.lossDbPer100m !== undefined && !(e.lossDbPer100m >= 0 && finite(e.lossDbPer100m)))
          throw new ModelError(`${f}.lossDbPer100m`, 'must be zero or positive');
        if (e.lossReferenceMHz !== undefined && !(e.lossReferenceMHz > 0 && finite(e.lossReferenceMHz)))
          throw new ModelError(`${f}.lossReferenceMHz`, 'must be positive');
        if (e.a === e.b) throw new ModelError(`${f}.b`, 'a line needs two different ends');
        break;
      case 'impedance':
        node(e.a, `${f}.a`);
        node(e.b, `${f}.b`);
        if (!finite(e.rOhm) || !finite(e.xOhm) || e.rOhm < 0)
          throw new ModelError(`${f}.rOhm`, 'R ≥ 0 and X finite');
        if (e.rOhm === 0 && e.xOhm === 0) throw new ModelError(`${f}`, 'a zero impedance is a closed switch');
        break;
      case 'transformer':
        e.primary.forEach((n, j) => node(n, `${f}.primary[${j}]`));
        e.secondary.forEach((n, j) => node(n, `${f}.secondary[${j}]`));
        if (!(e.turnsRatio > 0 && finite(e.turnsRatio)))
          throw new ModelError(`${f}.turnsRatio`, 'must be positive');
        branches++;
        break;
      case 'hybrid':
        e.ports.forEach((n, j) => node(n, `${f}.ports[${j}]`));
        if (!(e.z0Ohm > 0 && finite(e.z0Ohm))) throw new ModelError(`${f}.z0Ohm`, 'must be positive');
        break;
      case 'switch':
        node(e.a, `${f}.a`);
        node(e.b, `${f}.b`);
        if (e.closed) branches++;
        break;
      default:
        throw new ModelError(`${f}.kind`, 'unknown element');
    }
  });
  if (spec.sources.length === 0) throw new ModelError('network.sources', 'the network has no source');
  spec.sources.forEach((s, i) => {
    node(s.node, `network.sources[${i}].node`);
    if (s.node === COMMON_NODE)
      throw new ModelError(`network.sources[${i}].node`, 'a source needs a node other than common');
    if (!s.value.every(finite)) throw new ModelError(`network.sources[${i}].value`, 'must be finite');
    if (s.kind === 'voltage') branches++;
  });
  if (nodes.length + branches > 400)
    throw new ModelError('network', 'too many nodes and branches (at most 400)');
  return { spec, nodes, portIndex: spec.portNodes.map((p) => index.get(p)!), branches };
}

/** A line's loss law and speed: what lineHyperbolics needs of a line element. */
export type LineProperties = Pick<
  Extract<NetworkElement, { kind: 'line' }>,
  'velocityFactor' | 'lossDbPer100m' | 'lossReferenceMHz'
>;

/**
 * sinh γℓ and cosh γℓ of a line of length ℓ at f: loss in dB per 100 m scaled as √f from its
 * reference frequency, β = 2πf / (VF·c) (the lossy line's ABCD matrix, Pozar, Microwave
 * Engineering, 4th ed., §2.7).
 */
export function lineHyperbolics(
  e: LineProperties,
  lengthM: number,
  freqHz: number,
): { sh: Complex; ch: Complex } {
  const alphaDb =
    (e.lossDbPer100m ?? 0) * (e.lossReferenceMHz ? Math.sqrt(freqHz / (e.lossReferenceMHz * 1e6)) : 1);
  const alpha = alphaDb / 100 / (20 / Math.LN10); // dB/m → Np/m
  const beta = (2 * Math.PI * freqHz) / (e.velocityFactor * SPEED_OF_LIGHT_M_PER_S);
  // γℓ = a + jb; sinh and cosh of a complex argument
  const a = alpha * lengthM;
  const b = beta * lengthM;
  return {
    sh: c(Math.sinh(a) * Math.cos(b), Math.cosh(a) * Math.sin(b)),
    ch: c(Math.cosh(a) * Math.cos(b), Math.sinh(a) * Math.sin(b)),
  };
}

/** Two-port admittance (Y11 = Y22, Y12 = Y21) of a line at one frequency. */
export function lineAdmittance(
  e: Extract<NetworkElement, { kind: 'line' }>,
  freqHz: number,
): { y11: Complex; y12: Complex } {
  const { sh, ch } = lineHyperbolics(e, e.lengthM, freqHz);
  const zs = c(sh.re * e.z0Ohm, sh.im * e.z0Ohm);
  if (cAbs2(zs) < 1e-30)
    throw new ModelError(
      'network',
      'a lossless line a whole number of half waves long has no admittance matrix',
    );
  return { y11: cDiv(ch, zs), y12: cDiv(c(-1), zs) };
}

/** 4×4 admittance of the ideal 90° hybrid (row-major, 16 complex). */
export function hybridAdmittance(z0Ohm: number): Complex[] {
  const r = 1 / Math.SQRT2;
  // S = −(1/√2)[[0, j, 1, 0], [j, 0, 0, 1], [1, 0, 0, j], [0, 1, j, 0]]  (Pozar §7.5)
  const sRe = [0, 0, -r, 0, 0, 0, 0, -r, -r, 0, 0, 0, 0, -r, 0, 0];
  const sIm = [0, -r, 0, 0, -r, 0, 0, 0, 0, 0, 0, -r, 0, 0, -r, 0];
  // Y = (1/Z0)(I − S)(I + S)⁻¹ = (1/Z0)(I + S)⁻¹(I − S) (they commute): solve (I + S) Y = (I − S)/Z0
  const m = new Float64Array(32);
  for (let i = 0; i < 16; i++) {
    m[2 * i] = sRe[i] + (i % 5 === 0 ? 1 : 0);
    m[2 * i + 1] = sIm[i];
  }
  const lu = luFactor(4, m);
  const y: Complex[] = new Array(16);
  for (let col = 0; col < 4; col++) {
    const rhs = new Float64Array(8);
    for (let row = 0; row < 4; row++) {
      rhs[2 * row] = ((row === col ? 1 : 0) - sRe[row * 4 + col]) / z0Ohm;
      rhs[2 * row + 1] = -sIm[row * 4 + col] / z0Ohm;
    }
    const x = luSolve(lu, rhs);
    for (let row = 0; row < 4; row++) y[row * 4 + col] = c(x[2 * row], x[2 * row + 1]);
  }
  return y;
}

/**
 * Solve the network with the wires' port admittance `yw` (m×m, row-major complex). Returns the
 * port voltages and currents, the sources' results and the network's own loss.
 */
export function solveNetwork(pn: PreparedNetwork, yw: readonly Complex[], freqHz: number): NetworkSolution {
  const nN = pn.nodes.length;
  const N = nN + pn.branches;
  const idx = new Map(pn.nodes.map((n, i) => [n, i]));
  const at = (name: string): number => (name === COMMON_NODE ? -1 : idx.get(name)!);
  const A = new Float64Array(2 * N * N);
  const rhs = new Float64Array(2 * N);
  const add = (i: number, j: number, v: Complex) => {
    if (i < 0 || j < 0) return;
    A[2 * (i * N + j)] += v.re;
    A[2 * (i * N + j) + 1] += v.im;
  };
  /** Stamp an admittance matrix between nodes (each node referenced to common). */
  const stampNodal = (ns: number[], y: (r: number, s: number) => Complex) => {
    for (let r = 0; r < ns.length; r++) for (let s = 0; s < ns.length; s++) add(ns[r], ns[s], y(r, s));
  };
  /** Stamp a two-terminal admittance between nodes a and b. */
  const stampBranch = (a: number, b: number, y: Complex) => {
    const ny = c(-y.re, -y.im);
    add(a, a, y);
    add(b, b, y);
    add(a, b, ny);
    add(b, a, ny);
  };
  // the wires
  const m = pn.portIndex.length;
  stampNodal(pn.portIndex, (r, s) => yw[r * m + s]);
  let br = nN;
  const elementBranch: number[] = [];
  const lineY: ({ y11: Complex; y12: Complex } | null)[] = [];
  const hyb = new Map<number, Complex[]>();
  pn.spec.elements.forEach((e, i) => {
    lineY.push(null);
    elementBranch.push(-1);
    switch (e.kind) {
      case 'line': {
        const ly = lineAdmittance(e, freqHz);
        lineY[i] = ly;
        stampNodal([at(e.a), at(e.b)], (r, s) => (r === s ? ly.y11 : ly.y12));
        break;
      }
      case 'impedance':
        stampBranch(at(e.a), at(e.b), cDiv(c(1), c(e.rOhm, e.xOhm)));
        break;
      case 'hybrid': {
        const y = hybridAdmittance(e.z0Ohm);
        hyb.set(i, y);
        stampNodal(
          e.ports.map((p) => at(p)),
          (r, s) => y[r * 4 + s],
        );
        break;
      }
      case 'switch':
        if (e.closed) {
          // zero-volt branch: current j from a to b; KCL a: +j, b: −j; row: U_a − U_b = 0
          const j = br++;
          elementBranch[i] = j;
          add(at(e.a), j, c(1));
          add(at(e.b), j, c(-1));
          add(j, at(e.a), c(1));
          add(j, at(e.b), c(-1));
        }
        break;
      case 'transformer': {
        // j = current into the primary's + terminal; the secondary's + terminal takes −n·j.
        const j = br++;
        elementBranch[i] = j;
        const n = e.turnsRatio;
        const [p1, p2] = e.primary.map(at);
        const [s1, s2] = e.secondary.map(at);
        add(p1, j, c(1));
        add(p2, j, c(-1));
        add(s1, j, c(-n));
        add(s2, j, c(n));
        // (U_p1 − U_p2) − n (U_s1 − U_s2) = 0
        add(j, p1, c(1));
        add(j, p2, c(-1));
        add(j, s1, c(-n));
        add(j, s2, c(n));
        break;
      }
    }
  });
  const sourceBranch: number[] = [];
  pn.spec.sources.forEach((s) => {
    const a = at(s.node);
    const v = c(s.value[0], s.value[1]);
    if (s.kind === 'current') {
      rhs[2 * a] += v.re;
      rhs[2 * a + 1] += v.im;
      sourceBranch.push(-1);
    } else {
      // j = current delivered into node a: KCL a: (GU)_a − j = 0; row: U_a = V
      const j = br++;
      sourceBranch.push(j);
      add(a, j, c(-1));
      add(j, a, c(1));
      rhs[2 * j] = v.re;
      rhs[2 * j + 1] = v.im;
    }
  });
  let sol: Float64Array;
  try {
    sol = luSolve(luFactor(N, A), rhs);
  } catch (err) {
    if (err instanceof SingularMatrixError) {
      const what =
        err.column < nN
          ? `node '${pn.nodes[err.column]}'`
          : 'a loop of sources, closed switches or transformers';
      throw new ModelError(
        'network',
        `the network leaves ${what} undetermined (a floating node or a short across a source)`,
      );
    }
    throw err;
  }
  const U = (name: string): Complex => {
    const i = at(name);
    return i < 0 ? c(0) : c(sol[2 * i], sol[2 * i + 1]);
  };
  const portVoltages = pn.portIndex.map((i) => c(sol[2 * i], sol[2 * i + 1]));
  const portCurrents = portVoltages.map((_, r) => {
    let re = 0;
    let im = 0;
    for (let s = 0; s < m; s++) {
      const y = yw[r * m + s];
      re += y.re * portVoltages[s].re - y.im * portVoltages[s].im;
      im += y.re * portVoltages[s].im + y.im * portVoltages[s].re;
    }
    return c(re, im);
  });
  const sources: SourceResult[] = pn.spec.sources.map((s, i) => {
    const v = U(s.node);
    const j = sourceBranch[i];
    const cur = j >= 0 ? c(sol[2 * j], sol[2 * j + 1]) : c(s.value[0], s.value[1]);
    const powerW = 0.5 * (v.re * cur.re + v.im * cur.im);
    const impedance = cAbs2(cur) > 0 ? cDiv(v, cur) : c(OPEN_PORT_IMPEDANCE_OHM);
    return { node: s.node, kind: s.kind, voltage: v, current: cur, impedance, powerW };
  });
  // Each element's dissipation from its own terminal quantities.
  let lossW = 0;
  const half = (u: Complex, i: Complex) => 0.5 * (u.re * i.re + u.im * i.im);
  pn.spec.elements.forEach((e, i) => {
    if (e.kind === 'line') {
      const ly = lineY[i]!;
      const ua = U(e.a);
      const ub = U(e.b);
      const ia = cSub(cMul(ly.y11, ua), cMul(c(-ly.y12.re, -ly.y12.im), ub));
      const ib = cSub(cMul(ly.y11, ub), cMul(c(-ly.y12.re, -ly.y12.im), ua));
      lossW += half(ua, ia) + half(ub, ib);
    } else if (e.kind === 'impedance') {
      const u = cSub(U(e.a), U(e.b));
      const i = cDiv(u, c(e.rOhm, e.xOhm));
      lossW += half(u, i);
    } else if (e.kind === 'hybrid') {
      const y = hyb.get(i)!;
      const u = e.ports.map((p) => U(p));
      for (let r = 0; r < 4; r++) {
        let cur = c(0);
        for (let s = 0; s < 4; s++)
          cur = c(cur.re + cMul(y[r * 4 + s], u[s]).re, cur.im + cMul(y[r * 4 + s], u[s]).im);
        lossW += half(u[r], cur);
      }
    }
  });
  const nodeVoltages = new Map<string, Complex>();
  for (const n of pn.nodes) nodeVoltages.set(n, U(n));
  return { portVoltages, portCurrents, sources, lossW, nodeVoltages };
}
