import { describe, expect, it } from 'vitest';
import { anchorFromPick, inputUtcToIso, isoToInputUtc, moveItem, pinPointFromPick, sceneAtStep, threads, timeAgo, type SceneLike } from '../../../src/lib/client/scene-view';
import type { CommentOut } from '../../../src/lib/contracts/comment';

const base: SceneLike = {
  title: 't', site: { name: 's', lat: 40, lon: -105, height: 0, timeZone: 'UTC' }, time: '2026-03-20T19:30:00Z',
  layers: { stars: true, ecliptic: true }, camera: { mode: 'observer', azDeg: 180, altDeg: 20, fovDeg: 90 }, envelope: null, targets: [],
  pins: [{ id: 'p1', kind: 'label', frame: 'horizontal', points: [[90, 10]], label: 'East point' }], steps: [],
};

describe('sceneAtStep', () => {
  it('overlays the step time, camera and layers', () => {
    const s = sceneAtStep(base, { id: 's1', title: '', time: '2026-03-21T01:00:00Z', caption: '', camera: { mode: 'sphere' }, layers: { ecliptic: false } });
    expect(s.time).toBe('2026-03-21T01:00:00Z');
    expect(s.camera).toMatchObject({ mode: 'sphere', azDeg: 180 });
    expect(s.layers).toEqual({ stars: true, ecliptic: false });
  });
  it('turns toward a focused horizontal pin', () => {
    const s = sceneAtStep(base, { id: 's1', title: '', time: base.time, caption: '', pinId: 'p1' });
    expect(s.camera).toMatchObject({ azDeg: 90, altDeg: 10 });
  });
  it('lets the presenter override the time', () => {
    expect(sceneAtStep(base, undefined, '2026-01-01T00:00:00Z').time).toBe('2026-01-01T00:00:00Z');
  });
});

describe('anchorFromPick', () => {
  it('prefers the equatorial place and wraps RA', () => {
    expect(anchorFromPick({ ra: 370, dec: 10, azimuth: 5, altitude: 6 })).toEqual({ ra: 10, dec: 10 });
    expect(anchorFromPick({ azDeg: 200, altDeg: 30 })).toEqual({ azimuth: 200, altitude: 30 });
    expect(anchorFromPick({ foo: 1 })).toBeNull();
    expect(anchorFromPick({ ra: 10, dec: 95 })).toBeNull();
  });
  it('gives pin points in the pin frame', () => {
    expect(pinPointFromPick({ ra: 1, dec: 2, azimuth: 3, altitude: 4 }, 'horizontal')).toEqual([3, 4]);
    expect(pinPointFromPick({ ra: 1, dec: 2 }, 'equatorial')).toEqual([1, 2]);
    expect(pinPointFromPick({ ra: 1, dec: 2 }, 'horizontal')).toBeNull();
  });
});

describe('small helpers', () => {
  it('moves list items', () => {
    expect(moveItem(['a', 'b', 'c'], 0, 2)).toEqual(['b', 'c', 'a']);
    expect(moveItem(['a', 'b'], 0, 5)).toEqual(['a', 'b']);
  });
  it('converts datetime-local UTC values', () => {
    expect(inputUtcToIso('2026-03-20T19:30')).toBe('2026-03-20T19:30:00Z');
    expect(inputUtcToIso('nope')).toBeNull();
    expect(isoToInputUtc('2026-03-20T19:30:00Z')).toBe('2026-03-20T19:30');
  });
  it('says how long ago', () => {
    const now = Date.parse('2026-03-20T12:00:00Z');
    expect(timeAgo('2026-03-20T11:58:00Z', now)).toBe('2 minutes ago');
    expect(timeAgo(null, now)).toBe('never');
    expect(timeAgo('2026-03-22T12:00:00Z', now)).toBe('in 2 days');
  });
  it('groups replies under their thread', () => {
    const c = (id: string, parentId: string | null) => ({ id, parentId }) as CommentOut;
    const t = threads([c('a', null), c('b', 'a'), c('d', null)]);
    expect(t.map((x) => [x.root.id, x.replies.map((r) => r.id)])).toEqual([['a', ['b']], ['d', []]]);
  });
});

import { filterScenes } from '../../../src/lib/client/scene-list';
describe('filterScenes', () => {
  const rows = [
    { id: '1', teamId: 't', title: 'Equinox evening', version: 1, updatedAt: '2026-01-02T00:00:00Z', siteName: 'Ridge', createdBy: 'u1', time: '2026-03-20T19:00:00Z' },
    { id: '2', teamId: 't', title: 'Pointing review', description: 'dome limits', version: 3, updatedAt: '2026-01-03T00:00:00Z', siteName: 'Valley', createdBy: 'u2', time: '2026-02-01T00:00:00Z' },
  ];
  it('searches title and description, filters by site and author, sorts', () => {
    expect(filterScenes(rows, { search: 'dome', site: '', author: '', sort: 'updated-desc' }).map((r) => r.id)).toEqual(['2']);
    expect(filterScenes(rows, { search: '', site: 'Ridge', author: '', sort: 'updated-desc' }).map((r) => r.id)).toEqual(['1']);
    expect(filterScenes(rows, { search: '', site: '', author: 'u2', sort: 'updated-desc' }).map((r) => r.id)).toEqual(['2']);
    expect(filterScenes(rows, { search: '', site: '', author: '', sort: 'updated-desc' }).map((r) => r.id)).toEqual(['2', '1']);
    expect(filterScenes(rows, { search: '', site: '', author: '', sort: 'time-asc' }).map((r) => r.id)).toEqual(['2', '1']);
  });
});
