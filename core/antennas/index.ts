export * from './types.ts';
export { BUILDERS, builderFor } from './registry.ts';
export { bandPlan, DESIGN_FREQ_HZ, placeElements, CUT_ALLOWANCE_PER_END_M, WIRE_RADIUS_M } from './common.ts';
