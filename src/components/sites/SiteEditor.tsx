/**
 * Entering a site, wherever one is entered (new scene, a scene's site, the team's sites): a town from the
 * gazetteer, the browser's location, or typed coordinates. The time zone follows the coordinates
 * (`GET /api/places/zone`) until the user picks one by hand; the height is the user's, with a note on where
 * the value came from. A site at exactly 0°, 0° or without a name asks for confirmation first.
 */
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { siteSchema, type Site } from '../../lib/contracts/scene-doc';
import type { Place } from '../../lib/contracts/places';
import { Button } from '../ui/Button';
import { INPUT, LABEL, Labelled } from '../scenes/controls';
import { PlaceSearch, placeLabel } from './PlaceSearch';
import { useKeepEarlyInput } from '../ui/early-input';

let zonesCache: string[] | null = null;
export function timeZones(): string[] {
  if (zonesCache) return zonesCache;
  try {
    zonesCache = (Intl as unknown as { supportedValuesOf: (k: string) => string[] }).supportedValuesOf('timeZone');
  } catch {
    zonesCache = [];
  }
  if (!zonesCache.includes('UTC')) zonesCache = ['UTC', ...zonesCache];
  return zonesCache;
}

type ZoneState = { mode: 'derived' | 'manual'; status: 'idle' | 'busy' | 'error' };

const fmtCoord = (v: number, pos: string, neg: string) => `${Math.abs(v).toFixed(2)}° ${v >= 0 ? pos : neg}`;

export function SiteEditor({ value, onApply, submitLabel = 'Apply site' }: { value: Site; onApply: (s: Site) => void; submitLabel?: string }) {
  const id = useId();
  const eo = value.earthOrientation;
  const [f, setF] = useState({
    name: value.name, lat: String(value.lat), lon: String(value.lon), height: String(value.height ?? 0), timeZone: value.timeZone ?? 'UTC',
    dut1: eo ? String(eo.dut1) : '', xp: eo ? String(eo.xp) : '', yp: eo ? String(eo.yp) : '', eoDate: eo?.date ?? '', eoSource: eo?.source ?? '',
  });
  const [zone, setZone] = useState<ZoneState>({ mode: 'derived', status: 'idle' });
  const [heightNote, setHeightNote] = useState<string>(value.name ? 'As saved with the site.' : 'Type the height of the site above sea level.');
  const [from, setFrom] = useState<string | null>(null);
  const [err, setErr] = useState<{ field: string; message: string } | null>(null);
  const [confirm, setConfirm] = useState<{ reasons: string[]; site: Site } | null>(null);
  const [locating, setLocating] = useState(false);
  const zones = useMemo(timeZones, []);
  const coordsTouched = useRef(false);
  // Fields filled in before the island hydrated keep their text (ui/early-input.ts).
  const rootRef = useRef<HTMLDivElement>(null);
  useKeepEarlyInput(rootRef, (name, v) => {
    if (name === 'lat' || name === 'lon') {
      setCoords({ [name]: v });
      setFrom('Typed by you');
    } else if (name in f) setF((x) => ({ ...x, [name]: v }));
  });

  // The zone follows the coordinates (debounced) unless the user chose one by hand.
  useEffect(() => {
    if (!coordsTouched.current || zone.mode !== 'derived') return;
    const lat = Number(f.lat);
    const lon = Number(f.lon);
    if (f.lat.trim() === '' || f.lon.trim() === '' || !Number.isFinite(lat) || !Number.isFinite(lon) || Math.abs(lat) > 90 || Math.abs(lon) > 180) return;
    const ctl = new AbortController();
    const t = setTimeout(async () => {
      setZone((z) => ({ ...z, status: 'busy' }));
      try {
        const r = await fetch(`/api/places/zone?lat=${lat}&lon=${lon}`, { signal: ctl.signal, headers: { accept: 'application/json' } });
        if (!r.ok) throw new Error(String(r.status));
        const { timeZone } = (await r.json()) as { timeZone: string };
        setF((x) => ({ ...x, timeZone }));
        setZone((z) => ({ ...z, status: 'idle' }));
      } catch (e) {
        if ((e as Error).name !== 'AbortError') setZone((z) => ({ ...z, status: 'error' }));
      }
    }, 250);
    return () => {
      clearTimeout(t);
      ctl.abort();
    };
  }, [f.lat, f.lon, zone.mode]);

  const setCoords = (patch: Partial<typeof f>) => {
    coordsTouched.current = true;
    setF((x) => ({ ...x, ...patch }));
  };

  const pickPlace = (p: Place) => {
    coordsTouched.current = false; // the answer carries its zone already
    setF((x) => ({ ...x, name: p.name, lat: String(p.lat), lon: String(p.lon), timeZone: p.timeZone, height: p.height !== undefined ? String(p.height) : x.height }));
    setZone({ mode: 'derived', status: 'idle' });
    setFrom(`${p.name}, ${placeLabel(p)} (GeoNames)`);
    setHeightNote(
      p.height !== undefined
        ? `From GeoNames: the height of ${p.name}'s centre, not of your site. Check it.`
        : `GeoNames gives no height for ${p.name}: type your site's height from a map, a survey or a GPS reading.`,
    );
    setErr(null);
  };

  const useMyLocation = () => {
    if (!('geolocation' in navigator)) return setErr({ field: 'lat', message: 'This browser cannot tell its location; type the coordinates.' });
    setLocating(true);
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        setLocating(false);
        const { latitude, longitude, altitude, accuracy, altitudeAccuracy } = pos.coords;
        setCoords({ lat: latitude.toFixed(5), lon: longitude.toFixed(5), ...(altitude !== null ? { height: String(Math.round(altitude)) } : {}) });
        setZone({ mode: 'derived', status: 'idle' });
        setFrom(`Your device's location (±${Math.round(accuracy)} m)`);
        setHeightNote(
          altitude !== null
            ? `From your device's location fix${altitudeAccuracy ? ` (±${Math.round(altitudeAccuracy)} m)` : ''}: check it against a map.`
            : 'Your device gave no height: type it.',
        );
        setErr(null);
      },
      (e) => {
        setLocating(false);
        setErr({ field: 'lat', message: e.code === e.PERMISSION_DENIED ? 'Location permission was refused; search for a town or type the coordinates.' : 'Your location could not be found; type the coordinates.' });
      },
      { enableHighAccuracy: true, timeout: 15000, maximumAge: 60000 },
    );
  };

  const apply = () => {
    // Earth orientation: all five empty → none; otherwise all are checked by the schema.
    const eoGiven = [f.dut1, f.xp, f.yp, f.eoDate, f.eoSource].some((x) => x.trim() !== '');
    const earthOrientation = eoGiven
      ? { dut1: f.dut1.trim() === '' ? NaN : Number(f.dut1), xp: f.xp.trim() === '' ? NaN : Number(f.xp), yp: f.yp.trim() === '' ? NaN : Number(f.yp), date: f.eoDate.trim(), source: f.eoSource.trim() }
      : undefined;
    const notNumber = (v: string) => !Number.isFinite(Number(v));
    const bad =
      (['lat', 'lon', 'height'] as const).find((k) => f[k].trim() !== '' && notNumber(f[k])) ??
      (eoGiven ? (['dut1', 'xp', 'yp'] as const).find((k) => f[k].trim() === '' || notNumber(f[k])) : undefined);
    if (bad) return setErr({ field: bad, message: `${bad}: must be a number` });
    const lat = Number(f.lat || 0);
    const lon = Number(f.lon || 0);
    const reasons: string[] = [];
    let name = f.name.trim();
    if (!name) {
      name = `Site at ${fmtCoord(lat, 'N', 'S')}, ${fmtCoord(lon, 'E', 'W')}`;
      reasons.push(`The site has no name; it will be called “${name}”.`);
    }
    if (lat === 0 && lon === 0) reasons.push('The site is at exactly 0°, 0° — in the Gulf of Guinea, at sea — which is usually a site not yet filled in.');
    const r = siteSchema.safeParse({ name, lat, lon, height: Number(f.height || 0), timeZone: f.timeZone, earthOrientation });
    if (!r.success) {
      const i = r.error.issues[0]!;
      const k = i.path[0] === 'earthOrientation' ? (({ date: 'eoDate', source: 'eoSource' }) as Record<string, string>)[String(i.path[1])] ?? String(i.path[1]) : String(i.path[0]);
      return setErr({ field: k, message: `${i.path.join('.')}: ${i.message}` });
    }
    setErr(null);
    if (reasons.length) return setConfirm({ reasons, site: r.data });
    onApply(r.data);
  };

  const field = (k: keyof typeof f, label: string, hint?: string) => (
    <Labelled id={`${id}-${k}`} label={<>{label}</>}>
      <input
        id={`${id}-${k}`}
        name={k}
        className={INPUT}
        value={f[k]}
        inputMode={k === 'name' || k === 'eoDate' || k === 'eoSource' ? undefined : 'decimal'}
        aria-invalid={err?.field === k || undefined}
        aria-describedby={k === 'height' ? `${id}-height-note` : undefined}
        placeholder={hint}
        onChange={(e) => {
          if (k === 'lat' || k === 'lon') {
            setCoords({ [k]: e.target.value });
            setFrom('Typed by you');
          } else {
            setF({ ...f, [k]: e.target.value });
            if (k === 'height') setHeightNote('Typed by you.');
          }
        }}
      />
    </Labelled>
  );

  return (
    <div ref={rootRef} className="flex flex-col gap-3">
      <PlaceSearch onPick={pickPlace} />
      <div>
        <Button variant="ghost" className="px-0" onClick={useMyLocation} busy={locating}>
          Use my location
        </Button>
      </div>
      {field('name', 'Site name')}
      <div className="grid grid-cols-1 gap-2 sm:grid-cols-3">
        {field('lat', 'Latitude (°, north +)', '40.01')}
        {field('lon', 'Longitude (°, east +)', '-105.27')}
        {field('height', 'Height (m)', '1650')}
      </div>
      {from && <p className="text-xs text-ink-300">Coordinates: {from}.</p>}
      <p id={`${id}-height-note`} className="text-xs text-ink-300">
        Height: {heightNote}
      </p>
      <Labelled id={`${id}-tz`} label="Time zone">
        <select
          id={`${id}-tz`}
          name="timeZone"
          className={INPUT}
          value={f.timeZone}
          aria-invalid={err?.field === 'timeZone' || undefined}
          onChange={(e) => {
            setF({ ...f, timeZone: e.target.value });
            setZone({ mode: 'manual', status: 'idle' });
          }}
        >
          {!zones.includes(f.timeZone) && <option value={f.timeZone}>{f.timeZone}</option>}
          {zones.map((z) => (
            <option key={z} value={z}>
              {z}
            </option>
          ))}
        </select>
        <p className="text-xs text-ink-300" data-testid="zone-note">
          {zone.mode === 'manual' ? (
            <>
              Chosen by you.{' '}
              <button type="button" className="underline hover:text-brass-200" onClick={() => ((coordsTouched.current = true), setZone({ mode: 'derived', status: 'idle' }))}>
                Take it from the coordinates again
              </button>
            </>
          ) : zone.status === 'busy' ? (
            'Looking up the zone of these coordinates…'
          ) : zone.status === 'error' ? (
            'The zone could not be looked up; choose it from the list.'
          ) : (
            'From the coordinates (time-zone boundaries of OpenStreetMap, via timezone-boundary-builder). Choose another to override.'
          )}
        </p>
      </Labelled>
      <details className="text-xs" open={!!eo}>
        <summary className={LABEL}>Earth orientation for pointing (optional)</summary>
        <p className="mt-1 text-ink-300">UT1 − UTC and polar motion from IERS Bulletin A for the night observed; left empty they are taken as 0 (up to ~13″ of hour angle).</p>
        <div className="mt-1 grid grid-cols-3 gap-2">
          {field('dut1', 'UT1 − UTC (s)', '-0.0412')}
          {field('xp', 'Polar motion xp (″)', '0.1523')}
          {field('yp', 'Polar motion yp (″)', '0.3741')}
        </div>
        <div className="mt-1 grid grid-cols-2 gap-2">
          {field('eoDate', 'For the date', '2026-12-03')}
          {field('eoSource', 'Source', 'IERS Bulletin A')}
        </div>
      </details>
      {err && (
        <p role="alert" className="text-xs text-danger-300">
          {err.message}
        </p>
      )}
      {confirm ? (
        <div role="alertdialog" aria-label="Check the site" className="flex flex-col gap-2 rounded-md border border-brass-300/60 bg-ink-900 p-3 text-sm">
          {confirm.reasons.map((r) => (
            <p key={r}>{r}</p>
          ))}
          <div className="flex gap-2">
            <Button
              variant="secondary"
              onClick={() => {
                const s = confirm.site;
                setConfirm(null);
                setF((x) => ({ ...x, name: s.name }));
                onApply(s);
              }}
            >
              Use it anyway
            </Button>
            <Button variant="ghost" onClick={() => setConfirm(null)}>
              Go back
            </Button>
          </div>
        </div>
      ) : (
        <Button variant="secondary" onClick={apply}>
          {submitLabel}
        </Button>
      )}
    </div>
  );
}
