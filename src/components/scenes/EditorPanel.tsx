/** The scene's fields: editors change them (autosaved), viewers and reviewers read them. */
import { keys, useEnvelopes, useSites } from '../../lib/client/queries';
import { useEffect, useState, useId } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { cameraSchema, LAYER_KEYS, type Camera, type LayerKey, type Layers } from '../../lib/contracts/scene-doc';
import { envelopeSchema } from '../../lib/contracts/envelope';
import type { SceneOut } from '../../lib/contracts/scene';
import { formatInZone, inputUtcToIso, isoToInputUtc } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { INPUT, LABEL, Labelled, NumberField, Section } from './controls';
import { TargetsEditor } from './TargetsEditor';
import { HorizonImport, SkylineProfile } from './HorizonImport';

/** Server round-trips the imports need: save pending edits first, then re-read the scene (new version). */
export interface SceneSync {
  flush: () => Promise<void>;
  reload: () => Promise<void>;
}
import { PinsEditor, type PinDraft } from './PinsEditor';

type Edit = (patch: Partial<SceneOut>) => void;

const LAYER_LABELS: Record<LayerKey, string> = {
  horizon: 'Horizon', equator: 'Celestial equator', ecliptic: 'Ecliptic', meridian: 'Meridian', primeVertical: 'Prime vertical',
  galactic: 'Galactic equator', altAzGrid: 'Altitude–azimuth grid', raDecGrid: 'RA/Dec grid', eclipticGrid: 'Ecliptic grid',
  referencePoints: 'Cardinal points, zenith, poles', stars: 'Stars', starLabels: 'Star names', bodies: 'Sun, Moon, planets',
  bodyLabels: 'Body names', envelope: 'Pointing envelope', targets: 'Targets', pins: 'Pins', comments: 'Comment markers', ground: 'Ground',
};

/** Sites are entered with the place search, the browser's location or typed coordinates (components/sites). */
export { SiteEditor as SiteForm, timeZones } from '../sites/SiteEditor';
import { SiteEditor as SiteForm } from '../sites/SiteEditor';

function SiteSection({ scene, edit, readOnly }: { scene: SceneOut; edit: Edit; readOnly: boolean }) {
  const id = useId();
  const sites = useSites(scene.teamId, !readOnly);
  const s = scene.site;
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm">
        <span className="font-medium">{s.name}</span>
        <span className="text-ink-300">
          {' '}
          · {s.lat.toFixed(4)}°, {s.lon.toFixed(4)}° · {s.height ?? 0} m · {s.timeZone}
        </span>
      </p>
      {!readOnly && (
        <>
          {(sites.data?.sites.length ?? 0) > 0 && (
            <Labelled id={`${id}-team`} label="Use a team site">
              <select
                id={`${id}-team`}
                className={INPUT}
                value=""
                onChange={(e) => {
                  const t = sites.data!.sites.find((x) => x.id === e.target.value);
                  if (t) edit({ site: { name: t.name, lat: t.lat, lon: t.lon, height: t.height, timeZone: t.timeZone } });
                }}
              >
                <option value="">Choose…</option>
                {sites.data!.sites.map((t) => (
                  <option key={t.id} value={t.id}>
                    {t.name}
                  </option>
                ))}
              </select>
            </Labelled>
          )}
          <SiteForm key={JSON.stringify(s)} value={s} onApply={(site) => edit({ site })} />
        </>
      )}
    </div>
  );
}

function TimeSection({ scene, edit, readOnly }: { scene: SceneOut; edit: Edit; readOnly: boolean }) {
  const id = useId();
  const [v, setV] = useState(isoToInputUtc(scene.time));
  const [err, setErr] = useState<string | null>(null);
  const [last, setLast] = useState(scene.time);
  if (last !== scene.time) {
    setLast(scene.time);
    setV(isoToInputUtc(scene.time));
  }
  const commit = (value: string) => {
    const iso = inputUtcToIso(value);
    if (!iso) return setErr('time: enter a date and time');
    setErr(null);
    if (iso !== scene.time) edit({ time: iso });
  };
  return (
    <Labelled id={`${id}-t`} label="Instant (UTC)">
      <div className="flex gap-2">
        <input id={`${id}-t`} type="datetime-local" className={INPUT} value={v} readOnly={readOnly} aria-invalid={err ? true : undefined} onChange={(e) => setV(e.target.value)} onBlur={(e) => !readOnly && commit(e.target.value)} onKeyDown={(e) => e.key === 'Enter' && commit(v)} />
        {!readOnly && (
          <Button variant="secondary" onClick={() => commit(new Date().toISOString().slice(0, 16))}>
            Now
          </Button>
        )}
      </div>
      <p className="text-xs text-ink-300">At the site: {formatInZone(scene.time, scene.site.timeZone ?? 'UTC')}</p>
      {err && <p className="text-xs text-danger-300">{err}</p>}
    </Labelled>
  );
}

function LayersSection({ layers, edit, readOnly }: { layers: Layers; edit: (l: Layers) => void; readOnly: boolean }) {
  return (
    <div className="flex flex-col gap-2">
      <div className="grid grid-cols-1 gap-1 sm:grid-cols-2">
        {LAYER_KEYS.map((k) => (
          <label key={k} className="flex items-center gap-2 text-sm">
            <input type="checkbox" className="h-4 w-4 accent-brass-400" checked={layers[k] ?? false} disabled={readOnly} onChange={(e) => edit({ ...layers, [k]: e.target.checked })} />
            {LAYER_LABELS[k]}
          </label>
        ))}
      </div>
      <NumberField label="Faintest star shown" suffix="V mag" value={layers.limitingMagnitude} min={-2} max={8} onCommit={(n) => !readOnly && edit({ ...layers, limitingMagnitude: n ?? 5.5 })} />
    </div>
  );
}

function CameraSection({ camera, edit, readOnly }: { camera: Camera; edit: (c: Camera) => void; readOnly: boolean }) {
  const id = useId();
  const set = (p: Partial<Camera>) => {
    const r = cameraSchema.safeParse({ ...camera, ...p });
    if (r.success) edit(r.data);
  };
  return (
    <div className="grid grid-cols-2 gap-2">
      <Labelled id={`${id}-mode`} label="View" className="col-span-2">
        <select id={`${id}-mode`} className={INPUT} value={camera.mode} disabled={readOnly} onChange={(e) => set({ mode: e.target.value as Camera['mode'] })}>
          <option value="observer">Observer view</option>
          <option value="sphere">Sphere view</option>
        </select>
      </Labelled>
      <NumberField label="Azimuth" suffix="°" value={camera.azDeg} min={0} max={360} onCommit={(n) => !readOnly && n !== undefined && set({ azDeg: n })} />
      <NumberField label="Altitude" suffix="°" value={camera.altDeg} min={-90} max={90} onCommit={(n) => !readOnly && n !== undefined && set({ altDeg: n })} />
      <NumberField label="Field of view" suffix="°" value={camera.fovDeg} min={5} max={150} onCommit={(n) => !readOnly && n !== undefined && set({ fovDeg: n })} />
    </div>
  );
}

const ENV_NUMBERS = [
  ['minAltitude', 'Lowest altitude', -90, 90],
  ['maxAltitude', 'Highest altitude', -90, 90],
  ['keyholeRadius', 'Zenith keyhole radius', 0, 90],
  ['sunAvoidance', 'Sun avoidance', 0, 180],
  ['moonAvoidance', 'Moon avoidance', 0, 180],
] as const;

function EnvelopeSection({ scene, edit, readOnly, sync }: { scene: SceneOut; edit: Edit; readOnly: boolean; sync?: SceneSync }) {
  const id = useId();
  const qc = useQueryClient();
  const list = useEnvelopes(scene.teamId);
  const [err, setErr] = useState<string | null>(null);
  const mode = scene.envelopeId ? 'team' : scene.envelope ? 'inline' : 'none';
  const env = (scene.envelope ?? { name: 'Inline envelope' }) as Record<string, unknown>;
  const setInline = (patch: Record<string, unknown>) => {
    const next = { ...env, ...patch };
    for (const k of Object.keys(next)) if (next[k] === undefined) delete next[k];
    const r = envelopeSchema.safeParse(next);
    if (!r.success) {
      const i = r.error.issues[0]!;
      return setErr(`${i.path.join('.') || 'envelope'}: ${i.message}`);
    }
    setErr(null);
    edit({ envelopeId: null, envelope: r.data });
  };
  const envs = list.data?.envelopes ?? [];
  return (
    <div className="flex flex-col gap-2">
      <Labelled id={`${id}-src`} label="Pointing envelope">
        <select
          id={`${id}-src`}
          className={INPUT}
          disabled={readOnly}
          value={scene.envelopeId ? `team:${scene.envelopeId}` : mode}
          onChange={(e) => {
            const v = e.target.value;
            if (v === 'none') edit({ envelopeId: null, envelope: null });
            else if (v === 'inline') edit({ envelopeId: null, envelope: envelopeSchema.parse({ ...env, name: String(env.name ?? 'Inline envelope') }) });
            else {
              const t = envs.find((x) => `team:${x.id}` === v);
              if (t) edit({ envelopeId: t.id, envelope: (t.data ?? { name: t.name }) as SceneOut['envelope'] });
            }
          }}
        >
          <option value="none">None</option>
          {envs.map((e) => (
            <option key={e.id} value={`team:${e.id}`}>
              Team: {e.name}
            </option>
          ))}
          {scene.envelopeId && !envs.some((e) => e.id === scene.envelopeId) && <option value={`team:${scene.envelopeId}`}>Team: {scene.envelope?.name ?? scene.envelopeId}</option>}
          <option value="inline">Inline (this scene only)</option>
        </select>
      </Labelled>
      {mode === 'team' && <p className="text-xs text-ink-300">Shared with the team: changes to it show in every scene that uses it.</p>}
      {mode !== 'none' && (
        <div className="grid grid-cols-2 gap-2">
          {mode === 'inline' && !readOnly ? (
            <>
              <Labelled id={`${id}-name`} label="Envelope name" className="col-span-2">
                <input id={`${id}-name`} className={INPUT} defaultValue={String(env.name ?? '')} onBlur={(e) => e.target.value !== env.name && setInline({ name: e.target.value })} />
              </Labelled>
              {ENV_NUMBERS.map(([k, label, min, max]) => (
                <NumberField key={k} label={label} suffix="°" value={env[k] as number | undefined} min={min} max={max} onCommit={(n) => setInline({ [k]: n })} />
              ))}
            </>
          ) : (
            <dl className="col-span-2 grid grid-cols-2 gap-x-3 text-sm">
              {ENV_NUMBERS.filter(([k]) => env[k] !== undefined).map(([k, label]) => (
                <div key={k} className="contents">
                  <dt className="text-ink-300">{label}</dt>
                  <dd>{String(env[k])}°</dd>
                </div>
              ))}
              {Array.isArray(env.horizonMask) && (
                <>
                  <dt className="text-ink-300">Horizon mask</dt>
                  <dd>{(env.horizonMask as unknown[]).length} points</dd>
                </>
              )}
            </dl>
          )}
        </div>
      )}
      {mode !== 'none' && (
        <div className="flex flex-col gap-1" aria-label="Horizon mask">
          <p className={LABEL}>Horizon mask</p>
          {readOnly ? (
            Array.isArray(env.horizonMask) && (env.horizonMask as unknown[]).length > 0 ? (
              <SkylineProfile mask={env.horizonMask as [number, number][]} title={`Horizon mask, ${(env.horizonMask as unknown[]).length} points`} />
            ) : (
              <p className="text-xs text-ink-300">No horizon mask.</p>
            )
          ) : (
            <HorizonImport
              key={scene.envelopeId ?? 'inline'}
              envelopeId={scene.envelopeId ?? null}
              currentMask={Array.isArray(env.horizonMask) ? (env.horizonMask as [number, number][]) : null}
              onApplyInline={(horizonMask) => setInline({ horizonMask })}
              onDone={async () => {
                await qc.invalidateQueries({ queryKey: keys.envelopes(scene.teamId) });
                await sync?.reload();
              }}
            />
          )}
        </div>
      )}
      {err && (
        <p role="alert" className="text-xs text-danger-300">
          {err}
        </p>
      )}
    </div>
  );
}

function TitleInput({ id, value, readOnly, onCommit }: { id: string; value: string; readOnly: boolean; onCommit: (v: string) => void }) {
  const [text, setText] = useState(value);
  const [err, setErr] = useState(false);
  useEffect(() => {
    setText((t) => (t.trim() === value ? t : value));
  }, [value]);
  return (
    <>
      <input
        id={id}
        className={INPUT}
        value={text}
        readOnly={readOnly}
        maxLength={200}
        aria-invalid={err || undefined}
        aria-describedby={err ? `${id}-err` : undefined}
        onChange={(e) => {
          setText(e.target.value);
          const t = e.target.value.trim();
          setErr(!t);
          if (t && t !== value) onCommit(t);
        }}
      />
      {err && (
        <p id={`${id}-err`} className="text-xs text-danger-300">
          Title: must not be empty (not saved)
        </p>
      )}
    </>
  );
}

export function EditorPanel(props: { scene: SceneOut; edit: Edit; readOnly: boolean; pinDraft: PinDraft | null; setPinDraft: (d: PinDraft | null) => void; sync?: SceneSync }) {
  const { scene, edit, readOnly, sync } = props;
  const id = useId();
  return (
    <div className="flex flex-col gap-3">
      {readOnly && <p className="rounded-md border border-ink-700 px-3 py-2 text-sm text-ink-300">Read-only: your role can look and comment, not edit.</p>}
      <Labelled id={`${id}-title`} label="Title">
        <TitleInput id={`${id}-title`} value={scene.title} readOnly={readOnly} onCommit={(title) => edit({ title })} />
      </Labelled>
      <Labelled id={`${id}-desc`} label="Description">
        <textarea id={`${id}-desc`} className={`${INPUT} min-h-20`} value={scene.description} readOnly={readOnly} onChange={(e) => edit({ description: e.target.value })} />
      </Labelled>
      <Section title="Site" defaultOpen={false}>
        <SiteSection scene={scene} edit={edit} readOnly={readOnly} />
      </Section>
      <Section title="Time">
        <TimeSection scene={scene} edit={edit} readOnly={readOnly} />
      </Section>
      <Section title={`Targets (${scene.targets.length})`}>
        <TargetsEditor
          targets={scene.targets}
          onChange={(targets) => edit({ targets })}
          readOnly={readOnly}
          importer={sync ? { sceneId: scene.id, beforeImport: sync.flush, onImported: async () => sync.reload() } : undefined}
        />
      </Section>
      <Section title={`Pins (${scene.pins.length})`} defaultOpen={!!props.pinDraft}>
        <PinsEditor pins={scene.pins} onChange={(pins) => edit({ pins })} readOnly={readOnly} draft={props.pinDraft} setDraft={props.setPinDraft} />
      </Section>
      <Section title="Layers">
        <LayersSection layers={scene.layers} edit={(layers) => edit({ layers })} readOnly={readOnly} />
      </Section>
      <Section title="Camera">
        <CameraSection camera={scene.camera} edit={(camera) => edit({ camera })} readOnly={readOnly} />
      </Section>
      <Section title="Envelope">
        <EnvelopeSection scene={scene} edit={edit} readOnly={readOnly} sync={sync} />
      </Section>
    </div>
  );
}
