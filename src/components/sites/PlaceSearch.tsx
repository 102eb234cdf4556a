/**
 * Search-as-you-type over the app's offline gazetteer (`GET /api/places`), as an ARIA combobox: arrows move
 * through the answers, Enter picks, Escape closes. The GeoNames credit its licence asks for sits under it.
 */
import { useEffect, useId, useRef, useState } from 'react';
import { GEONAMES_CREDIT, type Place } from '../../lib/contracts/places';
import { INPUT, Labelled } from '../scenes/controls';

const DEBOUNCE_MS = 120;

export function placeLabel(p: Pick<Place, 'admin' | 'countryName' | 'country'>): string {
  return [p.admin, p.countryName || p.country].filter(Boolean).join(', ');
}

export function GeoNamesCredit() {
  return (
    <p className="text-xs text-ink-400">
      Places from{' '}
      <a className="underline hover:text-brass-200" href={GEONAMES_CREDIT.url} target="_blank" rel="noopener noreferrer">
        GeoNames
      </a>{' '}
      (
      <a className="underline hover:text-brass-200" href={GEONAMES_CREDIT.licenceUrl} target="_blank" rel="noopener noreferrer">
        {GEONAMES_CREDIT.licence}
      </a>
      ), towns of 1,000 people or more.
    </p>
  );
}

export function PlaceSearch({ onPick, label = 'Find a town' }: { onPick: (p: Place) => void; label?: string }) {
  const id = useId();
  const [q, setQ] = useState('');
  const [places, setPlaces] = useState<Place[]>([]);
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(-1);
  const [status, setStatus] = useState<'idle' | 'busy' | 'error'>('idle');
  const seq = useRef(0);

  useEffect(() => {
    const text = q.trim();
    if (!text) {
      setPlaces([]);
      setStatus('idle');
      return;
    }
    const mine = ++seq.current;
    const ctl = new AbortController();
    const timer = setTimeout(async () => {
      setStatus('busy');
      try {
        const r = await fetch(`/api/places?q=${encodeURIComponent(text)}&limit=8`, { signal: ctl.signal, headers: { accept: 'application/json' } });
        if (!r.ok) throw new Error(String(r.status));
        const data = (await r.json()) as { places: Place[] };
        if (mine !== seq.current) return;
        setPlaces(data.places);
        setActive(data.places.length ? 0 : -1);
        setOpen(true);
        setStatus('idle');
      } catch (e) {
        if ((e as Error).name !== 'AbortError' && mine === seq.current) setStatus('error');
      }
    }, DEBOUNCE_MS);
    return () => {
      clearTimeout(timer);
      ctl.abort();
    };
  }, [q]);

  const pick = (p: Place) => {
    onPick(p);
    setQ('');
    setPlaces([]);
    setOpen(false);
  };

  const listId = `${id}-list`;
  return (
    <Labelled id={`${id}-q`} label={<>{label}</>} className="relative">
      <input
        id={`${id}-q`}
        data-testid="place-search"
        className={INPUT}
        role="combobox"
        aria-expanded={open && places.length > 0}
        aria-controls={listId}
        aria-autocomplete="list"
        aria-activedescendant={open && active >= 0 ? `${id}-opt-${active}` : undefined}
        autoComplete="off"
        placeholder="Town name, e.g. “La Serena” or “Springfield, IL”"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        onFocus={() => places.length && setOpen(true)}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        onKeyDown={(e) => {
          if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
            if (!places.length) return;
            e.preventDefault();
            setOpen(true);
            setActive((a) => (a + (e.key === 'ArrowDown' ? 1 : -1) + places.length) % places.length);
          } else if (e.key === 'Enter' && open && active >= 0 && places[active]) {
            e.preventDefault();
            pick(places[active]!);
          } else if (e.key === 'Escape') {
            setOpen(false);
          }
        }}
      />
      {open && q.trim() && (
        <ul id={listId} role="listbox" aria-label="Places" className="absolute top-full z-20 mt-1 max-h-72 w-full overflow-auto rounded-md border border-ink-600 bg-ink-900 shadow-lg">
          {places.length === 0 && status !== 'busy' && <li className="px-3 py-2 text-sm text-ink-300">No town of that name in the gazetteer. Type the coordinates below.</li>}
          {places.map((p, i) => (
            <li
              key={`${p.geonamesId}-${i}`}
              id={`${id}-opt-${i}`}
              role="option"
              aria-selected={i === active}
              className="cursor-pointer px-3 py-2 text-sm aria-selected:bg-ink-700"
              onMouseDown={(e) => e.preventDefault()}
              onMouseEnter={() => setActive(i)}
              onClick={() => pick(p)}
            >
              <span className="font-medium text-ink-100">{p.name}</span>
              <span className="text-ink-300"> · {placeLabel(p)}</span>
              <span className="block text-xs text-ink-400">
                {p.lat.toFixed(3)}°, {p.lon.toFixed(3)}° · {p.timeZone}
                {p.population ? ` · ${p.population.toLocaleString('en')} people` : ''}
              </span>
            </li>
          ))}
        </ul>
      )}
      {status === 'error' && <p className="text-xs text-danger-300">The place search did not answer; type the coordinates below.</p>}
      <GeoNamesCredit />
    </Labelled>
  );
}
