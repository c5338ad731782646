/**
 * One antenna at one frequency: fill, excite, load, factor, solve, and the powers.
 *
 * Ports: a delta-gap source of voltage V at a node tested with the basis functions gives the
 * excitation V·f_m(node) (Harrington 1968, §4.3); the current through the gap is Σ_m I_m f_m(node)
 * and the port impedance V/I. Lumped loads add Z_L f_m f_n to the matrix; the conductor's
 * internal impedance z'(ω) (conductor.ts) adds z'∫ f_m f_n dl. Input power is ½ Re Σ V I*,
 * conductor loss ½ Σ R'∫|I|² dl, load loss ½ Σ Re Z_L |I_L|².
 *
 * Ground-connected wires over lossy ground: the Wait–Pope loss resistance Rg (radials.ts) of each
 * ground connection is computed from the surface magnetic field of the solved currents and put in
 * series with the connection; the solution is updated by the Sherman–Morrison–Woodbury identity
 * (Golub & Van Loan, Matrix Computations, 4th ed., 2013, §2.1.4) instead of a new factorisation.
 */
import { luFactor, luSolve, SingularMatrixError } from '../numeric/lu.ts';
import { c, cDiv, type Complex } from '../numeric/complex.ts';
import { gaussLegendre01 } from '../numeric/quadrature.ts';
import { ETA0, waveNumber } from './constants.ts';
import { internalImpedancePerM } from './conductor.ts';
import { ModelError, type Diagnostic } from './errors.ts';
import { addSegmentImpedance, fillImpedanceMatrix } from './fill.ts';
import {
  createGroundModel,
  type GroundAtFrequency,
  type GroundModel,
  type GroundModelChoice,
  type GroundZone,
} from './ground.ts';
import { createExactGroundModel } from './halfspace/ground.ts';
import { buildMesh, nodeAt, type GroundContact, type Mesh, type MeshOptions } from './mesh.ts';
import {
  BARE_CONTACT_RADIUS_M,
  NEAR_FIELD_WAVELENGTHS,
  groundLossResistance,
  type RadialScreen,
} from './radials.ts';
import type { AntennaModel, LoadSpec } from './types.ts';
import { bondedGroundLoss } from './bondedRadials.ts';
import {
  OPEN_PORT_IMPEDANCE_OHM,
  prepareNetwork,
  solveNetwork,
  type NetworkSolution,
  type PreparedNetwork,
} from './network.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

export interface Port {
  wire: number;
  /** Position used (node), 0…1 along the wire. */
  position: number;
  node: number;
  basis: Int32Array;
  coef: Float64Array;
}

export interface PreparedFeed extends Port {
  voltage: Complex;
}

export interface PreparedLoad extends Port {
  spec: LoadSpec;
}

export interface PreparedContact {
  contact: GroundContact;
  screen: RadialScreen;
  /** Radius of the connected wire (the lower integration limit with radials). */
  wireRadiusM: number;
  radialsIndex: number | null;
}

export interface PreparedModel {
  model: AntennaModel;
  mesh: Mesh;
  ground: GroundModel;
  feeds: PreparedFeed[];
  loads: PreparedLoad[];
  contacts: PreparedContact[];
  /** The feed network, when the model has one (network.ts); its ports are the feeds. */
  network: PreparedNetwork | null;
  diagnostics: Diagnostic[];
}

function resolvePort(mesh: Mesh, wire: number, position: number, field: string, nWires: number): Port {
  if (!Number.isInteger(wire) || wire < 0 || wire >= nWires)
    throw new ModelError(`${field}.wire`, `there is no wire ${wire}`);
  if (!(position >= 0 && position <= 1))
    throw new ModelError(`${field}.position`, 'must lie between 0 and 1');
  const at = nodeAt(mesh, wire, position);
  const basis: number[] = [];
  const coef: number[] = [];
  for (let t = mesh.nodeTermStart[at.node]; t < mesh.nodeTermStart[at.node + 1]; t++) {
    basis.push(mesh.nodeTermBasis[t]);
    coef.push(mesh.nodeTermCoef[t]);
  }
  if (basis.length === 0)
    throw new ModelError(
      `${field}.position`,
      `position ${position} is a free end of wire ${wire}, where no current flows`,
    );
  return {
    wire,
    position: at.position,
    node: at.node,
    basis: Int32Array.from(basis),
    coef: Float64Array.from(coef),
  };
}

/** Mesh diagnostics about the reflection-coefficient approximation near the ground. */
const APPROXIMATION_ONLY = new Set(['low-horizontal-wire', 'segment-near-lossy-ground']);

/**
 * Mesh the model and resolve feeds, loads and ground connections. Throws ModelError. Over lossy
 * soil the ground is the exact half-space model (halfspace/ground.ts) wrapping the
 * reflection-coefficient one, unless `groundModel` is 'approximate'.
 */
export function prepareModel(
  model: AntennaModel,
  meshOptions: MeshOptions,
  groundModel: GroundModelChoice = 'exact',
): PreparedModel {
  if (model.feeds.length === 0) throw new ModelError('feeds', 'the antenna has no feed');
  const mesh = buildMesh(model, meshOptions);
  const diagnostics = [...mesh.diagnostics];
  const nW = model.wires.length;
  const feeds: PreparedFeed[] = model.feeds.map((f, i) => {
    const port = resolvePort(mesh, f.wire, f.position, `feeds[${i}]`, nW);
    const v = f.voltage ?? [1, 0];
    if (!v.every(Number.isFinite)) throw new ModelError(`feeds[${i}].voltage`, 'must be finite');
    const L = Math.hypot(...model.wires[f.wire].to.map((x, j) => x - model.wires[f.wire].from[j]));
    if (Math.abs(port.position - f.position) * L > 0.01 * mesh.wavelengthM)
      diagnostics.push({
        level: 'info',
        code: 'feed-moved',
        message: `feed ${i} moved from ${f.position} to ${port.position.toFixed(4)} along wire ${f.wire} (nearest segment end)`,
        field: `feeds[${i}].position`,
      });
    if (model.network && f.voltage !== undefined)
      throw new ModelError(
        `feeds[${i}].voltage`,
        'a feed connected to the network takes its voltage from the network: remove the voltage',
      );
    return { ...port, voltage: c(v[0], v[1]) };
  });
  const network = model.network ? prepareNetwork(model.network, feeds.length) : null;
  const loads: PreparedLoad[] = (model.loads ?? []).map((l, i) => {
    const port = resolvePort(mesh, l.wire, l.position, `loads[${i}]`, nW);
    if (l.kind === 'parallel-rlc' && l.rOhm === undefined && l.lH === undefined && l.cF === undefined)
      throw new ModelError(`loads[${i}]`, 'a parallel RLC load needs at least one of rOhm, lH, cF');
    return { ...port, spec: l };
  });
  // Ground connections and radial systems.
  const contacts: PreparedContact[] = [];
  const soil = model.ground.kind === 'soil';
  (model.radials ?? []).forEach((r, i) => {
    if (!Number.isInteger(r.wire) || r.wire < 0 || r.wire >= nW)
      throw new ModelError(`radials[${i}].wire`, `there is no wire ${r.wire}`);
    if (!mesh.groundContacts.some((gc) => gc.ends.some((e) => e.wire === r.wire)))
      throw new ModelError(
        `radials[${i}].wire`,
        `wire ${r.wire} does not touch the ground, so radials cannot connect to it`,
      );
    if (r.lengthsM.length !== r.count)
      throw new ModelError(`radials[${i}].lengthsM`, `${r.lengthsM.length} lengths for ${r.count} radials`);
    if (!soil)
      diagnostics.push({
        level: 'info',
        code: 'radials-ignored',
        message: `radials ${i} have no effect over ${model.ground.kind === 'perfect' ? 'perfect ground' : 'free space'}`,
        field: `radials[${i}]`,
      });
  });
  if (soil) {
    mesh.groundContacts.forEach((gc) => {
      const ri = (model.radials ?? []).findIndex((r) => gc.ends.some((e) => e.wire === r.wire));
      const r = ri >= 0 ? model.radials![ri] : null;
      const wireRadiusM = Math.max(...gc.ends.map((e) => model.wires[e.wire].radiusM));
      if (!r)
        diagnostics.push({
          level: 'warning',
          code: 'bare-ground-connection',
          message: `wire ${gc.ends[0].wire} meets the lossy ground without radials: its ground loss is that of a bare ${BARE_CONTACT_RADIUS_M * 1000} mm stake (surface-impedance method)`,
          field: `wires[${gc.ends[0].wire}]`,
        });
      contacts.push({
        contact: gc,
        screen: r ? { lengthsM: r.lengthsM, radiusM: r.radiusM } : { lengthsM: [], radiusM: 1e-3 },
        wireRadiusM,
        radialsIndex: ri >= 0 ? ri : null,
      });
    });
  }
  const zones: GroundZone[] = contacts.map((pc) => ({
    x: pc.contact.x,
    y: pc.contact.y,
    radiusM: (f: number) => zoneRadius(pc, f),
  }));
  const approximate = createGroundModel(model.ground, zones);
  // Lossy soil: the exact half-space near the ground unless the input asks for the approximation.
  const exact = approximate.kind === 'reflection-coefficient' && groundModel === 'exact';
  const ground = exact ? createExactGroundModel(approximate) : approximate;
  return {
    model,
    mesh,
    ground,
    feeds,
    loads,
    contacts,
    network,
    // the approximation's warning about low wires does not apply to the exact model
    diagnostics: exact ? diagnostics.filter((d) => !APPROXIMATION_ONLY.has(d.code)) : diagnostics,
  };
}

/** Outer limit of the radial-system integration: the near-field disc (radials.ts). */
export function zoneRadius(_pc: PreparedContact, freqHz: number): number {
  return (NEAR_FIELD_WAVELENGTHS * SPEED_OF_LIGHT_M_PER_S) / freqHz;
}

export function loadImpedance(spec: LoadSpec, freqHz: number): Complex {
  const w = 2 * Math.PI * freqHz;
  switch (spec.kind) {
    case 'impedance':
      return c(spec.rOhm, spec.xOhm);
    case 'series-rlc': {
      const x = (spec.lH ?? 0) * w - (spec.cF !== undefined ? 1 / (w * spec.cF) : 0);
      return c(spec.rOhm ?? 0, x);
    }
    case 'parallel-rlc': {
      // Y = 1/R + 1/(jωL) + jωC
      const g = spec.rOhm !== undefined ? 1 / spec.rOhm : 0;
      const b = (spec.cF ?? 0) * w - (spec.lH !== undefined ? 1 / (w * spec.lH) : 0);
      return cDiv(c(1), c(g, b));
    }
  }
}

export interface FeedResult {
  voltage: Complex;
  current: Complex;
  impedance: Complex;
}

export interface ContactResult {
  /** Wait–Pope loss resistance in series with the connection (Ω). */
  lossResistanceOhm: number;
  /** Current into the ground connection. */
  current: Complex;
  integrationLimitM: number;
  innerLimitM: number;
  radials: number;
}

export interface FrequencySolution {
  freqHz: number;
  k: number;
  /** Basis currents (re, im) and node currents along each wire (re, im). */
  currents: Float64Array;
  nodeCurrents: Float64Array;
  feeds: FeedResult[];
  contacts: ContactResult[];
  inputPowerW: number;
  conductorLossW: number;
  loadLossW: number;
  groundSystemLossW: number;
  /** The feed network's solution (sources, port voltages, its own loss); null without one. */
  network: NetworkSolution | null;
  networkLossW: number;
  groundAt: GroundAtFrequency | null;
}

/** Reusable work arrays for repeated solves of one prepared model (sweeps). */
export interface SolveWorkspace {
  z: Float64Array;
  pivots: Int32Array;
}

export function createWorkspace(pm: PreparedModel): SolveWorkspace {
  const n = pm.mesh.nBasis;
  return { z: new Float64Array(2 * n * n), pivots: new Int32Array(n) };
}

/** Port value vector dotted with a basis vector: Σ coef·x[basis]. */
function portDot(p: Port, x: Float64Array): Complex {
  let re = 0;
  let im = 0;
  for (let t = 0; t < p.basis.length; t++) {
    re += p.coef[t] * x[2 * p.basis[t]];
    im += p.coef[t] * x[2 * p.basis[t] + 1];
  }
  return c(re, im);
}

export function nodeCurrentsOf(
  mesh: Mesh,
  x: Float64Array,
  out = new Float64Array(2 * mesh.nNodes),
): Float64Array {
  for (let nd = 0; nd < mesh.nNodes; nd++) {
    let re = 0;
    let im = 0;
    for (let t = mesh.nodeTermStart[nd]; t < mesh.nodeTermStart[nd + 1]; t++) {
      const b = mesh.nodeTermBasis[t];
      re += mesh.nodeTermCoef[t] * x[2 * b];
      im += mesh.nodeTermCoef[t] * x[2 * b + 1];
    }
    out[2 * nd] = re;
    out[2 * nd + 1] = im;
  }
  return out;
}

/** Solve the prepared model at one frequency. */
export function solveFrequency(
  pm: PreparedModel,
  freqHz: number,
  ws: SolveWorkspace = createWorkspace(pm),
): FrequencySolution {
  const { mesh } = pm;
  const n = mesh.nBasis;
  const n2 = 2 * n;
  const k = waveNumber(freqHz);
  const groundAt = pm.ground.at(freqHz);
  const z = ws.z;
  fillImpedanceMatrix(mesh, k, ETA0, groundAt, z);
  // Conductor loss: internal impedance per wire.
  const zInt: (Complex | null)[] = mesh.wireMaterial.map((m, w) =>
    m ? internalImpedancePerM(freqHz, pm.model.wires[w].radiusM, m) : null,
  );
  for (let s = 0; s < mesh.nSeg; s++) {
    const zi = zInt[mesh.segWire[s]];
    if (zi) addSegmentImpedance(mesh, s, zi.re, zi.im, z);
  }
  const loadZ = pm.loads.map((l) => loadImpedance(l.spec, freqHz));
  pm.loads.forEach((l, i) => {
    const zl = loadZ[i];
    for (let a = 0; a < l.basis.length; a++)
      for (let b = 0; b < l.basis.length; b++) {
        const idx = l.basis[a] * n2 + 2 * l.basis[b];
        const w = l.coef[a] * l.coef[b];
        z[idx] += w * zl.re;
        z[idx + 1] += w * zl.im;
      }
  });
  let lu: ReturnType<typeof luFactor>;
  try {
    lu = luFactor(n, z, ws.pivots);
  } catch (e) {
    if (e instanceof SingularMatrixError) throw singularModelError(mesh, e.column);
    throw e;
  }
  const portVector = (f: PreparedFeed): Float64Array => {
    const e = new Float64Array(n2);
    for (let t = 0; t < f.basis.length; t++) e[2 * f.basis[t]] += f.coef[t];
    return e;
  };
  let x: Float64Array;
  // With a network: W = Z⁻¹E (one column per port), the wires' port admittance Eᵀ W, the network
  // solved on it, and x = W V (network.ts). Without: x = Z⁻¹ Σ E_p V_p.
  let w: Float64Array[] = [];
  let net: NetworkSolution | null = null;
  const solveNet = (): Float64Array => {
    const m = w.length;
    const yw: Complex[] = [];
    for (let r = 0; r < m; r++) for (let q = 0; q < m; q++) yw.push(portDot(pm.feeds[r], w[q]));
    net = solveNetwork(pm.network!, yw, freqHz);
    const out = new Float64Array(n2);
    net.portVoltages.forEach((v, q) => {
      const wq = w[q];
      for (let i = 0; i < n; i++) {
        out[2 * i] += wq[2 * i] * v.re - wq[2 * i + 1] * v.im;
        out[2 * i + 1] += wq[2 * i] * v.im + wq[2 * i + 1] * v.re;
      }
    });
    return out;
  };
  if (pm.network) {
    w = pm.feeds.map((f) => luSolve(lu, portVector(f)));
    x = solveNet();
  } else {
    const rhs = new Float64Array(n2);
    for (const f of pm.feeds)
      for (let t = 0; t < f.basis.length; t++) {
        rhs[2 * f.basis[t]] += f.coef[t] * f.voltage.re;
        rhs[2 * f.basis[t] + 1] += f.coef[t] * f.voltage.im;
      }
    x = luSolve(lu, rhs);
  }

  // Ground connections over lossy ground: Wait–Pope loss in series, Woodbury update.
  const contacts: ContactResult[] = [];
  if (pm.contacts.length > 0 && groundAt?.zg) {
    const nodeI = nodeCurrentsOf(mesh, x);
    const rg =
      pm.model.radialsBonded && pm.contacts.length > 1
        ? bondedContactLoss(pm, freqHz, k, nodeI, x, groundAt.zg)
        : pm.contacts.map((pc) => contactLoss(pm, pc, freqHz, k, nodeI, x, groundAt.zg!));
    const rgOhm = rg.map((r) => r.lossResistanceOhm);
    if (pm.network) {
      // the loss resistances change the wires' port admittance: update W, solve the network again
      woodburyUpdate(pm, lu, w, rgOhm);
      x = solveNet();
    } else woodburyUpdate(pm, lu, [x], rgOhm);
    pm.contacts.forEach((pc, i) => {
      let re = 0;
      let im = 0;
      for (const b of pc.contact.basis) {
        re += x[2 * b];
        im += x[2 * b + 1];
      }
      contacts.push({ ...rg[i], current: c(re, im) });
    });
  }
  const nodeCurrents = nodeCurrentsOf(mesh, x);

  const netSol = net as NetworkSolution | null;
  const feeds: FeedResult[] = pm.feeds.map((f, p) => {
    const i = portDot(f, x);
    if (netSol) {
      // a network port may be open (an idle element): report a finite stand-in impedance
      const v = netSol.portVoltages[p];
      const open = !(Math.hypot(i.re, i.im) > 1e-15 * Math.max(1, Math.hypot(v.re, v.im)));
      return { voltage: v, current: i, impedance: open ? c(OPEN_PORT_IMPEDANCE_OHM) : cDiv(v, i) };
    }
    if (!(Math.hypot(i.re, i.im) > 0))
      throw new ModelError('feeds', 'a feed carries no current (the antenna is open-circuited at the feed)');
    return { voltage: f.voltage, current: i, impedance: cDiv(f.voltage, i) };
  });
  let inputPowerW = 0;
  if (netSol) for (const s of netSol.sources) inputPowerW += s.powerW;
  else
    for (const f of feeds) inputPowerW += 0.5 * (f.voltage.re * f.current.re + f.voltage.im * f.current.im);
  let conductorLossW = 0;
  for (let s = 0; s < mesh.nSeg; s++) {
    const zi = zInt[mesh.segWire[s]];
    if (!zi) continue;
    const w = mesh.segWire[s];
    const kk = s - mesh.wireSegStart[w];
    const a = mesh.wireNodeStart[w] + kk;
    const ar = nodeCurrents[2 * a];
    const ai = nodeCurrents[2 * a + 1];
    const br = nodeCurrents[2 * a + 2];
    const bi = nodeCurrents[2 * a + 3];
    const int = (ar * ar + ai * ai + ar * br + ai * bi + br * br + bi * bi) / 3;
    conductorLossW += 0.5 * zi.re * mesh.len[s] * int;
  }
  let loadLossW = 0;
  pm.loads.forEach((l, i) => {
    const il = portDot(l, x);
    loadLossW += 0.5 * loadZ[i].re * (il.re * il.re + il.im * il.im);
  });
  let groundSystemLossW = 0;
  for (const cr of contacts)
    groundSystemLossW +=
      0.5 * cr.lossResistanceOhm * (cr.current.re * cr.current.re + cr.current.im * cr.current.im);
  return {
    freqHz,
    k,
    currents: x,
    nodeCurrents,
    feeds,
    contacts,
    inputPowerW,
    conductorLossW,
    loadLossW,
    groundSystemLossW,
    network: netSol,
    networkLossW: netSol?.lossW ?? 0,
    groundAt,
  };
}

function woodburyUpdate(
  pm: PreparedModel,
  lu: ReturnType<typeof luFactor>,
  xs: Float64Array[],
  rg: number[],
): void {
  // Z' = Z + E R Eᵀ; x' = x − Y R (I + Eᵀ Y R)⁻¹ Eᵀ x, Y = Z⁻¹E, for each x = Z⁻¹b given.
  const m = rg.length;
  const n = pm.mesh.nBasis;
  const Y: Float64Array[] = pm.contacts.map((pc) => {
    const e = new Float64Array(2 * n);
    for (const b of pc.contact.basis) e[2 * b] = 1;
    return luSolve(lu, e);
  });
  const eDot = (ci: number, v: Float64Array): Complex => {
    let re = 0;
    let im = 0;
    for (const b of pm.contacts[ci].contact.basis) {
      re += v[2 * b];
      im += v[2 * b + 1];
    }
    return c(re, im);
  };
  const S = new Float64Array(2 * m * m);
  for (let i = 0; i < m; i++)
    for (let j = 0; j < m; j++) {
      const d = eDot(i, Y[j]);
      S[2 * (i * m + j)] = (i === j ? 1 : 0) + d.re * rg[j];
      S[2 * (i * m + j) + 1] = d.im * rg[j];
    }
  const sLu = luFactor(m, S);
  for (const x of xs) {
    const t = new Float64Array(2 * m);
    for (let i = 0; i < m; i++) {
      const d = eDot(i, x);
      t[2 * i] = d.re;
      t[2 * i + 1] = d.im;
    }
    const w = luSolve(sLu, t);
    for (let j = 0; j < m; j++) {
      const wr = w[2 * j] * rg[j];
      const wi = w[2 * j + 1] * rg[j];
      const yj = Y[j];
      for (let i = 0; i < n; i++) {
        x[2 * i] -= yj[2 * i] * wr - yj[2 * i + 1] * wi;
        x[2 * i + 1] -= yj[2 * i] * wi + yj[2 * i + 1] * wr;
      }
    }
  }
}

const GH = gaussLegendre01(12);
const G4 = gaussLegendre01(4);

/**
 * Tangential magnetic field at a ground point (x, y, 0) from the node currents, over the perfect
 * image of the ground-system zone: twice the field of the real currents (the image doubles the
 * tangential part). H = (1/4π)∫ I(s)(1 + jkR) e^{−jkR}/R³ (t̂ × R⃗) ds (Balanis, Antenna Theory,
 * 3rd ed., §3.6); near segments use s = s* + d·sinh τ about the closest point.
 * Writes Hx, Hy (re, im) into out[0…3].
 */
export function surfaceMagneticField(
  mesh: Mesh,
  nodeI: Float64Array,
  k: number,
  x: number,
  y: number,
  out: Float64Array,
  /** Only these segments (default every segment). */
  segments?: Int32Array,
): void {
  let hxr = 0,
    hxi = 0,
    hyr = 0,
    hyi = 0;
  const nS = segments ? segments.length : mesh.nSeg;
  for (let q = 0; q < nS; q++) {
    const s = segments ? segments[q] : q;
    const w = mesh.segWire[s];
    const a = mesh.wireNodeStart[w] + (s - mesh.wireSegStart[w]);
    const i0r = nodeI[2 * a];
    const i0i = nodeI[2 * a + 1];
    const i1r = nodeI[2 * a + 2];
    const i1i = nodeI[2 * a + 3];
    if (i0r === 0 && i0i === 0 && i1r === 0 && i1i === 0) continue;
    const L = mesh.len[s];
    const ttx = mesh.tx[s];
    const tty = mesh.ty[s];
    const ttz = mesh.tz[s];
    const rx = x - mesh.sx[s];
    const ry = y - mesh.sy[s];
    const rz = -mesh.sz[s];
    let sStar = rx * ttx + ry * tty + rz * ttz;
    const d2 = rx * rx + ry * ry + rz * rz - sStar * sStar;
    const d = Math.sqrt(Math.max(d2, 0)) + 1e-12;
    sStar = Math.min(Math.max(sStar, -10 * L), 11 * L);
    const near = d < 2 * L;
    const ta = near ? Math.asinh((0 - sStar) / d) : 0;
    const tb = near ? Math.asinh((L - sStar) / d) : 1;
    const rule = near ? GH : G4;
    for (let i = 0; i < rule.x.length; i++) {
      let sv: number;
      let ds: number;
      if (near) {
        // sinh and cosh from one exponential
        const e = Math.exp(ta + (tb - ta) * rule.x[i]);
        const ie = 1 / e;
        sv = sStar + d * 0.5 * (e - ie);
        ds = rule.w[i] * (tb - ta) * d * 0.5 * (e + ie);
      } else {
        sv = L * rule.x[i];
        ds = rule.w[i] * L;
      }
      const u = sv / L;
      const ir = i0r * (1 - u) + i1r * u;
      const ii = i0i * (1 - u) + i1i * u;
      const Rx = rx - sv * ttx;
      const Ry = ry - sv * tty;
      const Rz = rz - sv * ttz;
      const R = Math.sqrt(Rx * Rx + Ry * Ry + Rz * Rz);
      const kR = k * R;
      // (1 + jkR) e^{−jkR} / R³
      const cs = Math.cos(kR);
      const sn = Math.sin(kR);
      const fr = (cs + kR * sn) / (R * R * R);
      const fi = (kR * cs - sn) / (R * R * R);
      // t × R: x = ty Rz − tz Ry, y = tz Rx − tx Rz
      const cx = tty * Rz - ttz * Ry;
      const cy = ttz * Rx - ttx * Rz;
      const gr = (ir * fr - ii * fi) * ds;
      const gi = (ir * fi + ii * fr) * ds;
      hxr += gr * cx;
      hxi += gi * cx;
      hyr += gr * cy;
      hyi += gi * cy;
    }
  }
  const f = 2 / (4 * Math.PI);
  out[0] = f * hxr;
  out[1] = f * hxi;
  out[2] = f * hyr;
  out[3] = f * hyi;
}

/** Inner limit of a connection's integration: the wire radius with radials, the stake without. */
function innerLimit(pc: PreparedContact): number {
  return pc.screen.lengthsM.length > 0 ? pc.wireRadiusM : Math.max(BARE_CONTACT_RADIUS_M, pc.wireRadiusM);
}

/** Bonded radial fields of several connections (bondedRadials.ts), with the solved currents' field. */
function bondedContactLoss(
  pm: PreparedModel,
  freqHz: number,
  k: number,
  nodeI: Float64Array,
  x: Float64Array,
  zg: Complex,
): Omit<ContactResult, 'current'>[] {
  const h = new Float64Array(4);
  const connections = pm.contacts.map((pc) => {
    let re = 0;
    let im = 0;
    for (const b of pc.contact.basis) {
      re += x[2 * b];
      im += x[2 * b + 1];
    }
    return {
      x: pc.contact.x,
      y: pc.contact.y,
      screen: pc.screen,
      rhoMinM: innerLimit(pc),
      rhoMaxM: zoneRadius(pc, freqHz),
      current: c(re, im),
    };
  });
  const loss = bondedGroundLoss({
    freqHz,
    zg,
    connections,
    hAbs2: (px, py) => {
      surfaceMagneticField(pm.mesh, nodeI, k, px, py, h);
      return h[0] * h[0] + h[1] * h[1] + h[2] * h[2] + h[3] * h[3];
    },
  });
  return pm.contacts.map((pc, i) => ({
    lossResistanceOhm: loss.lossResistanceOhm[i],
    integrationLimitM: connections[i].rhoMaxM,
    innerLimitM: connections[i].rhoMinM,
    radials: pc.screen.lengthsM.length,
  }));
}

function contactLoss(
  pm: PreparedModel,
  pc: PreparedContact,
  freqHz: number,
  k: number,
  nodeI: Float64Array,
  x: Float64Array,
  zg: Complex,
): Omit<ContactResult, 'current'> {
  const mesh = pm.mesh;
  let i0r = 0;
  let i0i = 0;
  for (const b of pc.contact.basis) {
    i0r += x[2 * b];
    i0i += x[2 * b + 1];
  }
  const i02 = i0r * i0r + i0i * i0i;
  const rhoMaxM = zoneRadius(pc, freqHz);
  const rhoMinM = innerLimit(pc);
  // Azimuthally symmetric when every current-carrying wire is vertical through the contact.
  // Otherwise the segments on that axis (a vertical's own wire, a tower) are still a field of
  // one magnitude all round, along φ̂ = (−cos φ, sin φ) with φ the bearing from north (t̂ × R⃗ with
  // t̂ = ±ẑ): it is computed once per radius and turned to each azimuth; the other segments' field
  // is computed at each azimuth.
  const axis: number[] = [];
  const rest: number[] = [];
  for (let s = 0; s < mesh.nSeg; s++) {
    const vertical = Math.abs(mesh.tz[s]) > 1 - 1e-9;
    const onAxis = Math.hypot(mesh.sx[s] - pc.contact.x, mesh.sy[s] - pc.contact.y) < 1e-6;
    (vertical && onAxis ? axis : rest).push(s);
  }
  const symmetric = rest.length === 0;
  const nAz = symmetric ? 1 : 8;
  const axisSegs = Int32Array.from(axis);
  const restSegs = Int32Array.from(rest);
  const h = new Float64Array(4);
  const lossOhm =
    i02 > 0
      ? groundLossResistance({
          freqHz,
          screen: pc.screen,
          zg,
          rhoMinM,
          rhoMaxM,
          hAbs2PerI0: (rho) => {
            if (symmetric) {
              const phi = Math.PI;
              surfaceMagneticField(
                mesh,
                nodeI,
                k,
                pc.contact.x + rho * Math.sin(phi),
                pc.contact.y + rho * Math.cos(phi),
                h,
              );
              return (h[0] * h[0] + h[1] * h[1] + h[2] * h[2] + h[3] * h[3]) / i02;
            }
            // the axis field's complex magnitude along φ̂ at bearing 0 (φ̂ = (−1, 0) there)
            let ar = 0;
            let ai = 0;
            if (axisSegs.length) {
              surfaceMagneticField(mesh, nodeI, k, pc.contact.x, pc.contact.y + rho, h, axisSegs);
              ar = -h[0];
              ai = -h[1];
            }
            let sum = 0;
            for (let j = 0; j < nAz; j++) {
              const phi = (2 * Math.PI * (j + 0.5)) / nAz;
              const sn = Math.sin(phi);
              const cs = Math.cos(phi);
              surfaceMagneticField(
                mesh,
                nodeI,
                k,
                pc.contact.x + rho * sn,
                pc.contact.y + rho * cs,
                h,
                restSegs,
              );
              const hxr = h[0] - ar * cs;
              const hxi = h[1] - ai * cs;
              const hyr = h[2] + ar * sn;
              const hyi = h[3] + ai * sn;
              sum += hxr * hxr + hxi * hxi + hyr * hyr + hyi * hyi;
            }
            return sum / nAz / i02;
          },
        })
      : 0;
  return {
    lossResistanceOhm: lossOhm,
    integrationLimitM: rhoMaxM,
    innerLimitM: rhoMinM,
    radials: pc.screen.lengthsM.length,
  };
}

/**
 * The model error of a singular impedance matrix: names the wire that carries the unknown whose
 * pivot vanished (the first segment piece of that basis function) and what usually causes it.
 */
function singularModelError(mesh: PreparedModel['mesh'], column: number): ModelError {
  let wire = -1;
  for (let s = 0; s < mesh.nSeg && wire < 0; s++)
    for (let t = mesh.segPieceStart[s]; t < mesh.segPieceStart[s + 1]; t++)
      if (mesh.pieceBasis[t] === column) {
        wire = mesh.segWire[s];
        break;
      }
  return new ModelError(
    wire >= 0 ? `wires[${wire}]` : 'wires',
    `the model cannot be solved (its matrix is singular at unknown ${column}${wire >= 0 ? `, on wire ${wire}` : ''}): two wires coincide or overlap, or a radius is far outside the thin-wire range; move or remove the duplicate wire`,
  );
}
