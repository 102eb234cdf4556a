/**
 * The sky background of the Observer view: a sphere around the observer painted per vertex from the Sun's
 * altitude and direction (sky-colour.ts), recoloured only when the Sun has moved. It fades out as the
 * camera leaves for the Sphere view. One opaque draw with no blending while fully shown, colours in sRGB
 * with no per-pixel conversion (FlatFillMaterial: cheap on a software rasteriser). `?sky=flat` in the page URL leaves it out (the benchmark's before/after).
 */
import { useFrame } from '@react-three/fiber';
import { useEffect, useMemo } from 'react';
import * as THREE from 'three';
import { useView } from './context';
import { SPHERE_RADIUS, worldToEnu } from './geometry';
import { skyColourAt, skyGradient } from './sky-colour';
import { FlatFillMaterial } from './materials';

const RAD = 180 / Math.PI;

export function SkyDome() {
  const { model, cam } = useView();
  const objs = useMemo(() => {
    const geom = new THREE.SphereGeometry(SPHERE_RADIUS * 1.5, 48, 24);
    const pos = geom.attributes.position as THREE.BufferAttribute;
    const n = pos.count;
    // Each vertex's direction as east-north-up unit vector and altitude, computed once.
    const enu = new Float32Array(n * 3);
    const alt = new Float32Array(n);
    const w = [0, 0, 0], e = [0, 0, 0];
    for (let i = 0; i < n; i++) {
      w[0] = pos.getX(i);
      w[1] = pos.getY(i);
      w[2] = pos.getZ(i);
      worldToEnu(e, w);
      const len = Math.hypot(e[0]!, e[1]!, e[2]!) || 1;
      enu[i * 3] = e[0]! / len;
      enu[i * 3 + 1] = e[1]! / len;
      enu[i * 3 + 2] = e[2]! / len;
      alt[i] = Math.asin(Math.max(-1, Math.min(1, enu[i * 3 + 2]!))) * RAD;
    }
    geom.setAttribute('color', new THREE.BufferAttribute(new Float32Array(n * 3), 3));
    const mat = new FlatFillMaterial({ vertexColors: true, side: THREE.BackSide, depthWrite: false, depthTest: false });
    const mesh = new THREE.Mesh(geom, mat);
    mesh.renderOrder = -10;
    mesh.frustumCulled = false;
    return { mesh, enu, alt, n, last: { alt: NaN, az: NaN } };
  }, []);
  useEffect(
    () => () => {
      objs.mesh.geometry.dispose();
      (objs.mesh.material as THREE.Material).dispose();
    },
    [objs],
  );
  const flat = useMemo(() => new URLSearchParams(location.search).get('sky') === 'flat', []);
  useFrame(() => {
    if (flat) {
      objs.mesh.visible = false;
      return;
    }
    const t = cam.t;
    const mat = objs.mesh.material as FlatFillMaterial;
    objs.mesh.visible = t < 0.999;
    mat.opacity = 1 - t;
    if (mat.transparent !== t > 0) {
      mat.transparent = t > 0;
      mat.needsUpdate = true;
    }
    const sun = model.sun;
    if (!sun || !objs.mesh.visible) return;
    const last = objs.last;
    if (Math.abs(sun.altDeg - last.alt) < 0.05 && Math.abs(sun.azDeg - last.az) < 0.1) return;
    last.alt = sun.altDeg;
    last.az = sun.azDeg;
    const g = skyGradient(sun.altDeg);
    const col = objs.mesh.geometry.attributes.color as THREE.BufferAttribute;
    const arr = col.array as Float32Array;
    const s = sun.enu, enu = objs.enu;
    for (let i = 0; i < objs.n; i++) {
      const dot = enu[i * 3]! * s[0] + enu[i * 3 + 1]! * s[1] + enu[i * 3 + 2]! * s[2];
      // sRGB, written as it is (FlatFillMaterial: no per-pixel conversion).
      skyColourAt(arr, g, objs.alt[i]!, Math.acos(Math.max(-1, Math.min(1, dot))) * RAD, i * 3);
    }
    col.needsUpdate = true;
  });
  return <primitive object={objs.mesh} />;
}
