/**
 * A support's metal as the planner models it: material, height, equivalent radius, grounding.
 * Kept apart from conductors.ts (which needs the builder registry) so that the site can use it.
 * Equivalent radius: see the note of conductors.ts.
 */
/** Face width of a lattice tower whose width is not given, metres (common practice, no source). */
export const DEFAULT_FACE_WIDTH_M = 0.3;
/** Diameter of a tubular mast whose diameter is not given, metres (common practice, no source). */
export const DEFAULT_MAST_DIAMETER_M = 0.05;
/** Leg radius of a lattice tower, metres: about 32 mm tube legs (common practice, no source). */
export const LATTICE_LEG_RADIUS_M = 0.016;
/** What the planner knows of a support's metal, from the project. */
export interface SupportMetal {
  material: 'steel' | 'aluminium';
  heightM: number;
  radiusM: number;
  grounded: boolean;
}

/** Equivalent radius of a lattice tower of face width w: ∛(c·w²) (module note), metres. */
export function latticeEquivalentRadiusM(faceWidthM: number, legRadiusM = LATTICE_LEG_RADIUS_M): number {
  return Math.cbrt(legRadiusM * faceWidthM * faceWidthM);
}

/**
 * The conductor of a support, or null when it does not conduct (or its material is unknown).
 * `conducts` is supportConducts() of the project schema.
 */
export function supportMetal(s: {
  kind: string;
  conducts: boolean | null;
  material?: string;
  usableHeightM: number;
  structureHeightM?: number;
  faceWidthM?: number;
  diameterM?: number;
  grounded?: boolean;
}): SupportMetal | null {
  if (s.conducts !== true) return null;
  const radiusM =
    s.kind === 'tower' && s.diameterM === undefined
      ? latticeEquivalentRadiusM(s.faceWidthM ?? DEFAULT_FACE_WIDTH_M)
      : (s.diameterM ?? DEFAULT_MAST_DIAMETER_M) / 2;
  return {
    material: s.material === 'aluminium' ? 'aluminium' : 'steel',
    heightM: s.structureHeightM ?? s.usableHeightM,
    radiusM,
    grounded: s.grounded ?? true,
  };
}
