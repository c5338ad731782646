/**
 * Input types of the field solver, in SI and in the site frame (x east, y north, z up, ground
 * z = 0). The JSON input (core/em/input.ts) converts to these.
 */
import type { ConductorMaterial, MaterialName } from './conductor.ts';
import type { NetworkSpec } from './network.ts';

export type Vec3 = readonly [number, number, number];
/** A complex number as [re, im] in an input or output document. */
export type ComplexPair = readonly [number, number];

export interface WireSpec {
  from: Vec3;
  to: Vec3;
  radiusM: number;
  /** Number of segments; chosen from the frequency when absent. */
  segments?: number;
  /** Conductor; 'perfect' for a lossless wire. Default 'copper'. */
  material?: MaterialName | ConductorMaterial;
}

export interface FeedSpec {
  wire: number;
  /** Place along the wire, 0 at `from`, 1 at `to`; moved to the nearest segment end. */
  position: number;
  /** Source voltage [re, im] in volts; default [1, 0]. */
  voltage?: ComplexPair;
}

export type LoadSpec =
  | { wire: number; position: number; kind: 'impedance'; rOhm: number; xOhm: number }
  | { wire: number; position: number; kind: 'series-rlc'; rOhm?: number; lH?: number; cF?: number }
  | { wire: number; position: number; kind: 'parallel-rlc'; rOhm?: number; lH?: number; cF?: number };

export interface RadialSpec {
  /** The wire whose end touches the ground at the centre of the radial system. */
  wire: number;
  count: number;
  /** One length for every radial, or one per radial (clipped by a lot boundary). */
  lengthsM: readonly number[];
  radiusM: number;
}

export type GroundSpec =
  | { kind: 'free-space' }
  | { kind: 'perfect' }
  | { kind: 'soil'; permittivity: number; conductivitySPerM: number; label?: string };

export interface AntennaModel {
  wires: readonly WireSpec[];
  feeds: readonly FeedSpec[];
  loads?: readonly LoadSpec[];
  radials?: readonly RadialSpec[];
  ground: GroundSpec;
  /**
   * A feed network (lines, transformers, hybrids, relays; core/em/network.ts) between the feeds
   * and its own sources. With a network every feed is one of its ports and takes no voltage.
   */
  network?: NetworkSpec;
  /**
   * Several ground connections with radials: their radial fields meet and are bonded along the
   * lines halfway between, and the ground loss is integrated once over the union with the total
   * field (core/em/bondedRadials.ts). Default false: each connection's own disk.
   */
  radialsBonded?: boolean;
}
