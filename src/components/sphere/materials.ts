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

export interface FlatFillOptions {
  /** Uniform colour (CSS/hex, sRGB); multiplied by the vertex colour when `vertexColors` is set. */
  color?: string;
  vertexColors?: boolean;
  opacity?: number;
  transparent?: boolean;
  side?: THREE.Side;
  depthWrite?: boolean;
  depthTest?: boolean;
  forceSinglePass?: boolean;
}

/**
 * A flat fill for the large surfaces of the view (sky dome, ground, envelope tint, horizon-mask band): the
 * colour, uniform or per vertex (RGB or RGBA), is given in sRGB and written as it is. three's
 * MeshBasicMaterial instead takes linear colours and converts every pixel back to sRGB with a `pow()`; on a
 * software rasteriser (SwiftShader, no GPU) that per-pixel conversion over a fill as large as the screen was
 * most of the sky dome's cost (measured, src/components/sphere/README.md). Blending works on the sRGB values
 * in the framebuffer either way, so a uniform colour gives the same pixels; a per-vertex gradient is
 * interpolated in sRGB, as a CSS gradient is.
 */
export class FlatFillMaterial extends THREE.ShaderMaterial {
  constructor(o: FlatFillOptions = {}) {
    const c = new THREE.Color(o.color ?? '#ffffff');
    const srgb = { r: 1, g: 1, b: 1 };
    c.getRGB(srgb, THREE.SRGBColorSpace);
    super({
      uniforms: { uColor: { value: new THREE.Vector3(srgb.r, srgb.g, srgb.b) }, uOpacity: { value: o.opacity ?? 1 } },
      vertexShader: /* glsl */ `
        uniform vec3 uColor;
        uniform float uOpacity;
        varying vec4 vFill;
        void main() {
          #if defined( USE_COLOR_ALPHA )
            vFill = vec4(uColor * color.rgb, color.a * uOpacity);
          #elif defined( USE_COLOR )
            vFill = vec4(uColor * color, uOpacity);
          #else
            vFill = vec4(uColor, uOpacity);
          #endif
          gl_Position = projectionMatrix * modelViewMatrix * vec4(position, 1.0);
        }`,
      fragmentShader: /* glsl */ `
        varying vec4 vFill;
        void main() { gl_FragColor = vFill; }`,
      vertexColors: o.vertexColors ?? false,
      transparent: o.transparent ?? false,
      side: o.side ?? THREE.FrontSide,
      depthWrite: o.depthWrite ?? true,
      depthTest: o.depthTest ?? true,
      forceSinglePass: o.forceSinglePass ?? false,
    });
  }
  // Material's own `opacity` is not a uniform of a ShaderMaterial: keep the two as one.
  override get opacity(): number {
    return (this.uniforms?.uOpacity?.value as number | undefined) ?? 1;
  }
  override set opacity(v: number) {
    if (this.uniforms?.uOpacity) this.uniforms.uOpacity.value = v;
  }
}

/** A colour's sRGB components (0–1), as FlatFillMaterial's vertex colours want them. */
export function srgbOf(color: string): { r: number; g: number; b: number } {
  const out = { r: 0, g: 0, b: 0 };
  new THREE.Color(color).getRGB(out, THREE.SRGBColorSpace);
  return out;
}
