/** The repository's root, with a trailing separator. */
export const ROOT: string;
/**
 * The bundle of `entry` (a path from the root) as `dir/name.mjs`, built with esbuild when missing
 * or when an input changed; null when esbuild is not available.
 */
export function freshBundle(entry: string, dir: string, name: string): string | null;
