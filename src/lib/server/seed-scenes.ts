/**
 * Demo sites, envelope, scenes, comments and share links for the invented "Larkspur Ridge
 * Observatory", called at the end of seedDemo() inside its transaction. Runs outside Astro (imports
 * no astro:* module). Everything here is invented; positions quoted in captions were computed with
 * astronomy-engine for the demo sites and instants and are for illustration.
 * Share-link tokens are random at seed time and never printed (editors mint their own in the app).
 */
import type { Tx } from './db/client';
import { DEFAULT_LAYERS, type Pin, type Step, type Target } from '../contracts/scene-doc';
import { createSite } from './sites';
import { createEnvelope } from './envelopes';
import { insertScene, sceneRow } from './scene-service';
import { addComment } from './comments';
import { createLink } from './links';
import type { TeamEnvelopeJson } from '../contracts/envelope';

export interface DemoSceneContext {
  teamId: string;
  otherTeamId: string;
  /** User ids of the demo people. */
  users: { owner: string; editor: string; reviewer: string; viewer: string; outsider: string };
}

export const DEMO_SITES = {
  summit: { name: 'Larkspur Ridge summit', lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' },
  visitors: { name: 'Larkspur visitor centre', lat: 38.897, lon: -106.231, height: 2750, timeZone: 'America/Denver' },
} as const;

/**
 * Limits patterned on published alt-az practice (altitude 20°–87°, see /work/shared/domain-facts.md);
 * the horizon mask is invented: a ridge rising to ~26° in the west.
 */
export const DEMO_ENVELOPE: TeamEnvelopeJson = {
  name: '0.6 m alt-az limits',
  minAltitude: 20,
  maxAltitude: 87,
  azimuthRanges: [[0, 360]],
  keyholeRadius: 3,
  sunAvoidance: 45,
  moonAvoidance: 10,
  horizonMask: [
    [0, 8], [45, 6], [90, 5], [135, 6], [180, 9], [210, 14],
    [240, 22], [260, 26], [280, 24], [300, 18], [330, 11], [350, 9],
  ],
  hourAngleLimits: [-5.5, 5.5],
  declinationLimits: [-35, 75],
};

const briefingSteps: Step[] = [
  {
    id: 'horizon',
    title: 'The local horizon',
    time: '2026-03-21T01:10:00Z',
    camera: { mode: 'observer', azDeg: 270, altDeg: 15, fovDeg: 100 },
    layers: { horizon: true, referencePoints: true, meridian: true, equator: false, ecliptic: false },
    caption:
      '## Where we stand\n\nThe **horizon** is the great circle 90° from the **zenith**. Azimuth runs from north (0°) through east (90°).\n\n' +
      'It is the evening of the March equinox: the Sun sets almost exactly **due west** (azimuth ≈ 270°).',
    pinId: 'west-point',
  },
  {
    id: 'equator',
    title: 'Pole and celestial equator',
    time: '2026-03-21T01:45:00Z',
    camera: { mode: 'sphere', azDeg: 200, altDeg: 25, fovDeg: 60 },
    layers: { horizon: true, equator: true, meridian: true, raDecGrid: true },
    caption:
      '## Tilted by our latitude\n\nThe celestial pole stands **38.9°** above the north point: the altitude of the pole equals the latitude.\n\n' +
      'The **celestial equator** meets the horizon at the east and west points and crosses the meridian in the south at 90° − 38.9° = **51.1°**.',
    pinId: 'ncp',
  },
  {
    id: 'ecliptic',
    title: 'The ecliptic',
    time: '2026-03-21T01:45:00Z',
    camera: { mode: 'sphere', azDeg: 240, altDeg: 20, fovDeg: 60 },
    layers: { equator: true, ecliptic: true, eclipticGrid: false },
    caption:
      '## The Sun\'s yearly path\n\nThe **ecliptic** is tilted about **23.44°** to the equator and crosses it at the two equinox points.\n\n' +
      'Today the Sun is at the March equinox point, so day and night are nearly equal everywhere.',
  },
  {
    id: 'moon-planets',
    title: 'Moon and planets',
    time: '2026-03-21T02:00:00Z',
    camera: { mode: 'observer', azDeg: 265, altDeg: 15, fovDeg: 80 },
    layers: { bodies: true, bodyLabels: true, ecliptic: true },
    caption:
      '## Along the ecliptic\n\nA thin crescent **Moon** (about 5 % lit, two days after new) and **Venus** sit low in the west, close to the ecliptic.\n\n' +
      '**Jupiter** is high in the south-east. *Never point optics near the Sun while it is still up.*',
  },
  {
    id: 'rise-set',
    title: 'What rises when',
    time: '2026-03-21T03:00:00Z',
    camera: { mode: 'observer', azDeg: 90, altDeg: 20, fovDeg: 100 },
    layers: { stars: true, starLabels: true, altAzGrid: true },
    caption:
      '## Turning sky\n\nThe sky turns **15.04° per hour** about the pole. Stars rise in the east, reach their highest point on the meridian, and set in the west.\n\n' +
      'Computed times are for planning; site rules take precedence.',
  },
];

const briefingPins: Pin[] = [
  { id: 'west-point', kind: 'label', frame: 'horizontal', points: [[270, 0]], label: 'West point' },
  { id: 'east-point', kind: 'label', frame: 'horizontal', points: [[90, 0]], label: 'East point' },
  { id: 'ncp', kind: 'label', frame: 'equatorial', points: [[0, 90]], label: 'North celestial pole' },
];

/** HR numbers: Bright Star Catalogue, 5th revised ed. (Vega 7001, Arcturus 5340, Deneb 7924, Altair 7557). */
const reviewTargets: Target[] = [
  { id: 'vega', kind: 'star', name: 'Vega', hr: 7001 },
  { id: 'arcturus', kind: 'star', name: 'Arcturus', hr: 5340 },
  { id: 'deneb', kind: 'star', name: 'Deneb', hr: 7924 },
  { id: 'altair', kind: 'star', name: 'Altair', hr: 7557, notes: 'Focus check star.' },
  // M13 (NGC 6205), ICRS from SIMBAD, rounded: 16h41m41.6s +36°27′37″.
  { id: 'm13', kind: 'custom', name: 'M13', ra: 250.4233, dec: 36.4603 },
  { id: 'field-a17', kind: 'custom', name: 'Survey field A-17 (invented)', ra: 283.5, dec: -30.2 },
  { id: 'field-s40', kind: 'custom', name: 'Calibration field S-40 (invented)', ra: 300.0, dec: -40.0 },
];

export async function seedDemoScenes(tx: Tx, ctx: DemoSceneContext): Promise<void> {
  const { teamId, users } = ctx;
  const origin = process.env.PUBLIC_ORIGIN || 'http://127.0.0.1:4321';

  await createSite(tx, teamId, { ...DEMO_SITES.summit }, users.owner);
  await createSite(tx, teamId, { ...DEMO_SITES.visitors }, users.owner);
  const envelope = await createEnvelope(tx, teamId, DEMO_ENVELOPE, users.editor);

  const briefingId = await insertScene(
    tx,
    teamId,
    {
      title: 'Equinox evening briefing',
      description: 'Volunteer briefing for the March equinox open night: horizon, equator, ecliptic, Moon and planets.',
      site: { ...DEMO_SITES.visitors },
      time: '2026-03-21T01:10:00Z',
      layers: { ...DEFAULT_LAYERS },
      camera: { mode: 'observer', azDeg: 270, altDeg: 15, fovDeg: 100 },
      envelopeId: null,
      envelope: null,
      targets: [
        { id: 'moon', kind: 'body', name: 'Moon', body: 'moon' },
        { id: 'venus', kind: 'body', name: 'Venus', body: 'venus' },
        { id: 'jupiter', kind: 'body', name: 'Jupiter', body: 'jupiter' },
      ],
      pins: briefingPins,
      steps: briefingSteps,
    },
    users.editor,
  );

  const reviewId = await insertScene(
    tx,
    teamId,
    {
      title: '0.6 m pointing review',
      description: 'Proposed June targets for the 0.6 m: check every one against the envelope before sign-off.',
      site: { ...DEMO_SITES.summit },
      time: '2026-06-15T06:00:00Z',
      layers: { ...DEFAULT_LAYERS, envelope: true, targets: true, altAzGrid: true },
      camera: { mode: 'observer', azDeg: 180, altDeg: 40, fovDeg: 110 },
      envelopeId: envelope.id,
      envelope: null,
      targets: reviewTargets,
      pins: [
        { id: 'ridge', kind: 'arc', frame: 'horizontal', points: [[240, 22], [260, 26], [280, 24]], label: 'West ridge', color: '#c08a3e' },
      ],
      steps: [],
    },
    users.editor,
  );

  await insertScene(
    tx,
    teamId,
    {
      title: 'Moon and planets evening',
      description: 'Public evening at the visitor centre: a waxing Moon beside Jupiter, Venus low in the west.',
      site: { ...DEMO_SITES.visitors },
      time: '2026-04-23T02:30:00Z',
      layers: { ...DEFAULT_LAYERS, bodies: true, bodyLabels: true, ecliptic: true },
      camera: { mode: 'observer', azDeg: 260, altDeg: 30, fovDeg: 100 },
      envelopeId: null,
      envelope: null,
      targets: [
        { id: 'moon', kind: 'body', name: 'Moon', body: 'moon' },
        { id: 'jupiter', kind: 'body', name: 'Jupiter', body: 'jupiter' },
        { id: 'venus', kind: 'body', name: 'Venus', body: 'venus' },
        { id: 'mars', kind: 'body', name: 'Mars', body: 'mars', notes: 'Below the horizon this evening (a morning object).' },
        { id: 'saturn', kind: 'body', name: 'Saturn', body: 'saturn', notes: 'Below the horizon this evening (a morning object).' },
      ],
      pins: [],
      steps: [
        {
          id: 'dusk',
          title: 'Nautical dusk',
          time: '2026-04-23T02:30:00Z',
          caption: 'The Moon, about 40 % lit, stands high in the west-south-west **beside Jupiter**; Venus is low in the west.',
          camera: { azDeg: 260, altDeg: 30 },
        },
        {
          id: 'later',
          title: 'An hour later',
          time: '2026-04-23T03:30:00Z',
          caption: 'Venus is setting; the Moon and Jupiter have moved west together with the turning sky.',
          camera: { azDeg: 270, altDeg: 25 },
        },
      ],
    },
    users.editor,
  );

  const review = (await sceneRow(tx, reviewId))!;
  // Review comments dated over the last two days (relative to the seeding instant).
  const t0 = Date.now() - 2 * 86_400_000;
  const at = (min: number) => new Date(t0 + min * 60_000);
  await addComment(
    tx,
    review,
    {
      body: 'Field S-40 is at Dec −40°, outside the declination limit (−35°). Drop it or justify an exception.',
      anchor: { ra: 300.0, dec: -40.0 },
    },
    { userId: users.reviewer },
    { now: at(0) },
  );
  await addComment(
    tx,
    review,
    {
      body: 'The mask reaches **26°** at azimuth 260°: please confirm the ridge survey, A-17 sets behind it.',
      anchor: { azimuth: 260, altitude: 26 },
    },
    { userId: users.reviewer },
    { now: at(5) },
  );
  const vega = await addComment(
    tx,
    review,
    {
      body: 'Vega transits at about 89.9° here (90° − |38.91° − 38.78°|), above the 87° ceiling and inside the keyhole: plan a gap around transit.',
      anchor: { ra: 279.2347, dec: 38.7837 },
    },
    { userId: users.reviewer },
    { now: at(10), resolvedBy: users.reviewer },
  );
  await addComment(
    tx,
    review,
    { body: 'Split Vega into two blocks, before and after transit.', parentId: vega.id },
    { userId: users.editor },
    { now: at(30) },
  );

  await createLink(tx, users.editor, { id: briefingId, teamId }, 'viewer', null, origin);
  await createLink(tx, users.editor, { id: reviewId, teamId }, 'reviewer', new Date(Date.now() + 180 * 86_400_000), origin);
}
