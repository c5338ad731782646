/**
 * The one error type of the field solver: thrown only when a model cannot be built at all
 * (no wires, a feed on a wire that does not exist, a wire below the ground, …). `field` is
 * the JSON path of the offending input, e.g. `wires[2].radiusM` or `feeds[0].position`.
 */
export class ModelError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(field ? `${field}: ${message}` : message);
    this.name = 'ModelError';
  }
}

/** A diagnostic attached to a result: something the user should know, not a failure. */
export interface Diagnostic {
  level: 'info' | 'warning';
  /** Stable machine-readable code, e.g. 'segment-long', 'low-horizontal-wire'. */
  code: string;
  message: string;
  /** JSON path of the input it refers to, where there is one. */
  field?: string;
}
