/**
 * The night panel of a scene: the altitude-over-time chart, the sky-coverage chart and the per-target
 * figures, from the night API. The cursor is the scene's (view) time: the host passes it in and gets
 * drags and clicks back, so the sphere and the charts stay in step both ways.
 */
import { useEffect, useMemo, useState } from 'react';
import { AltitudeChart, type ChartComment } from './AltitudeChart';
import { CoverageChart } from './CoverageChart';
import { FiguresTable } from './FiguresTable';
import { useNight, nightPath, type NightSource } from '../../lib/client/night';
import { errorText } from '../../lib/client/api';
import { downloadPng } from './download';

const PLANETS = ['venus', 'mars', 'jupiter', 'saturn'] as const;
const cap = (s: string) => s[0].toUpperCase() + s.slice(1);

export interface NightPanelProps {
  source: NightSource;
  timeZone: string;
  /** Changes when targets, envelope or site change (refetch). */
  revision: string;
  cursor: number;
  onCursor: (t: number, done: boolean) => void;
  comments?: ChartComment[];
  /** Reviewers: called with a chart anchor when they pick a target at a time. */
  onPickComment?: (anchor: { chart: 'altitude'; target: string; time: string }) => void;
}

export function NightPanel({ source, timeZone, revision, cursor, onCursor, comments, onPickComment }: NightPanelProps) {
  const [at, setAt] = useState<string | undefined>(undefined);
  const [bodies, setBodies] = useState<string[]>([]);
  const [highlight, setHighlight] = useState<string | null>(null);
  const [picking, setPicking] = useState(false);
  const [pngError, setPngError] = useState<string | null>(null);
  const params = useMemo(() => ({ at, bodies }), [at, bodies]);
  const night = useNight(source, params, revision);
  const data = night.data;

  // The cursor left the night shown (the sphere's time moved to another day): show the night around it.
  useEffect(() => {
    if (!data || night.isFetching) return;
    const from = Date.parse(data.from), to = Date.parse(data.to);
    if (cursor < from - 3600000 || cursor > to + 3600000) setAt(new Date(Math.round(cursor / 60000) * 60000).toISOString().replace('.000Z', 'Z'));
  }, [cursor, data, night.isFetching]);

  const daylight = data ? data.sun.samples.some((s) => s.altitude > -0.84) : false;
  const svgHref = nightPath(source, params, 'night.svg');

  return (
    <section aria-label="Night" className="flex flex-col gap-3" data-testid="night-panel">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2 text-xs">
        <fieldset className="flex flex-wrap items-center gap-2">
          <legend className="sr-only">Also draw</legend>
          <span className="text-ink-300">Also draw:</span>
          {PLANETS.map((p) => (
            <label key={p} className="inline-flex items-center gap-1">
              <input type="checkbox" checked={bodies.includes(p)} onChange={(e) => setBodies(e.target.checked ? [...bodies, p] : bodies.filter((b) => b !== p))} />
              {cap(p)}
            </label>
          ))}
        </fieldset>
        <span className="flex flex-wrap items-center gap-2">
          <a className="rounded border border-ink-600 px-2 py-1 hover:bg-white/5" href={svgHref} download="night.svg" data-testid="night-svg">
            Download SVG
          </a>
          <button
            type="button"
            className="rounded border border-ink-600 px-2 py-1 hover:bg-white/5"
            onClick={() => {
              setPngError(null);
              downloadPng(svgHref, 'night.png').catch((e) => setPngError(errorText(e)));
            }}
          >
            Download PNG
          </button>
          {onPickComment && (
            <button type="button" aria-pressed={picking} className={`rounded border px-2 py-1 ${picking ? 'border-brass-500 bg-brass-500/20' : 'border-ink-600 hover:bg-white/5'}`} onClick={() => setPicking(!picking)}>
              {picking ? 'Click a curve… (cancel)' : 'Comment on the chart'}
            </button>
          )}
        </span>
      </div>
      {pngError && <p className="text-xs text-red-300">PNG not made: {pngError}</p>}
      {night.error && !data && <p className="text-sm text-red-300">The night could not be computed: {errorText(night.error)}</p>}
      {!data && !night.error && <p className="text-sm text-ink-300">Computing the night…</p>}
      {data && (
        <>
          <AltitudeChart
            data={data}
            timeZone={timeZone}
            cursor={cursor}
            onCursor={onCursor}
            highlight={highlight}
            comments={comments}
            picking={picking}
            onPick={
              onPickComment
                ? (target, t) => {
                    setPicking(false);
                    onPickComment({ chart: 'altitude', target, time: new Date(t).toISOString().replace('.000Z', 'Z') });
                  }
                : undefined
            }
          />
          <p className="text-xs text-ink-300">
            Drag or click the chart to move the scene time (arrow keys step {data.step} min). Solid: inside the envelope; faint dots: outside. Bands: daylight and twilights; red: altitudes the
            envelope forbids.
            {daylight && <strong className="ml-1 text-red-300">Solar caution: part of this span is in daylight — never point optics at or near the Sun.</strong>} Computed times are for planning;
            local rules and instrument interlocks take precedence.
          </p>
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,18rem)]">
            <FiguresTable data={data} timeZone={timeZone} highlight={highlight} onHighlight={setHighlight} onSelectTime={(t) => onCursor(t, true)} />
            <CoverageChart data={data} cursor={cursor} highlight={highlight} timeZone={timeZone} />
          </div>
        </>
      )}
    </section>
  );
}
