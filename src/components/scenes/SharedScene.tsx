/**
 * What a share link opens: the scene read-only with the sky filling the page, its steps in a drawer (after
 * the sky on a phone), follow the presenter (the audience's stage), and for reviewer links comments.
 */
import { useChartComments, useSharedScene } from '../../lib/client/queries';
import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import { QueryRoot } from '../ui/QueryRoot';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { ApiError, errorText } from '../../lib/client/api';
import type { Anchor } from '../../lib/contracts/comment';
import { anchorFromPick, commentMarkers, formatInZone, sceneAtStep, toSceneLike } from '../../lib/client/scene-view';
import { Sky, type PickedPoint } from './Sky';
import { afterFirstFrame } from '../sphere/sky-adapter';
import { Section, Tabs } from './controls';
import { ExportPanel } from './ExportPanel';
import { AudienceStage, FollowBadge, useFollow } from '../briefing/Presenter';
import { SkyWorkspace } from '../stage/SkyWorkspace';
import { Markdown, preloadMarkdown } from '../briefing/Markdown';
import { useComments, type ReviewAccess } from '../review/comments';
import { chartComments, nightRevision } from '../night/mount';

/** Only reviewer links show it: a chunk of its own, so a viewer link's first frame does not wait for it. */
const ReviewPanel = lazy(() => import('../review/ReviewPanel').then((m) => ({ default: m.ReviewPanel })));
const ChartComposer = lazy(() => import('../review/ReviewPanel').then((m) => ({ default: m.Composer })));
/** Below the sky, with its charting code: a chunk of its own, fetched once the sky has drawn its first frame. */
const NightPanel = lazy(() => afterFirstFrame().then(() => import('../night/NightPanel')).then((m) => ({ default: m.NightPanel })));

function Shared({ token, embed }: { token: string; embed: boolean }) {
  const q = useSharedScene(token);
  const [following, setFollowing] = useState(false);
  const [stepIdx, setStepIdx] = useState<number | null>(null);
  const [picking, setPicking] = useState(false);
  const [anchor, setAnchor] = useState<Anchor | null>(null);
  // The view's instant shared by the sphere and the night charts, for the scene/step time it was set against.
  const [view, setView] = useState<{ ms: number; base: string } | null>(null);
  const [tab, setTab] = useState<'steps' | 'review' | 'about'>(() => (typeof location !== 'undefined' && location.hash.startsWith('#comment-') ? 'review' : 'steps'));
  const reviewer = q.data?.role === 'reviewer' && !embed;
  const access: ReviewAccess = { kind: 'guest', token, canComment: true };
  const comments = useComments(access, reviewer);
  // viewer links: only the comments pinned to the altitude chart, which are shown to everyone
  const pins = useChartComments(token, !!q.data && !reviewer && !embed);
  const markers = useMemo(() => (reviewer ? commentMarkers(comments.data ?? []) : []), [reviewer, comments.data]);
  const follow = useFollow(following ? `/api/shared/${encodeURIComponent(token)}/presenter/stream` : null);
  // Captions and comments are Markdown: its renderer is fetched once the sky has drawn its first frame.
  useEffect(() => {
    if (!embed) void afterFirstFrame().then(preloadMarkdown);
  }, [embed]);

  if (q.isPending) return <p className="p-4 text-sm text-ink-300">Loading the scene…</p>;
  if (q.isError)
    return (
      <div className="p-4">
        <Alert tone="error">{q.error instanceof ApiError && q.error.status === 404 ? 'This link does not exist, has expired or was revoked.' : errorText(q.error)}</Alert>
      </div>
    );
  const { scene } = q.data;
  if (embed && q.data.role !== 'viewer') return <Alert tone="error">Only viewer links can be embedded.</Alert>;
  const like = toSceneLike(scene);
  const idx = following && follow.state ? follow.state.stepIndex : stepIdx;
  const step = idx !== null ? scene.steps[idx] : undefined;
  const shown = following && follow.state ? sceneAtStep(like, step, follow.state.time) : sceneAtStep(like, step);
  const viewMs = view && view.base === shown.time ? view.ms : null;
  const skyScene = viewMs !== null ? { ...shown, time: new Date(viewMs).toISOString() } : shown;
  const setViewMs = (ms: number) => setView({ ms, base: shown.time });
  const onPick = (p: PickedPoint) => {
    if (!picking) return;
    setAnchor(anchorFromPick(p));
    setPicking(false);
    setTab('review');
  };

  const followCtl = following ? (
    <FollowBadge connected={follow.connected} ended={follow.ended} onStop={() => setFollowing(false)} />
  ) : (
    <Button variant="secondary" onClick={() => setFollowing(true)}>
      Follow presenter
    </Button>
  );

  if (embed) {
    return (
      <div className="flex h-screen flex-col">
        <div className="min-h-0 flex-1">
          <Sky scene={shown} chrome="stage" />
        </div>
        <div className="flex h-12 items-center justify-between gap-2 border-t border-ink-800 px-3 text-xs">
          <span className="truncate">
            {scene.title} · {step ? `Step ${(idx ?? 0) + 1}: ${step.title}` : scene.site.name}
          </span>
          <span className="flex items-center gap-2">
            {followCtl}
            <a href={`/s/${encodeURIComponent(token)}`} target="_blank" rel="noopener" className="text-brass-300 underline">
              Open in Armilla
            </a>
          </span>
        </div>
      </div>
    );
  }

  const strip = (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
      <h1 className="min-w-0 max-w-full truncate text-xl font-bold">{scene.title}</h1>
      <span className="text-sm text-ink-300">
        {scene.site.name} · {formatInZone(scene.time, scene.site.timeZone ?? 'UTC')}
      </span>
      <span className="text-xs uppercase tracking-[0.15em] text-ink-300">{q.data.role === 'reviewer' ? 'you may comment' : 'read-only'}</span>
      {followCtl}
    </div>
  );

  const sky = (
    <div className="flex h-full min-h-0 flex-col gap-1">
      {picking && (
        <div role="status" className="rounded-md border border-brass-500/60 bg-brass-500/10 px-3 py-1.5 text-sm text-brass-200">
          Click on the sky where your comment belongs.{' '}
          <button type="button" className="underline" onClick={() => setPicking(false)}>
            Cancel
          </button>
        </div>
      )}
      <div className="min-h-0 flex-1">
        <Sky scene={skyScene} comments={markers} onPick={onPick} onTimeChange={setViewMs} />
      </div>
    </div>
  );

  const drawer = (
    <>
      {step && (
        <section aria-label="Step shown" className="rounded border border-ink-700 p-3" data-testid="shared-step-caption">
          <p className="text-xs uppercase tracking-[0.15em] text-brass-300">
            Step {(idx ?? 0) + 1} of {scene.steps.length}
            {step.title ? ` · ${step.title}` : ''}
          </p>
          {step.caption && <Markdown source={step.caption} className="mt-1" />}
        </section>
      )}
      <Tabs
        label="Shared scene panels"
        current={tab}
        onChange={setTab}
        tabs={[{ key: 'steps', label: `Steps (${scene.steps.length})` }, ...(reviewer ? [{ key: 'review' as const, label: 'Comments' }] : []), { key: 'about', label: 'About' }]}
      />
      <div role="tabpanel">
        {tab === 'steps' && (
          <ol className="flex flex-col gap-2" aria-label="Steps">
            {scene.steps.length === 0 && <li className="text-sm text-ink-300">This scene has no steps.</li>}
            {scene.steps.map((s, i) => (
              <li key={s.id}>
                <button
                  type="button"
                  disabled={following}
                  aria-pressed={idx === i}
                  onClick={() => setStepIdx(stepIdx === i ? null : i)}
                  className="w-full rounded border border-ink-700 p-2 text-left text-sm hover:border-brass-300 aria-pressed:border-brass-400 disabled:opacity-60"
                >
                  <span className="font-medium">
                    {i + 1}. {s.title || 'Untitled step'}
                  </span>
                  <span className="block text-xs text-ink-300">{formatInZone(s.time, scene.site.timeZone ?? 'UTC')}</span>
                </button>
              </li>
            ))}
          </ol>
        )}
        {tab === 'review' && reviewer && (
          <Suspense fallback={<p className="text-sm text-ink-300">Loading comments…</p>}>
            <ReviewPanel access={access} steps={scene.steps} anchor={anchor} onPick={() => setPicking(true)} onClearAnchor={() => setAnchor(null)} />
          </Suspense>
        )}
        {tab === 'about' && (
          <div className="flex flex-col gap-3">
            {scene.description ? <Markdown source={scene.description} className="text-sm text-ink-300" /> : <p className="text-sm text-ink-300">No description.</p>}
            <Section title="Export & print">
              <ExportPanel source={{ kind: 'shared', token }} time={shown.time} />
            </Section>
          </div>
        )}
      </div>
    </>
  );

  const night = (
    <div className="px-3 pb-6 pt-2" data-testid="night-section">
      <Section title="Night: altitude over time, sky coverage, figures" defaultOpen>
      <Suspense fallback={<p className="text-sm text-ink-300">Loading the night…</p>}>
      <NightPanel
        source={{ kind: 'shared', token }}
        timeZone={scene.site.timeZone ?? 'UTC'}
        revision={nightRevision(scene)}
        cursor={viewMs ?? Date.parse(shown.time)}
        onCursor={(t) => setViewMs(t)}
        comments={reviewer ? chartComments(comments.data ?? []) : (pins.data ?? [])}
        composer={
          reviewer
            ? (anchor, done) => (
                <Suspense fallback={<p className="text-sm text-ink-300">Loading the comment form…</p>}>
                  <ChartComposer access={access} steps={scene.steps} anchor={anchor} onDone={done} label="Comment on the chart" />
                </Suspense>
              )
            : undefined
        }
      />
      </Suspense>
    </Section>
    </div>
  );

  return (
    <>
      <SkyWorkspace strip={strip} sky={sky} drawer={drawer} drawerLabel="Steps and details" sheet={{ label: 'Night', content: night }} />
      {following && follow.state && (
        <AudienceStage scene={like} state={follow.state} connected={follow.connected} ended={follow.ended} onStop={() => setFollowing(false)} renderSky={(s) => <Sky scene={s} chrome="stage" />} />
      )}
    </>
  );
}

export default function SharedScene(props: { token: string; embed?: boolean }) {
  return (
    <QueryRoot>
      <Shared token={props.token} embed={!!props.embed} />
    </QueryRoot>
  );
}
