/**
 * Clock helpers for the time bar: wall time in an IANA zone ↔ UTC, step sizes. Pure (Intl only).
 */

/** Mean sidereal day, 23h56m04.0905s of clock time (domain facts; common practice). */
export const SIDEREAL_DAY_MS = 86_164_090.5;
/** Sidereal hours per clock hour: 24 h / 23h56m04.0905s = 1.0027379 (common practice). */
export const SIDEREAL_PER_SOLAR = 86_400_000 / SIDEREAL_DAY_MS;

export const STEPS = [
  { id: 'min', label: '1 min', ms: 60_000 },
  { id: 'hour', label: '1 h', ms: 3_600_000 },
  { id: 'day', label: '1 day', ms: 86_400_000 },
  { id: 'sday', label: '1 sidereal day', ms: SIDEREAL_DAY_MS },
] as const;

export const RATES = [1, 10, 60, 300, 900, 3600] as const;

const fmtCache = new Map<string, Intl.DateTimeFormat>();
function partsFormatter(timeZone: string): Intl.DateTimeFormat {
  let f = fmtCache.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    fmtCache.set(timeZone, f);
  }
  return f;
}

export interface WallParts {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

export function wallParts(ms: number, timeZone: string): WallParts {
  const p: Record<string, number> = {};
  for (const x of partsFormatter(timeZone).formatToParts(new Date(ms))) if (x.type !== 'literal') p[x.type] = Number(x.value);
  return { year: p.year, month: p.month, day: p.day, hour: p.hour === 24 ? 0 : p.hour, minute: p.minute, second: p.second };
}

/** Offset of the zone from UTC at instant `ms`, in minutes (east positive). */
export function zoneOffsetMinutes(ms: number, timeZone: string): number {
  const w = wallParts(ms, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return Math.round((asUtc - Math.floor(ms / 1000) * 1000) / 60_000);
}

/** UTC instant of a wall-clock time in `timeZone` (the earlier one in a repeated hour). */
export function wallTimeToUtc(w: WallParts, timeZone: string): number {
  const naive = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  let guess = naive - zoneOffsetMinutes(naive, timeZone) * 60_000;
  guess = naive - zoneOffsetMinutes(guess, timeZone) * 60_000;
  return guess;
}

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** "2026-03-20 19:30:00" in the zone. */
export function formatWall(ms: number, timeZone: string): string {
  const w = wallParts(ms, timeZone);
  return `${w.year}-${pad(w.month)}-${pad(w.day)} ${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}`;
}

/** Value for <input type="datetime-local"> in the zone. */
export function toLocalInputValue(ms: number, timeZone: string): string {
  const w = wallParts(ms, timeZone);
  return `${w.year}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

export function fromLocalInputValue(v: string, timeZone: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(v);
  if (!m) return null;
  return wallTimeToUtc({ year: +m[1], month: +m[2], day: +m[3], hour: +m[4], minute: +m[5], second: +(m[6] ?? 0) }, timeZone);
}

export function formatOffset(ms: number, timeZone: string): string {
  const off = zoneOffsetMinutes(ms, timeZone);
  const s = off < 0 ? '−' : '+';
  const a = Math.abs(off);
  return `UTC${s}${pad(Math.floor(a / 60))}:${pad(a % 60)}`;
}

export function formatUtc(ms: number): string {
  return new Date(ms).toISOString().replace('T', ' ').slice(0, 19);
}

export function isoUtc(ms: number): string {
  return new Date(Math.round(ms / 1000) * 1000).toISOString().replace('.000Z', 'Z');
}
