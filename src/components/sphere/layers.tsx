/**
 * The scene as a list of layers. Each layer keeps its three.js objects for its lifetime and refreshes its
 * buffers in useFrame only when the model's version moved (time or site changed): no React state per frame.
 */
import { useFrame } from '@react-three/fiber';
import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import type { LineMaterial } from 'three/examples/jsm/lines/LineMaterial.js';
import { useView } from './context';
import * as engine from './sky-adapter';
import { altAzToEnu, buildGrid, enuListToWorld, enuToWorld, envelopeShell, envelopeTintFace, SPHERE_RADIUS, tintIndices, starSizePx, starTint, unitFromLonLat } from './geometry';
import { bodyMaterial, FlatFillMaterial, patternLineMaterial, srgbOf, starMaterial } from './materials';
import { RING_SEGMENTS } from './model';
import { CIRCLE_STYLES, COLORS, GRID_STYLES, type CircleKey } from './styles';
import { PLAN_LINES, PLANET_TINTS } from '../../lib/style/palette';

const R = SPHERE_RADIUS;

/** Pixels per world unit at the distance of the sphere, for screen-sized dash patterns. */
function pxPerUnit(camera: THREE.Camera, height: number, t: number): number {
  const cam = camera as THREE.PerspectiveCamera;
  const dist = R * (1 - t) + Math.max(R, cam.position.length()) * t;
  return height / (2 * dist * Math.tan((cam.fov * Math.PI) / 360));
}

/**
 * LineSegmentsGeometry's quad: corners (x = side, y = which end; y outside 0…1 = round cap) and triangles.
 * Without caps a segment is 4 corners and 2 triangles: half the vertex work, and on a smooth ring the
 * joints cannot be seen. The horizon mask, whose skyline has corners, keeps its round caps.
 */
const QUAD = {
  caps: {
    pos: [-1, 2, 0, 1, 2, 0, -1, 1, 0, 1, 1, 0, -1, 0, 0, 1, 0, 0, -1, -1, 0, 1, -1, 0],
    uv: [-1, 2, 1, 2, -1, 1, 1, 1, -1, -1, 1, -1, -1, -2, 1, -2],
    index: [0, 2, 1, 2, 3, 1, 2, 4, 3, 4, 5, 3, 4, 6, 5, 6, 7, 5],
  },
  plain: {
    pos: [-1, 1, 0, 1, 1, 0, -1, 0, 0, 1, 0, 0],
    uv: [-1, 1, 1, 1, -1, -1, 1, -1],
    index: [0, 2, 1, 2, 3, 1],
  },
};

/**
 * A fat polyline drawn with three's LineMaterial (screen-space width, our dash patterns), but as a plain,
 * non-instanced mesh: each segment's quad carries its two end points as ordinary vertex attributes.
 * Line2 draws one instance per segment; a plain mesh is the same picture with less work for a software
 * rasteriser (SwiftShader, no GPU). Vertices are rewritten in place (no allocation after creation).
 */
class PolyLine {
  geom = new THREE.BufferGeometry();
  line: THREE.Mesh;
  n: number;
  private k: number;
  private start: THREE.BufferAttribute;
  private end: THREE.BufferAttribute;
  private dStart: THREE.BufferAttribute;
  private dEnd: THREE.BufferAttribute;
  private buf = new THREE.Vector2();
  constructor(public mat: LineMaterial, points: number, caps = false) {
    this.n = points;
    const q = caps ? QUAD.caps : QUAD.plain;
    const k = (this.k = q.pos.length / 3);
    const segs = Math.max(1, points - 1);
    const pos = new Float32Array(segs * k * 3);
    const uv = new Float32Array(segs * k * 2);
    const index = new (segs * k > 65535 ? Uint32Array : Uint16Array)(segs * q.index.length);
    for (let i = 0; i < segs; i++) {
      pos.set(q.pos, i * k * 3);
      uv.set(q.uv, i * k * 2);
      for (let j = 0; j < q.index.length; j++) index[i * q.index.length + j] = q.index[j] + i * k;
    }
    this.geom.setIndex(new THREE.BufferAttribute(index, 1));
    this.geom.setAttribute('position', new THREE.BufferAttribute(pos, 3));
    this.geom.setAttribute('uv', new THREE.BufferAttribute(uv, 2));
    this.start = new THREE.BufferAttribute(new Float32Array(segs * k * 3), 3);
    this.end = new THREE.BufferAttribute(new Float32Array(segs * k * 3), 3);
    this.dStart = new THREE.BufferAttribute(new Float32Array(segs * k), 1);
    this.dEnd = new THREE.BufferAttribute(new Float32Array(segs * k), 1);
    for (const a of [this.start, this.end, this.dStart, this.dEnd]) a.setUsage(THREE.DynamicDrawUsage);
    this.geom.setAttribute('instanceStart', this.start);
    this.geom.setAttribute('instanceEnd', this.end);
    this.geom.setAttribute('instanceDistanceStart', this.dStart);
    this.geom.setAttribute('instanceDistanceEnd', this.dEnd);
    this.line = new THREE.Mesh(this.geom, mat);
    this.line.frustumCulled = false;
    // LineMaterial's width is in pixels of the drawing buffer (as Line2 sets it before each render).
    this.line.onBeforeRender = (renderer) => {
      renderer.getDrawingBufferSize(this.buf);
      mat.resolution.set(this.buf.x, this.buf.y);
    };
  }
  /** Writes a polyline of world points into the segment buffers, with the dash distances. */
  set(world: ArrayLike<number>) {
    const s = this.start.array as Float32Array, e = this.end.array as Float32Array;
    const ds = this.dStart.array as Float32Array, de = this.dEnd.array as Float32Array;
    const segs = this.n - 1;
    let acc = 0;
    for (let i = 0; i < segs; i++) {
      const ax = world[i * 3], ay = world[i * 3 + 1], az = world[i * 3 + 2];
      const bx = world[i * 3 + 3], by = world[i * 3 + 4], bz = world[i * 3 + 5];
      const d0 = acc;
      acc += Math.sqrt((bx - ax) ** 2 + (by - ay) ** 2 + (bz - az) ** 2);
      for (let v = 0; v < this.k; v++) {
        const j = (i * this.k + v) * 3;
        s[j] = ax; s[j + 1] = ay; s[j + 2] = az;
        e[j] = bx; e[j + 1] = by; e[j + 2] = bz;
        ds[i * this.k + v] = d0;
        de[i * this.k + v] = acc;
      }
    }
    this.start.needsUpdate = this.end.needsUpdate = this.dStart.needsUpdate = this.dEnd.needsUpdate = true;
  }
  dispose() {
    this.geom.dispose();
    this.mat.dispose();
  }
}

export function Ring({ k }: { k: CircleKey }) {
  const { model, cam } = useView();
  const style = CIRCLE_STYLES[k];
  const pl = useMemo(() => new PolyLine(patternLineMaterial(style.color, style.widthPx, style.pattern), RING_SEGMENTS + 1), [k]);
  const world = useMemo(() => new Float32Array((RING_SEGMENTS + 1) * 3), []);
  const last = useRef(-1);
  useEffect(() => () => pl.dispose(), [pl]);
  useFrame(({ camera, size }) => {
    if (last.current !== model.version) {
      enuListToWorld(model.rings[k], R, world);
      pl.set(world);
      last.current = model.version;
    }
    pl.mat.dashScale = pxPerUnit(camera, size.height, cam.t);
  });
  return <primitive object={pl.line} renderOrder={3} />;
}

/** Row-major frame → ENU (3×3) to a three Matrix4 frame → world. */
function frameToWorld(out: THREE.Matrix4, m: ArrayLike<number> | null): THREE.Matrix4 {
  if (!m) return out.set(1, 0, 0, 0, 0, 0, 1, 0, 0, -1, 0, 0, 0, 0, 0, 1);
  return out.set(m[0], m[1], m[2], 0, m[6], m[7], m[8], 0, -m[3], -m[4], -m[5], 0, 0, 0, 0, 1);
}

/** A coordinate grid built once in its own frame; the engine's rotation for the instant is the object matrix. */
export function Grid({ kind }: { kind: 'altAzGrid' | 'raDecGrid' | 'eclipticGrid' }) {
  const { model } = useView();
  const obj = useMemo(() => {
    const g = buildGrid(
      kind === 'altAzGrid' ? (az, alt, o) => altAzToEnu(o, az, alt) : (lon, lat, o) => unitFromLonLat(o, lon, lat),
      { lonStep: kind === 'raDecGrid' ? 15 : 30, latStep: 15, stepDeg: 6, lonLabel: String, latLabel: String },
    );
    const pos = new Float32Array(g.segments.length);
    for (let i = 0; i < pos.length; i++) pos[i] = g.segments[i] * R;
    const geom = new THREE.BufferGeometry();
    geom.setAttribute('position', new THREE.BufferAttribute(pos, 3));
    const st = GRID_STYLES[kind];
    const mat = new THREE.LineBasicMaterial({ color: st.color, transparent: true, opacity: st.opacity, depthWrite: false });
    const ls = new THREE.LineSegments(geom, mat);
    ls.matrixAutoUpdate = false;
    ls.frustumCulled = false;
    return ls;
  }, [kind]);
  useEffect(() => () => {
    obj.geometry.dispose();
    (obj.material as THREE.Material).dispose();
  }, [obj]);
  const last = useRef(-1);
  useFrame(() => {
    if (last.current === model.version) return;
    last.current = model.version;
    const m = kind === 'altAzGrid' ? null : kind === 'raDecGrid' ? model.frame.icrsToEnu : model.eclToEnu;
    frameToWorld(obj.matrix, m);
    obj.matrixWorldNeedsUpdate = true;
  });
  return <primitive object={obj} renderOrder={1} />;
}

export function Stars({ limit }: { limit: number }) {
  const { model, store } = useView();
  const ready = store.get().catalogueReady;
  const points = useMemo(() => {
    const cat = model.cat;
    const n = cat?.count ?? 0;
    const geom = new THREE.BufferGeometry();
    const size = new Float32Array(n);
    const color = new Float32Array(n * 3);
    for (let i = 0; i < n; i++) {
      size[i] = starSizePx(cat!.vmag[i]);
      const c = starTint(cat!.vmag[i]);
      color[i * 3] = c[0];
      color[i * 3 + 1] = c[1];
      color[i * 3 + 2] = c[2];
    }
    geom.setAttribute('position', new THREE.BufferAttribute(new Float32Array(n * 3), 3));
    geom.setAttribute('aSize', new THREE.BufferAttribute(size, 1));
    geom.setAttribute('aColor', new THREE.BufferAttribute(color, 3));
    const p = new THREE.Points(geom, starMaterial());
    p.frustumCulled = false;
    return p;
  }, [ready, model]);
  useEffect(() => () => {
    points.geometry.dispose();
    (points.material as THREE.Material).dispose();
  }, [points]);
  const last = useRef(-1);
  useFrame(({ gl }) => {
    (points.material as THREE.ShaderMaterial).uniforms.uPixelRatio.value = gl.getPixelRatio();
    points.geometry.setDrawRange(0, model.starCountTo(limit));
    if (last.current === model.version) return;
    last.current = model.version;
    const attr = points.geometry.attributes.position as THREE.BufferAttribute;
    enuListToWorld(model.starEnu, R, attr.array as Float32Array);
    attr.needsUpdate = true;
  });
  return <primitive object={points} renderOrder={2} />;
}

const BODY_COLORS: Record<string, string> = {
  sun: COLORS.sun, moon: COLORS.moonLit, ...PLANET_TINTS,
};

export function Bodies() {
  const { model } = useView();
  const N = 9;
  const points = useMemo(() => {
    const geom = new THREE.BufferGeometry();
    geom.setAttribute('position', new THREE.BufferAttribute(new Float32Array(N * 3), 3));
    geom.setAttribute('aSize', new THREE.BufferAttribute(new Float32Array(N), 1));
    geom.setAttribute('aColor', new THREE.BufferAttribute(new Float32Array(N * 3), 3));
    geom.setAttribute('aLight', new THREE.BufferAttribute(new Float32Array(N * 3), 3));
    const p = new THREE.Points(geom, bodyMaterial());
    p.frustumCulled = false;
    return p;
  }, []);
  useEffect(() => () => {
    points.geometry.dispose();
    (points.material as THREE.Material).dispose();
  }, [points]);
  const last = useRef(-1);
  const s = useMemo(() => ({ m: new THREE.Vector3(), sv: new THREE.Vector3(), c: new THREE.Color(), w: [0, 0, 0] }), []);
  useFrame(({ camera, gl }) => {
    (points.material as THREE.ShaderMaterial).uniforms.uPixelRatio.value = gl.getPixelRatio();
    const g = points.geometry;
    const pos = g.attributes.position as THREE.BufferAttribute;
    const size = g.attributes.aSize as THREE.BufferAttribute;
    const col = g.attributes.aColor as THREE.BufferAttribute;
    const light = g.attributes.aLight as THREE.BufferAttribute;
    const bodies = model.bodies;
    if (last.current !== model.version) {
      last.current = model.version;
      for (let i = 0; i < N; i++) {
        const b = bodies[i];
        if (!b) {
          size.setX(i, 0);
          continue;
        }
        enuToWorld(s.w, b.enu, R * 0.995);
        pos.setXYZ(i, s.w[0], s.w[1], s.w[2]);
        size.setX(i, b.body === 'sun' || b.body === 'moon' ? 24 : Math.max(5, Math.min(11, 7 - b.magnitude)));
        s.c.set(BODY_COLORS[b.body] ?? COLORS.planet);
        col.setXYZ(i, s.c.r, s.c.g, s.c.b);
      }
      pos.needsUpdate = size.needsUpdate = col.needsUpdate = true;
    }
    // The Moon's lit side faces the Sun on screen; its phase angle comes from the engine.
    camera.updateMatrixWorld();
    for (let i = 0; i < N; i++) {
      const b = bodies[i];
      if (!b || b.body !== 'moon' || !model.sun || b.phaseAngleDeg === undefined) {
        light.setXYZ(i, 0, 0, 1);
        continue;
      }
      enuToWorld(s.w, b.enu, R);
      s.m.set(s.w[0], s.w[1], s.w[2]).applyMatrix4(camera.matrixWorldInverse);
      enuToWorld(s.w, model.sun.enu, R);
      s.sv.set(s.w[0], s.w[1], s.w[2]).applyMatrix4(camera.matrixWorldInverse).sub(s.m);
      const mh = s.m.normalize();
      s.sv.addScaledVector(mh, -s.sv.dot(mh));
      const d = Math.hypot(s.sv.x, s.sv.y) || 1;
      const ph = (b.phaseAngleDeg * Math.PI) / 180;
      light.setXYZ(i, (s.sv.x / d) * Math.sin(ph), (s.sv.y / d) * Math.sin(ph), Math.cos(ph));
    }
    light.needsUpdate = true;
  });
  return <primitive object={points} renderOrder={4} />;
}

/*
 * Transparent double-sided meshes are drawn in one pass (forceSinglePass): three would otherwise draw their
 * back faces and then their front faces, twice the work for a tint whose order does not matter.
 */

/** Ground: an opaque lower hemisphere in the Observer view, a translucent horizon disc in the Sphere view. */
export function Ground({ show }: { show: boolean }) {
  const { cam } = useView();
  const objs = useMemo(() => {
    const hemi = new THREE.Mesh(
      new THREE.SphereGeometry(R * 0.97, 64, 24, 0, Math.PI * 2, Math.PI / 2, Math.PI / 2),
      new FlatFillMaterial({ color: COLORS.groundObserver, side: THREE.BackSide, transparent: true, depthWrite: true }),
    );
    hemi.renderOrder = 5;
    const disc = new THREE.Mesh(
      new THREE.CircleGeometry(R, 128).rotateX(-Math.PI / 2),
      new FlatFillMaterial({ color: COLORS.groundSphere, side: THREE.DoubleSide, transparent: true, opacity: 0.35, depthWrite: false, forceSinglePass: true }),
    );
    disc.renderOrder = 0;
    const observer = new THREE.Group();
    const body = new THREE.Mesh(new THREE.ConeGeometry(2.2, 7, 16).translate(0, 3.5, 0), new THREE.MeshBasicMaterial({ color: '#f1f5f9' }));
    const head = new THREE.Mesh(new THREE.SphereGeometry(1.5, 16, 12).translate(0, 8.2, 0), new THREE.MeshBasicMaterial({ color: '#f1f5f9' }));
    observer.add(body, head);
    return { hemi, disc, observer };
  }, []);
  useEffect(() => () => {
    for (const o of [objs.hemi, objs.disc]) {
      o.geometry.dispose();
      (o.material as THREE.Material).dispose();
    }
  }, [objs]);
  useFrame(() => {
    const t = cam.t;
    const hm = objs.hemi.material as FlatFillMaterial;
    hm.opacity = 1 - t;
    // Opaque while it is fully opaque: blending costs every pixel of half the screen on a software rasteriser.
    if (hm.transparent !== t > 0) {
      hm.transparent = t > 0;
      hm.needsUpdate = true;
    }
    objs.hemi.visible = show && t < 0.999;
    hm.depthWrite = t < 0.5;
    (objs.disc.material as FlatFillMaterial).opacity = 0.35 * t;
    objs.disc.visible = show && t > 0.001;
    objs.observer.visible = t > 0.05;
    objs.observer.scale.setScalar(Math.max(0.001, t));
  });
  return (
    <>
      <primitive object={objs.hemi} />
      <primitive object={objs.disc} />
      <primitive object={objs.observer} />
    </>
  );
}

/** Sphere view: the axis through the celestial poles and the zenith–nadir line. */
export function Axes() {
  const { model, cam } = useView();
  const objs = useMemo(() => {
    const polar = new PolyLine(patternLineMaterial(COLORS.axis, 2, []), 2);
    const vertical = new PolyLine(patternLineMaterial(COLORS.referencePoint, 1.4, [4, 4]), 2);
    return { polar, vertical };
  }, []);
  useEffect(() => () => {
    objs.polar.dispose();
    objs.vertical.dispose();
  }, [objs]);
  const last = useRef(-1);
  const w = useMemo(() => new Float32Array(6), []);
  useFrame(({ size, camera }) => {
    const vis = cam.t > 0.02;
    objs.polar.line.visible = objs.vertical.line.visible = vis;
    objs.polar.mat.opacity = objs.vertical.mat.opacity = cam.t;
    objs.polar.mat.transparent = objs.vertical.mat.transparent = true;
    objs.vertical.mat.dashScale = pxPerUnit(camera, size.height, cam.t);
    if (last.current === model.version) return;
    last.current = model.version;
    const ncp = model.refs.find((r) => r.key === 'ncp');
    if (ncp) {
      const e = enuToWorld([0, 0, 0], ncp.enu, R * 1.25);
      w.set([-e[0], -e[1], -e[2], e[0], e[1], e[2]]);
      objs.polar.set(w);
    }
    w.set([0, -R * 1.15, 0, 0, R * 1.15, 0]);
    objs.vertical.set(w);
  });
  return (
    <>
      <primitive object={objs.polar.line} />
      <primitive object={objs.vertical.line} />
    </>
  );
}

/**
 * The pointing envelope: forbidden directions tinted (evaluated by the engine on an alt-az mesh), the
 * horizon mask as a skyline with the blocked band filled, Sun and Moon keep-out rings.
 */
export function Envelope() {
  const { model, clock } = useView();
  const NA = 120, NB = 45; // 3° in azimuth, 2° in altitude
  const objs = useMemo(() => {
    const n = (NA + 1) * (NB + 1);
    const shell = envelopeShell(NA, NB, R * 0.99);
    const geom = new THREE.BufferGeometry();
    geom.setAttribute('position', new THREE.BufferAttribute(shell.positions, 3));
    geom.setAttribute('color', new THREE.BufferAttribute(new Float32Array(n * 4), 4));
    geom.setIndex(new THREE.BufferAttribute(shell.indices, 1));
    const mesh = new THREE.Mesh(geom, new FlatFillMaterial({ vertexColors: true, transparent: true, side: THREE.FrontSide, depthWrite: false }));
    mesh.frustumCulled = false;
    mesh.renderOrder = 1;
    const maskLine = new PolyLine(patternLineMaterial(COLORS.maskEdge, 2.2, []), 361, true);
    const maskBand = new THREE.Mesh(
      new THREE.BufferGeometry().setAttribute('position', new THREE.BufferAttribute(new Float32Array(361 * 2 * 3), 3)).setIndex(
        Array.from({ length: 360 }, (_, i) => [i * 2, i * 2 + 1, i * 2 + 2, i * 2 + 1, i * 2 + 3, i * 2 + 2]).flat(),
      ),
      new FlatFillMaterial({ color: COLORS.mask, side: THREE.DoubleSide, transparent: true, opacity: 0.85, forceSinglePass: true }),
    );
    maskBand.frustumCulled = false;
    maskBand.renderOrder = 6;
    const sunRing = new PolyLine(patternLineMaterial(COLORS.sunKeepOut, PLAN_LINES.keepOut.widthPx, PLAN_LINES.keepOut.pattern), 97);
    const moonRing = new PolyLine(patternLineMaterial(COLORS.moonKeepOut, 2, PLAN_LINES.keepOut.pattern), 97);
    return { mesh, maskLine, maskBand, sunRing, moonRing };
  }, []);
  useEffect(() => () => {
    objs.mesh.geometry.dispose();
    (objs.mesh.material as THREE.Material).dispose();
    objs.maskLine.dispose();
    objs.maskBand.geometry.dispose();
    objs.sunRing.dispose();
    objs.moonRing.dispose();
  }, [objs]);
  const last = useRef({ version: -1, at: 0, env: null as unknown });
  const w = useMemo(() => new Float32Array(97 * 3), []);
  const { cam } = useView();
  useFrame(({ size, camera }) => {
    // The blocked band reads as landscape in the Observer view; from outside it must not hide the sphere.
    (objs.maskBand.material as FlatFillMaterial).opacity = 0.85 - 0.6 * cam.t;
    // Tint one side only: the inner face from the observer's place, the near (outer) face from outside.
    // Half the fragments of a double-sided shell, which is what a software rasteriser pays for.
    const tintMat = objs.mesh.material as FlatFillMaterial;
    const side = envelopeTintFace(camera.position.length(), R * 0.99) === 'inner' ? THREE.FrontSide : THREE.BackSide;
    if (tintMat.side !== side) {
      tintMat.side = side;
      tintMat.needsUpdate = true;
    }
    for (const pl of [objs.sunRing, objs.moonRing, objs.maskLine]) {
        pl.mat.dashScale = pxPerUnit(camera, size.height, 0);
    }
    const env = model.envelope;
    objs.mesh.visible = !!env;
    objs.maskLine.line.visible = objs.maskBand.visible = !!env?.horizonMask?.length;
    objs.sunRing.line.visible = !!model.sunKeepOut;
    objs.moonRing.line.visible = !!model.moonKeepOut;
    if (!env) return;
    const now = performance.now();
    const L = last.current;
    if (L.version === model.version && L.env === env) return;
    // While time plays, re-shade at most ~4 times a second: the envelope moves slowly.
    if (clock.playing && L.env === env && now - L.at < 250) return;
    L.version = model.version;
    L.env = env;
    L.at = now;
    const hd = { haHours: 0, decDeg: 0 };
    const col = objs.mesh.geometry.attributes.color as THREE.BufferAttribute;
    const arr = col.array as Float32Array;
    const c = srgbOf(COLORS.forbidden);
    const v = [0, 0, 0];
    for (let b = 0; b <= NB; b++) {
      for (let a = 0; a <= NA; a++) {
        const azDeg = (a * 360) / NA, altDeg = (b * 90) / NB;
        model.haDecOfDate(altAzToEnu(v, azDeg, altDeg), hd);
        const ok = engine.checkEnvelope(env, { azDeg, altDeg, haHours: hd.haHours, decDeg: hd.decDeg }, model).inside;
        const i = (b * (NA + 1) + a) * 4;
        arr[i] = c.r;
        arr[i + 1] = c.g;
        arr[i + 2] = c.b;
        arr[i + 3] = ok ? 0 : 0.2;
      }
    }
    col.needsUpdate = true;
    // Draw only the cells with a forbidden corner, wholly forbidden runs merged: far fewer triangles.
    const idx = objs.mesh.geometry.index!;
    const k = tintIndices((v) => arr[v * 4 + 3] > 0, NA, NB, idx.array as Uint32Array);
    idx.needsUpdate = true;
    objs.mesh.geometry.setDrawRange(0, k);
    if (env.horizonMask?.length) {
      const lineW = new Float32Array(361 * 3);
      const band = objs.maskBand.geometry.attributes.position as THREE.BufferAttribute;
      for (let az = 0; az <= 360; az++) {
        const alt = engine.maskAltitude(env.horizonMask, az);
        enuToWorld(v, altAzToEnu(v, az, alt), R * 0.985);
        lineW.set(v, az * 3);
        band.setXYZ(az * 2, v[0], v[1], v[2]);
        enuToWorld(v, altAzToEnu(v, az, -0.5), R * 0.985);
        band.setXYZ(az * 2 + 1, v[0], v[1], v[2]);
      }
      band.needsUpdate = true;
      objs.maskLine.set(lineW);
    }
    if (model.sunKeepOut) {
      enuListToWorld(model.sunKeepOut, R * 0.99, w);
      objs.sunRing.set(w);
    }
    if (model.moonKeepOut) {
      enuListToWorld(model.moonKeepOut, R * 0.99, w);
      objs.moonRing.set(w);
    }
  });
  return (
    <>
      <primitive object={objs.mesh} />
      <primitive object={objs.maskBand} />
      <primitive object={objs.maskLine.line} />
      <primitive object={objs.sunRing.line} />
      <primitive object={objs.moonRing.line} />
    </>
  );
}
