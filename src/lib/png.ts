const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** PNG signature followed by an IHDR chunk (PNG spec, ISO/IEC 15948 §5.2, §11.2.2). */
export function isPng(b: Uint8Array): boolean {
  if (b.length < 33) return false;
  if (!PNG_SIGNATURE.every((x, i) => b[i] === x)) return false;
  const ihdrLen = (b[8]! << 24) | (b[9]! << 16) | (b[10]! << 8) | b[11]!;
  return ihdrLen === 13 && String.fromCharCode(b[12]!, b[13]!, b[14]!, b[15]!) === 'IHDR';
}

/** Largest thumbnail side accepted (pixels), and the largest decoded image (bytes of raw scanlines). */
export const PNG_MAX_SIDE = 2048;
export const PNG_MAX_DECODED_BYTES = PNG_MAX_SIDE * PNG_MAX_SIDE * 4 + PNG_MAX_SIDE;

export interface PngHeader {
  width: number;
  height: number;
  bitDepth: number;
  colorType: number;
  interlace: number;
}

/** Samples per pixel by colour type (PNG spec §11.2.2, Table 11.1); undefined for an invalid type. */
const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };
const DEPTHS: Record<number, number[]> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] };

/** The IHDR fields of a PNG (null when the signature or header is not a PNG's, or a field is invalid). */
export function readPngHeader(b: Uint8Array): PngHeader | null {
  if (!isPng(b)) return null;
  const u32 = (o: number) => ((b[o]! << 24) >>> 0) + (b[o + 1]! << 16) + (b[o + 2]! << 8) + b[o + 3]!;
  const h: PngHeader = { width: u32(16), height: u32(20), bitDepth: b[24]!, colorType: b[25]!, interlace: b[28]! };
  if (!DEPTHS[h.colorType]?.includes(h.bitDepth) || b[26] !== 0 || b[27] !== 0 || h.interlace > 1) return null;
  return h;
}

/**
 * Bytes of the decoded, filtered scanlines a header announces (a filter byte per row; Adam7 passes
 * counted separately) — what an inflated IDAT stream must hold exactly.
 */
export function pngRawBytes(h: PngHeader): number {
  const bpp = CHANNELS[h.colorType]! * h.bitDepth;
  const rowBytes = (w: number) => (w === 0 ? 0 : 1 + Math.ceil((w * bpp) / 8));
  if (h.interlace === 0) return h.height * rowBytes(h.width);
  // Adam7: 7 passes, each a sub-image (PNG spec §8.2).
  const passes = [[0, 0, 8, 8], [4, 0, 8, 8], [0, 4, 4, 8], [2, 0, 4, 4], [0, 2, 2, 4], [1, 0, 2, 2], [0, 1, 1, 2]] as const;
  let total = 0;
  for (const [x0, y0, dx, dy] of passes) {
    const w = Math.ceil((h.width - x0) / dx), hh = Math.ceil((h.height - y0) / dy);
    if (w > 0 && hh > 0) total += hh * rowBytes(w);
  }
  return total;
}
