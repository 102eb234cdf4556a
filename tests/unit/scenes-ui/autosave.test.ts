import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { Autosave, patchBody, type SaveFn } from '../../../src/lib/client/autosave';
import type { SceneOut } from '../../../src/lib/contracts/scene';

function scene(over: Partial<SceneOut> = {}): SceneOut {
  return {
    id: 's1', teamId: 't1', title: 'Equinox evening', description: '', version: 1,
    site: { name: 'Larkspur Ridge', lat: 40, lon: -105, height: 1600, timeZone: 'America/Denver' },
    time: '2026-03-20T19:30:00Z', layers: {}, camera: { mode: 'observer', azDeg: 180, altDeg: 20, fovDeg: 90 },
    envelopeId: null, envelope: null, targets: [], pins: [], steps: [],
    createdBy: null, updatedBy: null, createdAt: '2026-01-01T00:00:00Z', updatedAt: '2026-01-01T00:00:00Z', hasThumbnail: false,
    ...over,
  };
}

/** A fake server holding one scene with optimistic concurrency, like PATCH /api/scenes/:id. */
function fakeServer(initial: SceneOut) {
  let current = initial;
  const calls: Record<string, unknown>[] = [];
  const save: SaveFn = async (body) => {
    calls.push(body);
    if (body.version !== current.version) return { kind: 'conflict', scene: current };
    const { version: _v, ...fields } = body;
    current = { ...current, ...fields, version: current.version + 1 };
    return { kind: 'ok', scene: current };
  };
  return { save, calls, get: () => current, otherWrites: (p: Partial<SceneOut>) => (current = { ...current, ...p, version: current.version + 1 }) };
}

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe('Autosave', () => {
  it('debounces edits into one PATCH carrying the base version and only the changed fields', async () => {
    const srv = fakeServer(scene());
    const a = new Autosave(srv.get(), srv.save, 500);
    a.edit({ title: 'A' });
    a.edit({ title: 'AB' });
    a.edit({ description: 'x' });
    expect(a.get().status).toBe('dirty');
    expect(srv.calls).toHaveLength(0);
    await vi.advanceTimersByTimeAsync(600);
    expect(srv.calls).toEqual([{ version: 1, title: 'AB', description: 'x' }]);
    expect(a.get().status).toBe('saved');
    expect(a.get().local.version).toBe(2);
  });

  it('on 409 keeps both sides and pauses; keep mine re-PATCHes on the server version and keeps their other fields', async () => {
    const srv = fakeServer(scene());
    const a = new Autosave(srv.get(), srv.save, 100);
    srv.otherWrites({ description: 'theirs' });
    a.edit({ title: 'mine' });
    await vi.advanceTimersByTimeAsync(200);
    expect(a.get().status).toBe('conflict');
    expect(a.get().theirs?.description).toBe('theirs');
    expect(a.get().local.title).toBe('mine');
    // Further edits during a conflict are kept locally, not sent.
    a.edit({ time: '2026-03-21T00:00:00Z' });
    await vi.advanceTimersByTimeAsync(500);
    expect(srv.calls).toHaveLength(1);
    await a.keepMine();
    expect(srv.calls[1]).toEqual({ version: 2, title: 'mine', time: '2026-03-21T00:00:00Z' });
    expect(srv.get()).toMatchObject({ title: 'mine', description: 'theirs', version: 3 });
    expect(a.get().status).toBe('saved');
  });

  it('take theirs drops my unsaved edits', async () => {
    const srv = fakeServer(scene());
    const a = new Autosave(srv.get(), srv.save, 100);
    srv.otherWrites({ title: 'theirs' });
    a.edit({ title: 'mine' });
    await vi.advanceTimersByTimeAsync(200);
    a.takeTheirs();
    expect(a.get()).toMatchObject({ status: 'saved', dirty: [] });
    expect(a.get().local.title).toBe('theirs');
    expect(a.version).toBe(2);
  });

  it('an edit made while a save is in flight is saved next, not lost', async () => {
    let release!: () => void;
    const srv = fakeServer(scene());
    const slow: SaveFn = (b) => new Promise((res) => (release = () => res(srv.save(b)))).then((x) => x as Awaited<ReturnType<SaveFn>>);
    const a = new Autosave(srv.get(), slow, 50);
    a.edit({ title: 'one' });
    await vi.advanceTimersByTimeAsync(60);
    expect(a.get().status).toBe('saving');
    a.edit({ title: 'two' });
    release();
    await vi.advanceTimersByTimeAsync(0);
    expect(a.get().local.title).toBe('two');
    expect(a.get().dirty).toEqual(['title']);
    await vi.advanceTimersByTimeAsync(60);
    release();
    await vi.advanceTimersByTimeAsync(0);
    expect(srv.get()).toMatchObject({ title: 'two', version: 3 });
    expect(a.get().status).toBe('saved');
  });

  it('shows an error and retries on demand', async () => {
    let fail = true;
    const srv = fakeServer(scene());
    const a = new Autosave(srv.get(), (b) => (fail ? Promise.reject(new Error('offline')) : srv.save(b)), 10);
    a.edit({ title: 'x' });
    await vi.advanceTimersByTimeAsync(20);
    expect(a.get()).toMatchObject({ status: 'error', message: 'offline' });
    fail = false;
    a.retry();
    await vi.advanceTimersByTimeAsync(0);
    expect(a.get().status).toBe('saved');
  });
});

describe('patchBody', () => {
  it('sends a team envelope by id only, an inline one with a null id', () => {
    const s = scene({ envelopeId: 'e1', envelope: { name: 'Dome' } as SceneOut['envelope'] });
    expect(patchBody(s, ['envelopeId'], 4)).toEqual({ version: 4, envelopeId: 'e1' });
    const t = scene({ envelopeId: null, envelope: { name: 'Inline' } as SceneOut['envelope'] });
    expect(patchBody(t, ['envelope'], 4)).toEqual({ version: 4, envelopeId: null, envelope: { name: 'Inline' } });
  });
});
