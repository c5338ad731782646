/**
 * What the store keeps of an aerial image that is referenced rather than embedded: which file it
 * was (name, size, modification time, so the same file can be recognised when the user opens it
 * again) and how it lies on the earth (its coordinate system and affine georeference, as
 * core/project/crs.ts and renderer/src/lib/aerial.ts use them). The image itself stays in the
 * user's file, which must stay where it is; the project holds no copy unless the user embeds one.
 */
import { z } from 'zod';

const finite = z.number().finite();

export const ImageCrsSchema = z
  .object({
    definition: z.string().min(1).max(2000),
    label: z.string().max(200),
    scaleX: finite.positive(),
    scaleY: finite.positive(),
    geographic: z.boolean(),
    unitM: finite.positive(),
    epsg: z.number().int().positive().nullable(),
  })
  .strict();

export const AerialReferenceSchema = z
  .object({
    fileName: z.string().min(1).max(260),
    sizeBytes: z.number().int().nonnegative(),
    modifiedMs: finite.nonnegative(),
    widthPx: z.number().int().positive(),
    heightPx: z.number().int().positive(),
    crs: ImageCrsSchema,
    transform: z.tuple([finite, finite, finite, finite, finite, finite]),
  })
  .strict();

export type AerialReference = z.infer<typeof AerialReferenceSchema>;

/** True when `file` looks like the one the reference was made from (same name and size). */
export function sameFile(ref: AerialReference, file: { name: string; size: number }): boolean {
  return ref.fileName === file.name && ref.sizeBytes === file.size;
}
