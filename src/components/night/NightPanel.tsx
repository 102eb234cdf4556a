/**
 * The night panel of a scene: the altitude-over-time chart, the sky-coverage chart and the per-target
 * figures, from the night API. The cursor is the scene's (view) time: the host passes it in and gets
 * drags and clicks back, so the sphere and the charts stay in step both ways.
 */
import { useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import { AltitudeChart, type ChartComment } from './AltitudeChart';
import { CoverageChart } from './CoverageChart';
import { FiguresTable } from './FiguresTable';
import { useNight, nightPath, type NightSource } from '../../lib/client/night';
import { errorText } from '../../lib/client/api';
import { downloadPng } from './download';
import { clock } from '../../lib/night/chart';

/** The anchor of a comment pinned to the altitude chart (contracts/comment.ts). */
export interface ChartAnchor {
  chart: 'altitude';
  target: string;
  time: string;
}
const anchorOf = (d: { target: string; time: number }): ChartAnchor => ({ chart: 'altitude', target: d.target, time: new Date(Math.round(d.time / 1000) * 1000).toISOString().replace('.000Z', 'Z') });

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
  /**
   * Those who may comment: the comment form for a point of the chart (the host's review composer, which
   * posts with this anchor); `done` closes it after posting.
   */
  composer?: (anchor: ChartAnchor, done: () => void) => ReactNode;
}

export function NightPanel({ source, timeZone, revision, cursor, onCursor, comments = [], composer }: NightPanelProps) {
  const formId = useId();
  const [at, setAt] = useState<string | undefined>(undefined);
  const [bodies, setBodies] = useState<string[]>([]);
  const [highlight, setHighlight] = useState<string | null>(null);
  // The chart is drawn at the pixel size of its box (text stays at its own size) and a height that leaves
  // it whole under the sky at laptop sizes: 30 % of the window, 240–420 px.
  const chartBox = useRef<HTMLDivElement>(null);
  const [chartSize, setChartSize] = useState<{ width: number; height: number } | null>(null);
  const [picking, setPicking] = useState(false);
  /** A click near a curve: the "Comment here" button at that point. */
  const [offer, setOffer] = useState<{ target: string; time: number; x: number; y: number } | null>(null);
  /** The point a comment is being written for. */
  const [draft, setDraft] = useState<{ target: string; time: number } | null>(null);
  const formRef = useRef<HTMLDivElement>(null);
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

  const hasData = !!data;
  useEffect(() => {
    const box = chartBox.current;
    if (!box) return;
    const measure = () => {
      const width = Math.round(box.clientWidth);
      if (width <= 0) return;
      const height = Math.round(Math.min(420, Math.max(240, window.innerHeight * 0.3)));
      setChartSize((s) => (s && s.width === width && s.height === height ? s : { width: Math.max(300, width), height }));
    };
    measure();
    const ro = typeof ResizeObserver === 'function' ? new ResizeObserver(measure) : null;
    ro?.observe(box);
    window.addEventListener('resize', measure);
    return () => {
      ro?.disconnect();
      window.removeEventListener('resize', measure);
    };
  }, [hasData]);

  const daylight = data ? data.sun.samples.some((s) => s.altitude > -0.84) : false;
  const svgHref = nightPath(source, params, 'night.svg');

  /** The form at the scene time (clamped to the span) for the highlighted target, or the first one. */
  const openDraft = () => {
    if (!data || !data.targets.length) return;
    const from = Date.parse(data.from), to = Date.parse(data.to);
    const target = data.targets.find((t) => t.name === highlight)?.name ?? data.targets[0].name;
    setDraft({ target, time: Math.min(to, Math.max(from, Math.round(cursor / 60000) * 60000)) });
    setOffer(null);
  };
  // move the focus into the form when it opens (keyboard users land on the target choice)
  const draftOpen = draft !== null;
  useEffect(() => {
    if (draftOpen) formRef.current?.querySelector('select')?.focus();
  }, [draftOpen]);

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
          {composer && data && data.targets.length > 0 && (
            <button type="button" aria-expanded={draft !== null} aria-controls={draft !== null ? formId : undefined} className="rounded border border-ink-600 px-2 py-1 hover:bg-white/5" data-testid="chart-comment-open" onClick={() => openDraft()}>
              Comment on the chart
            </button>
          )}
        </span>
      </div>
      {pngError && <p className="text-xs text-red-300">PNG not made: {pngError}</p>}
      {night.error && !data && <p className="text-sm text-red-300">The night could not be computed: {errorText(night.error)}</p>}
      {!data && !night.error && <p className="text-sm text-ink-300">Computing the night…</p>}
      {data && (
        <>
          <div className="relative" ref={chartBox}>
            <AltitudeChart
              data={data}
              width={chartSize?.width}
              height={chartSize?.height}
              timeZone={timeZone}
              cursor={cursor}
              onCursor={onCursor}
              highlight={highlight}
              comments={comments}
              pending={draft}
              picking={picking}
              onPick={
                composer
                  ? (target, t) => {
                      setPicking(false);
                      setDraft({ target, time: t });
                    }
                  : undefined
              }
              onPoint={composer ? (target, t, at) => setOffer({ target, time: t, ...at }) : undefined}
              onEnter={composer ? () => openDraft() : undefined}
            />
            {offer && (
              <div className="absolute z-10 flex -translate-x-1/2 items-center gap-1 rounded border border-brass-500/70 bg-ink-900/95 px-2 py-1 text-xs shadow" style={{ left: offer.x, top: Math.max(0, offer.y - 40) }} data-testid="chart-comment-offer">
                <span className="text-ink-300">
                  {offer.target} at {clock(offer.time, timeZone)}
                </span>
                <button
                  type="button"
                  className="rounded bg-brass-500/25 px-2 py-0.5 font-medium text-brass-100 hover:bg-brass-500/40"
                  onClick={() => {
                    setDraft({ target: offer.target, time: offer.time });
                    setOffer(null);
                    setPicking(false);
                  }}
                  autoFocus
                >
                  Comment here
                </button>
                <button type="button" className="px-1 text-ink-300 hover:text-ink-100" aria-label="Close" onClick={() => setOffer(null)}>
                  ×
                </button>
              </div>
            )}
          </div>
          {composer && draft && (
            <div ref={formRef} id={formId} role="group" aria-label="Comment on a point of the altitude chart" className="flex flex-col gap-2 rounded border border-brass-500/50 bg-brass-500/5 p-3 text-sm" data-testid="chart-comment-form">
              <div className="flex flex-wrap items-end gap-3">
                <label className="flex flex-col gap-1 text-xs text-ink-300">
                  Target
                  <select className="rounded border border-ink-600 bg-ink-900 px-2 py-1 text-sm text-ink-100" value={draft.target} onChange={(e) => setDraft({ ...draft, target: e.target.value })} data-testid="chart-comment-target">
                    {data.targets.map((t) => (
                      <option key={t.name} value={t.name}>
                        {t.name}
                      </option>
                    ))}
                  </select>
                </label>
                <span className="flex flex-col gap-1 text-xs text-ink-300">
                  Time ({timeZone})
                  <span className="flex items-center gap-1">
                    <button type="button" className="rounded border border-ink-600 px-2 py-1 text-ink-100 hover:bg-white/5" onClick={() => setDraft({ ...draft, time: Math.max(Date.parse(data.from), draft.time - data.step * 60000) })}>
                      −{data.step} min
                    </button>
                    <output className="min-w-[4.5rem] text-center font-mono text-sm text-ink-100" data-testid="chart-comment-time">
                      {clock(draft.time, timeZone)}
                    </output>
                    <button type="button" className="rounded border border-ink-600 px-2 py-1 text-ink-100 hover:bg-white/5" onClick={() => setDraft({ ...draft, time: Math.min(Date.parse(data.to), draft.time + data.step * 60000) })}>
                      +{data.step} min
                    </button>
                  </span>
                </span>
                <button type="button" aria-pressed={picking} className={`rounded border px-2 py-1 text-xs ${picking ? 'border-brass-500 bg-brass-500/20' : 'border-ink-600 hover:bg-white/5'}`} onClick={() => setPicking(!picking)}>
                  {picking ? 'Click a curve… (cancel)' : 'Pick the point on the chart'}
                </button>
              </div>
              {composer(anchorOf(draft), () => setDraft(null))}
              <button type="button" className="self-start text-xs text-ink-300 underline" onClick={() => { setDraft(null); setPicking(false); }}>
                Cancel
              </button>
            </div>
          )}
          {comments.length > 0 && (
            <div className="text-xs" data-testid="chart-comment-list">
              <p className="text-ink-300">Comments on the chart ({comments.length})</p>
              <ul className="mt-1 flex flex-col gap-1">
                {comments.map((cm) => (
                  <li key={cm.id} data-comment={cm.id} className={cm.resolved ? 'text-ink-300' : 'text-ink-100'}>
                    <span aria-hidden="true" className="text-brass-300">▼ </span>
                    <span className="font-medium">
                      {cm.target} at {clock(Date.parse(cm.time), timeZone)}
                    </span>
                    {cm.author ? ` — ${cm.author}` : ''}
                    {cm.resolved ? ' (resolved)' : ''}: <span className="whitespace-pre-wrap">{cm.body}</span>
                  </li>
                ))}
              </ul>
            </div>
          )}
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
