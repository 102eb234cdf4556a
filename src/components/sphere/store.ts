/**
 * A tiny store for the view's rarely-changing UI state (layers, mode, selection, play state), read with
 * useSyncExternalStore. The instant shown lives in `Clock`, a mutable object read per frame, never React state.
 */
import { useSyncExternalStore } from 'react';

export interface Store<T> {
  get: () => T;
  set: (patch: Partial<T> | ((s: T) => Partial<T>)) => void;
  subscribe: (fn: () => void) => () => void;
}

export function createStore<T extends object>(initial: T): Store<T> {
  let state = initial;
  const subs = new Set<() => void>();
  return {
    get: () => state,
    set(patch) {
      const p = typeof patch === 'function' ? patch(state) : patch;
      state = { ...state, ...p };
      subs.forEach((f) => f());
    },
    subscribe(fn) {
      subs.add(fn);
      return () => {
        subs.delete(fn);
      };
    },
  };
}

export function useStore<T extends object, S>(store: Store<T>, select: (s: T) => S): S {
  return useSyncExternalStore(store.subscribe, () => select(store.get()), () => select(store.get()));
}

/** The instant shown, mutated in place; `version` changes whenever `ms` does. */
export class Clock {
  ms: number;
  version = 0;
  playing = false;
  /** Simulated seconds per real second. */
  rate = 60;
  private subs = new Set<() => void>();
  /** Runs before the listeners (the model update), so every listener sees the new instant's sky. */
  pre: (() => void) | null = null;
  constructor(ms: number) {
    this.ms = ms;
  }
  setMs(ms: number) {
    if (!Number.isFinite(ms) || ms === this.ms) return;
    this.ms = ms;
    this.version++;
    this.pre?.();
    this.subs.forEach((f) => f());
  }
  /** Listeners run on every change (also per frame while playing): keep them cheap, write to refs. */
  subscribe(fn: () => void) {
    this.subs.add(fn);
    return () => {
      this.subs.delete(fn);
    };
  }
}
