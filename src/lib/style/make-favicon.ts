/**
 * `npm run favicon`: writes public/favicon.svg and public/favicon.ico (PNG images of 16, 32 and 48 px in
 * one ICO container: 6-byte ICONDIR, a 16-byte ICONDIRENTRY per image, then the PNGs; PNG-in-ICO is
 * read by every browser since 2008) from faviconSvg(). Run after changing the icon or the palette.
 */
import { writeFileSync } from 'node:fs';
import { Resvg } from '@resvg/resvg-js';
import { faviconSvg } from './favicon';

const svg = faviconSvg();
const sizes = [16, 32, 48];
const pngs = sizes.map((px) => new Resvg(svg, { fitTo: { mode: 'width', value: px }, font: { loadSystemFonts: false } }).render().asPng());
const head = Buffer.alloc(6 + 16 * sizes.length);
head.writeUInt16LE(0, 0); // reserved
head.writeUInt16LE(1, 2); // 1 = icon
head.writeUInt16LE(sizes.length, 4);
let offset = head.length;
sizes.forEach((px, i) => {
  const e = 6 + 16 * i;
  head.writeUInt8(px, e); // width (0 would mean 256)
  head.writeUInt8(px, e + 1); // height
  head.writeUInt8(0, e + 2); // no palette
  head.writeUInt8(0, e + 3); // reserved
  head.writeUInt16LE(1, e + 4); // colour planes
  head.writeUInt16LE(32, e + 6); // bits per pixel
  head.writeUInt32LE(pngs[i]!.length, e + 8);
  head.writeUInt32LE(offset, e + 12);
  offset += pngs[i]!.length;
});
writeFileSync('public/favicon.ico', Buffer.concat([head, ...pngs.map((p) => Buffer.from(p))]));
writeFileSync('public/favicon.svg', svg + '\n');
console.log(`favicon.ico ${offset} bytes (${sizes.join(', ')} px), favicon.svg ${svg.length} bytes`);
