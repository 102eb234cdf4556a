/**
 * The WebGL part of the view: Canvas (render on demand), camera rig with the Observer ⇄ Sphere transition,
 * pointer handling (look around, zoom, hover readout, pick), the layers, the label overlay and the snapshot.
 */
import { OrbitControls } from '@react-three/drei';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import type { OrbitControls as OrbitControlsImpl } from 'three-stdlib';
import { useView, type ViewHandles, ViewContext, type Selection } from './context';
import * as engine from './sky-adapter';
import { altAzToEnu, enuToWorld, raySphereDirection, SPHERE_RADIUS, worldToEnu } from './geometry';
import { Axes, Bodies, Envelope, Grid, Ground, Ring, Stars } from './layers';
import { SkyDome } from './SkyDome';
import { skyGradient } from './sky-colour';
import { collectLabels, drawOverlay, type LabelItem } from './overlay';
import { drawPins } from './pins';
import { useStore } from './store';
import { CIRCLE_KEYS } from './styles';

const R = SPHERE_RADIUS;
const TRANSITION_S = 1.4;

declare global {
  interface Window {
    __armillaStats?: { frames: number; firstFrameAt: number | null; startedAt: number; lastFrameAt: number; updateMs: number; renderMs: number; overlayMs: number; drawCalls?: number; triangles?: number };
  }
}

const ease = (x: number) => (x < 0.5 ? 4 * x * x * x : 1 - Math.pow(-2 * x + 2, 3) / 2);

function sphereCameraPosition(out: THREE.Vector3, azDeg: number): THREE.Vector3 {
  // Seen from behind the observer's line of sight and above, so the horizon disc opens up.
  const v = altAzToEnu([0, 0, 0], azDeg + 180 - 35, 24);
  enuToWorld(v, v, 1);
  return out.set(v[0], v[1], v[2]).multiplyScalar(330);
}

function CameraRig() {
  const { cam, store } = useView();
  const mode = useStore(store, (s) => s.mode);
  const controls = useRef<OrbitControlsImpl | null>(null);
  const invalidate = useThree((s) => s.invalidate);
  const anim = useMemo(
    () => ({ from: 0, to: 0, k: 1, fromPos: new THREE.Vector3(), toPos: new THREE.Vector3(), fromLook: new THREE.Vector3(), toLook: new THREE.Vector3(), fromFov: 80, toFov: 40, look: new THREE.Vector3(), v: [0, 0, 0] }),
    [],
  );
  const { hud } = useView();
  const camera = useThree((s) => s.camera);
  useEffect(() => {
    const sph = new THREE.Spherical();
    hud.orbit = (dAz, dAlt, zoom) => {
      if (cam.t !== 1) return;
      sph.setFromVector3(camera.position);
      sph.theta -= (dAz * Math.PI) / 180;
      sph.phi = Math.max(0.05, Math.min(Math.PI - 0.05, sph.phi - (dAlt * Math.PI) / 180));
      sph.radius = Math.max(R * 1.25, Math.min(R * 6, sph.radius * zoom));
      camera.position.setFromSpherical(sph);
      camera.lookAt(0, 0, 0);
      controls.current?.update();
      invalidate();
    };
    return () => {
      hud.orbit = null;
    };
  }, [camera]);
  const target = mode === 'sphere' ? 1 : 0;
  useEffect(() => {
    if (anim.to === target && anim.k >= 1) return;
    anim.from = cam.t;
    anim.to = target;
    anim.k = 0;
    invalidate();
  }, [target]);

  useFrame(({ camera }, delta) => {
    const pc = camera as THREE.PerspectiveCamera;
    const v = anim.v;
    enuToWorld(v, altAzToEnu(v, cam.az, cam.alt), R);
    const obsLook = anim.look.set(v[0], v[1], v[2]);
    if (anim.k < 1) {
      if (anim.k === 0) {
        // Capture both ends once at the start.
        if (anim.to === 1) {
          anim.fromPos.set(0, 0, 0);
          anim.fromLook.copy(obsLook);
          anim.fromFov = cam.fov;
          sphereCameraPosition(anim.toPos, cam.az);
          anim.toLook.set(0, 0, 0);
          anim.toFov = cam.sphereFov;
        } else {
          anim.fromPos.copy(pc.position);
          anim.fromLook.set(0, 0, 0);
          anim.fromFov = pc.fov;
          anim.toPos.set(0, 0, 0);
          anim.toLook.copy(obsLook);
          anim.toFov = cam.fov;
        }
      }
      anim.k = Math.min(1, anim.k + Math.min(delta, 0.1) / TRANSITION_S);
      const e = ease(anim.k);
      cam.t = anim.from + (anim.to - anim.from) * e;
      pc.position.lerpVectors(anim.fromPos, anim.toPos, e);
      const lx = anim.fromLook.x + (anim.toLook.x - anim.fromLook.x) * e;
      const ly = anim.fromLook.y + (anim.toLook.y - anim.fromLook.y) * e;
      const lz = anim.fromLook.z + (anim.toLook.z - anim.fromLook.z) * e;
      pc.fov = anim.fromFov + (anim.toFov - anim.fromFov) * e;
      pc.up.set(0, 1, 0);
      pc.lookAt(lx, ly, lz);
      pc.updateProjectionMatrix();
      if (controls.current) controls.current.enabled = false;
      invalidate();
      return;
    }
    if (cam.t === 0) {
      pc.position.set(0, 0, 0);
      if (pc.fov !== cam.fov) {
        pc.fov = cam.fov;
        pc.updateProjectionMatrix();
      }
      pc.lookAt(obsLook);
    } else if (controls.current && !controls.current.enabled) {
      controls.current.target.set(0, 0, 0);
      controls.current.enabled = true;
      controls.current.update();
    }
    if (cam.t === 1 && pc.fov !== cam.sphereFov) {
      pc.fov = cam.sphereFov;
      pc.updateProjectionMatrix();
    }
  }, -2);
  return <OrbitControls ref={controls as any} enabled={false} enablePan={false} minDistance={R * 1.25} maxDistance={R * 6} rotateSpeed={0.6} zoomSpeed={0.8} />;
}

/** Advances the clock while time plays. */
function Player() {
  const { clock } = useView();
  const invalidate = useThree((s) => s.invalidate);
  useFrame((_s, delta) => {
    if (!clock.playing) return;
    const t0 = performance.now();
    clock.setMs(clock.ms + Math.min(delta, 0.25) * 1000 * clock.rate);
    const st = window.__armillaStats;
    if (st) st.updateMs += performance.now() - t0;
    invalidate();
  }, -3);
  useEffect(() => clock.subscribe(() => invalidate()), [clock, invalidate]);
  return null;
}

/** Pointer handling on the WebGL canvas. */
function Interaction({ onPickPoint }: { onPickPoint?: ((anchor: { ra: number; dec: number; azimuth: number; altitude: number }) => void) | undefined }) {
  const { cam, store, hud, model, clock } = useView();
  const { gl, camera, invalidate } = useThree();
  useEffect(() => {
    const el = gl.domElement;
    const pointers = new Map<number, { x: number; y: number }>();
    let downAt: { x: number; y: number } | null = null;
    let pinchDist = 0;
    let hoverPending = false;
    let lastHover = { x: 0, y: 0 };
    const ray = new THREE.Raycaster();
    const ndc = new THREE.Vector2();
    const isObserver = () => cam.t === 0 && store.get().mode === 'observer';

    const dirAt = (x: number, y: number): number[] | null => {
      const r = el.getBoundingClientRect();
      ndc.set(((x - r.left) / r.width) * 2 - 1, -((y - r.top) / r.height) * 2 + 1);
      camera.updateMatrixWorld();
      ray.setFromCamera(ndc, camera);
      const o = ray.ray.origin, d = ray.ray.direction;
      const w = raySphereDirection([o.x, o.y, o.z], [d.x, d.y, d.z], R);
      return w ? (worldToEnu([0, 0, 0], w) as number[]) : null;
    };

    const hover = () => {
      hoverPending = false;
      const enu = dirAt(lastHover.x, lastHover.y);
      hud.readout?.(enu ? engine.readoutAt(enu, model.site, new Date(model.ms), model.frame) : null);
    };

    const pick = (x: number, y: number): Selection | null => {
      const r = el.getBoundingClientRect();
      const px = x - r.left, py = y - r.top;
      const v = new THREE.Vector3();
      const w = [0, 0, 0];
      let best: Selection | null = null;
      let bestD = 14 * 14;
      const test = (enu: ArrayLike<number>, sel: Selection, bias = 0) => {
        enuToWorld(w, enu, R);
        v.set(w[0], w[1], w[2]).applyMatrix4(camera.matrixWorldInverse);
        if (v.z >= 0) return;
        v.applyMatrix4(camera.projectionMatrix);
        const sx = (v.x * 0.5 + 0.5) * r.width, sy = (-v.y * 0.5 + 0.5) * r.height;
        const d = (sx - px) ** 2 + (sy - py) ** 2 - bias;
        if (d < bestD) {
          bestD = d;
          best = sel;
        }
      };
      const L = store.get().layers;
      if (L.targets) for (const t of model.targets) test(t.enu, { kind: 'target', id: t.id }, 40);
      if (L.bodies) for (const b of model.bodies) test(b.enu, { kind: 'body', body: b.body }, 30);
      if (L.stars && model.cat) {
        const n = model.starCountTo(L.limitingMagnitude);
        const e = [0, 0, 0];
        for (let i = 0; i < n; i++) {
          e[0] = model.starEnu[i * 3];
          e[1] = model.starEnu[i * 3 + 1];
          e[2] = model.starEnu[i * 3 + 2];
          test(e, { kind: 'star', index: i });
        }
      }
      return best;
    };

    const onDown = (e: PointerEvent) => {
      pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
      if (pointers.size === 1) downAt = { x: e.clientX, y: e.clientY };
      if (pointers.size === 2) {
        const [a, b] = [...pointers.values()];
        pinchDist = Math.hypot(a.x - b.x, a.y - b.y);
      }
      if (isObserver()) el.setPointerCapture(e.pointerId);
    };
    const onMove = (e: PointerEvent) => {
      lastHover = { x: e.clientX, y: e.clientY };
      if (!hoverPending) {
        hoverPending = true;
        requestAnimationFrame(hover);
      }
      const p = pointers.get(e.pointerId);
      if (!p || !isObserver()) return;
      if (pointers.size === 2) {
        pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
        const [a, b] = [...pointers.values()];
        const d = Math.hypot(a.x - b.x, a.y - b.y);
        if (pinchDist > 0) cam.fov = Math.max(10, Math.min(120, (cam.fov * pinchDist) / d));
        pinchDist = d;
        invalidate();
        return;
      }
      const h = el.clientHeight || 1;
      const degPerPx = cam.fov / h;
      cam.az = (cam.az - (e.clientX - p.x) * degPerPx + 360) % 360;
      cam.alt = Math.max(-30, Math.min(89.5, cam.alt + (e.clientY - p.y) * degPerPx));
      pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
      invalidate();
    };
    const onUp = (e: PointerEvent) => {
      pointers.delete(e.pointerId);
      if (downAt && Math.hypot(e.clientX - downAt.x, e.clientY - downAt.y) < 5 && pointers.size === 0) {
        const sel = pick(e.clientX, e.clientY);
        if (sel) store.set({ selected: sel });
        else {
          const enu = dirAt(e.clientX, e.clientY);
          if (enu && onPickPoint) {
            const r = engine.readoutAt(enu, model.site, new Date(model.ms), model.frame);
            onPickPoint({ ra: r.raDeg, dec: r.decDeg, azimuth: r.azDeg, altitude: r.altDeg });
          }
          store.set({ selected: null });
        }
        invalidate();
      }
      if (pointers.size === 0) downAt = null;
    };
    const onWheel = (e: WheelEvent) => {
      if (!isObserver()) return;
      e.preventDefault();
      cam.fov = Math.max(10, Math.min(120, cam.fov * Math.exp(e.deltaY * 0.001)));
      invalidate();
    };
    const onLeave = () => hud.readout?.(null);
    el.addEventListener('pointerdown', onDown);
    el.addEventListener('pointermove', onMove);
    el.addEventListener('pointerup', onUp);
    el.addEventListener('pointercancel', onUp);
    el.addEventListener('pointerleave', onLeave);
    el.addEventListener('wheel', onWheel, { passive: false });
    const unsub = clock.subscribe(() => {
      if (!hoverPending && lastHover.x) {
        hoverPending = true;
        requestAnimationFrame(hover);
      }
    });
    return () => {
      el.removeEventListener('pointerdown', onDown);
      el.removeEventListener('pointermove', onMove);
      el.removeEventListener('pointerup', onUp);
      el.removeEventListener('pointercancel', onUp);
      el.removeEventListener('pointerleave', onLeave);
      el.removeEventListener('wheel', onWheel);
      unsub();
    };
  }, [gl, camera, onPickPoint]);
  return null;
}

/** Renders the scene, then the label overlay, and counts frames for the benchmark. */
function Renderer() {
  const { model, store, hud, cam } = useView();
  const ui = useStore(store, (s) => s);
  const cache = useRef<{ version: number; ui: unknown; items: LabelItem[] }>({ version: -1, ui: null, items: [] });
  const { gl, scene, camera } = useThree();
  useEffect(() => {
    // Test hook: page coordinates of a body as drawn (null when off screen, below the horizon or under a panel).
    (window as any).__armillaProject = (body: string) => {
      const b = model.bodies.find((x) => x.body === body);
      if (!b || b.altDeg < 2) return null;
      const w = enuToWorld([0, 0, 0], b.enu, R);
      const v = new THREE.Vector3(w[0], w[1], w[2]).applyMatrix4(camera.matrixWorldInverse);
      if (v.z >= 0) return null;
      v.applyMatrix4(camera.projectionMatrix);
      if (Math.abs(v.x) > 0.9 || Math.abs(v.y) > 0.9) return null;
      const r = gl.domElement.getBoundingClientRect();
      const x = r.left + (v.x * 0.5 + 0.5) * r.width, y = r.top + (-v.y * 0.5 + 0.5) * r.height;
      // Not under one of the panels or bars drawn over the sky (a click there would not reach the sky).
      const top = document.elementFromPoint(x, y);
      if (top && !gl.domElement.closest('[data-testid=sky-canvas]')?.contains(top)) return null;
      return { x, y };
    };
    hud.snapshot = async () => {
      gl.render(scene, camera);
      return gl.domElement.toDataURL('image/png');
    };
    return () => {
      hud.snapshot = null;
    };
  }, [gl, scene, camera]);
  const sky = useMemo(() => ({ c: new THREE.Color(), alt: NaN }), []);
  useFrame(({ gl, scene, camera, size }) => {
    const t0 = performance.now();
    // Behind the sky dome (and in the Sphere view): the zenith colour of this Sun altitude, darkened.
    const sunAlt = model.sun?.altDeg ?? -90;
    if (Math.abs(sunAlt - sky.alt) > 0.05 || Number.isNaN(sky.alt)) {
      sky.alt = sunAlt;
      const z = skyGradient(sunAlt).zenith;
      sky.c.setRGB(z[0] * 0.6, z[1] * 0.6, z[2] * 0.6, THREE.SRGBColorSpace);
      gl.setClearColor(sky.c);
    }
    gl.render(scene, camera);
    const t1 = performance.now();
    const c = cache.current;
    if (c.version !== model.version || c.ui !== ui) {
      c.items = collectLabels(model, ui.layers, ui.pins, ui.comments, ui.selected);
      c.version = model.version;
      c.ui = ui;
    }
    const ov = hud.overlay;
    if (ov) {
      const dpr = Math.min(2, Math.max(1, window.devicePixelRatio || 1)); // labels stay sharp when the WebGL canvas renders at a reduced ratio
      const w = Math.round(size.width * dpr), h = Math.round(size.height * dpr);
      if (ov.width !== w || ov.height !== h) {
        ov.width = w;
        ov.height = h;
      }
      const ctx = ov.getContext('2d');
      if (ctx) {
        const hide = ui.layers.ground && cam.t < 0.5;
        drawOverlay(ctx, size.width, size.height, dpr, camera, c.items, hide, cam.t);
        if (ui.layers.pins) drawPins(ctx, size.width, size.height, camera, model, ui.pins, hide);
      }
    }
    const st = window.__armillaStats;
    if (st) {
      st.renderMs += t1 - t0;
      st.overlayMs += performance.now() - t1;
      st.frames++;
      st.drawCalls = gl.info.render.calls;
      st.triangles = gl.info.render.triangles;
      st.lastFrameAt = performance.now();
      st.firstFrameAt ??= st.lastFrameAt;
    }
    engine.frameDrawn();
  }, 1);
  return null;
}

export interface SkyCanvasProps {
  handles: ViewHandles;
  onPickPoint?: ((anchor: { ra: number; dec: number; azimuth: number; altitude: number }) => void) | undefined;
}

function Layers() {
  const { store } = useView();
  const L = useStore(store, (s) => s.layers);
  const ready = useStore(store, (s) => s.catalogueReady);
  const { model } = useView();
  const hasEnvelope = !!model.envelope;
  return (
    <>
      <SkyDome />
      <Ground show={L.ground} />
      {L.altAzGrid && <Grid kind="altAzGrid" />}
      {L.raDecGrid && <Grid kind="raDecGrid" />}
      {L.eclipticGrid && <Grid kind="eclipticGrid" />}
      {CIRCLE_KEYS.map((k) => L[k] && <Ring key={k} k={k} />)}
      <Axes />
      {L.stars && ready && <Stars limit={L.limitingMagnitude} />}
      {L.bodies && <Bodies />}
      {L.envelope && hasEnvelope && <Envelope />}
    </>
  );
}

/**
 * MSAA is costly on a software rasteriser (SwiftShader, used when there is no GPU): detect it once and
 * render without antialiasing there. `?aa=1` / `?aa=0` in the page URL overrides.
 */
let aaChoice: boolean | null = null;
const RENDERER_KEY = 'armilla.webglRenderer';
function wantAntialias(): boolean {
  if (aaChoice !== null) return aaChoice;
  const q = new URLSearchParams(location.search).get('aa');
  if (q === '0' || q === '1') return (aaChoice = q === '1');
  // The probe costs a second WebGL context (50–180 ms on a software renderer): remembered per browser.
  try {
    const seen = localStorage.getItem(RENDERER_KEY);
    if (seen === 'hardware' || seen === 'software') return (aaChoice = seen === 'hardware');
  } catch {
    /* storage blocked: probe every time */
  }
  try {
    const c = document.createElement('canvas');
    const g = c.getContext('webgl2') ?? c.getContext('webgl');
    const ext = g?.getExtension('WEBGL_debug_renderer_info');
    const name = g && ext ? String(g.getParameter(ext.UNMASKED_RENDERER_WEBGL)) : '';
    g?.getExtension('WEBGL_lose_context')?.loseContext();
    aaChoice = !/swiftshader|llvmpipe|software/i.test(name);
    if (name) localStorage.setItem(RENDERER_KEY, aaChoice ? 'hardware' : 'software');
  } catch {
    aaChoice ??= true;
  }
  return aaChoice;
}

/** True when WebGL runs on a software rasteriser (SwiftShader, llvmpipe): no GPU on this machine. */
function softwareRenderer(): boolean {
  return wantAntialias() === false && new URLSearchParams(location.search).get('aa') === null;
}

/**
 * On a software rasteriser every pixel costs CPU time: render the canvas at a reduced resolution and let
 * the browser scale it up (lines stay sharp enough; labels are drawn by the overlay at full resolution).
 * The ratio is at most 0.5 and shrinks so that the drawing buffer stays within a fixed pixel budget:
 * measured on the 2-core bench machine (2026-12-03, quiet), SwiftShader's GPU process spends about 28 ms a
 * frame whatever the size plus about 90 ms per million drawn pixels, so a 1902×958 canvas at 0.5 (0.46 Mpx)
 * ran at 19–25 fps where the 1440×900 layout (0.28 Mpx) ran at 30–38. With the budget, a larger window
 * costs what the 1440×900 one does and draws slightly softer lines. `?dpr=` in the page URL overrides.
 */
function softwareDpr(width: number, height: number): number {
  const q = Number(new URLSearchParams(location.search).get('dpr'));
  if (Number.isFinite(q) && q > 0 && q <= 2) return q;
  const px = Math.max(1, width * height);
  return Math.min(SOFTWARE_DPR, Math.max(0.25, Math.sqrt(SOFTWARE_PIXEL_BUDGET / px)));
}
const SOFTWARE_DPR = 0.5;
/** Drawing-buffer pixels on a software rasteriser: the 1440×900 layout's canvas (1422×778) at 0.5. */
const SOFTWARE_PIXEL_BUDGET = 280_000;

/** Keeps a software rasteriser's drawing buffer within SOFTWARE_PIXEL_BUDGET as the canvas is resized. */
function SoftwareResolution() {
  const width = useThree((s) => s.size.width);
  const height = useThree((s) => s.size.height);
  const setDpr = useThree((s) => s.setDpr);
  useEffect(() => {
    setDpr(softwareDpr(width, height));
  }, [width, height, setDpr]);
  return null;
}

export default function SkyCanvas({ handles, onPickPoint }: SkyCanvasProps) {
  const invalidateRef = useRef<(() => void) | null>(null);
  useEffect(() => {
    handles.hud.invalidate = () => invalidateRef.current?.();
    return () => {
      handles.hud.invalidate = null;
    };
  }, [handles]);
  return (
    <Canvas
      frameloop="demand"
      dpr={softwareRenderer() ? softwareDpr(window.innerWidth, window.innerHeight) : [1, 2]}
      gl={{ antialias: !softwareRenderer() && wantAntialias(), alpha: false, preserveDrawingBuffer: false }}
      camera={{ fov: handles.cam.fov, near: 0.1, far: 2000, position: [0, 0, 0] }}
      onCreated={(s) => {
        s.gl.setClearColor('#05070d');
        // three.js asks the driver for every shader's compile status right after linking, which waits for
        // the compile (a software renderer compiles slowly); its documentation advises turning this check
        // off in production. `?shadercheck=1` turns it back on when working on a shader.
        s.gl.debug.checkShaderErrors = new URLSearchParams(location.search).get('shadercheck') === '1';
        invalidateRef.current = s.invalidate;
        window.__armillaStats ??= { frames: 0, firstFrameAt: null, startedAt: performance.now(), lastFrameAt: 0, updateMs: 0, renderMs: 0, overlayMs: 0 };
      }}
      aria-hidden="true"
      style={{ position: 'absolute', inset: 0, touchAction: 'none' }}
    >
      <ViewContext.Provider value={handles}>
        {softwareRenderer() && <SoftwareResolution />}
        <CameraRig />
        <Player />
        <Interaction onPickPoint={onPickPoint} />
        <Layers />
        <Renderer />
      </ViewContext.Provider>
    </Canvas>
  );
}


