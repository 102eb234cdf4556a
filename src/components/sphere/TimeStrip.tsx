/**
 * The time bar that stays within reach under the sky: site time, play/pause, rate, step back and forward
 * by a chosen amount, jump to the next event, now. The detailed time panel (UTC, sidereal time, a date
 * field, twilight menu) is one of the collapsible panels.
 */
import { useRef, useState } from 'react';
import { useClockText } from './clock-text';
import { usePref } from '../ui/persist';
import { useView } from './context';
import { jumpToNextEvent } from './next-event';
import { useStore } from './store';
import { formatOffset, formatWall, RATES, STEPS } from './clock';

const btn =
  'inline-flex h-8 min-w-8 items-center justify-center rounded border border-slate-600 bg-slate-800/90 px-2 text-xs text-slate-100 hover:bg-slate-700 focus-visible:outline focus-visible:outline-2 focus-visible:outline-sky-400 disabled:opacity-40';
const select = 'h-8 rounded border border-slate-600 bg-slate-800 px-1 text-xs text-slate-100';

export function rateLabel(r: number): string {
  return r === 1 ? 'real time' : r < 60 ? `${r}×` : r < 3600 ? `${r}× (${r / 60} min/s)` : `${r}× (1 h/s)`;
}

export function TimeStrip({ onSaveTime }: { onSaveTime?: (() => void) | undefined }) {
  const h = useView();
  const { clock, store, timeZone } = h;
  const playing = useStore(store, (s) => s.playing);
  const rate = useStore(store, (s) => s.rate);
  const [stepId, setStepId] = usePref<string>('timeStep', 'hour');
  const stepMs = (STEPS.find((s) => s.id === stepId) ?? STEPS[1]).ms;
  const wallRef = useRef<HTMLSpanElement>(null);
  const [msg, setMsg] = useState('');

  useClockText(
    clock,
    () => {
      if (wallRef.current) wallRef.current.textContent = `${formatWall(clock.ms, timeZone).slice(0, 16)} ${formatOffset(clock.ms, timeZone)}`;
    },
    [clock, timeZone],
  );

  const togglePlay = () => {
    clock.playing = !clock.playing;
    store.set({ playing: clock.playing });
    if (clock.playing) clock.setMs(clock.ms + 1);
  };
  const next = () => {
    const ev = jumpToNextEvent(h);
    setMsg(ev ? `${ev.what[0]!.toUpperCase()}${ev.what.slice(1)} at ${formatWall(ev.ms, timeZone).slice(11, 16)}` : 'No event in the next 48 h');
  };

  return (
    <div role="group" aria-label="Time bar" className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-slate-700 bg-slate-950/90 px-2 py-1.5 text-slate-100 shadow-lg" data-testid="time-strip">
      <p className="flex items-baseline gap-2">
        <span className="sr-only">Site time</span>
        <span ref={wallRef} className="font-mono text-sm tabular-nums" data-testid="strip-time" />
        <span className="text-[11px] text-slate-400">{timeZone}</span>
      </p>
      <div className="flex items-center gap-1">
        <button className={btn} onClick={togglePlay} aria-pressed={playing} data-testid="play" title="Play or pause (Space)">
          <span aria-hidden="true">{playing ? '❚❚' : '▶'}</span>
          <span className="sr-only">{playing ? 'Pause' : 'Play'}</span>
        </button>
        <select
          className={select}
          value={rate}
          onChange={(e) => {
            clock.rate = Number(e.target.value);
            store.set({ rate: clock.rate });
          }}
          aria-label="Rate of time"
          data-testid="rate"
        >
          {RATES.map((r) => (
            <option key={r} value={r}>
              {rateLabel(r)}
            </option>
          ))}
        </select>
      </div>
      <div className="flex items-center gap-1" role="group" aria-label="Step time">
        <button className={btn} onClick={() => clock.setMs(clock.ms - stepMs)} aria-label="Step back" title="Step back">
          <span aria-hidden="true">−</span>
        </button>
        <select className={select} value={stepId} onChange={(e) => setStepId(e.target.value)} aria-label="Step size" data-testid="step-size">
          {STEPS.map((s) => (
            <option key={s.id} value={s.id}>
              {s.label}
            </option>
          ))}
        </select>
        <button className={btn} onClick={() => clock.setMs(clock.ms + stepMs)} aria-label="Step forward" title="Step forward" data-testid="step-forward">
          <span aria-hidden="true">+</span>
        </button>
      </div>
      <div className="flex items-center gap-1">
        <button className={btn} onClick={next} title="Next event (E)" data-testid="next-event">
          Next event
        </button>
        <button className={btn} onClick={() => clock.setMs(Date.now())} title="Now (N)">
          Now
        </button>
        {onSaveTime && (
          <button className={btn} onClick={onSaveTime} data-testid="use-time">
            Use this time in the scene
          </button>
        )}
      </div>
      <p role="status" className="min-w-0 text-[11px] text-amber-200" data-testid="time-strip-status">
        {msg}
      </p>
    </div>
  );
}
