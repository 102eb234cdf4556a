/**
 * three.js materials of the view: fat lines with an arbitrary on/off pattern (solid, dashed, dotted,
 * dash-dot...), round star points sized in pixels, and the Sun/Moon/planet discs (the Moon lit by the
 * phase the engine reports).
 */
import * as THREE from 'three';
import { LineMaterial } from 'three/examples/jsm/lines/LineMaterial.js';

const DASH_LINE = 'if ( mod( vLineDistance + dashOffset, dashSize + gapSize ) > dashSize ) discard; // todo - FIX';

/**
 * A LineMaterial whose dash test is replaced by a pattern of up to 8 on/off lengths. Lengths are in CSS
 * pixels; the `dashScale` uniform (world units → pixels) is set per frame by the ring layer.
 */
export function patternLineMaterial(color: string, widthPx: number, pattern: number[], opacity = 1): LineMaterial {
  const m = new LineMaterial({ color: new THREE.Color(color).getHex(), linewidth: widthPx, transparent: opacity < 1, opacity, dashed: true, worldUnits: false });
  const pat = new Float32Array(8);
  pattern.slice(0, 8).forEach((v, i) => (pat[i] = v));
  m.uniforms.uPattern = { value: pat };
  m.uniforms.uPatternN = { value: Math.min(8, pattern.length) };
  m.uniforms.uPatternLen = { value: pattern.reduce((a, b) => a + b, 0) || 1 };
  if (!m.fragmentShader.includes(DASH_LINE)) throw new Error('LineMaterial shader changed: pattern patch needs updating');
  m.fragmentShader = m.fragmentShader
    .replace('uniform float dashOffset;', 'uniform float dashOffset;\nuniform float uPattern[8];\nuniform int uPatternN;\nuniform float uPatternLen;')
    .replace(
      DASH_LINE,
      `if ( uPatternN > 0 ) {
        float d = mod( vLineDistance, uPatternLen );
        float acc = 0.0;
        bool draw = false;
        for ( int i = 0; i < 8; i ++ ) {
          if ( i >= uPatternN ) break;
          acc += uPattern[ i ];
          if ( d < acc ) { draw = ( i - ( i / 2 ) * 2 ) == 0; break; }
        }
        if ( ! draw ) discard;
      }`,
    );
  return m;
}

/** Round points with per-vertex size (CSS px) and colour; soft edge. */
export function starMaterial(): THREE.ShaderMaterial {
  return new THREE.ShaderMaterial({
    uniforms: { uPixelRatio: { value: 1 }, uScale: { value: 1 } },
    vertexShader: /* glsl */ `
      attribute float aSize;
      attribute vec3 aColor;
      uniform float uPixelRatio;
      uniform float uScale;
      varying vec3 vColor;
      void main() {
        vColor = aColor;
        vec4 mv = modelViewMatrix * vec4(position, 1.0);
        gl_Position = projectionMatrix * mv;
        gl_PointSize = aSize * uPixelRatio * uScale;
      }`,
    fragmentShader: /* glsl */ `
      varying vec3 vColor;
      void main() {
        vec2 c = gl_PointCoord - 0.5;
        float r = length(c) * 2.0;
        if (r > 1.0) discard;
        float a = smoothstep(1.0, 0.55, r);
        gl_FragColor = vec4(vColor, a);
      }`,
    transparent: true,
    depthWrite: false,
  });
}

/**
 * Body discs: per-vertex size, colour and a light direction in screen space (x right, y up, z towards the
 * viewer). A fully lit disc has light (0,0,1); the Moon's comes from its phase angle and the Sun's direction.
 */
export function bodyMaterial(): THREE.ShaderMaterial {
  return new THREE.ShaderMaterial({
    uniforms: { uPixelRatio: { value: 1 } },
    vertexShader: /* glsl */ `
      attribute float aSize;
      attribute vec3 aColor;
      attribute vec3 aLight;
      uniform float uPixelRatio;
      varying vec3 vColor;
      varying vec3 vLight;
      void main() {
        vColor = aColor;
        vLight = aLight;
        vec4 mv = modelViewMatrix * vec4(position, 1.0);
        gl_Position = projectionMatrix * mv;
        gl_PointSize = aSize * uPixelRatio;
      }`,
    fragmentShader: /* glsl */ `
      varying vec3 vColor;
      varying vec3 vLight;
      void main() {
        vec2 c = (gl_PointCoord - 0.5) * 2.0;
        c.y = -c.y;
        float r2 = dot(c, c);
        if (r2 > 1.0) discard;
        vec3 n = vec3(c, sqrt(1.0 - r2));
        float lit = smoothstep(-0.04, 0.04, dot(n, vLight));
        vec3 dark = vColor * 0.16;
        vec3 col = mix(dark, vColor, lit);
        float edge = smoothstep(1.0, 0.86, r2);
        gl_FragColor = vec4(col, edge);
      }`,
    transparent: true,
    depthWrite: false,
  });
}
