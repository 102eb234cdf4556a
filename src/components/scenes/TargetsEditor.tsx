/** Targets: catalogue stars (by proper name, HR number or designation), solar-system bodies, custom RA/Dec. */
import { useEffect, useId, useState } from 'react';
import { BODY_NAMES, type Target } from '../../lib/contracts/scene-doc';
import { formatDecDms, formatRaHms, parseDec, parseRa } from '../../lib/imports/angles';
import { newId } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { INPUT, Labelled } from './controls';
import { TargetsImport } from './TargetsImport';

/** What the CSV import needs: the scene, and how to sync with the server before and after. */
export interface TargetsImporter {
  sceneId: string;
  beforeImport: () => Promise<void>;
  onImported: (added: number) => Promise<void>;
}

type Hit = { hr: number; designation: string; name: string | null; raDeg: number; decDeg: number; vmag: number };

const BODY_LABEL: Record<(typeof BODY_NAMES)[number], string> = {
  sun: 'Sun', moon: 'Moon', mercury: 'Mercury', venus: 'Venus', mars: 'Mars', jupiter: 'Jupiter', saturn: 'Saturn', uranus: 'Uranus', neptune: 'Neptune',
};

function useCatalogueSearch(q: string) {
  const [hits, setHits] = useState<Hit[]>([]);
  const [loading, setLoading] = useState(false);
  useEffect(() => {
    if (q.trim().length < 1) {
      setHits([]);
      return;
    }
    let live = true;
    setLoading(true);
    const t = setTimeout(async () => {
      // The catalogue is large: load it only when someone searches.
      const { searchCatalogue } = await import('../../lib/sky/catalogue/index');
      if (!live) return;
      setHits(searchCatalogue(q, 12));
      setLoading(false);
    }, 150);
    return () => {
      live = false;
      clearTimeout(t);
    };
  }, [q]);
  return { hits, loading };
}

export function describeTarget(t: Target): string {
  if (t.kind === 'star') return `HR ${t.hr}`;
  if (t.kind === 'body') return 'Solar-system body';
  return `${formatRaHms(t.ra, 1)}  ${formatDecDms(t.dec, 0)}`;
}

export function TargetsEditor({ targets, onChange, readOnly, importer }: { targets: Target[]; onChange: (t: Target[]) => void; readOnly: boolean; importer?: TargetsImporter }) {
  const id = useId();
  const [q, setQ] = useState('');
  const { hits, loading } = useCatalogueSearch(q);
  const [body, setBody] = useState<(typeof BODY_NAMES)[number]>('moon');
  const [custom, setCustom] = useState({ name: '', ra: '', dec: '' });
  const [customErr, setCustomErr] = useState<{ field: string; message: string } | null>(null);

  const add = (t: Target) => onChange([...targets, t]);
  const addCustom = () => {
    const name = custom.name.trim();
    if (!name) return setCustomErr({ field: 'name', message: 'Name: must not be empty' });
    const ra = parseRa(custom.ra);
    if (!ra.ok) return setCustomErr({ field: 'ra', message: `Right ascension ${ra.message}` });
    const dec = parseDec(custom.dec);
    if (!dec.ok) return setCustomErr({ field: 'dec', message: `Declination ${dec.message}` });
    if (ra.value < 0 || ra.value >= 360) return setCustomErr({ field: 'ra', message: 'Right ascension must be within 0–360° (0–24 h)' });
    if (dec.value < -90 || dec.value > 90) return setCustomErr({ field: 'dec', message: 'Declination must be within −90…+90°' });
    setCustomErr(null);
    add({ id: newId('t'), kind: 'custom', name, ra: ra.value, dec: dec.value });
    setCustom({ name: '', ra: '', dec: '' });
  };

  return (
    <div className="flex flex-col gap-3">
      {targets.length === 0 ? (
        <p className="text-sm text-ink-300">No targets yet.</p>
      ) : (
        <ul className="flex flex-col gap-1" aria-label="Targets">
          {targets.map((t) => (
            <li key={t.id} className="flex items-center justify-between gap-2 rounded bg-ink-850 px-2 py-1 text-sm">
              <span>
                <span className="font-medium">{t.name}</span> <span className="text-xs text-ink-300">{describeTarget(t)}</span>
              </span>
              {!readOnly && (
                <Button variant="ghost" className="px-2 py-1 text-xs" aria-label={`Remove target ${t.name}`} onClick={() => onChange(targets.filter((x) => x.id !== t.id))}>
                  Remove
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {!readOnly && (
        <>
          <Labelled id={`${id}-q`} label="Find a star">
            <input id={`${id}-q`} className={INPUT} value={q} onChange={(e) => setQ(e.target.value)} placeholder="Proper name, HR number or designation (e.g. Vega, HR 7001, α Lyr)" aria-describedby={`${id}-qs`} />
            <p id={`${id}-qs`} className="sr-only" aria-live="polite">
              {loading ? 'Searching' : q ? `${hits.length} matches` : ''}
            </p>
            {hits.length > 0 && (
              <ul className="max-h-48 overflow-auto rounded border border-ink-700" aria-label="Catalogue matches">
                {hits.map((h) => (
                  <li key={h.hr}>
                    <button
                      type="button"
                      className="flex w-full justify-between gap-2 px-2 py-1 text-left text-sm hover:bg-ink-800 focus-visible:bg-ink-800"
                      onClick={() => {
                        add({ id: newId('t'), kind: 'star', name: h.name ?? h.designation, hr: h.hr });
                        setQ('');
                      }}
                    >
                      <span>
                        {h.name ?? h.designation} <span className="text-ink-300">{h.name ? h.designation : ''}</span>
                      </span>
                      <span className="text-xs text-ink-300">
                        HR {h.hr} · V {Number.isFinite(h.vmag) ? h.vmag.toFixed(2) : '—'}
                      </span>
                    </button>
                  </li>
                ))}
              </ul>
            )}
          </Labelled>
          <div className="flex items-end gap-2">
            <Labelled id={`${id}-body`} label="Solar-system body" className="flex-1">
              <select id={`${id}-body`} className={INPUT} value={body} onChange={(e) => setBody(e.target.value as typeof body)}>
                {BODY_NAMES.map((b) => (
                  <option key={b} value={b}>
                    {BODY_LABEL[b]}
                  </option>
                ))}
              </select>
            </Labelled>
            <Button variant="secondary" onClick={() => add({ id: newId('t'), kind: 'body', name: BODY_LABEL[body], body })}>
              Add body
            </Button>
          </div>
          <fieldset className="flex flex-col gap-2 rounded border border-ink-800 p-2">
            <legend className="px-1 text-sm font-medium">Custom position (ICRS/J2000)</legend>
            <div className="grid grid-cols-1 gap-2 sm:grid-cols-3">
              {(['name', 'ra', 'dec'] as const).map((f) => (
                <div key={f} className="flex flex-col gap-1">
                  <label htmlFor={`${id}-${f}`} className="text-xs text-ink-300">
                    {f === 'name' ? 'Name' : f === 'ra' ? 'RA (deg, or h m s)' : 'Dec (deg, or ° ′ ″)'}
                  </label>
                  <input
                    id={`${id}-${f}`}
                    className={INPUT}
                    value={custom[f]}
                    placeholder={f === 'name' ? 'Field 7' : f === 'ra' ? '14 15 39.7' : '+19 10 57'}
                    aria-invalid={customErr?.field === f || undefined}
                    onChange={(e) => setCustom({ ...custom, [f]: e.target.value })}
                  />
                </div>
              ))}
            </div>
            {customErr && (
              <p role="alert" className="text-xs text-danger-300">
                {customErr.message}
              </p>
            )}
            <Button variant="secondary" onClick={addCustom}>
              Add custom target
            </Button>
          </fieldset>
          {importer && <TargetsImport sceneId={importer.sceneId} beforeImport={importer.beforeImport} onImported={importer.onImported} />}
        </>
      )}
    </div>
  );
}
