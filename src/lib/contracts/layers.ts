/**
 * The sky's layers: their keys and the defaults a new scene starts with. Kept apart from `scene-doc.ts`
 * (which re-exports them) and free of zod: the sky view of a viewer link needs the defaults, and importing
 * them from the schemas put zod into the JavaScript sent before the link's first frame (11.6 kB as brotli,
 * measured 399.7 kB against the 400 kB goal).
 */
export const LAYER_KEYS = [
  'horizon', 'equator', 'ecliptic', 'meridian', 'primeVertical', 'galactic',
  'altAzGrid', 'raDecGrid', 'eclipticGrid', 'referencePoints',
  'stars', 'starLabels', 'bodies', 'bodyLabels', 'envelope', 'targets', 'pins', 'comments', 'ground',
] as const;
export type LayerKey = (typeof LAYER_KEYS)[number];

/** Every layer switched on or off, and the faintest star shown (the scene schema's `layers`, all given). */
export type LayerSet = Record<LayerKey, boolean> & { limitingMagnitude: number };

export const DEFAULT_LAYERS: LayerSet = {
  horizon: true, equator: true, ecliptic: true, meridian: true, primeVertical: false, galactic: false,
  altAzGrid: false, raDecGrid: false, eclipticGrid: false, referencePoints: true,
  stars: true, starLabels: true, bodies: true, bodyLabels: true, envelope: true, targets: true, pins: true,
  comments: true, ground: true, limitingMagnitude: 5.5,
};
