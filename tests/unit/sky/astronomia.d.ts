// Minimal declarations for the parts of the `astronomia` package (Meeus's algorithms) the cross-checks use.
declare module 'astronomia/coord' {
  export class Equatorial {
    constructor(ra?: number, dec?: number);
    ra: number;
    dec: number;
    toEcliptic(eps: number): { lon: number; lat: number };
    toHorizontal(g: { lat: number; lon: number }, stSeconds: number): { az: number; alt: number };
  }
}
declare module 'astronomia/precess' {
  export class Precessor {
    constructor(epochFrom: number, epochTo: number);
    precess(eq: { ra: number; dec: number }): { ra: number; dec: number };
  }
}
declare module 'astronomia/nutation' {
  export function nutation(jde: number): [number, number];
}
declare module 'astronomia/sidereal' {
  export function mean(jd: number): number;
}
declare module 'astronomia/moonillum' {
  export function phaseAngle3(jde: number): number;
}
declare module 'astronomia/moonphase' {
  export function newMoon(year: number): number;
}
declare module 'astronomia/illum' {
  export function mars84(r: number, delta: number, i: number): number;
  export function jupiter84(r: number, delta: number, i: number): number;
}
declare module 'astronomia/planetposition' {
  export class Planet {
    constructor(data: unknown);
    position2000(jde: number): { lon: number; lat: number; range: number };
  }
}
declare module 'astronomia/data/vsop87Bearth' { const d: unknown; export default d; }
declare module 'astronomia/data/vsop87Bmars' { const d: unknown; export default d; }
declare module 'astronomia/data/vsop87Bjupiter' { const d: unknown; export default d; }
declare module 'astronomia/refraction' {
  /** Refraction (radians) for a true altitude (radians), Meeus eq. 16.4. */
  export function saemundsson(h: number): number;
  /** Refraction (radians) for an apparent altitude (radians), Meeus eq. 16.3 with the correction. */
  export function bennett2(h0: number): number;
}
