/**
 * Segmentation of the wires and the current basis of the moment method.
 *
 * Each wire is cut into equal straight segments. The unknowns are the currents at segment
 * ends ("nodes"): the current along a segment is linear between its two node currents, so the
 * basis functions are triangles (piecewise-linear, "rooftop") spanning the two segments around
 * a node (Harrington, Field Computation by Moment Methods, 1968, §4.2–4.3; Gibson, The Method of
 * Moments in Electromagnetics, 2nd ed., 2014, ch. 4, triangle basis on wires).
 *
 *  - an interior node of a wire carries one triangle;
 *  - a free wire end carries none (the current is zero there);
 *  - a junction of M ≥ 2 wire ends carries M − 1 basis functions, each a half triangle on the
 *    first wire's end segment joined to a half triangle on one other wire, so that the current
 *    flowing into the junction from the first wire leaves it through the others: Kirchhoff's
 *    current law holds at the junction by construction;
 *  - over a ground (perfect or lossy), a wire end on the ground plane carries a half triangle
 *    whose other half is its image: the wire is connected to the ground.
 *
 * Every basis function is stored through its values at the nodes ("node terms"); the piece of a
 * basis function on one segment is then a + b·u, u ∈ [0, 1] from the segment's start to its end,
 * with a = value at the start node and b = (value at the end node) − a, in the direction of the
 * segment. The impedance-matrix fill works with those pieces only.
 *
 * Default segmentation: `DEFAULT_SEGMENTS_PER_WAVELENGTH` (80) segments per wavelength at the
 * highest frequency, each at least `DEFAULT_MIN_SEGMENT_RADII` radii long, adjusted so that feeds
 * and loads fall on nodes. With the triangle basis and Galerkin testing the impedance then moves
 * by less than 1 % and the 15° gain by less than 0.05 dB when the count is doubled (a dipole and
 * a half-square over average ground, a vertical with radials: test/reference/em/properties.test.ts);
 * at 40 per wavelength the reactance of a thin dipole still moves by 3 %.
 *
 * Segment-to-segment distance: C. Ericson, Real-Time Collision Detection (2005), §5.1.9.
 */
import type { ConductorMaterial } from './conductor.ts';
import { MATERIALS } from './conductor.ts';
import { ModelError, type Diagnostic } from './errors.ts';
import type { AntennaModel, Vec3 } from './types.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../units/index.ts';

export const DEFAULT_SEGMENTS_PER_WAVELENGTH = 80;
/** Wire ends closer than this (metres) are joined. */
export const JUNCTION_TOLERANCE_M = 1e-4;
/** A wire end at most this high (metres, or the wire radius if larger) touches the ground. */
export const GROUND_CONTACT_TOLERANCE_M = 1e-3;
/** Warn when a segment is longer than this fraction of the wavelength. */
export const MAX_SEGMENT_WAVELENGTHS = 0.1;
/** Warn when a segment is shorter than this many wire radii (thin-wire kernel breaks down). */
export const MIN_SEGMENT_RADII = 2;
/** The default segmentation keeps segments at least this many radii long. */
export const DEFAULT_MIN_SEGMENT_RADII = 2;
/** Warn when a horizontal wire over lossy ground is lower than this many wavelengths. */
export const LOW_WIRE_WAVELENGTHS = 0.1;

export interface WireEndRef {
  wire: number;
  end: 0 | 1;
}

export interface GroundContact {
  /** Point on the ground plane (z = 0). */
  x: number;
  y: number;
  ends: WireEndRef[];
  /** Basis function of each end (same order as ends). */
  basis: number[];
}

export interface Mesh {
  readonly nSeg: number;
  readonly nBasis: number;
  readonly nWires: number;
  readonly nNodes: number;
  /** Segment start point, unit direction, length, radius. */
  readonly sx: Float64Array;
  readonly sy: Float64Array;
  readonly sz: Float64Array;
  readonly tx: Float64Array;
  readonly ty: Float64Array;
  readonly tz: Float64Array;
  readonly len: Float64Array;
  readonly radius: Float64Array;
  readonly segWire: Int32Array;
  /** Wire w owns segments wireSegStart[w] … wireSegStart[w+1]−1 and nodes wireNodeStart[w] …. */
  readonly wireSegStart: Int32Array;
  readonly wireNodeStart: Int32Array;
  /** Node terms (CSR over global nodes): basis index and its value at the node, along the wire. */
  readonly nodeTermStart: Int32Array;
  readonly nodeTermBasis: Int32Array;
  readonly nodeTermCoef: Float64Array;
  /** Basis pieces (CSR over segments): basis index and a + b·u along the segment. */
  readonly segPieceStart: Int32Array;
  readonly pieceBasis: Int32Array;
  readonly pieceA: Float64Array;
  readonly pieceB: Float64Array;
  /** Conductor of each wire; null for a perfect conductor. */
  readonly wireMaterial: readonly (ConductorMaterial | null)[];
  readonly groundContacts: readonly GroundContact[];
  readonly diagnostics: readonly Diagnostic[];
  /** Wavelength used for the default segmentation (highest frequency). */
  readonly wavelengthM: number;
}

export interface MeshOptions {
  /** Highest frequency of the evaluation: sets the default segment length. */
  maxFreqHz: number;
  segmentsPerWavelength?: number;
}

const sub = (a: Vec3, b: Vec3): [number, number, number] => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dist = (a: Vec3, b: Vec3): number => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

/**
 * Length over which two straight wires lie on top of each other (collinear within `tolM` and with
 * overlapping extents), or 0. Wires that merely meet end to end overlap by 0.
 */
export function collinearOverlapM(a: readonly Vec3[], b: readonly Vec3[], tolM: number): number {
  if (a.length < 2 || b.length < 2) return 0;
  const da = sub(a[1], a[0]);
  const La = Math.hypot(da[0], da[1], da[2]);
  if (La === 0) return 0;
  const u: Vec3 = [da[0] / La, da[1] / La, da[2] / La];
  // Distance of each end of b from the line of a.
  for (const p of b) {
    const r = sub(p, a[0]);
    const t = r[0] * u[0] + r[1] * u[1] + r[2] * u[2];
    const off = Math.hypot(r[0] - t * u[0], r[1] - t * u[1], r[2] - t * u[2]);
    if (off > tolM) return 0;
  }
  const t0 = dotSub(b[0], a[0], u);
  const t1 = dotSub(b[1], a[0], u);
  const lo = Math.max(0, Math.min(t0, t1));
  const hi = Math.min(La, Math.max(t0, t1));
  const overlap = hi - lo;
  return overlap > Math.max(tolM, 1e-6) ? overlap : 0;
}

function dotSub(p: Vec3, o: Vec3, u: Vec3): number {
  return (p[0] - o[0]) * u[0] + (p[1] - o[1]) * u[1] + (p[2] - o[2]) * u[2];
}

/** Closest distance between segments p0–p1 and q0–q1 (Ericson 2005, §5.1.9). */
export function segmentDistance(p0: Vec3, p1: Vec3, q0: Vec3, q1: Vec3): { d: number; s: number; t: number } {
  const d1 = sub(p1, p0);
  const d2 = sub(q1, q0);
  const r = sub(p0, q0);
  const a = d1[0] * d1[0] + d1[1] * d1[1] + d1[2] * d1[2];
  const e = d2[0] * d2[0] + d2[1] * d2[1] + d2[2] * d2[2];
  const f = d2[0] * r[0] + d2[1] * r[1] + d2[2] * r[2];
  const cc = d1[0] * r[0] + d1[1] * r[1] + d1[2] * r[2];
  const b = d1[0] * d2[0] + d1[1] * d2[1] + d1[2] * d2[2];
  const denom = a * e - b * b;
  let s = denom > 1e-12 * a * e ? Math.min(1, Math.max(0, (b * f - cc * e) / denom)) : 0;
  let t = (b * s + f) / e;
  if (t < 0) {
    t = 0;
    s = Math.min(1, Math.max(0, -cc / a));
  } else if (t > 1) {
    t = 1;
    s = Math.min(1, Math.max(0, (b - cc) / a));
  }
  const cp: Vec3 = [p0[0] + d1[0] * s, p0[1] + d1[1] * s, p0[2] + d1[2] * s];
  const cq: Vec3 = [q0[0] + d2[0] * t, q0[1] + d2[1] * t, q0[2] + d2[2] * t];
  return { d: dist(cp, cq), s, t };
}

function resolveMaterial(m: AntennaModel['wires'][number]['material']): ConductorMaterial | null {
  if (m === undefined) return MATERIALS.copper;
  if (m === 'perfect') return null;
  if (typeof m === 'string') return MATERIALS[m];
  return m;
}

/** Positions on each wire that must fall on a node (feeds and loads). */
function specialPositions(model: AntennaModel): Map<number, number[]> {
  const out = new Map<number, number[]>();
  const add = (w: number, p: number) => {
    const list = out.get(w) ?? [];
    list.push(p);
    out.set(w, list);
  };
  model.feeds.forEach((f) => add(f.wire, f.position));
  (model.loads ?? []).forEach((l) => add(l.wire, l.position));
  return out;
}

/** Smallest count ≥ n0 (up to 1.5·n0 + 2) that puts every special position nearest to a node. */
function alignSegments(n0: number, positions: number[]): number {
  if (positions.length === 0) return n0;
  const interior = positions.some((p) => p > 0 && p < 1);
  let best = Math.max(n0, interior ? 2 : 1);
  let bestErr = Infinity;
  const nMax = Math.ceil(1.5 * n0) + 2;
  for (let n = Math.max(n0, interior ? 2 : 1); n <= nMax; n++) {
    let err = 0;
    for (const p of positions) {
      const k = Math.round(p * n);
      let e = Math.abs(p * n - k) / n;
      if (p > 0 && p < 1 && (k === 0 || k === n)) e = 1; // must land on an interior node
      err = Math.max(err, e);
    }
    if (err < bestErr - 1e-12) {
      bestErr = err;
      best = n;
      if (err < 1e-9) break;
    }
  }
  return best;
}

/**
 * Rows of basis terms packed end to end (compressed rows): the terms of row r are entries
 * start[r] … start[r + 1] − 1 of `basis` and of one array per named field in `values`.
 */
function packTerms<K extends string, T extends { basis: number } & Record<K, number>>(
  rows: readonly (readonly T[])[],
  fields: readonly K[],
): { start: Int32Array; basis: Int32Array; values: Float64Array[] } {
  const start = new Int32Array(rows.length + 1);
  for (let r = 0; r < rows.length; r++) start[r + 1] = start[r] + rows[r].length;
  const basis = new Int32Array(start[rows.length]);
  const values = fields.map(() => new Float64Array(start[rows.length]));
  rows.forEach((row, r) =>
    row.forEach((t, j) => {
      basis[start[r] + j] = t.basis;
      fields.forEach((f, k) => (values[k][start[r] + j] = t[f]));
    }),
  );
  return { start, basis, values };
}

/** Build the mesh of a model. Throws ModelError when the model cannot be built. */
export function buildMesh(model: AntennaModel, opts: MeshOptions): Mesh {
  const diagnostics: Diagnostic[] = [];
  const hasGround = model.ground.kind !== 'free-space';
  const nWires = model.wires.length;
  if (nWires === 0) throw new ModelError('wires', 'the antenna has no wires');
  if (!(opts.maxFreqHz > 0)) throw new ModelError('frequenciesMHz', 'no positive frequency');
  const lambda = SPEED_OF_LIGHT_M_PER_S / opts.maxFreqHz;
  const spw = opts.segmentsPerWavelength ?? DEFAULT_SEGMENTS_PER_WAVELENGTH;
  const special = specialPositions(model);

  // Validate wires and clamp tiny negative heights.
  const ends: Vec3[][] = [];
  model.wires.forEach((w, i) => {
    const pts: Vec3[] = [w.from, w.to];
    pts.forEach((p, e) => {
      if (!p.every(Number.isFinite))
        throw new ModelError(`wires[${i}].${e ? 'to' : 'from'}`, 'coordinates must be finite numbers');
    });
    if (!(w.radiusM > 0) || !Number.isFinite(w.radiusM))
      throw new ModelError(`wires[${i}].radiusM`, 'radius must be positive');
    const fixed = pts.map((p, e): Vec3 => {
      if (hasGround && p[2] < 0) {
        const tol = Math.max(GROUND_CONTACT_TOLERANCE_M, w.radiusM);
        if (p[2] < -tol)
          throw new ModelError(
            `wires[${i}].${e ? 'to' : 'from'}[2]`,
            `the wire goes ${(-p[2]).toFixed(3)} m below the ground; buried conductors are described as radials, not wires`,
          );
        diagnostics.push({
          level: 'warning',
          code: 'wire-below-ground',
          message: `wire ${i} ends ${(-p[2] * 1000).toFixed(2)} mm below the ground; moved up to the ground`,
          field: `wires[${i}].${e ? 'to' : 'from'}[2]`,
        });
        return [p[0], p[1], 0];
      }
      return p;
    });
    if (dist(fixed[0], fixed[1]) < 1e-6) throw new ModelError(`wires[${i}]`, 'the wire has zero length');
    ends.push(fixed);
  });

  // Segment counts.
  const counts: number[] = model.wires.map((w, i) => {
    const L = dist(ends[i][0], ends[i][1]);
    if (w.segments !== undefined) {
      if (!Number.isInteger(w.segments) || w.segments < 1)
        throw new ModelError(`wires[${i}].segments`, 'must be a positive integer');
      return w.segments;
    }
    let n0 = Math.max(1, Math.ceil((L * spw) / lambda));
    const maxByRadius = Math.max(1, Math.floor(L / (DEFAULT_MIN_SEGMENT_RADII * w.radiusM)));
    if (n0 > maxByRadius) {
      n0 = maxByRadius;
      diagnostics.push({
        level: 'warning',
        code: 'wire-thick',
        message: `wire ${i} is thick for its length: segmentation limited to ${n0} segments (each at least ${DEFAULT_MIN_SEGMENT_RADII} radii long)`,
        field: `wires[${i}].radiusM`,
      });
    }
    return alignSegments(n0, special.get(i) ?? []);
  });

  // Segment and node arrays.
  const wireSegStart = new Int32Array(nWires + 1);
  const wireNodeStart = new Int32Array(nWires + 1);
  for (let i = 0; i < nWires; i++) {
    wireSegStart[i + 1] = wireSegStart[i] + counts[i];
    wireNodeStart[i + 1] = wireNodeStart[i] + counts[i] + 1;
  }
  const nSeg = wireSegStart[nWires];
  const nNodes = wireNodeStart[nWires];
  const sx = new Float64Array(nSeg);
  const sy = new Float64Array(nSeg);
  const sz = new Float64Array(nSeg);
  const tx = new Float64Array(nSeg);
  const ty = new Float64Array(nSeg);
  const tz = new Float64Array(nSeg);
  const len = new Float64Array(nSeg);
  const radius = new Float64Array(nSeg);
  const segWire = new Int32Array(nSeg);
  for (let i = 0; i < nWires; i++) {
    const [a, b] = ends[i];
    const L = dist(a, b);
    const n = counts[i];
    const d = sub(b, a);
    for (let k = 0; k < n; k++) {
      const s = wireSegStart[i] + k;
      sx[s] = a[0] + (d[0] * k) / n;
      sy[s] = a[1] + (d[1] * k) / n;
      sz[s] = a[2] + (d[2] * k) / n;
      tx[s] = d[0] / L;
      ty[s] = d[1] / L;
      tz[s] = d[2] / L;
      len[s] = L / n;
      radius[s] = model.wires[i].radiusM;
      segWire[s] = i;
    }
    const dl = L / n;
    if (dl > MAX_SEGMENT_WAVELENGTHS * lambda)
      diagnostics.push({
        level: 'warning',
        code: 'segment-long',
        message: `wire ${i}: segments are ${(dl / lambda).toFixed(3)} λ long (more than ${MAX_SEGMENT_WAVELENGTHS} λ); results are coarse`,
        field: `wires[${i}].segments`,
      });
    if (dl < model.wires[i].radiusM)
      throw new ModelError(
        `wires[${i}].radiusM`,
        `the radius ${model.wires[i].radiusM} m is larger than the segment length ${dl.toPrecision(3)} m; ` +
          'use fewer segments or a thinner wire (the thin-wire model needs segments longer than the radius)',
      );
    if (dl < MIN_SEGMENT_RADII * model.wires[i].radiusM)
      diagnostics.push({
        level: 'warning',
        code: 'segment-short',
        message: `wire ${i}: segments are only ${(dl / model.wires[i].radiusM).toFixed(2)} radii long; the thin-wire kernel needs segments longer than ${MIN_SEGMENT_RADII} radii`,
        field: `wires[${i}].segments`,
      });
    if (model.wires[i].radiusM > 0.01 * lambda)
      diagnostics.push({
        level: 'warning',
        code: 'radius-large',
        message: `wire ${i}: radius ${(model.wires[i].radiusM / lambda).toExponential(2)} λ is beyond the thin-wire range (< 0.01 λ)`,
        field: `wires[${i}].radiusM`,
      });
  }

  // Node terms: lists per node, then CSR.
  const terms: { basis: number; coef: number }[][] = Array.from({ length: nNodes }, () => []);
  let nBasis = 0;
  for (let i = 0; i < nWires; i++) {
    for (let k = 1; k < counts[i]; k++) terms[wireNodeStart[i] + k].push({ basis: nBasis++, coef: 1 });
  }
  // Cluster wire ends.
  interface EndInfo {
    ref: WireEndRef;
    p: Vec3;
    node: number;
    inflow: number;
  }
  const allEnds: EndInfo[] = [];
  for (let i = 0; i < nWires; i++) {
    allEnds.push({ ref: { wire: i, end: 0 }, p: ends[i][0], node: wireNodeStart[i], inflow: -1 });
    allEnds.push({ ref: { wire: i, end: 1 }, p: ends[i][1], node: wireNodeStart[i + 1] - 1, inflow: 1 });
  }
  const clusterOf = new Int32Array(allEnds.length).fill(-1);
  const clusters: EndInfo[][] = [];
  allEnds.forEach((e, idx) => {
    if (clusterOf[idx] >= 0) return;
    const cl = [e];
    clusterOf[idx] = clusters.length;
    for (let j = idx + 1; j < allEnds.length; j++) {
      if (clusterOf[j] < 0 && dist(allEnds[j].p, e.p) <= JUNCTION_TOLERANCE_M) {
        clusterOf[j] = clusters.length;
        cl.push(allEnds[j]);
      }
    }
    clusters.push(cl);
  });
  const groundContacts: GroundContact[] = [];
  clusters.forEach((cl) => {
    const p = cl[0].p;
    const wireR = Math.max(...cl.map((e) => model.wires[e.ref.wire].radiusM));
    const onGround = hasGround && p[2] <= Math.max(GROUND_CONTACT_TOLERANCE_M, wireR);
    if (onGround) {
      const contact: GroundContact = { x: p[0], y: p[1], ends: [], basis: [] };
      for (const e of cl) {
        const b = nBasis++;
        terms[e.node].push({ basis: b, coef: -e.inflow });
        contact.ends.push(e.ref);
        contact.basis.push(b);
      }
      groundContacts.push(contact);
      return;
    }
    if (cl.length < 2) return;
    const r = cl[0];
    for (let j = 1; j < cl.length; j++) {
      const b = nBasis++;
      terms[r.node].push({ basis: b, coef: r.inflow });
      terms[cl[j].node].push({ basis: b, coef: -cl[j].inflow });
    }
  });
  if (nBasis === 0)
    throw new ModelError('wires', 'the wires carry no current: every wire has free ends and one segment');

  const {
    start: nodeTermStart,
    basis: nodeTermBasis,
    values: [nodeTermCoef],
  } = packTerms(terms, ['coef']);

  // Pieces per segment from the node terms of its two nodes.
  const pieces: { basis: number; a: number; b: number }[][] = Array.from({ length: nSeg }, () => []);
  for (let i = 0; i < nWires; i++) {
    for (let k = 0; k < counts[i]; k++) {
      const s = wireSegStart[i] + k;
      const n0 = wireNodeStart[i] + k;
      const vals = new Map<number, [number, number]>();
      for (let t = nodeTermStart[n0]; t < nodeTermStart[n0 + 1]; t++)
        vals.set(nodeTermBasis[t], [nodeTermCoef[t], 0]);
      for (let t = nodeTermStart[n0 + 1]; t < nodeTermStart[n0 + 2]; t++) {
        const v = vals.get(nodeTermBasis[t]) ?? [0, 0];
        v[1] = nodeTermCoef[t];
        vals.set(nodeTermBasis[t], v);
      }
      for (const [basis, [v0, v1]] of vals) pieces[s].push({ basis, a: v0, b: v1 - v0 });
    }
  }
  const {
    start: segPieceStart,
    basis: pieceBasis,
    values: [pieceA, pieceB],
  } = packTerms(pieces, ['a', 'b']);

  geometryDiagnostics(
    model,
    ends,
    counts,
    clusters.map((cl) => cl.map((e) => e.ref)),
    lambda,
    hasGround,
    diagnostics,
  );

  return {
    nSeg,
    nBasis,
    nWires,
    nNodes,
    sx,
    sy,
    sz,
    tx,
    ty,
    tz,
    len,
    radius,
    segWire,
    wireSegStart,
    wireNodeStart,
    nodeTermStart,
    nodeTermBasis,
    nodeTermCoef,
    segPieceStart,
    pieceBasis,
    pieceA,
    pieceB,
    wireMaterial: model.wires.map((w) => resolveMaterial(w.material)),
    groundContacts,
    diagnostics,
    wavelengthM: lambda,
  };
}

function geometryDiagnostics(
  model: AntennaModel,
  ends: Vec3[][],
  counts: number[],
  clusters: WireEndRef[][],
  lambda: number,
  hasGround: boolean,
  out: Diagnostic[],
): void {
  const nWires = ends.length;
  const joined = (i: number, j: number): boolean =>
    clusters.some((cl) => cl.some((e) => e.wire === i) && cl.some((e) => e.wire === j));
  // Ends that nearly meet, and ends that touch another wire between its ends.
  for (let i = 0; i < nWires; i++) {
    for (let e = 0; e < 2; e++) {
      const p = ends[i][e];
      for (let j = 0; j < nWires; j++) {
        if (j === i) continue;
        const r = model.wires[i].radiusM + model.wires[j].radiusM;
        for (let f = 0; f < 2; f++) {
          const d = dist(p, ends[j][f]);
          if (d > JUNCTION_TOLERANCE_M && d < 10 * r && j > i)
            out.push({
              level: 'warning',
              code: 'ends-nearly-meet',
              message: `wire ${i} and wire ${j} have ends ${(d * 1000).toFixed(2)} mm apart: not joined (they join only within ${JUNCTION_TOLERANCE_M * 1000} mm)`,
              field: `wires[${i}]`,
            });
        }
        const sd = segmentDistance(ends[j][0], ends[j][1], p, p);
        if (sd.d <= r && sd.s > 1e-6 && sd.s < 1 - 1e-6)
          out.push({
            level: 'warning',
            code: 'end-on-wire',
            message: `wire ${i} ends on wire ${j} between its ends, but wires join only at their ends: split wire ${j} there`,
            field: `wires[${i}]`,
          });
      }
    }
  }
  // Crossing, touching, overlapping and closely spaced wires.
  for (let i = 0; i < nWires; i++) {
    for (let j = i + 1; j < nWires; j++) {
      const overlapM = collinearOverlapM(ends[i], ends[j], model.wires[i].radiusM + model.wires[j].radiusM);
      if (overlapM > 0)
        throw new ModelError(
          `wires[${j}]`,
          `wire ${j} lies along wire ${i} for ${overlapM.toPrecision(3)} m; two conductors cannot occupy the same place (remove one, or join them end to end)`,
        );
      if (joined(i, j)) continue;
      const sd = segmentDistance(ends[i][0], ends[i][1], ends[j][0], ends[j][1]);
      const r = model.wires[i].radiusM + model.wires[j].radiusM;
      const segLen = Math.min(
        dist(ends[i][0], ends[i][1]) / counts[i],
        dist(ends[j][0], ends[j][1]) / counts[j],
      );
      if (sd.d <= r)
        out.push({
          level: 'warning',
          code: 'wires-cross',
          message: `wires ${i} and ${j} cross, touch or overlap without a junction; the result is unreliable`,
          field: `wires[${j}]`,
        });
      else if (sd.d < 0.25 * segLen)
        out.push({
          level: 'info',
          code: 'wires-close',
          message: `wires ${i} and ${j} come within ${sd.d.toFixed(3)} m, under a quarter of a segment; accuracy drops there`,
          field: `wires[${j}]`,
        });
    }
  }
  if (!hasGround) return;
  const soil = model.ground.kind === 'soil';
  for (let i = 0; i < nWires; i++) {
    const [a, b] = ends[i];
    const L = dist(a, b);
    const tzAbs = Math.abs(b[2] - a[2]) / L;
    const zMax = Math.max(a[2], b[2]);
    const zMin = Math.min(a[2], b[2]);
    const rad = model.wires[i].radiusM;
    const touches = zMin <= Math.max(GROUND_CONTACT_TOLERANCE_M, rad);
    if (!touches && zMin < 4 * rad)
      out.push({
        level: 'warning',
        code: 'segment-near-ground',
        message: `wire ${i} comes within ${(zMin * 1000).toFixed(1)} mm of the ground (under 4 radii) without touching it; the image kernel is inaccurate there`,
        field: `wires[${i}]`,
      });
    if (soil && tzAbs < 0.5 && zMax < LOW_WIRE_WAVELENGTHS * lambda)
      out.push({
        level: 'warning',
        code: 'low-horizontal-wire',
        message: `wire ${i} runs horizontally at ${(zMax / lambda).toFixed(3)} λ (under ${LOW_WIRE_WAVELENGTHS} λ) over lossy ground: the reflection-coefficient ground model is known to misjudge ground loss that low (an exact half-space model is needed)`,
        field: `wires[${i}]`,
      });
    else if (soil && !touches && zMin < 0.025 * lambda)
      out.push({
        level: 'info',
        code: 'segment-near-lossy-ground',
        message: `wire ${i} comes within ${(zMin / lambda).toFixed(3)} λ of lossy ground; the reflection-coefficient model is rough that close`,
        field: `wires[${i}]`,
      });
  }
}

/** Value vector of the basis functions at a node: (basis, coef) pairs. */
export function nodeTerms(mesh: Mesh, node: number): { basis: number; coef: number }[] {
  const out: { basis: number; coef: number }[] = [];
  for (let t = mesh.nodeTermStart[node]; t < mesh.nodeTermStart[node + 1]; t++)
    out.push({ basis: mesh.nodeTermBasis[t], coef: mesh.nodeTermCoef[t] });
  return out;
}

/** The node nearest to a position (0…1) along a wire, and the position it stands for. */
export function nodeAt(
  mesh: Mesh,
  wire: number,
  position: number,
): { node: number; index: number; position: number } {
  const n = mesh.wireSegStart[wire + 1] - mesh.wireSegStart[wire];
  const index = Math.round(position * n);
  return { node: mesh.wireNodeStart[wire] + index, index, position: index / n };
}
