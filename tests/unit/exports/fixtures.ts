import type { SceneOut } from '../../../src/lib/contracts/scene';

/** Sirius, ICRS α 06h45m08.91728s δ −16°42′58.0171″ — the position of reference-values.md E1 (ERFA atco13). */
export const SIRIUS_RA = (6 + 45 / 60 + 8.91728 / 3600) * 15;
export const SIRIUS_DEC = -(16 + 42 / 60 + 58.0171 / 3600);

/** A scene at the E1 site (φ 51.4769°, λ 0°, 0 m) and instant (2024-01-15T22:00:00Z). Invented otherwise. */
export function e1Scene(over: Partial<SceneOut> = {}): SceneOut {
  return {
    id: 's1',
    teamId: 'team1',
    title: 'E1 check',
    description: '',
    site: { name: 'Greenwich-like test site', lat: 51.4769, lon: 0, height: 0, timeZone: 'Europe/London' },
    time: '2024-01-15T22:00:00Z',
    layers: {},
    camera: { mode: 'observer', azDeg: 180, altDeg: 20, fovDeg: 90 },
    envelopeId: null,
    envelope: null,
    targets: [
      { id: 't1', kind: 'custom', name: 'Sirius (E1)', ra: SIRIUS_RA, dec: SIRIUS_DEC },
      { id: 't2', kind: 'star', name: 'Vega', hr: 7001 },
      { id: 't3', kind: 'body', name: 'Jupiter', body: 'jupiter' },
    ],
    pins: [],
    steps: [],
    version: 1,
    createdBy: null,
    updatedBy: null,
    createdAt: '2024-01-01T00:00:00.000Z',
    updatedAt: '2024-01-01T00:00:00.000Z',
    hasThumbnail: false,
    ...over,
  };
}
