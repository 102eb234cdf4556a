/**
 * Coordinates → IANA time zone with `geo-tz` (exact point-in-polygon on the timezone-boundary-builder
 * shapes). geo-tz reads the shapes of one quadtree cell from disk on first use and keeps them; left alone
 * its cache grows to ~450 MB once the whole world has been asked about, so it is given a store bounded
 * by an estimate of the bytes each cell costs (lru-cache). Figures: README.md in this folder.
 */
import { createRequire } from 'node:module';
import { LRUCache } from 'lru-cache';

interface GeoTz {
  find(lat: number, lon: number): string[];
  setCache(opts: { store?: unknown; preload?: boolean }): void;
}

/** Heap held by the zone shapes kept between lookups. */
export const ZONE_CACHE_BYTES = 48 * 1024 * 1024;
/** Rough heap cost of one decoded coordinate pair (a two-element array of doubles) in V8. */
const BYTES_PER_POINT = 72;

function countPoints(v: unknown): number {
  if (!Array.isArray(v)) {
    if (v && typeof v === 'object') {
      let n = 0;
      for (const x of Object.values(v)) n += countPoints(x);
      return n;
    }
    return 0;
  }
  if (v.length > 0 && typeof v[0] === 'number') return 1;
  let n = 0;
  for (const x of v) n += countPoints(x);
  return n;
}

let tz: GeoTz | null = null;
let cache: LRUCache<string, object> | null = null;

function geoTz(): GeoTz {
  if (tz) return tz;
  const t = createRequire(import.meta.url)('geo-tz') as GeoTz;
  cache = new LRUCache<string, object>({
    maxSize: ZONE_CACHE_BYTES,
    sizeCalculation: (value) => Math.max(1, countPoints((value as { features?: unknown }).features) * BYTES_PER_POINT),
  });
  t.setCache({ store: cache });
  tz = t;
  return t;
}

/**
 * The zone at a point. On a border or in a disputed area geo-tz answers several; the first is taken.
 * At sea it answers the nautical zone (`Etc/GMT+5`, …), which is what a ship keeps.
 */
export function zoneAt(lat: number, lon: number): string {
  const found = geoTz().find(lat, lon);
  return found[0] ?? 'UTC';
}

/** Estimated bytes held by the shape cache (for the benchmark). */
export const zoneCacheBytes = () => cache?.calculatedSize ?? 0;
