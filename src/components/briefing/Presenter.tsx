/**
 * Presenter mode: full screen (Fullscreen API), → / PageDown / Space next, ← / PageUp previous, Esc leaves.
 * Each move is POSTed so followers see it; the sky eases from one step's time to the next.
 * Follow mode: the view follows the presenter's server-sent events.
 */
import { useCallback, useEffect, useRef, useState, type ReactNode } from 'react';
import type { PresenterOut } from '../../lib/contracts/presenter';
import { apiPost } from '../../lib/client/api';
import { sceneAtStep, formatInZone, type SceneLike } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { Markdown } from './Markdown';

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
  const now = useClock();
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
    <div
      ref={box}
      tabIndex={-1}
      role="dialog"
      aria-modal="true"
      aria-label="Presenter"
      data-testid="presenter"
      className="fixed inset-0 z-50 flex flex-col bg-ink-950 text-ink-100 outline-none"
      onKeyDown={(e) => {
        if (e.key === 'ArrowRight' || e.key === 'PageDown' || e.key === ' ') {
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
    >
      <style>{'@keyframes armilla-fadein{from{opacity:0;transform:translateY(6px)}to{opacity:1;transform:none}}'}</style>
      <div className="relative min-h-0 flex-1">{renderSky(sceneAtStep(scene, step, shownTime))}</div>
      <div className="grid grid-cols-1 gap-3 border-t border-ink-800 bg-ink-900 px-6 py-4 md:grid-cols-[1fr_auto]">
        <div key={step?.id ?? 'none'} className="animate-[armilla-fadein_400ms_ease-out] motion-reduce:animate-none">
          <p className="text-xs uppercase tracking-[0.15em] text-brass-300" aria-live="polite">
            Step {index + 1} of {scene.steps.length}
            {step?.title ? ` · ${step.title}` : ''}
          </p>
          {step?.caption ? <Markdown source={step.caption} className="mt-1 text-lg" /> : null}
        </div>
        <div className="flex flex-col items-end gap-2 text-right">
          <p className="font-mono text-2xl tabular-nums" aria-label="Sky time at the site">
            {formatInZone(shownTime, scene.site.timeZone ?? 'UTC')}
          </p>
          <p className="text-xs text-ink-300">Clock {now.toLocaleTimeString()}</p>
          {broadcastError && <p className="text-xs text-danger-300">Followers not updated: {broadcastError}</p>}
          <div className="flex gap-2">
            <Button variant="secondary" onClick={() => go(-1)} disabled={index === 0} aria-label="Previous step">
              ←
            </Button>
            <Button variant="secondary" onClick={() => go(1)} disabled={index >= scene.steps.length - 1} aria-label="Next step">
              →
            </Button>
            <Button variant="ghost" onClick={onClose}>
              Leave (Esc)
            </Button>
          </div>
        </div>
      </div>
    </div>
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
