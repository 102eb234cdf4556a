/**
 * Checks an uploaded PNG before it is stored and served to every viewer's browser (issue 17 finding 5:
 * a 1.56 MB file declaring 20000×20000 took a dashboard's tab from 1 GB to 3 GB). The declared size must
 * be at most 2048×2048, the chunks must lie inside the file, and the image data must inflate to exactly
 * the bytes its header announces — inflated with a cap, so a bomb stops at the cap. Runs on the compute
 * pool (a 2048² RGBA image inflates 16 MB). Pure apart from node:zlib.
 */
import { inflateSync } from 'node:zlib';
import { PNG_MAX_DECODED_BYTES, PNG_MAX_SIDE, pngRawBytes, readPngHeader } from '../png';

export type PngCheck = { ok: true; width: number; height: number } | { ok: false; message: string };

export function checkPng(bytes: Uint8Array): PngCheck {
  const h = readPngHeader(bytes);
  if (!h) return { ok: false, message: 'The body is not a PNG image (bad signature or header).' };
  if (h.width < 1 || h.height < 1 || h.width > PNG_MAX_SIDE || h.height > PNG_MAX_SIDE) {
    return { ok: false, message: `The image is ${h.width}×${h.height} pixels; a thumbnail may be at most ${PNG_MAX_SIDE}×${PNG_MAX_SIDE}.` };
  }
  const expected = pngRawBytes(h);
  if (expected > PNG_MAX_DECODED_BYTES) return { ok: false, message: 'The image is too large once decoded.' };
  const idat: Uint8Array[] = [];
  let off = 8;
  let ended = false;
  while (off + 12 <= bytes.length) {
    const len = ((bytes[off]! << 24) >>> 0) + (bytes[off + 1]! << 16) + (bytes[off + 2]! << 8) + bytes[off + 3]!;
    const type = String.fromCharCode(bytes[off + 4]!, bytes[off + 5]!, bytes[off + 6]!, bytes[off + 7]!);
    if (off + 12 + len > bytes.length) return { ok: false, message: `The PNG's ${type} chunk runs past the end of the file.` };
    if (type === 'IDAT') idat.push(bytes.subarray(off + 8, off + 8 + len));
    off += 12 + len;
    if (type === 'IEND') {
      ended = true;
      break;
    }
  }
  if (!ended || idat.length === 0) return { ok: false, message: 'The PNG has no image data or no end.' };
  let raw: Buffer;
  try {
    raw = inflateSync(Buffer.concat(idat), { maxOutputLength: expected + 1 });
  } catch {
    return { ok: false, message: 'The PNG image data does not decode (or decodes to more than its header announces).' };
  }
  if (raw.length !== expected) return { ok: false, message: 'The PNG image data does not match its declared size.' };
  return { ok: true, width: h.width, height: h.height };
}
