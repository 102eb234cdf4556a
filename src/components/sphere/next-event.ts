/**
 * "Next event" of the time bar: the earliest of sunrise, sunset and the twilights, and (when something is
 * selected) its rise, transit and set, after a given instant. Searches two days ahead.
 */
import * as engine from './sky-adapter';
import { selectedName, selectedTarget } from './panels';

export interface NextEvent {
  ms: number;
  /** What happens, in words: "civil dusk", "sunrise", "Vega transits". */
  what: string;
}

const SUN_WORDS: Record<string, string> = { rise: 'sunrise', set: 'sunset', transit: 'the Sun transits' };
const VERBS: Record<string, string> = { rise: 'rises', set: 'sets', transit: 'transits' };

/** `target`: the selected object (engine target) and its name, or null. */
export function findNextEvent(site: engine.SiteInput, fromMs: number, target: { t: { raDeg: number; decDeg: number } | { body: string }; name: string } | null): NextEvent | null {
  const from = new Date(fromMs + 1000);
  const to = new Date(fromMs + 2 * 86_400_000);
  const found: NextEvent[] = [];
  for (const e of engine.twilightEvents(site, from, to)) found.push({ ms: e.time.getTime(), what: e.kind.replace('-', ' ') });
  for (const e of engine.riseTransitSet(site, { body: 'sun' }, from, to)) if (e.kind !== 'transit') found.push({ ms: e.time.getTime(), what: SUN_WORDS[e.kind] ?? e.kind });
  if (target) for (const e of engine.riseTransitSet(site, target.t, from, to)) found.push({ ms: e.time.getTime(), what: `${target.name} ${VERBS[e.kind] ?? e.kind}` });
  const after = found.filter((e) => e.ms > fromMs);
  after.sort((a, b) => a.ms - b.ms);
  return after[0] ?? null;
}

/** Moves the view's clock to the next event; returns what it jumped to (or null when nothing in 48 h). */
export function jumpToNextEvent(h: { model: import('./model').SkyModel; clock: import('./store').Clock; store: import('./store').Store<import('./context').UiState> }): NextEvent | null {
  const sel = h.store.get().selected;
  const t = selectedTarget(h.model, sel);
  const ev = findNextEvent(h.model.site, h.clock.ms, t ? { t, name: selectedName(h.model, sel) } : null);
  if (ev) h.clock.setMs(ev.ms);
  return ev;
}
