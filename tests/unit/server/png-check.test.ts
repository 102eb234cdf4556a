/**
 * Thumbnail PNG bounds (issue 17 finding 5). Images are made with node:zlib following the PNG
 * specification (ISO/IEC 15948: signature §5.2, IHDR §11.2.2, filtered scanlines §7.3, Adam7 §8.2);
 * CRCs via zlib's crc32 polynomial are not checked by the reader, so they are written as zero.
 */
import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { checkPng } from '../../../src/lib/server/png-check';
import { pngRawBytes, readPngHeader } from '../../../src/lib/png';

function chunk(type: string, data: Uint8Array): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  return Buffer.concat([len, Buffer.from(type, 'latin1'), Buffer.from(data), Buffer.alloc(4)]);
}
function png(width: number, height: number, raw: Uint8Array, { colorType = 6, bitDepth = 8, interlace = 0 } = {}): Uint8Array {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = bitDepth;
  ihdr[9] = colorType;
  ihdr[12] = interlace;
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', new Uint8Array())]);
}

describe('PNG thumbnail bounds', () => {
  it('accepts a well-formed RGBA image (4×3: 3 rows of 1 filter byte + 16 bytes)', () => {
    const img = png(4, 3, new Uint8Array(3 * (1 + 16)));
    expect(readPngHeader(img)).toMatchObject({ width: 4, height: 3, bitDepth: 8, colorType: 6 });
    expect(checkPng(img)).toEqual({ ok: true, width: 4, height: 3 });
  });
  it('counts Adam7 passes (8×8 grey 8-bit: 7 passes, 1+1+1+2+2+4+4 rows)', () => {
    // pass sizes for 8×8 (PNG spec §8.2): 1×1, 1×1, 2×1, 2×2, 4×2, 4×4, 8×4 → rows·(1 + width)
    const expected = 1 * 2 + 1 * 2 + 1 * 3 + 2 * 3 + 2 * 5 + 4 * 5 + 4 * 9;
    expect(pngRawBytes({ width: 8, height: 8, bitDepth: 8, colorType: 0, interlace: 1 })).toBe(expected);
  });
  it('refuses a declared 20000×20000 image without inflating it', () => {
    const bomb = png(20000, 20000, new Uint8Array(1000));
    const r = checkPng(bomb);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toMatch(/20000×20000.*2048×2048/);
  });
  it('refuses image data that inflates to more (or less) than the header announces', () => {
    expect(checkPng(png(16, 16, new Uint8Array(16 * 65 * 50))).ok).toBe(false);
    expect(checkPng(png(16, 16, new Uint8Array(10))).ok).toBe(false);
  });
  it('refuses a truncated file and an invalid header', () => {
    const ok = png(2, 2, new Uint8Array(2 * 9));
    expect(checkPng(ok.subarray(0, ok.length - 20)).ok).toBe(false);
    expect(checkPng(png(2, 2, new Uint8Array(2 * 9), { colorType: 5 })).ok).toBe(false);
    expect(checkPng(new Uint8Array([1, 2, 3])).ok).toBe(false);
  });
});
