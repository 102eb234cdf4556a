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
