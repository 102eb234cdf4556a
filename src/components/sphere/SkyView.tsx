/**
 * <SkyView>: the celestial-sphere view of a scene (Observer view and Sphere view). With `chrome="full"` the
 * sky fills its box and the controls sit over it: a time bar at the bottom, collapsible panels (time,
 * layers, pointer, the sky in words) on the left, the object card on the right; on a phone they follow
 * the sky instead. With `chrome="stage"` only the sky and the solar caution are drawn (presenter, audience,
 * embed). Mount with client:only="react".
 */
import { Component, useEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import type { Layers } from '../../lib/contracts/scene-doc';
import { DEFAULT_LAYERS } from '../../lib/contracts/layers';
import { type CamState, type CommentAnchor, type PinLike, type UiState, type ViewHandles, ViewContext } from './context';
import * as engine from './sky-adapter';
import type { EnvelopeLike } from './sky-adapter';
import { formatHours } from './geometry';
import { SkyModel, type TargetLike } from './model';
import { FloatPanel } from './FloatPanel';
import { keyAction } from './keys';
import { KeyHelp } from './KeyHelp';
import { jumpToNextEvent } from './next-event';
import { Legend, Readout, SelectionCard, SkySummary, TimeBar } from './panels';
import { TimeStrip } from './TimeStrip';
import SkyCanvas from './SkyCanvas';
import { composeSnapshot } from './snapshot';
import { Clock, createStore, useStore } from './store';
import { formatOffset, formatUtc, formatWall, isoUtc } from './clock';

/**
 * Keeps the page working when the browser gives no WebGL (blocked, or no GPU and no software fallback):
 * the drawing is replaced by a notice, and the summary, readouts, cards and time controls stay.
 */
class DrawingGuard extends Component<{ children: ReactNode }, { failed: boolean }> {
  override state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  override render() {
    if (!this.state.failed) return this.props.children;
    return (
      <div role="status" data-testid="sky-no-webgl" className="absolute inset-0 flex items-center justify-center p-6 text-center text-sm text-slate-300">
        <p>
          This browser could not start WebGL, so the sky is not drawn here. The summary of what is up, the time
          controls, the object cards and the keyboard still work. Turning on hardware acceleration (or, where
          there is no GPU, the browser's software WebGL) brings the drawing back.
        </p>
      </div>
    );
  }
}

export interface SceneLike {
  title: string;
  site: {
    name: string; lat: number; lon: number; height?: number; timeZone?: string;
    earthOrientation?: { dut1: number; xp: number; yp: number; date: string; source: string };
  };
  /** ISO 8601 UTC. */
  time: string;
  layers?: Layers;
  camera?: { mode?: 'observer' | 'sphere'; azDeg?: number; altDeg?: number; fovDeg?: number };
  envelope?: EnvelopeLike | null;
  targets?: TargetLike[];
  pins?: PinLike[];
  steps?: { id: string; title?: string; time: string; camera?: SceneLike['camera']; layers?: Layers; caption?: string }[];
}

/** What the view changes in edit mode: the layers, the camera (all of it) or the saved instant. */
export interface SceneViewPatch {
  layers?: Layers;
  camera?: { mode: 'observer' | 'sphere'; azDeg: number; altDeg: number; fovDeg: number };
  time?: string;
}

export interface SkyViewProps {
  scene: SceneLike;
  mode?: 'edit' | 'view';
  /** Edit mode only: the fields the user changed in the view, to merge into the caller's scene. */
  onSceneChange?: (patch: SceneViewPatch) => void;
  comments?: CommentAnchor[];
  onPickPoint?: (anchor: { ra: number; dec: number; azimuth: number; altitude: number }) => void;
  onSnapshot?: (dataUrl: string) => void;
  /** `full`: the sky with its panels and time bar (default); `stage`: the sky alone (presenter, audience). */
  chrome?: 'full' | 'stage';
  /** The view's instant as it moves (time bar, playing, steps), at most five times a second: keeps the night chart's cursor in step. */
  onTimeChange?: (ms: number) => void;
}

const btn = 'rounded border border-slate-600 bg-slate-800 px-2 py-1 text-xs text-slate-100 hover:bg-slate-700 focus-visible:outline focus-visible:outline-2 focus-visible:outline-sky-400';

const SUN_UP_ALT = -50 / 60; // upper limb on the horizon (USNO)

function siteInput(s: SceneLike['site']): engine.SiteInput {
  const e = s.earthOrientation;
  return {
    latDeg: s.lat, lonDeg: s.lon, heightM: s.height ?? 0,
    ...(e ? { dut1Sec: e.dut1, xpArcsec: e.xp, ypArcsec: e.yp, eopDate: e.date, eopSource: e.source } : {}),
  };
}

export function SkyView({ scene, mode = 'view', onSceneChange, comments, onPickPoint, onSnapshot, chrome = 'full', onTimeChange }: SkyViewProps) {
  const timeZone = scene.site.timeZone ?? 'UTC';
  const handles = useMemo<ViewHandles>(() => {
    const ms = Date.parse(scene.time);
    const clock = new Clock(Number.isFinite(ms) ? ms : Date.now());
    const model = new SkyModel(siteInput(scene.site), clock.ms);
    clock.pre = () => model.update(clock.ms);
    const layers = { ...DEFAULT_LAYERS, ...(scene.layers ?? {}) } as Required<Layers>;
    const store = createStore<UiState>({
      mode: scene.camera?.mode ?? 'observer',
      layers,
      selected: null,
      playing: false,
      rate: clock.rate,
      catalogueReady: false,
      pins: scene.pins ?? [],
      comments: comments ?? [],
    });
    const cam: CamState = {
      az: scene.camera?.azDeg ?? 180,
      alt: scene.camera?.altDeg ?? 20,
      fov: scene.camera?.fovDeg ?? 80,
      t: scene.camera?.mode === 'sphere' ? 1 : 0,
      sphereFov: 40,
      sphereDist: 330,
    };
    return { model, clock, store, cam, hud: { readout: null, snapshot: null, invalidate: null, orbit: null, overlay: null }, siteName: scene.site.name, timeZone };
  }, []);
  const { model, clock, store, cam, hud } = handles;
  const uiMode = useStore(store, (s) => s.mode);
  const overlayRef = useRef<HTMLCanvasElement>(null);
  const [sunUp, setSunUp] = useState(false);
  const [sunTargets, setSunTargets] = useState<string[]>([]);
  const [snapUrl, setSnapUrl] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  // Props → model/store (the scene may change under us: steps, another editor, a live presenter).
  useEffect(() => {
    model.setSite(siteInput(scene.site));
    hud.invalidate?.();
  }, [scene.site.lat, scene.site.lon, scene.site.height, scene.site.earthOrientation?.dut1, scene.site.earthOrientation?.xp, scene.site.earthOrientation?.yp]);
  useEffect(() => {
    const ms = Date.parse(scene.time);
    if (Number.isFinite(ms)) clock.setMs(ms);
  }, [scene.time]);
  useEffect(() => {
    if (scene.layers) store.set({ layers: { ...DEFAULT_LAYERS, ...scene.layers } as Required<Layers> });
  }, [JSON.stringify(scene.layers ?? null)]);
  // A step, a restored version or a followed presenter may bring its own camera.
  const cameraKey = JSON.stringify(scene.camera ?? null);
  const firstCamera = useRef(true);
  useEffect(() => {
    if (firstCamera.current) {
      firstCamera.current = false; // the initial camera is already in `cam` and the store
      return;
    }
    const c = scene.camera;
    if (!c) return;
    if (c.mode && c.mode !== store.get().mode) store.set({ mode: c.mode });
    return glideCamera(cam, c, () => hud.invalidate?.());
  }, [cameraKey]);
  useEffect(() => {
    model.setPlan(scene.envelope ?? null, scene.targets ?? []);
    model.update(clock.ms, true);
    store.set({ pins: scene.pins ?? [] });
    hud.invalidate?.();
  }, [scene.envelope, scene.targets, scene.pins]);
  const timeListener = useRef(onTimeChange);
  timeListener.current = onTimeChange;
  useEffect(() => {
    // at most five times a second, and once more after the last change
    let timer: ReturnType<typeof setTimeout> | null = null;
    const off = clock.subscribe(() => {
      if (timer || !timeListener.current) return;
      timer = setTimeout(() => {
        timer = null;
        timeListener.current?.(clock.ms);
      }, 200);
    });
    return () => {
      off();
      if (timer) clearTimeout(timer);
    };
  }, []);
  useEffect(() => {
    store.set({ comments: comments ?? [] });
    hud.invalidate?.();
  }, [comments]);
  useEffect(() => {
    let alive = true;
    engine.loadCatalogue().then((c) => {
      if (!alive) return;
      model.setCatalogue(c);
      model.computeTargets();
      store.set({ catalogueReady: true });
      hud.invalidate?.();
    });
    return () => {
      alive = false;
    };
  }, []);
  useEffect(() => {
    hud.overlay = overlayRef.current;
    hud.invalidate?.();
  });
  // Layer switches that change what the model computes.
  useEffect(() => {
    const sync = () => {
      const L = store.get().layers;
      model.setStarLimit(L.stars ? L.limitingMagnitude : -5);
      const needEcl = L.eclipticGrid;
      if (needEcl !== model.needEcliptic) {
        model.needEcliptic = needEcl;
        if (needEcl) model.update(clock.ms, true);
      }
      hud.invalidate?.();
    };
    sync();
    return store.subscribe(sync);
  }, []);
  // The clock drives the model; the canvas re-renders through its own subscription. React state only
  // changes when the caution's content changes.
  const lastCaution = useRef({ up: false, near: '' });
  useEffect(() => {
    const onTime = () => {
      const up = !!model.sun && model.sun.altDeg > SUN_UP_ALT;
      const limit = model.envelope?.sunAvoidance;
      const near = model.sun && limit !== undefined ? model.targets.filter((t) => t.sunSepDeg < limit).map((t) => t.name) : [];
      const key = near.join('\u0000');
      if (up !== lastCaution.current.up) setSunUp(up);
      if (key !== lastCaution.current.near) setSunTargets(near);
      lastCaution.current = { up, near: key };
    };
    onTime();
    return clock.subscribe(onTime);
  }, []);

  const emit = (patch: SceneViewPatch) => {
    if (mode !== 'edit' || !onSceneChange) return;
    onSceneChange(patch);
  };
  const layersChanged = () => setTimeout(() => emit({ layers: store.get().layers }), 0);
  const setMode = (m: 'observer' | 'sphere') => {
    store.set({ mode: m });
    hud.invalidate?.();
    emit({ camera: { mode: m, azDeg: cam.az, altDeg: cam.alt, fovDeg: cam.fov } });
  };

  const snapshot = async () => {
    if (!hud.snapshot) return;
    setBusy(true);
    try {
      const gl = await hud.snapshot();
      const url = await composeSnapshot(
        gl,
        overlayRef.current,
        {
          title: scene.title,
          site: `${scene.site.name} (${scene.site.lat.toFixed(3)}°, ${scene.site.lon.toFixed(3)}°, ${Math.round(scene.site.height ?? 0)} m)`,
          local: `${formatWall(clock.ms, timeZone)} ${timeZone} (${formatOffset(clock.ms, timeZone)})`,
          utc: `${formatUtc(clock.ms)} UTC`,
          lst: formatHours(model.frame.lstHours, 0),
          view: store.get().mode === 'sphere' ? 'Sphere view' : 'Observer view',
        },
        store.get().layers,
        sunUp,
      );
      setSnapUrl(url);
      onSnapshot?.(url);
    } finally {
      setBusy(false);
    }
  };

  const onKey = (e: KeyboardEvent) => {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    const act = keyAction(e.key, e.shiftKey);
    if (!act || act.kind === 'help') return; // `?` is answered page-wide by <KeyHelp>
    const obs = store.get().mode === 'observer';
    switch (act.kind) {
      case 'look':
        if (obs) {
          cam.az = (cam.az + act.dAz + 360) % 360;
          cam.alt = Math.max(-30, Math.min(89.5, cam.alt + act.dAlt));
        } else hud.orbit?.(act.dAz, act.dAlt, 1);
        break;
      case 'zoom':
        if (obs) cam.fov = Math.max(10, Math.min(120, cam.fov * act.factor));
        else hud.orbit?.(0, 0, act.factor);
        break;
      case 'toggleView':
        setMode(obs ? 'sphere' : 'observer');
        break;
      case 'step':
        clock.setMs(clock.ms + act.ms);
        break;
      case 'nextEvent':
        jumpToNextEvent(handles);
        break;
      case 'play':
        clock.playing = !clock.playing;
        store.set({ playing: clock.playing });
        if (clock.playing) clock.setMs(clock.ms + 1);
        break;
      case 'now':
        clock.setMs(Date.now());
        break;
      case 'clearSelection':
        store.set({ selected: null });
        break;
    }
    e.preventDefault();
    hud.invalidate?.();
  };

  const caution = (sunUp || sunTargets.length > 0) && (
    <div role="alert" className="shrink-0 rounded bg-red-700 px-3 py-1.5 text-sm font-bold text-white" data-testid="solar-caution">
      {sunUp ? (
        <>
          Never point optics at the Sun without a certified full-aperture solar filter.
          {sunTargets.length > 0 && <span className="font-normal"> Inside the Sun-avoidance angle: {sunTargets.join(', ')}.</span>}
        </>
      ) : (
        <>Targets inside the Sun-avoidance angle: {sunTargets.join(', ')}. Never point optics at the Sun without a certified full-aperture solar filter.</>
      )}
    </div>
  );

  const sky = (
    <div
      className="absolute inset-0 bg-[#05070d] focus-visible:outline focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-sky-400"
      tabIndex={0}
      role="application"
      aria-roledescription="sky view"
      aria-label={`Sky over ${scene.site.name}. Arrow keys look around, plus and minus zoom, V switches Observer and Sphere view, H steps one hour (Shift H back), D one day, M one minute, S one sidereal day, E jumps to the next event, P or space plays, N jumps to now; question mark lists every key.${chrome === 'full' ? ' The panel “Above the horizon now” describes the sky in words.' : ''}`}
      onKeyDown={onKey}
      data-testid="sky-canvas"
    >
      <DrawingGuard>
        <SkyCanvas handles={handles} onPickPoint={onPickPoint} />
      </DrawingGuard>
      <canvas ref={overlayRef} aria-hidden="true" className="pointer-events-none absolute inset-0 h-full w-full" />
    </div>
  );

  if (chrome === 'stage') {
    return (
      <ViewContext.Provider value={handles}>
        <div className="armilla-sky flex h-full w-full flex-col text-slate-100" data-testid="sky-view" data-chrome="stage" data-mode={uiMode}>
          {caution}
          <div className="relative min-h-0 flex-1">{sky}</div>
        </div>
      </ViewContext.Provider>
    );
  }

  const over = 'lg:col-start-1 lg:row-start-1 lg:z-10';
  return (
    <ViewContext.Provider value={handles}>
      <div className="armilla-sky flex flex-col gap-2 text-slate-100 lg:h-full lg:gap-1" data-testid="sky-view" data-chrome="full" data-mode={uiMode}>
        {caution}
        <div className="flex flex-col gap-2 lg:grid lg:min-h-0 lg:flex-1 lg:grid-cols-[minmax(0,1fr)] lg:grid-rows-[minmax(0,1fr)] lg:gap-0">
          <div className="relative h-[62svh] min-h-64 w-full overflow-hidden border border-slate-800 lg:col-start-1 lg:row-start-1 lg:h-full lg:min-h-0" data-testid="sky-area">
            {sky}
            <div className="pointer-events-none absolute left-2 right-2 top-2 z-10 flex flex-wrap items-center gap-2">
              <div role="radiogroup" aria-label="View" className="pointer-events-auto flex overflow-hidden rounded border border-slate-600">
                {(['observer', 'sphere'] as const).map((m) => (
                  <button
                    key={m}
                    role="radio"
                    aria-checked={uiMode === m}
                    className={`px-3 py-1 text-xs ${uiMode === m ? 'bg-sky-700 text-white' : 'bg-slate-900/90 text-slate-200 hover:bg-slate-700'}`}
                    onClick={() => setMode(m)}
                    data-testid={`mode-${m}`}
                  >
                    {m === 'observer' ? 'Observer view' : 'Sphere view'}
                  </button>
                ))}
              </div>
              <button className={`${btn} pointer-events-auto`} onClick={snapshot} disabled={busy} data-testid="snapshot">
                {busy ? 'Rendering…' : 'Snapshot (PNG)'}
              </button>
              {snapUrl && (
                <a className={`${btn} pointer-events-auto`} href={snapUrl} download={`armilla-${isoUtc(clock.ms).replace(/[:]/g, '')}.png`} data-testid="snapshot-download">
                  Download PNG
                </a>
              )}
              <KeyHelp buttonClassName={`${btn} pointer-events-auto w-7`} />
              <span className="hidden rounded bg-slate-950/70 px-1.5 py-0.5 text-[11px] text-slate-300 sm:inline">
                {scene.site.name} · {scene.site.lat.toFixed(3)}°, {scene.site.lon.toFixed(3)}° · {Math.round(scene.site.height ?? 0)} m
              </span>
            </div>
          </div>
          <div className={`${over} px-2 lg:mx-2 lg:mb-2 lg:self-end lg:px-0`}>
            <TimeStrip onSaveTime={mode === 'edit' && onSceneChange ? () => emit({ time: isoUtc(clock.ms) }) : undefined} />
          </div>
          <div className={`${over} px-2 lg:mr-2 lg:mt-12 lg:w-80 lg:self-start lg:justify-self-end lg:px-0`}>
            <SelectionCard />
          </div>
          <div className={`${over} flex flex-col gap-1.5 px-2 lg:ml-2 lg:px-0 lg:mt-12 lg:max-h-[calc(100%-8.5rem)] lg:w-80 lg:self-start lg:justify-self-start lg:overflow-y-auto`} aria-label="Sky panels" role="region" data-testid="sky-panels">
            <FloatPanel id="time" title="Time">
              <TimeBar timeZone={timeZone} />
            </FloatPanel>
            <FloatPanel id="layers" title="Layers">
              <Legend onLayersChange={layersChanged} />
            </FloatPanel>
            <FloatPanel id="pointer" title="Pointer">
              <Readout />
            </FloatPanel>
            <FloatPanel id="summary" title="Above the horizon now">
              <SkySummary />
            </FloatPanel>
          </div>
        </div>
        <p className="shrink-0 px-2 text-[11px] text-slate-400 lg:truncate">
          Computed times and positions are for planning; local rules, site regulations and the instrument's own safety interlocks take precedence.
        </p>
      </div>
    </ViewContext.Provider>
  );
}

/**
 * Moves the Observer camera to a new direction and field over ~1 s (shortest way round in azimuth), so a
 * step or a followed presenter turns the view instead of cutting. Returns a cancel function.
 */
function glideCamera(cam: CamState, to: NonNullable<SceneLike['camera']>, invalidate: () => void): () => void {
  const from = { az: cam.az, alt: cam.alt, fov: cam.fov };
  const dAz = to.azDeg === undefined ? 0 : ((((to.azDeg - from.az) % 360) + 540) % 360) - 180;
  const dAlt = to.altDeg === undefined ? 0 : to.altDeg - from.alt;
  const dFov = to.fovDeg === undefined ? 0 : to.fovDeg - from.fov;
  if (!dAz && !dAlt && !dFov) return () => undefined;
  const reduce = typeof matchMedia === 'function' && matchMedia('(prefers-reduced-motion: reduce)').matches;
  const ms = reduce ? 0 : 1100;
  const t0 = performance.now();
  let raf = 0;
  const tick = () => {
    const u = ms ? Math.min(1, (performance.now() - t0) / ms) : 1;
    const e = u < 0.5 ? 4 * u * u * u : 1 - Math.pow(-2 * u + 2, 3) / 2;
    cam.az = (((from.az + dAz * e) % 360) + 360) % 360;
    cam.alt = from.alt + dAlt * e;
    cam.fov = from.fov + dFov * e;
    invalidate();
    if (u < 1) raf = requestAnimationFrame(tick);
  };
  tick();
  return () => cancelAnimationFrame(raf);
}

export default SkyView;
