/** Place search: the gazetteer's towns with the time zone of each answer derived from its coordinates. */
import type { Place } from '../../contracts/places';
import { gazetteer } from './gazetteer';
import { zoneAt } from './zone';

export function searchPlaces(q: string, limit: number): Place[] {
  return gazetteer()
    .search(q, limit)
    .map((p) => ({ ...p, timeZone: p.timeZone ?? zoneAt(p.lat, p.lon) }));
}
