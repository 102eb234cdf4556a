/**
 * The DOM side of the view: legend with layer toggles, time bar, hover readout, selection card and the
 * text alternative. Time-driven text is written through refs (no React render per frame); panels that need
 * React (card, summary) refresh at most twice a second.
 */
import { useEffect, useRef, useState, type ReactNode } from 'react';
import type { LayerKey } from '../../lib/contracts/scene-doc';
import { useView } from './context';
import * as engine from './sky-adapter';
import { altAzToEnu, altitudeWords, angleDeg, compassWord, formatDeg, formatDms, formatHours, formatSignedHours } from './geometry';
import { bodyName } from './overlay';
import { useStore } from './store';
import { useClockText } from './clock-text';
import { CIRCLE_STYLES, dashArray, GRID_STYLES, LEGEND, type CircleKey } from './styles';
import { formatOffset, formatUtc, formatWall, fromLocalInputValue, SIDEREAL_DAY_MS, toLocalInputValue } from './clock';

const btn = 'rounded border border-slate-600 bg-slate-800 px-2 py-1 text-xs text-slate-100 hover:bg-slate-700 focus-visible:outline focus-visible:outline-2 focus-visible:outline-sky-400 disabled:opacity-40';

/** Calls `fn` on clock changes, at most every `ms` milliseconds (trailing call guaranteed). */
export function useThrottledClock(fn: () => void, ms: number, deps: unknown[] = []) {
  const { clock } = useView();
  useEffect(() => {
    let last = 0;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const run = () => {
      last = performance.now();
      timer = null;
      fn();
    };
    run();
    const unsub = clock.subscribe(() => {
      if (timer) return;
      const wait = Math.max(0, ms - (performance.now() - last));
      timer = setTimeout(run, wait);
    });
    return () => {
      unsub();
      if (timer) clearTimeout(timer);
    };
  }, deps);
}

function Swatch({ k }: { k: LayerKey }) {
  if (k in CIRCLE_STYLES) {
    const st = CIRCLE_STYLES[k as CircleKey];
    return (
      <svg width="40" height="10" aria-hidden="true" className="shrink-0">
        <line x1="1" y1="5" x2="39" y2="5" stroke={st.color} strokeWidth={st.widthPx} strokeDasharray={dashArray(st.pattern)} />
      </svg>
    );
  }
  if (k in GRID_STYLES) {
    const st = GRID_STYLES[k as keyof typeof GRID_STYLES];
    return (
      <svg width="40" height="10" aria-hidden="true" className="shrink-0">
        <path d="M1 2 H39 M1 8 H39 M10 0 V10 M30 0 V10" stroke={st.color} strokeWidth="1" />
      </svg>
    );
  }
  return <span className="inline-block w-10 shrink-0" aria-hidden="true" />;
}

export function Legend({ onLayersChange }: { onLayersChange?: (() => void) | undefined }) {
  const { store } = useView();
  const layers = useStore(store, (s) => s.layers);
  const set = (k: LayerKey, v: boolean) => {
    store.set((s) => ({ layers: { ...s.layers, [k]: v } }));
    onLayersChange?.();
  };
  const groups = ['Rings', 'Grids', 'Sky', 'Plan'] as const;
  return (
    <div className="space-y-2" data-testid="sky-legend">
      {groups.map((g) => (
        <fieldset key={g} className="space-y-1">
          <legend className="text-[11px] uppercase tracking-wide text-slate-400">{g}</legend>
          {LEGEND.filter((l) => l.group === g).map((l) => {
            const st = CIRCLE_STYLES[l.key as CircleKey];
            return (
              <label key={l.key} className="flex cursor-pointer items-center gap-2 text-xs text-slate-200">
                <input type="checkbox" checked={layers[l.key]} onChange={(e) => set(l.key, e.target.checked)} data-layer={l.key} />
                <Swatch k={l.key} />
                <span>
                  {l.label}
                  {st && <span className="sr-only"> ({st.patternName} line)</span>}
                </span>
              </label>
            );
          })}
        </fieldset>
      ))}
      <label className="flex items-center gap-2 text-xs text-slate-200">
        <span>Faintest stars</span>
        <input
          type="range"
          min={-1}
          max={7}
          step={0.5}
          value={layers.limitingMagnitude}
          onChange={(e) => {
            store.set((s) => ({ layers: { ...s.layers, limitingMagnitude: Number(e.target.value) } }));
            onLayersChange?.();
          }}
          aria-label="Limiting magnitude"
          data-testid="limiting-magnitude"
        />
        <output className="w-8 tabular-nums">{layers.limitingMagnitude.toFixed(1)}</output>
      </label>
    </div>
  );
}

export function TimeBar({ timeZone, onSaveTime }: { timeZone: string; onSaveTime?: (() => void) | undefined }) {
  const { clock, model, store } = useView();
  const localRef = useRef<HTMLSpanElement>(null);
  const utcRef = useRef<HTMLSpanElement>(null);
  const lstRef = useRef<HTMLSpanElement>(null);
  const inputRef = useRef<HTMLInputElement>(null);
  const selected = useStore(store, (s) => s.selected);
  const [twilights, setTwilights] = useState<engine.EventLike[]>([]);
  const [msg, setMsg] = useState('');

  useClockText(
    clock,
    () => {
      if (localRef.current) localRef.current.textContent = `${formatWall(clock.ms, timeZone)} (${formatOffset(clock.ms, timeZone)})`;
      if (utcRef.current) utcRef.current.textContent = `${formatUtc(clock.ms)} UTC`;
      if (lstRef.current) lstRef.current.textContent = formatHours(model.frame.lstHours, 1);
      if (inputRef.current && document.activeElement !== inputRef.current) inputRef.current.value = toLocalInputValue(clock.ms, timeZone);
    },
    [clock, timeZone],
  );

  const step = (ms: number) => clock.setMs(clock.ms + ms);
  const loadTwilights = () => {
    const from = new Date(clock.ms);
    setTwilights(engine.twilightEvents(model.site, from, new Date(clock.ms + 2 * 86400000)).slice(0, 12));
  };
  const jump = (kind: 'rise' | 'transit' | 'set') => {
    const t = selectedTarget(model, selected);
    if (!t) return;
    const ev = engine.riseTransitSet(model.site, t, new Date(clock.ms + 1000), new Date(clock.ms + 2 * 86400000)).find((e) => e.kind === kind);
    if (ev) {
      clock.setMs(ev.time.getTime());
      setMsg('');
    } else setMsg(`No ${kind} in the next 48 h`);
  };
  return (
    <div className="space-y-2" data-testid="sky-time">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs">
        <dt className="text-slate-400">Site time</dt>
        <dd className="tabular-nums text-slate-100" ref={localRef} data-testid="time-local" />
        <dt className="text-slate-400">UTC</dt>
        <dd className="tabular-nums text-slate-100" ref={utcRef} data-testid="time-utc" />
        <dt className="text-slate-400">Local sidereal time</dt>
        <dd className="tabular-nums text-slate-100" ref={lstRef} data-testid="time-lst" />
      </dl>
      <label className="flex items-center gap-2 text-xs text-slate-300">
        <span>Set ({timeZone})</span>
        <input
          ref={inputRef}
          type="datetime-local"
          className="rounded bg-slate-800 px-1 text-slate-100"
          onChange={(e) => {
            const ms = fromLocalInputValue(e.target.value, timeZone);
            if (ms !== null) clock.setMs(ms);
          }}
          aria-label={`Date and time at the site (${timeZone})`}
        />
      </label>
      <div className="flex flex-wrap gap-1" role="group" aria-label="Step time">
        <button className={btn} onClick={() => step(-SIDEREAL_DAY_MS)} aria-label="Back one sidereal day">−1 sid. day</button>
        <button className={btn} onClick={() => step(-86400000)} aria-label="Back one day">−1 d</button>
        <button className={btn} onClick={() => step(-3600000)} aria-label="Back one hour" data-testid="step-minus-hour">−1 h</button>
        <button className={btn} onClick={() => step(-60000)} aria-label="Back one minute">−1 min</button>
        <button className={btn} onClick={() => step(60000)} aria-label="Forward one minute">+1 min</button>
        <button className={btn} onClick={() => step(3600000)} aria-label="Forward one hour" data-testid="step-plus-hour">+1 h</button>
        <button className={btn} onClick={() => step(86400000)} aria-label="Forward one day">+1 d</button>
        <button className={btn} onClick={() => step(SIDEREAL_DAY_MS)} aria-label="Forward one sidereal day" data-testid="step-plus-sday">+1 sid. day</button>
      </div>
      <div className="flex flex-wrap items-center gap-1">
        {onSaveTime && <button className={btn} onClick={onSaveTime}>Use this time in the scene</button>}
      </div>
      <div className="flex flex-wrap items-center gap-1" role="group" aria-label="Jump to events">
        <button className={btn} disabled={!selected} onClick={() => jump('rise')}>Next rise</button>
        <button className={btn} disabled={!selected} onClick={() => jump('transit')}>Next transit</button>
        <button className={btn} disabled={!selected} onClick={() => jump('set')}>Next set</button>
        <select
          className="rounded bg-slate-800 px-1 text-xs text-slate-100"
          onFocus={loadTwilights}
          onPointerDown={loadTwilights}
          value=""
          onChange={(e) => e.target.value && clock.setMs(Number(e.target.value))}
          aria-label="Jump to a twilight time"
        >
          <option value="">Twilight…</option>
          {twilights.map((t) => (
            <option key={t.kind + t.time.getTime()} value={t.time.getTime()}>{`${t.kind.replace('-', ' ')} ${formatWall(t.time.getTime(), timeZone).slice(5, 16)}`}</option>
          ))}
        </select>
      </div>
      {msg && <p className="text-xs text-amber-300" role="status">{msg}</p>}
    </div>
  );
}

/** Engine target for the current selection. */
export function selectedTarget(model: import('./model').SkyModel, sel: import('./context').Selection | null): { raDeg: number; decDeg: number } | { body: any } | null {
  if (!sel) return null;
  if (sel.kind === 'body') return { body: sel.body };
  if (sel.kind === 'star' && model.cat) return { raDeg: model.cat.raDeg[sel.index], decDeg: model.cat.decDeg[sel.index] };
  if (sel.kind === 'target') {
    const def = model.targetDefs.find((t) => t.id === sel.id);
    if (!def) return null;
    if (def.kind === 'body') return { body: def.body };
    const st = model.targets.find((t) => t.id === sel.id);
    return st ? { raDeg: st.raDeg, decDeg: st.decDeg } : null;
  }
  return null;
}

/** Display name of the current selection (for "Vega rises" and the like). */
export function selectedName(model: import('./model').SkyModel, sel: import('./context').Selection | null): string {
  if (!sel) return '';
  if (sel.kind === 'body') return bodyName(sel.body);
  if (sel.kind === 'star' && model.cat) return model.cat.name[sel.index] ?? model.cat.designation[sel.index] ?? 'The star';
  if (sel.kind === 'target') return model.targetDefs.find((t) => t.id === sel.id)?.name ?? 'The target';
  return '';
}

const FIELDS: [keyof engine.PointReadout | 'raDec' | 'raDecDate' | 'ecl' | 'gal', string][] = [
  ['altDeg', 'Altitude'],
  ['zdDeg', 'Zenith distance'],
  ['azDeg', 'Azimuth'],
  ['raDec', 'RA / Dec (J2000)'],
  ['raDecDate', 'RA / Dec (of date)'],
  ['haHours', 'Hour angle'],
  ['polarDistDeg', 'Polar distance'],
  ['ecl', 'Ecliptic λ / β'],
  ['gal', 'Galactic l / b'],
  ['constellation', 'Constellation'],
];

/** Which UT1 − UTC and polar motion the view uses (they shift pointing by up to ~13″). */
export function earthOrientationNote(s: engine.SiteInput): string {
  if (s.dut1Sec === undefined && s.xpArcsec === undefined && s.ypArcsec === undefined) return 'Earth orientation: UT1 − UTC and polar motion taken as 0 (up to ~13″ of hour angle).';
  const sign = (x: number) => (x >= 0 ? '+' : '−') + Math.abs(x).toFixed(3);
  const src = [s.eopSource, s.eopDate ? `for ${s.eopDate}` : ''].filter(Boolean).join(', ');
  return `Earth orientation: UT1 − UTC ${sign(s.dut1Sec ?? 0)} s, xp ${sign(s.xpArcsec ?? 0)}″, yp ${sign(s.ypArcsec ?? 0)}″${src ? ` (${src})` : ''}.`;
}

export function Readout() {
  const { hud, model } = useView();
  const refs = useRef<Record<string, HTMLElement | null>>({});
  const boxRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    hud.readout = (r) => {
      if (boxRef.current) boxRef.current.dataset.empty = r ? 'false' : 'true';
      const set = (k: string, v: string) => {
        const el = refs.current[k];
        if (el) el.textContent = v;
      };
      if (!r) {
        for (const [k] of FIELDS) set(k, '—');
        return;
      }
      set('altDeg', formatDeg(r.altDeg, 3));
      set('zdDeg', formatDeg(r.zdDeg, 3));
      set('azDeg', formatDeg(r.azDeg, 3));
      set('raDec', `${formatHours(r.raDeg / 15, 1)}  ${formatDms(r.decDeg)}`);
      set('raDecDate', `${formatHours(r.raDateDeg / 15, 1)}  ${formatDms(r.decDateDeg)}`);
      set('haHours', formatSignedHours(r.haHours));
      set('polarDistDeg', formatDeg(r.polarDistDeg, 3));
      set('ecl', `${formatDeg(r.eclLonDeg, 2)} / ${formatDeg(r.eclLatDeg, 2)}`);
      set('gal', `${formatDeg(r.galLDeg, 2)} / ${formatDeg(r.galBDeg, 2)}`);
      set('constellation', r.constellation);
      if (boxRef.current) boxRef.current.dataset.json = JSON.stringify(r);
    };
    return () => {
      hud.readout = null;
    };
  }, [hud]);
  return (
    <div ref={boxRef} data-empty="true" data-testid="sky-readout">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs">
        {FIELDS.map(([k, label]) => (
          <div key={k} className="contents">
            <dt className="text-slate-400">{label}</dt>
            <dd className="tabular-nums text-slate-100" ref={(el) => void (refs.current[k] = el)} data-field={k}>—</dd>
          </div>
        ))}
      </dl>
      <p className="mt-1 text-[11px] text-slate-400">Hover or tap the sky. Altitudes include standard refraction.</p>
      <p className="mt-0.5 text-[11px] text-slate-400" data-testid="sky-eop">{earthOrientationNote(model.site)}</p>
    </div>
  );
}

interface CardData {
  title: string;
  rows: [string, ReactNode][];
  warn: string | null;
}

export function SelectionCard() {
  const { store, model, clock, timeZone } = useView();
  const selected = useStore(store, (s) => s.selected);
  const [data, setData] = useState<CardData | null>(null);
  const events = useRef<{ key: string; dayMs: number; list: engine.EventLike[]; note: string }>({ key: '', dayMs: 0, list: [], note: '' });
  useThrottledClock(
    () => {
      if (!selected) return setData(null);
      const t = selectedTarget(model, selected);
      if (!t) return setData(null);
      let title = '';
      let mag: number | null = null;
      let azDeg = 0, altDeg = 0, raDeg = 0, decDeg = 0;
      let inside: boolean | null = null;
      let breaks: string[] = [];
      let sunSep: number | null = null;
      let extra: [string, ReactNode][] = [];
      if (selected.kind === 'star' && model.cat) {
        const i = selected.index;
        title = model.cat.name[i] ? `${model.cat.name[i]} (${model.cat.designation[i]})` : model.cat.designation[i];
        mag = model.cat.vmag[i];
        const e = [model.starEnu[i * 3], model.starEnu[i * 3 + 1], model.starEnu[i * 3 + 2]];
        const aa = enuAltAz(e);
        azDeg = aa.azDeg;
        altDeg = aa.altDeg;
        raDeg = model.cat.raDeg[i];
        decDeg = model.cat.decDeg[i];
        extra.push(['Catalogue', `HR ${model.cat.hr[i]}`]);
      } else if (selected.kind === 'body') {
        const b = model.bodies.find((x) => x.body === selected.body);
        if (!b) return setData(null);
        title = bodyName(b.body);
        mag = b.magnitude;
        ({ azDeg, altDeg, raDeg, decDeg } = b);
        if (b.illuminatedFraction !== undefined) extra.push(['Illuminated', `${Math.round(b.illuminatedFraction * 100)}%`]);
      } else if (selected.kind === 'target') {
        const st = model.targets.find((x) => x.id === selected.id);
        if (!st) return setData(null);
        title = `${st.name} (target)`;
        mag = st.magnitude;
        ({ azDeg, altDeg, raDeg, decDeg, inside, breaks } = st);
        sunSep = st.sunSepDeg;
      }
      if (model.envelope && selected.kind !== 'target') {
        const e = altAzToEnu([0, 0, 0], azDeg, altDeg);
        const hd = model.haDecOfDate(e);
        const v = engine.checkEnvelope(model.envelope, { azDeg, altDeg, haHours: hd.haHours, decDeg: hd.decDeg }, model);
        inside = v.inside;
        breaks = v.breaks;
      }
      if (sunSep === null && model.sun && !(selected.kind === 'body' && selected.body === 'sun')) {
        const e = [0, 0, 0];
        altAzToEnu(e, azDeg, altDeg);
        sunSep = angleDeg(e, model.sun.enu);
      }
      const key = JSON.stringify(selected);
      const dayMs = Math.floor(clock.ms / 3600000);
      if (events.current.key !== key || events.current.dayMs !== dayMs) {
        const r = engine.riseTransitSetDetailed(model.site, t, new Date(clock.ms - 12 * 3600000), new Date(clock.ms + 36 * 3600000));
        events.current = { key, dayMs, list: r.events, note: r.alwaysUp ? 'Always above the horizon in this span' : r.alwaysDown ? 'Does not rise in this span' : '' };
      }
      const ev = events.current;
      const fmt = (e: engine.EventLike | undefined) => (e ? `${formatWall(e.time.getTime(), timeZone).slice(5, 16)}` : '—');
      const after = (k: string) => ev.list.find((e) => e.kind === k && e.time.getTime() >= clock.ms - 12 * 3600000 && e.time.getTime() > clock.ms - 1);
      const airmass = engine.airmassAt(altDeg);
      const sunLimit = model.envelope?.sunAvoidance;
      const rows: [string, ReactNode][] = [
        ['Magnitude', mag === null || Number.isNaN(mag) ? '—' : mag.toFixed(2)],
        ['Altitude / azimuth', `${formatDeg(altDeg, 2)} / ${formatDeg(azDeg, 2)}`],
        ['RA / Dec (J2000)', `${formatHours(raDeg / 15, 1)} ${formatDms(decDeg)}`],
        ['Airmass now', airmass === null ? 'below the horizon' : airmass.toFixed(3)],
        ['Next rise', fmt(after('rise'))],
        ['Next transit', fmt(after('transit'))],
        ['Next set', fmt(after('set'))],
        ...extra,
      ];
      if (selected.kind === 'star') rows.push(['Proper motion', 'none: the catalogue (BSC5) has no proper motions, so its J2000 place is used at every date (most bright stars move < 1″ a year)']);
      if (ev.note) rows.push(['Events', ev.note]);
      if (inside !== null) rows.push(['Envelope', inside ? 'inside' : `outside: ${breaks.join('; ')}`]);
      if (sunSep !== null) rows.push(['From the Sun', formatDeg(sunSep, 1)]);
      const warn = sunSep !== null && sunSep < (sunLimit ?? 15) ? `Within ${sunLimit ?? 15}° of the Sun: keep optics away.` : null;
      setData({ title, rows, warn });
    },
    500,
    [selected],
  );
  if (!data) return null;
  return (
    <section aria-labelledby="sky-card-h" className="rounded border border-slate-600 bg-slate-900 p-2" data-testid="sky-card">
      <div className="flex items-start justify-between gap-2">
        <h2 id="sky-card-h" className="text-sm font-bold text-slate-100">{data.title}</h2>
        <button className={btn} onClick={() => store.set({ selected: null })} aria-label="Close the card">×</button>
      </div>
      {data.warn && <p className="mt-1 rounded bg-red-800 px-2 py-1 text-xs font-bold text-white">{data.warn}</p>}
      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs">
        {data.rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-slate-400">{k}</dt>
            <dd className="tabular-nums text-slate-100">{v}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-1 text-[11px] text-slate-500">Times in {timeZone}; rise/set with standard refraction.</p>
    </section>
  );
}

function enuAltAz(e: number[]) {
  const az = (Math.atan2(e[0], e[1]) * 180) / Math.PI;
  return { azDeg: az < 0 ? az + 360 : az, altDeg: (Math.atan2(e[2], Math.hypot(e[0], e[1])) * 180) / Math.PI };
}

/** Twilight state from the Sun's altitude (USNO thresholds: −50′ rise/set, −6°, −12°, −18°). */
export function twilightState(sunAltDeg: number): string {
  if (sunAltDeg > -50 / 60) return 'daytime (the Sun is up)';
  if (sunAltDeg > -6) return 'civil twilight';
  if (sunAltDeg > -12) return 'nautical twilight';
  if (sunAltDeg > -18) return 'astronomical twilight';
  return 'night (astronomical darkness)';
}

/** The text alternative ("Above the horizon now"): the sky in words. Updated at most once a second. */
export function SkySummary() {
  const { model, store, timeZone, clock } = useView();
  const ref = useRef<HTMLDivElement>(null);
  const ready = useStore(store, (s) => s.catalogueReady);
  const showTargets = useStore(store, (s) => s.layers.targets);
  useThrottledClock(
    () => {
      const lines: string[] = [];
      const L = store.get().layers;
      lines.push(`At ${formatWall(clock.ms, timeZone)} (${timeZone}), local sidereal time ${formatHours(model.frame.lstHours, 0)}.`);
      const sun = model.sun, moon = model.moon;
      if (sun) lines.push(`Sun: ${sun.altDeg > -50 / 60 ? `up, ${altitudeWords(sun.altDeg)} in the ${compassWord(sun.azDeg)}` : 'below the horizon'} (altitude ${sun.altDeg.toFixed(1)}°). Sky: ${twilightState(sun.altDeg)}.`);
      if (moon) {
        const pct = moon.illuminatedFraction !== undefined ? `${Math.round(moon.illuminatedFraction * 100)}% lit` : '';
        lines.push(`Moon: ${moon.altDeg > 0 ? `up, ${altitudeWords(moon.altDeg)} in the ${compassWord(moon.azDeg)}` : 'below the horizon'}, ${pct} (altitude ${moon.altDeg.toFixed(1)}°).`);
      }
      const planets = model.bodies.filter((b) => b.body !== 'sun' && b.body !== 'moon' && b.altDeg > 0);
      lines.push(planets.length ? `Planets up: ${planets.map((b) => `${bodyName(b.body)} ${altitudeWords(b.altDeg)} in the ${compassWord(b.azDeg)} (altitude ${b.altDeg.toFixed(0)}°)`).join('; ')}.` : 'No planets above the horizon.');
      if (model.cat) {
        const up: string[] = [];
        const nStars = model.starCountTo(model.starLimit);
        for (let i = 0; i < nStars && model.cat.vmag[i] <= 1.6; i++) {
          const u = model.starEnu[i * 3 + 2];
          if (u <= 0) continue;
          const a = enuAltAz([model.starEnu[i * 3], model.starEnu[i * 3 + 1], u]);
          up.push(`${model.cat.name[i] ?? model.cat.designation[i]} ${altitudeWords(a.altDeg)} in the ${compassWord(a.azDeg)}`);
        }
        lines.push(up.length ? `Bright stars up: ${up.join('; ')}.` : 'No bright stars above the horizon.');
      }
      if (L.targets && model.targets.length) {
        lines.push(`Targets: ${model.targets.map((t) => `${t.name} ${t.altDeg > 0 ? `at altitude ${t.altDeg.toFixed(0)}° in the ${compassWord(t.azDeg)}` : 'below the horizon'}${t.inside === false ? ' (outside the envelope)' : ''}`).join('; ')}.`);
      }
      const el = ref.current;
      if (!el) return;
      const html = lines.map((l) => `<p>${l.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</p>`).join('');
      if (el.innerHTML !== html) el.innerHTML = html;
    },
    1000,
    [timeZone, ready, showTargets],
  );
  return (
    <div ref={ref} aria-live="polite" className="space-y-1 text-xs text-slate-200" data-testid="sky-summary" />
  );
}
