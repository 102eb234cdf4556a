/** /scenes/new: a blank scene, one from a team site, or a copy of an existing scene. */
import { useScenes, useSites } from '../../lib/client/queries';
import { useId, useRef, useState, useSyncExternalStore } from 'react';
import { useMutation } from '@tanstack/react-query';
import { QueryRoot } from '../ui/QueryRoot';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { apiPost, errorText } from '../../lib/client/api';
import type { SceneOut } from '../../lib/contracts/scene';
import { inputUtcToIso } from '../../lib/client/scene-view';
import type { Site } from '../../lib/contracts/scene-doc';
import { SiteForm } from './EditorPanel';
import { INPUT, LABEL, Labelled } from './controls';
import { SceneFileImport } from './SceneFileImport';
import { useKeepEarlyInput } from '../ui/early-input';

const noSubscription = () => () => {};

type Mode = 'blank' | 'site' | 'copy';
interface TeamLite {
  id: string;
  name: string;
}

function NewScene({ teams, initialTeamId, fromSceneId }: { teams: TeamLite[]; initialTeamId: string | null; fromSceneId: string | null }) {
  const id = useId();
  const [teamId, setTeamId] = useState(initialTeamId ?? teams[0]?.id ?? '');
  const [mode, setMode] = useState<Mode>(fromSceneId ? 'copy' : 'blank');
  const [title, setTitle] = useState('');
  const [time, setTime] = useState(() => new Date(Math.round(Date.now() / 3.6e6) * 3.6e6).toISOString().slice(0, 16));
  const [site, setSite] = useState<Site | null>(null);
  const [siteId, setSiteId] = useState('');
  const [copyOf, setCopyOf] = useState(fromSceneId ?? '');
  const [err, setErr] = useState<string | null>(null);
  // What was typed or chosen while the page was still plain HTML is kept (ui/early-input.ts); the submit
  // button waits for the form to be live (before that it would send the page a plain GET and lose it all).
  const formRef = useRef<HTMLFormElement>(null);
  useKeepEarlyInput(formRef, (name, v) => {
    if (name === 'title') setTitle(v);
    else if (name === 'time') setTime(v);
    else if (name === 'mode' && (v === 'blank' || v === 'site' || v === 'copy')) setMode(v);
    else if (name === 'teamId') setTeamId(v);
    else if (name === 'siteId') setSiteId(v);
    else if (name === 'fromSceneId') setCopyOf(v);
  });
  const live = useSyncExternalStore(noSubscription, () => true, () => false);
  const sites = useSites(teamId, !!teamId);
  const scenes = useScenes(teamId, !!teamId);
  const create = useMutation({
    mutationFn: () => {
      const iso = inputUtcToIso(time);
      const body: Record<string, unknown> = { teamId };
      if (title.trim()) body.title = title.trim();
      if (mode === 'copy') {
        if (!copyOf) throw new Error('Scene to copy: choose one');
        body.fromSceneId = copyOf;
        if (!title.trim()) delete body.title;
      } else {
        if (!title.trim()) throw new Error('Title: must not be empty');
        if (!iso) throw new Error('Time: enter a date and time');
        body.time = iso;
        if (mode === 'site') {
          if (!siteId) throw new Error('Site: choose one of the team’s sites');
          body.siteId = siteId;
        } else {
          if (!site) throw new Error('Site: fill in the site and press “Use this site”');
          body.site = site;
        }
      }
      return apiPost<{ scene: SceneOut }>('/api/scenes', body);
    },
    onSuccess: (r) => location.assign(`/scenes/${encodeURIComponent(r.scene.id)}`),
    onError: (e) => setErr(errorText(e)),
  });
  if (!teams.length) return <Alert tone="info">You need the editor role in a team to create scenes.</Alert>;
  return (
    <>
    <form
      ref={formRef}
      className="flex max-w-2xl flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        setErr(null);
        create.mutate();
      }}
    >
      {teams.length > 1 && (
        <Labelled id={`${id}-team`} label="Team">
          <select id={`${id}-team`} name="teamId" className={INPUT} value={teamId} onChange={(e) => setTeamId(e.target.value)}>
            {teams.map((t) => (
              <option key={t.id} value={t.id}>
                {t.name}
              </option>
            ))}
          </select>
        </Labelled>
      )}
      <fieldset className="flex flex-col gap-2">
        <legend className={`${LABEL} mb-1`}>Start from</legend>
        {(
          [
            ['blank', 'A blank scene (enter a site)'],
            ['site', 'One of the team’s sites'],
            ['copy', 'A copy of an existing scene'],
          ] as const
        ).map(([m, label]) => (
          <label key={m} className="flex items-center gap-2 text-sm">
            <input type="radio" name="mode" value={m} checked={mode === m} onChange={() => setMode(m)} className="accent-brass-400" />
            {label}
          </label>
        ))}
      </fieldset>
      <Labelled id={`${id}-title`} label={<>Title{mode === 'copy' ? ' (optional: defaults to the copied title)' : ''}</>}>
        <input id={`${id}-title`} name="title" className={INPUT} value={title} maxLength={200} onChange={(e) => setTitle(e.target.value)} />
      </Labelled>
      {mode !== 'copy' && (
        <Labelled id={`${id}-time`} label="Instant (UTC)">
          <input id={`${id}-time`} name="time" type="datetime-local" className={INPUT} value={time} onChange={(e) => setTime(e.target.value)} />
        </Labelled>
      )}
      {mode === 'site' && (
        <Labelled id={`${id}-site`} label="Site">
          <select id={`${id}-site`} name="siteId" className={INPUT} value={siteId} onChange={(e) => setSiteId(e.target.value)}>
            <option value="">Choose…</option>
            {(sites.data?.sites ?? []).map((s) => (
              <option key={s.id} value={s.id}>
                {s.name} ({s.lat.toFixed(3)}°, {s.lon.toFixed(3)}°)
              </option>
            ))}
          </select>
          {sites.isError && <p className="text-xs text-danger-300">{errorText(sites.error)}</p>}
        </Labelled>
      )}
      {mode === 'blank' && (
        <div className="rounded border border-ink-700 p-3">
          <SiteForm value={site ?? { name: '', lat: 0, lon: 0, height: 0, timeZone: 'UTC' }} onApply={setSite} submitLabel="Use this site" />
          {site && <p className="mt-2 text-xs text-ok-300">Site set: {site.name}</p>}
        </div>
      )}
      {mode === 'copy' && (
        <Labelled id={`${id}-copy`} label="Scene to copy">
          <select id={`${id}-copy`} name="fromSceneId" className={INPUT} value={copyOf} onChange={(e) => setCopyOf(e.target.value)}>
            <option value="">Choose…</option>
            {(scenes.data?.scenes ?? []).map((s) => (
              <option key={s.id} value={s.id}>
                {s.title}
              </option>
            ))}
          </select>
        </Labelled>
      )}
      {err && <Alert tone="error">{err}</Alert>}
      <div>
        <Button type="submit" busy={create.isPending} disabled={!live}>
          Create scene
        </Button>
      </div>
    </form>
    <SceneFileImport teamId={teamId} teamName={teams.find((t) => t.id === teamId)?.name ?? ''} />
    </>
  );
}

export default function SceneNew(props: { teams: TeamLite[]; initialTeamId: string | null; fromSceneId: string | null }) {
  return (
    <QueryRoot>
      <NewScene {...props} />
    </QueryRoot>
  );
}
