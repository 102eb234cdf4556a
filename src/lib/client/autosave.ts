/**
 * Autosave with optimistic concurrency, framework-free so it can be tested with fake timers.
 * Edits are merged into `local`, the changed fields are PATCHed (debounced) with the version they were
 * based on. A 409 stops autosaving and keeps both sides until the user chooses: keep mine (re-PATCH the
 * changed fields on the server's version), take theirs, or compare. Nothing is dropped silently.
 */
import { EDITABLE_FIELDS, type EditableField, type SceneOut } from '../contracts/scene';

export type SaveStatus = 'saved' | 'dirty' | 'saving' | 'conflict' | 'error';

export interface AutosaveState {
  status: SaveStatus;
  local: SceneOut;
  /** The server's scene after a 409. */
  theirs: SceneOut | null;
  /** Fields edited here and not yet saved. */
  dirty: EditableField[];
  message: string | null;
  savedAt: number | null;
}

export type SaveOutcome = { kind: 'ok'; scene: SceneOut } | { kind: 'conflict'; scene: SceneOut };
export type SaveFn = (body: Record<string, unknown>) => Promise<SaveOutcome>;

export function patchBody(local: SceneOut, fields: Iterable<EditableField>, version: number): Record<string, unknown> {
  const body: Record<string, unknown> = { version };
  const set = new Set(fields);
  if (set.has('envelope') || set.has('envelopeId')) {
    // A team envelope is sent by id only (the resolved copy would be refused as "both").
    set.add('envelopeId');
    set.add('envelope');
  }
  for (const f of EDITABLE_FIELDS) if (set.has(f)) body[f] = local[f];
  if (body.envelopeId) delete body.envelope;
  return body;
}

export class Autosave {
  private state: AutosaveState;
  private subs = new Set<() => void>();
  private timer: ReturnType<typeof setTimeout> | null = null;
  private inFlight: Promise<void> | null = null;
  private seq = 0;
  private fieldSeq = new Map<EditableField, number>();
  private base: SceneOut;

  constructor(
    initial: SceneOut,
    private readonly save: SaveFn,
    private readonly delayMs = 800,
  ) {
    this.base = initial;
    this.state = { status: 'saved', local: initial, theirs: null, dirty: [], message: null, savedAt: null };
  }

  get = () => this.state;
  subscribe = (fn: () => void) => {
    this.subs.add(fn);
    return () => {
      this.subs.delete(fn);
    };
  };

  private set(patch: Partial<AutosaveState>) {
    this.state = { ...this.state, ...patch };
    this.subs.forEach((f) => f());
  }

  private schedule() {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.flush();
    }, this.delayMs);
  }

  /** Applies an edit locally and schedules a save (paused while a conflict is open). */
  edit(patch: Partial<Pick<SceneOut, EditableField>>) {
    const keys = Object.keys(patch).filter((k): k is EditableField => (EDITABLE_FIELDS as readonly string[]).includes(k));
    if (!keys.length) return;
    this.seq++;
    for (const k of keys) this.fieldSeq.set(k, this.seq);
    const dirty = [...new Set([...this.state.dirty, ...keys])];
    const conflict = this.state.status === 'conflict';
    this.set({ local: { ...this.state.local, ...patch }, dirty, status: conflict ? 'conflict' : this.inFlight ? 'saving' : 'dirty' });
    if (!conflict) this.schedule();
  }

  /** Saves now (also what the debounce calls). Resolves when the server has answered. */
  async flush(): Promise<void> {
    if (this.timer) {
      clearTimeout(this.timer);
      this.timer = null;
    }
    if (this.inFlight) {
      await this.inFlight;
      if (this.state.dirty.length && this.state.status !== 'conflict') return this.flush();
      return;
    }
    if (!this.state.dirty.length || this.state.status === 'conflict') return;
    this.inFlight = this.send(this.base.version);
    try {
      await this.inFlight;
    } finally {
      this.inFlight = null;
    }
    if (this.state.dirty.length && this.state.status === 'dirty') this.schedule();
  }

  private async send(version: number) {
    const sentSeq = this.seq;
    const fields = [...this.state.dirty];
    this.set({ status: 'saving', message: null });
    let out: SaveOutcome;
    try {
      out = await this.save(patchBody(this.state.local, fields, version));
    } catch (e) {
      this.set({ status: 'error', message: e instanceof Error ? e.message : String(e) });
      return;
    }
    if (out.kind === 'conflict') {
      this.set({ status: 'conflict', theirs: out.scene, message: 'Someone else saved this scene meanwhile.' });
      return;
    }
    this.accept(out.scene, sentSeq);
  }

  /** Takes a saved scene from the server, keeping the fields edited after `sentSeq`. */
  private accept(scene: SceneOut, sentSeq: number) {
    this.base = scene;
    const stillDirty = this.state.dirty.filter((f) => (this.fieldSeq.get(f) ?? 0) > sentSeq);
    const local: SceneOut = { ...scene };
    for (const f of stillDirty) (local as unknown as Record<string, unknown>)[f] = this.state.local[f];
    this.set({ local, dirty: stillDirty, theirs: null, status: stillDirty.length ? 'dirty' : 'saved', message: null, savedAt: Date.now() });
  }

  /** Conflict → my changed fields win, saved on top of the server's version (its other fields are kept). */
  async keepMine(): Promise<void> {
    const theirs = this.state.theirs;
    if (!theirs) return;
    this.base = theirs;
    this.set({ status: 'dirty', theirs: null, message: null });
    await this.flush();
  }

  /** Conflict → drop my unsaved changes and show the server's scene. */
  takeTheirs() {
    const theirs = this.state.theirs;
    if (!theirs) return;
    this.base = theirs;
    this.fieldSeq.clear();
    this.set({ status: 'saved', local: theirs, theirs: null, dirty: [], message: null });
  }

  /** A newer scene arrived from elsewhere (restore, reload): adopt it unless there are unsaved edits. */
  adopt(scene: SceneOut) {
    if (scene.version < this.base.version) return;
    if (this.state.dirty.length || this.inFlight) {
      if (scene.version > this.base.version) this.set({ status: 'conflict', theirs: scene, message: 'This scene changed on the server while you had unsaved edits.' });
      return;
    }
    this.base = scene;
    this.set({ local: scene, status: 'saved', theirs: null });
  }

  /** Retries after an error. */
  retry() {
    if (this.state.status === 'error') {
      this.set({ status: 'dirty' });
      void this.flush();
    }
  }

  get version() {
    return this.base.version;
  }

  dispose() {
    if (this.timer) clearTimeout(this.timer);
    this.subs.clear();
  }
}
