/**
 * The windows request both `sky.bench.ts` (b) and `compute.bench.ts` send: 200 targets × 12 h with the full
 * envelope (altitude limits, azimuth ranges, keyhole, Sun and Moon avoidance, horizon mask, hour-angle and
 * declination limits). Site: an invented observatory.
 */
export const WINDOWS_BODY = {
  site: { lat: 37.3414, lon: -121.6429, height: 1283 },
  envelope: {
    name: 'full envelope', minAltitude: 20, maxAltitude: 87, azimuthRanges: [[300, 60], [90, 270]], keyholeRadius: 3,
    sunAvoidance: 30, moonAvoidance: 10, horizonMask: Array.from({ length: 36 }, (_, k) => [k * 10, 5 + 10 * Math.abs(Math.sin(k))]),
    hourAngleLimits: [-5.48, 5.23], declinationLimits: [-31.18, 64.1],
  },
  targets: Array.from({ length: 200 }, (_, i) => ({ name: `T${i + 1}`, ra: (i * 37.3) % 360, dec: -60 + ((i * 13.7) % 120) })),
  from: '2024-05-01T02:00:00Z',
  to: '2024-05-01T14:00:00Z',
};
