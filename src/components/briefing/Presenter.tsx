/**
 * Presenter mode: the stage (see ../stage/Stage.tsx) full screen (Fullscreen API), → / PageDown / Space
 * next, ← / PageUp previous, Esc leaves. Each move is POSTed so followers see it; the sky's time eases
 * from one step to the next and the camera turns. Follow mode: the audience's stage follows the
 * presenter's server-sent events.
 */
import { useCallback, useEffect, useRef, useState, type ReactNode } from 'react';
import type { PresenterOut } from '../../lib/contracts/presenter';
import { apiPost } from '../../lib/client/api';
import { sceneAtStep, type SceneLike } from '../../lib/client/scene-view';
import { Stage, STAGE_BUTTON } from '../stage/Stage';
import { NightModeButton } from '../ui/NightMode';

/** Eases an ISO time toward `target` over `ms` (a few updates, not per frame). */
export function useEasedTime(target: string, ms = 1200): string {
  const [shown, setShown] = useState(target);
  const from = useRef(target);
  useEffect(() => {
    const a = Date.parse(from.current);
    const b = Date.parse(target);
    if (!Number.isFinite(a) || !Number.isFinite(b) || a === b || Math.abs(b - a) > 3 * 86400e3) {
      from.current = target;
      setShown(target);
      return;
    }
    const t0 = performance.now();
    let raf = 0;
    let lastStep = -1;
    const tick = () => {
      const u = Math.min(1, (performance.now() - t0) / ms);
      const step = Math.round(u * 24);
      if (step !== lastStep) {
        lastStep = step;
        const e = u < 0.5 ? 2 * u * u : 1 - Math.pow(-2 * u + 2, 2) / 2;
        const iso = new Date(a + (b - a) * e).toISOString();
        from.current = iso;
        setShown(u >= 1 ? target : iso);
      }
      if (u < 1) raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [target, ms]);
  return shown;
}

export function useClock(): Date {
  const [now, setNow] = useState(() => new Date());
  useEffect(() => {
    const t = setInterval(() => setNow(new Date()), 1000);
    return () => clearInterval(t);
  }, []);
  return now;
}

export function Presenter({ scene, startIndex, onClose, broadcastUrl, renderSky }: { scene: SceneLike; startIndex: number; onClose: () => void; broadcastUrl: string | null; renderSky: (s: SceneLike) => ReactNode }) {
  const box = useRef<HTMLDivElement>(null);
  const [index, setIndex] = useState(Math.min(startIndex, Math.max(0, scene.steps.length - 1)));
  const [broadcastError, setBroadcastError] = useState<string | null>(null);
  const step = scene.steps[index];
  const shownTime = useEasedTime(step?.time ?? scene.time);
  const go = useCallback((d: number) => setIndex((i) => Math.max(0, Math.min(scene.steps.length - 1, i + d))), [scene.steps.length]);

  useEffect(() => {
    const el = box.current;
    if (el && document.fullscreenEnabled && !document.fullscreenElement) el.requestFullscreen().catch(() => undefined);
    el?.focus();
    const onFs = () => {
      if (!document.fullscreenElement) onClose();
    };
    document.addEventListener('fullscreenchange', onFs);
    return () => {
      document.removeEventListener('fullscreenchange', onFs);
      if (document.fullscreenElement) document.exitFullscreen().catch(() => undefined);
    };
  }, [onClose]);

  useEffect(() => {
    if (!broadcastUrl) return;
    apiPost(broadcastUrl, { stepIndex: index }).then(
      () => setBroadcastError(null),
      (e) => setBroadcastError(e instanceof Error ? e.message : String(e)),
    );
  }, [index, broadcastUrl]);

  return (
    <Stage
      boxRef={box}
      label="Presenter"
      testId="presenter"
      sky={renderSky(sceneAtStep(scene, step, shownTime))}
      step={step}
      index={index}
      count={scene.steps.length}
      time={shownTime}
      timeZone={scene.site.timeZone ?? 'UTC'}
      status={broadcastError ? <p className="text-xs text-danger-300">Followers not updated: {broadcastError}</p> : null}
      onKeyDown={(e) => {
        if (e.key === 'ArrowRight' || e.key === 'PageDown' || (e.key === ' ' && !(e.target instanceof HTMLButtonElement))) {
          e.preventDefault();
          go(1);
        } else if (e.key === 'ArrowLeft' || e.key === 'PageUp') {
          e.preventDefault();
          go(-1);
        } else if (e.key === 'Escape') {
          e.preventDefault();
          onClose();
        }
      }}
      controls={
        <>
          <button type="button" className={STAGE_BUTTON} onClick={() => go(-1)} disabled={index === 0} aria-label="Previous step" title="Previous step (←)">
            <span aria-hidden="true">←</span>
          </button>
          <button type="button" className={STAGE_BUTTON} onClick={() => go(1)} disabled={index >= scene.steps.length - 1} aria-label="Next step" title="Next step (→)">
            <span aria-hidden="true">→</span>
          </button>
          <NightModeButton className={STAGE_BUTTON} />
          <button type="button" className={STAGE_BUTTON} onClick={onClose}>
            Leave (Esc)
          </button>
        </>
      }
    />
  );
}

/**
 * What a follower of a live presentation sees: the same stage as the room, following the presenter's
 * step (the time eases to it as in the room), with "Stop following" in place of the step buttons.
 */
export function AudienceStage({ scene, state, connected, ended, onStop, renderSky }: { scene: SceneLike; state: PresenterOut; connected: boolean; ended: boolean; onStop: () => void; renderSky: (s: SceneLike) => ReactNode }) {
  const step = scene.steps[state.stepIndex];
  const shownTime = useEasedTime(state.time ?? step?.time ?? scene.time);
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => box.current?.focus(), []);
  return (
    <Stage
      boxRef={box}
      label="Live presentation"
      testId="audience-stage"
      sky={renderSky(sceneAtStep(scene, step, shownTime))}
      step={step}
      index={state.stepIndex}
      count={scene.steps.length}
      time={shownTime}
      timeZone={scene.site.timeZone ?? 'UTC'}
      status={
        <p role="status" className="flex items-center gap-2 text-xs text-ink-300">
          <span aria-hidden="true" className={`inline-block h-2 w-2 rounded-full ${connected ? 'bg-ok-300' : 'bg-ink-500'}`} />
          {ended ? 'The presentation ended' : connected ? 'Following the presenter' : 'Reconnecting to the presenter…'}
        </p>
      }
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.preventDefault();
          onStop();
        }
      }}
      controls={
        <>
          <NightModeButton className={STAGE_BUTTON} />
          <button type="button" className={STAGE_BUTTON} onClick={onStop}>
            Stop following (Esc)
          </button>
        </>
      }
    />
  );
}

/** Follows a presenter stream; returns the latest state (null until the presenter moves). */
export function useFollow(url: string | null): { state: PresenterOut | null; connected: boolean; ended: boolean } {
  const [state, setState] = useState<PresenterOut | null>(null);
  const [connected, setConnected] = useState(false);
  const [ended, setEnded] = useState(false);
  useEffect(() => {
    if (!url) {
      setConnected(false);
      return;
    }
    setEnded(false);
    const es = new EventSource(url);
    es.onopen = () => setConnected(true);
    es.onerror = () => setConnected(false);
    es.addEventListener('step', (ev) => {
      try {
        setState(JSON.parse((ev as MessageEvent<string>).data) as PresenterOut);
      } catch {
        /* ignore a malformed event */
      }
    });
    es.addEventListener('end', () => {
      setEnded(true);
      setConnected(false);
      es.close();
    });
    return () => es.close();
  }, [url]);
  return { state, connected, ended };
}

export function FollowBadge({ connected, ended, onStop }: { connected: boolean; ended: boolean; onStop: () => void }) {
  return (
    <div role="status" className="flex items-center gap-2 rounded-full border border-brass-500/60 px-3 py-1 text-xs text-brass-200">
      <span aria-hidden="true" className={`inline-block h-2 w-2 rounded-full ${connected ? 'animate-pulse bg-ok-300' : 'bg-ink-500'}`} />
      {ended ? 'The presentation ended' : connected ? 'Following the presenter' : 'Connecting to the presenter…'}
      <button type="button" className="underline" onClick={onStop}>
        Stop following
      </button>
    </div>
  );
}
