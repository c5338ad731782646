/**
 * A stable 64-bit FNV-1a hash of a string, as 16 hex digits (pure, no platform crypto). Each
 * UTF-16 code unit is fed as its low byte, then its high byte when non-zero. Checked against the
 * published FNV-1a 64 test vectors for ASCII input (L. C. Noll, FNV hash reference).
 */
export function fnv1a64(text: string): string {
  // The 64-bit state in four 16-bit limbs, little end first; offset basis 0xcbf29ce484222325.
  const h = [0x2325, 0x8422, 0x9ce4, 0xcbf2];
  const step = (byte: number): void => {
    h[0] ^= byte;
    // h *= 0x100000001b3 = h·0x1b3 + (h << 40); the shift touches limbs 2 and 3 only.
    const t0 = h[0] * 0x1b3;
    const t1 = h[1] * 0x1b3 + (t0 >>> 16);
    const t2 = h[2] * 0x1b3 + (h[0] << 8) + (t1 >>> 16);
    const t3 = h[3] * 0x1b3 + (h[1] << 8) + (t2 >>> 16);
    h[0] = t0 & 0xffff;
    h[1] = t1 & 0xffff;
    h[2] = t2 & 0xffff;
    h[3] = t3 & 0xffff;
  };
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    step(c & 0xff);
    if (c > 0xff) step(c >>> 8);
  }
  const hex = (v: number): string => v.toString(16).padStart(4, '0');
  return hex(h[3]) + hex(h[2]) + hex(h[1]) + hex(h[0]);
}
