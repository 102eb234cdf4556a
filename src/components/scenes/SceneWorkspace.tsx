/**
 * /scenes/[id]: the sky fills the page, the editor (scene, steps, review, share, history) is a drawer
 * beside it. Editors' changes are autosaved with the version they were based on; a 409 opens the
 * conflict choice. Present opens the stage; following a presenter shows the audience's stage.
 */
import { useMembers } from '../../lib/client/queries';
import { useCallback, useEffect, useMemo, useState, useSyncExternalStore } from 'react';
import { QueryRoot } from '../ui/QueryRoot';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { ApiError, apiGet, apiPatch, errorText, request, readError } from '../../lib/client/api';
import { Autosave, type SaveFn } from '../../lib/client/autosave';
import type { Anchor, CommentOut } from '../../lib/contracts/comment';
import type { Role } from '../../lib/contracts/roles';
import type { SceneOut } from '../../lib/contracts/scene';
import { anchorFromPick, commentMarkers, pinPointFromPick, sceneAtStep, toSceneLike, type SceneLike } from '../../lib/client/scene-view';
import { sameValue } from '../../lib/client/scene-diff';
import { EditorPanel, type SceneSync } from './EditorPanel';
import { ExportPanel } from './ExportPanel';
import type { PinDraft } from './PinsEditor';
import { ConflictDialog } from './ConflictDialog';
import { VersionHistory } from './VersionHistory';
import { SharePanel } from './SharePanel';
import { SaveBadge, Section, Tabs } from './controls';
import { can } from '../../lib/contracts/roles';
import { Sky, shrinkPng, type PickedPoint } from './Sky';
import { StepsEditor } from '../briefing/StepsEditor';
import { AudienceStage, FollowBadge, Presenter, useFollow } from '../briefing/Presenter';
import { SkyWorkspace } from '../stage/SkyWorkspace';
import { Composer, ReviewPanel, useComments, type ReviewAccess } from '../review/ReviewPanel';
import { NightPanel } from '../night/NightPanel';
import { chartComments, nightRevision } from '../night/mount';

type Tab = 'scene' | 'steps' | 'review' | 'share' | 'history';

export interface WorkspaceProps {
  scene: SceneOut;
  role: Role;
  userId: string;
}

function Workspace({ scene: initial, role }: WorkspaceProps) {
  const canEdit = can(role, 'scene.write');
  const canComment = can(role, 'scene.comment');
  const saver = useMemo(() => {
    const save: SaveFn = async (body) => {
      try {
        const r = await apiPatch<{ scene: SceneOut }>(`/api/scenes/${initial.id}`, body);
        return { kind: 'ok', scene: r.scene };
      } catch (e) {
        if (e instanceof ApiError && e.status === 409 && (e.body as { scene?: SceneOut })?.scene) return { kind: 'conflict', scene: (e.body as { scene: SceneOut }).scene };
        throw e;
      }
    };
    return new Autosave(initial, save, 800);
  }, [initial]);
  useEffect(() => () => saver.dispose(), [saver]);
  const st = useSyncExternalStore(saver.subscribe, saver.get, saver.get);
  const scene = st.local;
  const edit = useCallback((p: Partial<SceneOut>) => canEdit && saver.edit(p), [canEdit, saver]);
  // Imports change the scene on the server: save pending edits first, then re-read it (new version) so
  // autosave continues from the server's version instead of running into a conflict.
  const sync = useMemo<SceneSync>(
    () => ({
      flush: () => saver.flush(),
      reload: async () => {
        const r = await apiGet<{ scene: SceneOut }>(`/api/scenes/${encodeURIComponent(initial.id)}`);
        saver.adopt(r.scene);
      },
    }),
    [saver, initial.id],
  );

  // Leaving with unsaved edits: flush and warn.
  useEffect(() => {
    const h = (e: BeforeUnloadEvent) => {
      if (saver.get().dirty.length) {
        void saver.flush();
        e.preventDefault();
      }
    };
    window.addEventListener('beforeunload', h);
    return () => window.removeEventListener('beforeunload', h);
  }, [saver]);

  const [tab, setTab] = useState<Tab>(() => (typeof location !== 'undefined' && location.hash.startsWith('#comment-') ? 'review' : 'scene'));
  const [pinDraft, setPinDraft] = useState<PinDraft | null>(null);
  const [picking, setPicking] = useState(false);
  const [anchor, setAnchor] = useState<Anchor | null>(null);
  const [shownStep, setShownStep] = useState<string | null>(null);
  const [presenting, setPresenting] = useState<number | null>(null);
  const [following, setFollowing] = useState(false);
  const [snap, setSnap] = useState<string | null>(null);
  const [snapMsg, setSnapMsg] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const [focusedComment, setFocusedComment] = useState<string | null>(null);

  const members = useMembers(scene.teamId);
  const memberNames = useMemo(() => new Map((members.data?.members ?? []).map((m) => [m.userId, m.name])), [members.data]);
  const access: ReviewAccess = { kind: 'member', sceneId: scene.id, canComment, canResolve: canComment };
  const comments = useComments(access);
  const markers = useMemo(() => commentMarkers(comments.data ?? []), [comments.data]);
  const follow = useFollow(following ? `/api/scenes/${scene.id}/presenter/stream` : null);

  const like = toSceneLike(scene);
  const followedStep = following && follow.state ? scene.steps[follow.state.stepIndex] : undefined;
  const viewScene: SceneLike = following && follow.state ? sceneAtStep(like, followedStep, follow.state.time) : shownStep ? sceneAtStep(like, scene.steps.find((s) => s.id === shownStep)) : like;
  const viewEditable = canEdit && !shownStep && !following;
  // The view's instant shared by the sphere and the night charts (null: the scene's or the step's time).
  const [viewMs, setViewMs] = useState<number | null>(null);
  useEffect(() => setViewMs(null), [viewScene.time]);
  const skyScene = viewMs !== null ? { ...viewScene, time: new Date(viewMs).toISOString() } : viewScene;
  const onNightCursor = (t: number, done: boolean) => {
    setViewMs(t);
    if (done && viewEditable) edit({ time: new Date(Math.round(t / 1000) * 1000).toISOString().replace('.000Z', 'Z') });
  };

  const onPick = (p: PickedPoint) => {
    if (pinDraft) {
      const pt = pinPointFromPick(p, pinDraft.frame);
      if (pt) setPinDraft({ ...pinDraft, points: [...pinDraft.points, pt] });
      return;
    }
    if (picking) {
      setAnchor(anchorFromPick(p));
      setPicking(false);
      setTab('review');
    }
  };
  const onViewChange = (s: SceneLike) => {
    const patch: Partial<SceneOut> = {};
    if (s.time && s.time !== scene.time) patch.time = s.time;
    if (s.camera && !sameValue(s.camera, scene.camera)) patch.camera = { ...scene.camera, ...s.camera };
    if (s.layers && !sameValue(s.layers, scene.layers)) patch.layers = s.layers;
    if (Object.keys(patch).length) edit(patch);
  };
  const saveThumbnail = async () => {
    if (!snap) return;
    setSnapMsg(null);
    try {
      const small = await shrinkPng(snap);
      const blob = await (await fetch(small)).blob();
      const r = await request(`/api/scenes/${scene.id}/thumbnail`, { method: 'PUT', body: blob, headers: { 'content-type': 'image/png' } });
      if (r.status === 404 || r.status === 405) {
        // Older server: the thumbnail travels with a PATCH as a data URL.
        await saver.flush();
        const out = await apiPatch<{ scene: SceneOut }>(`/api/scenes/${scene.id}`, { version: saver.version, thumbnail: small });
        saver.adopt(out.scene);
      } else if (!r.ok) throw await readError(r);
      setSnapMsg({ tone: 'success', text: 'Thumbnail saved.' });
      setSnap(null);
    } catch (e) {
      setSnapMsg({ tone: 'error', text: `Thumbnail not saved: ${errorText(e)}` });
    }
  };

  const tabs: { key: Tab; label: string }[] = [
    { key: 'scene', label: canEdit ? 'Scene' : 'Details' },
    { key: 'steps', label: `Steps (${scene.steps.length})` },
    { key: 'review', label: `Review${markers.length ? ` (${(comments.data ?? []).filter((c) => !c.parentId && !c.resolved).length})` : ''}` },
    ...(canEdit ? [{ key: 'share' as const, label: 'Share' }] : []),
    { key: 'history', label: 'History' },
  ];

  const strip = (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
      <a href={`/dashboard?team=${encodeURIComponent(scene.teamId)}`} className="text-sm text-ink-300 underline hover:text-brass-200">
        ← Dashboard
      </a>
      <h1 className="min-w-0 max-w-full truncate text-xl font-bold" data-testid="scene-title">
        {scene.title}
      </h1>
      <span className="text-xs uppercase tracking-[0.15em] text-ink-300">your role: {role}</span>
      {canEdit && <SaveBadge status={st.status} version={saver.version} />}
      {st.status === 'error' && (
        <Button variant="secondary" className="px-3 py-1.5" onClick={() => saver.retry()}>
          Retry save
        </Button>
      )}
      {scene.steps.length > 0 && (
        <Button variant="secondary" className="px-3 py-1.5" onClick={() => setPresenting(0)} data-testid="present-top">
          Start presenting
        </Button>
      )}
      {following ? (
        <FollowBadge connected={follow.connected} ended={follow.ended} onStop={() => setFollowing(false)} />
      ) : (
        <Button variant="secondary" className="px-3 py-1.5" onClick={() => setFollowing(true)}>
          Follow presenter
        </Button>
      )}
    </div>
  );

  const sky = (
    <div className="flex h-full min-h-0 flex-col gap-1">
      {st.message && st.status === 'error' && <Alert tone="error">Not saved: {st.message}</Alert>}
      {(picking || pinDraft) && (
        <div role="status" className="rounded-md border border-brass-500/60 bg-brass-500/10 px-3 py-1.5 text-sm text-brass-200">
          {pinDraft ? 'Click on the sky to place the pin’s points.' : 'Click on the sky where your comment belongs.'}{' '}
          <button type="button" className="underline" onClick={() => (pinDraft ? setPinDraft(null) : setPicking(false))}>
            Cancel
          </button>
        </div>
      )}
      {shownStep && (
        <p className="text-sm text-brass-200">
          Showing a step.{' '}
          <button type="button" className="underline" onClick={() => setShownStep(null)}>
            Back to the scene
          </button>
        </p>
      )}
      <div className="min-h-0 flex-1">
        <Sky scene={skyScene} edit={viewEditable} onChange={onViewChange} comments={markers} onPick={onPick} onSnapshot={canEdit ? setSnap : undefined} onTimeChange={setViewMs} />
      </div>
    </div>
  );

  const drawer = (
    <>
      {canEdit && snap && (
        <div className="flex flex-wrap items-center gap-2 rounded border border-ink-700 p-2 text-sm">
          <img src={snap} alt="The snapshot just taken" className="h-16 rounded border border-ink-700" />
          <Button onClick={() => void saveThumbnail()}>Save snapshot as thumbnail</Button>
          <Button variant="ghost" onClick={() => setSnap(null)}>
            Dismiss
          </Button>
        </div>
      )}
      {snapMsg && <Alert tone={snapMsg.tone}>{snapMsg.text}</Alert>}
      <Tabs label="Scene panels" tabs={tabs} current={tab} onChange={setTab} />
      <div role="tabpanel" aria-label={tabs.find((t) => t.key === tab)?.label}>
        {tab === 'scene' && <EditorPanel scene={scene} edit={edit} readOnly={!canEdit} pinDraft={pinDraft} setPinDraft={setPinDraft} sync={canEdit ? sync : undefined} />}
        {tab === 'steps' && <StepsEditor scene={scene} onChange={(steps) => edit({ steps })} readOnly={!canEdit} onPresent={(i) => setPresenting(i)} onShowStep={setShownStep} shownStepId={shownStep} />}
        {tab === 'review' && (
          <ReviewPanel
            access={access}
            steps={scene.steps}
            anchor={anchor}
            onPick={() => setPicking(true)}
            onClearAnchor={() => setAnchor(null)}
            focusedId={focusedComment}
            onFocus={(c: CommentOut) => setFocusedComment(c.id)}
          />
        )}
        {tab === 'share' && canEdit && <SharePanel sceneId={scene.id} title={scene.title} />}
        {tab === 'history' && <VersionHistory scene={{ ...scene, version: saver.version }} canRestore={canEdit} memberNames={memberNames} onRestored={(s) => saver.adopt(s)} />}
      </div>
      <Section title="Export & print">
        <ExportPanel source={{ kind: 'scene', id: scene.id }} time={viewScene.time} />
      </Section>
    </>
  );

  const night = (
    <div className="px-3 pb-6 pt-2" data-testid="night-section">
      <Section title="Night: altitude over time, sky coverage, figures" defaultOpen>
      <NightPanel
        source={{ kind: 'scene', id: scene.id }}
        timeZone={scene.site.timeZone ?? 'UTC'}
        revision={nightRevision(scene)}
        cursor={viewMs ?? Date.parse(viewScene.time)}
        onCursor={onNightCursor}
        comments={chartComments(comments.data ?? [])}
        composer={canComment ? (anchor, done) => <Composer access={access} steps={scene.steps} anchor={anchor} onDone={done} label="Comment on the chart" /> : undefined}
      />
    </Section>    </div>
  );

  return (
    <>
      {st.status === 'conflict' && st.theirs && (
        <ConflictDialog mine={scene} theirs={st.theirs} dirty={st.dirty} onKeepMine={() => void saver.keepMine()} onTakeTheirs={() => saver.takeTheirs()} />
      )}
      <SkyWorkspace strip={strip} sky={sky} drawer={drawer} drawerLabel={canEdit ? 'Editor' : 'Scene panels'} sheet={{ label: 'Night', content: night }} />
      {presenting !== null && (
        <Presenter scene={like} startIndex={presenting} onClose={() => setPresenting(null)} broadcastUrl={canEdit ? `/api/scenes/${scene.id}/presenter` : null} renderSky={(s) => <Sky scene={s} chrome="stage" />} />
      )}
      {presenting === null && following && follow.state && (
        <AudienceStage scene={like} state={follow.state} connected={follow.connected} ended={follow.ended} onStop={() => setFollowing(false)} renderSky={(s) => <Sky scene={s} chrome="stage" />} />
      )}
    </>
  );
}

export default function SceneWorkspace(props: WorkspaceProps) {
  return (
    <QueryRoot>
      <Workspace {...props} />
    </QueryRoot>
  );
}
