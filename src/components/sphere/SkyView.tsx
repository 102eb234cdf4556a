/**
 * <SkyView>: the celestial-sphere view of a scene (Observer view and Sphere view), with its legend, time bar,
 * readouts, selection card, text alternative, solar caution and PNG snapshot. Mount with client:only="react".
 */
import { Component, useEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import { DEFAULT_LAYERS, type Layers } from '../../lib/scenes/scene';
import { type CamState, type CommentAnchor, type PinLike, type UiState, type ViewHandles, ViewContext } from './context';
import * as engine from './engine';
import type { EnvelopeLike } from './engine';
import { formatHours } from './geometry';
import { SkyModel, type TargetLike } from './model';
import { Legend, Readout, SelectionCard, SkySummary, TimeBar } from './panels';
import SkyCanvas from './SkyCanvas';
import { composeSnapshot } from './snapshot';
import { Clock, createStore, useStore } from './store';
import { formatOffset, formatUtc, formatWall, isoUtc, SIDEREAL_DAY_MS } from './time';

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

export interface SkyViewProps {
  scene: SceneLike;
  mode?: 'edit' | 'view';
  onSceneChange?: (scene: SceneLike) => void;
  comments?: CommentAnchor[];
  onPickPoint?: (anchor: { ra: number; dec: number; azimuth: number; altitude: number }) => void;
  onSnapshot?: (dataUrl: string) => void;
  /** Height of the sky canvas, CSS (default 70vh). */
  height?: string;
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

export function SkyView({ scene, mode = 'view', onSceneChange, comments, onPickPoint, onSnapshot, height = '70vh' }: SkyViewProps) {
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
  const [stepIdx, setStepIdx] = useState<number | null>(null);
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
    if (c.azDeg !== undefined) cam.az = c.azDeg;
    if (c.altDeg !== undefined) cam.alt = c.altDeg;
    if (c.fovDeg !== undefined) cam.fov = c.fovDeg;
    if (c.mode && c.mode !== store.get().mode) store.set({ mode: c.mode });
    hud.invalidate?.();
  }, [cameraKey]);
  useEffect(() => {
    model.setPlan(scene.envelope ?? null, scene.targets ?? []);
    model.update(clock.ms, true);
    store.set({ pins: scene.pins ?? [] });
    hud.invalidate?.();
  }, [scene.envelope, scene.targets, scene.pins]);
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

  const emit = (patch: Partial<SceneLike>) => {
    if (mode !== 'edit' || !onSceneChange) return;
    onSceneChange({ ...scene, ...patch });
  };
  const layersChanged = () => setTimeout(() => emit({ layers: store.get().layers }), 0);
  const setMode = (m: 'observer' | 'sphere') => {
    store.set({ mode: m });
    hud.invalidate?.();
    emit({ camera: { ...(scene.camera ?? {}), mode: m, azDeg: cam.az, altDeg: cam.alt, fovDeg: cam.fov } });
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

  const applyStep = (i: number) => {
    const s = scene.steps?.[i];
    if (!s) return;
    setStepIdx(i);
    const ms = Date.parse(s.time);
    if (Number.isFinite(ms)) clock.setMs(ms);
    if (s.layers) store.set((st) => ({ layers: { ...st.layers, ...s.layers } as Required<Layers> }));
    if (s.camera) {
      if (s.camera.azDeg !== undefined) cam.az = s.camera.azDeg;
      if (s.camera.altDeg !== undefined) cam.alt = s.camera.altDeg;
      if (s.camera.fovDeg !== undefined) cam.fov = s.camera.fovDeg;
      if (s.camera.mode) store.set({ mode: s.camera.mode });
    }
    hud.invalidate?.();
  };

  const onKey = (e: KeyboardEvent) => {
    const k = e.key;
    const obs = store.get().mode === 'observer';
    let handled = true;
    if (k === 'ArrowLeft' || k === 'ArrowRight' || k === 'ArrowUp' || k === 'ArrowDown') {
      const d = e.shiftKey ? 15 : 5;
      if (obs) {
        if (k === 'ArrowLeft') cam.az = (cam.az - d + 360) % 360;
        if (k === 'ArrowRight') cam.az = (cam.az + d) % 360;
        if (k === 'ArrowUp') cam.alt = Math.min(89.5, cam.alt + d);
        if (k === 'ArrowDown') cam.alt = Math.max(-30, cam.alt - d);
      } else hud.orbit?.(k === 'ArrowLeft' ? -d : k === 'ArrowRight' ? d : 0, k === 'ArrowUp' ? d : k === 'ArrowDown' ? -d : 0, 1);
    } else if (k === '+' || k === '=') {
      if (obs) cam.fov = Math.max(10, cam.fov / 1.15);
      else hud.orbit?.(0, 0, 1 / 1.15);
    } else if (k === '-' || k === '_') {
      if (obs) cam.fov = Math.min(120, cam.fov * 1.15);
      else hud.orbit?.(0, 0, 1.15);
    } else if (k === 'v' || k === 'V') setMode(obs ? 'sphere' : 'observer');
    else if (k === ']') clock.setMs(clock.ms + (e.shiftKey ? 86400000 : 3600000));
    else if (k === '[') clock.setMs(clock.ms - (e.shiftKey ? 86400000 : 3600000));
    else if (k === '.') clock.setMs(clock.ms + 60000);
    else if (k === ',') clock.setMs(clock.ms - 60000);
    else if (k === 's' || k === 'S') clock.setMs(clock.ms + (e.shiftKey ? -SIDEREAL_DAY_MS : SIDEREAL_DAY_MS));
    else if (k === ' ' || k === 'p' || k === 'P') {
      clock.playing = !clock.playing;
      store.set({ playing: clock.playing });
      if (clock.playing) clock.setMs(clock.ms + 1);
    } else if (k === 'n' || k === 'N') clock.setMs(Date.now());
    else if (k === 'Escape') store.set({ selected: null });
    else handled = false;
    if (handled) {
      e.preventDefault();
      hud.invalidate?.();
    }
  };

  return (
    <ViewContext.Provider value={handles}>
      <div className="armilla-sky flex flex-col gap-2 text-slate-100" data-testid="sky-view">
        {sunUp && (
          <div role="alert" className="rounded bg-red-700 px-3 py-2 text-sm font-bold text-white" data-testid="solar-caution">
            Never point optics at the Sun without a certified full-aperture solar filter.
            {sunTargets.length > 0 && <span className="font-normal"> Inside the Sun-avoidance angle: {sunTargets.join(', ')}.</span>}
          </div>
        )}
        {!sunUp && sunTargets.length > 0 && (
          <div role="alert" className="rounded bg-red-700 px-3 py-2 text-sm font-bold text-white" data-testid="solar-caution">
            Targets inside the Sun-avoidance angle: {sunTargets.join(', ')}. Never point optics at the Sun without a certified full-aperture solar filter.
          </div>
        )}
        <div className="flex flex-col gap-3 lg:flex-row">
          <div className="min-w-0 flex-1 space-y-2">
            <div className="flex flex-wrap items-center gap-2">
              <div role="radiogroup" aria-label="View" className="flex overflow-hidden rounded border border-slate-600">
                {(['observer', 'sphere'] as const).map((m) => (
                  <button
                    key={m}
                    role="radio"
                    aria-checked={uiMode === m}
                    className={`px-3 py-1 text-xs ${uiMode === m ? 'bg-sky-700 text-white' : 'bg-slate-800 text-slate-200 hover:bg-slate-700'}`}
                    onClick={() => setMode(m)}
                    data-testid={`mode-${m}`}
                  >
                    {m === 'observer' ? 'Observer view' : 'Sphere view'}
                  </button>
                ))}
              </div>
              <button className={btn} onClick={snapshot} disabled={busy} data-testid="snapshot">
                {busy ? 'Rendering…' : 'Snapshot (PNG)'}
              </button>
              {snapUrl && (
                <a className={btn} href={snapUrl} download={`armilla-${isoUtc(clock.ms).replace(/[:]/g, '')}.png`} data-testid="snapshot-download">
                  Download PNG
                </a>
              )}
              <span className="text-[11px] text-slate-400">{scene.site.name} · {scene.site.lat.toFixed(3)}°, {scene.site.lon.toFixed(3)}° · {Math.round(scene.site.height ?? 0)} m</span>
            </div>
            <div
              className="relative w-full border border-slate-700 bg-[#05070d] focus-visible:outline focus-visible:outline-2 focus-visible:outline-sky-400"
              style={{ height }}
              tabIndex={0}
              role="application"
              aria-roledescription="sky view"
              aria-label={`Sky over ${scene.site.name}. Arrow keys look around, plus and minus zoom, V switches Observer and Sphere view, [ and ] step one hour (with Shift one day), comma and period one minute, S one sidereal day, P or space plays, N jumps to now. The text summary beside the view describes what is up.`}
              onKeyDown={onKey}
              data-testid="sky-canvas"
            >
              <DrawingGuard>
                <SkyCanvas handles={handles} onPickPoint={onPickPoint} />
              </DrawingGuard>
              <canvas ref={overlayRef} aria-hidden="true" className="pointer-events-none absolute inset-0 h-full w-full" />
            </div>
            {scene.steps && scene.steps.length > 0 && (
              <nav aria-label="Briefing steps" className="flex flex-wrap items-center gap-1">
                {scene.steps.map((s, i) => (
                  <button key={s.id} className={`${btn} ${stepIdx === i ? 'bg-sky-700' : ''}`} aria-current={stepIdx === i ? 'step' : undefined} onClick={() => applyStep(i)}>
                    {i + 1}. {s.title || 'Step'}
                  </button>
                ))}
                {stepIdx !== null && scene.steps[stepIdx]?.caption && <p className="w-full whitespace-pre-wrap text-xs text-slate-300">{scene.steps[stepIdx].caption}</p>}
              </nav>
            )}
            <p className="text-[11px] text-slate-400">
              Computed times and positions are for planning; local rules, site regulations and the instrument's own safety interlocks take precedence.
            </p>
          </div>
          <aside className="w-full space-y-4 lg:w-80" aria-label="Sky controls and readouts">
            <TimeBar timeZone={timeZone} onSaveTime={mode === 'edit' && onSceneChange ? () => emit({ time: isoUtc(clock.ms) }) : undefined} />
            <SelectionCard />
            <Readout />
            <Legend onLayersChange={layersChanged} />
            <SkySummary />
          </aside>
        </div>
      </div>
    </ViewContext.Provider>
  );
}

export default SkyView;
