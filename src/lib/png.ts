const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** PNG signature followed by an IHDR chunk (PNG spec, ISO/IEC 15948 §5.2, §11.2.2). */
export function isPng(b: Uint8Array): boolean {
  if (b.length < 33) return false;
  if (!PNG_SIGNATURE.every((x, i) => b[i] === x)) return false;
  const ihdrLen = (b[8]! << 24) | (b[9]! << 16) | (b[10]! << 8) | b[11]!;
  return ihdrLen === 13 && String.fromCharCode(b[12]!, b[13]!, b[14]!, b[15]!) === 'IHDR';
}
