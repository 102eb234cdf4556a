/**
 * Altitude over time for one night: a curve per target and chosen body, airmass on the right, the Sun's
 * daylight bands, the envelope's altitude limits as bands, outside-the-limits parts faded, window edges
 * marked, the Moon, a cursor at the scene time. SVG from d3-scale + d3-shape through React, so the same
 * component draws on the server (the printed handout, the SVG download) and in the browser (see README.md).
 */
import { useId, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import { airmassTicks, clock, curveRuns, daylightBands, hourTicks, limitBands, moonPhaseName, nightSummary, altitudeAt, type Pt } from '../../lib/night/chart';
import { BODIES, DAYLIGHT, LABELS, PLAN, PLAN_LINES, SURFACE, dashArray, daylightOf, seriesAt } from '../../lib/style/palette';
import type { NightAnswer } from '../../lib/sky/night';

export interface ChartComment {
  id: string;
  target: string;
  time: string;
  body: string;
  author?: string;
  resolved?: boolean;
}

export interface AltitudeChartProps {
  data: NightAnswer;
  timeZone: string;
  /** 'screen' on the app's dark panels, 'print' on white paper (handout, downloads). */
  ink?: 'screen' | 'print';
  width?: number;
  height?: number;
  cursor?: number | null;
  /** Called while dragging (done = false) and on release or click (done = true). */
  onCursor?: (t: number, done: boolean) => void;
  highlight?: string | null;
  comments?: ChartComment[];
  /** In the panel's "pin" mode, a click picks the target nearest the pointer at that time. */
  onPick?: (target: string, t: number) => void;
  picking?: boolean;
  /** A click (not a drag) near a curve: the target, the instant and where, in px from the chart's top left. */
  onPoint?: (target: string, t: number, at: { x: number; y: number }) => void;
  /** Enter on the chart's time slider. */
  onEnter?: () => void;
  /** A comment being written: its point is marked (outlined) until it is posted. */
  pending?: { target: string; time: number } | null;
  title?: string;
  /** Width and height attributes in px (for a standalone SVG file) instead of filling the container. */
  fixedSize?: boolean;
  /** Number the comment markers 1, 2, … in list order (paper: the handout lists the texts under the chart). */
  numbered?: boolean;
}

const M = { top: 14, right: 46, bottom: 30, left: 40 };

export function AltitudeChart({ data, timeZone, ink = 'screen', width = 800, height = 400, cursor = null, onCursor, highlight = null, comments = [], onPick, picking = false, onPoint, onEnter, pending = null, title, fixedSize = false, numbered = false }: AltitudeChartProps) {
  const id = useId().replace(/[^a-zA-Z0-9_-]/g, '');
  // render-to-commit time of each drawing, as a performance entry `night-chart` (read by tests/bench/night.bench.ts)
  const renderStart = typeof performance !== 'undefined' ? performance.now() : 0;
  useLayoutEffect(() => {
    try {
      performance.measure('night-chart', { start: renderStart, end: performance.now(), detail: { targets: data.targets.length } });
    } catch {
      /* older browsers */
    }
  });
  const from = Date.parse(data.from), to = Date.parse(data.to);
  const x = useMemo(() => scaleLinear().domain([from, to]).range([M.left, width - M.right]), [from, to, width]);
  const y = useMemo(() => scaleLinear().domain([0, 90]).range([height - M.bottom, M.top]), [height]);
  const path = useMemo(() => line<Pt>().x((p) => x(p.t)).y((p) => y(p.alt)), [x, y]);
  const svgRef = useRef<SVGSVGElement>(null);
  const [drag, setDrag] = useState(false);
  const downAt = useRef<{ x: number; y: number } | null>(null);
  const c = (k: { screen: string; print: string }) => k[ink];

  const prepared = useMemo(() => {
    const sunFirst = data.sun.samples[0]?.altitude ?? -90;
    const bands = daylightBands(data.sun.events, from, to, daylightOf(sunFirst));
    const limits = limitBands(data.envelope as never);
    const curves = data.targets.map((t, i) => ({ name: t.name, i, runs: curveRuns(t.samples, t.windows), windows: t.windows, best: t.best }));
    const moon = curveRuns(data.moon.samples, []);
    const bodies = (data.bodies ?? []).filter((b) => b.body !== 'moon').map((b) => ({ body: b.body, runs: curveRuns(b.samples, []) }));
    return { bands, limits, curves, moon, bodies };
  }, [data, from, to]);

  // path strings and window-edge ticks, made once per data and size (a highlight or cursor redraw reuses them)
  const drawn = useMemo(
    () => ({
      curves: prepared.curves.map((cv) => ({
        paths: cv.runs.map((r) => path(r.points) ?? ''),
        edges: cv.windows
          .flatMap((w) => [w.start, w.end])
          .map((e) => Date.parse(e))
          .filter((t) => t > from && t < to)
          .map((t) => ({ x: x(t), y: y(altitudeAt(data.targets[cv.i].samples, t)) })),
      })),
      moon: prepared.moon.map((r) => path(r.points) ?? ''),
      bodies: prepared.bodies.map((b) => b.runs.map((r) => path(r.points) ?? '')),
    }),
    [prepared, path, data, from, to, x, y],
  );

  const summary = useMemo(() => nightSummary(data, timeZone), [data, timeZone]);
  const name = title ?? `Altitude over time, ${clock(from, timeZone)} to ${clock(to, timeZone)} ${timeZone}, ${data.targets.length} target${data.targets.length === 1 ? '' : 's'}`;
  const plotW = width - M.left - M.right, plotH = height - M.top - M.bottom;
  // hour labels at least ~44 px apart (a phone-wide chart labels every 2 or 3 hours)
  const spanH = (to - from) / 3600000;
  const ticks = hourTicks(from, to, timeZone, Math.max(spanH > 14 ? 2 : 1, Math.ceil((spanH * 44) / Math.max(1, plotW))));
  const text = c(SURFACE.text), muted = c(SURFACE.textMuted);
  // the Moon's own ink is pale grey: on paper its curve and label take the dim label ink
  const moonInk = ink === 'print' ? LABELS.labelDim.print : BODIES.moon.screen;

  const timeAt = (clientX: number) => {
    const r = svgRef.current!.getBoundingClientRect();
    const vx = ((clientX - r.left) / r.width) * width;
    return Math.round(Math.min(to, Math.max(from, x.invert(vx))) / 1000) * 1000;
  };
  const nearestTarget = (t: number, clientY: number) => {
    const r = svgRef.current!.getBoundingClientRect();
    const alt = y.invert(((clientY - r.top) / r.height) * height);
    let best: string | null = null, d = Infinity;
    for (const tg of data.targets) {
      const a = altitudeAt(tg.samples, t);
      if (Math.abs(a - alt) < d) { d = Math.abs(a - alt); best = tg.name; }
    }
    return d < 8 ? best : null;
  };
  const onDown = (e: PointerEvent<SVGRectElement>) => {
    if (picking && onPick) {
      const t = timeAt(e.clientX);
      const tg = nearestTarget(t, e.clientY);
      if (tg) onPick(tg, t);
      return;
    }
    downAt.current = { x: e.clientX, y: e.clientY };
    if (!onCursor) return;
    e.preventDefault(); // no text selection while dragging
    e.currentTarget.setPointerCapture?.(e.pointerId);
    setDrag(true);
    onCursor(timeAt(e.clientX), false);
  };
  const onMove = (e: PointerEvent<SVGRectElement>) => {
    if (drag && onCursor) onCursor(timeAt(e.clientX), false);
  };
  const onUp = (e: PointerEvent<SVGRectElement>) => {
    const down = downAt.current;
    downAt.current = null;
    if (drag && onCursor) {
      setDrag(false);
      onCursor(timeAt(e.clientX), true);
    }
    // a click rather than a drag, near a curve: offer that point (e.g. to pin a comment there)
    if (onPoint && down && e.type === 'pointerup' && Math.hypot(e.clientX - down.x, e.clientY - down.y) < 5) {
      const t = timeAt(e.clientX);
      const tg = nearestTarget(t, e.clientY);
      const r = svgRef.current!.getBoundingClientRect();
      if (tg) onPoint(tg, t, { x: e.clientX - r.left, y: e.clientY - r.top });
    }
  };
  const onKey = (e: KeyboardEvent<SVGRectElement>) => {
    if (e.key === 'Enter' && onEnter) {
      e.preventDefault();
      onEnter();
      return;
    }
    if (!onCursor) return;
    const stepMs = (e.shiftKey ? 60 : data.step) * 60000;
    const now = cursor ?? from;
    let t: number | null = null;
    if (e.key === 'ArrowRight') t = now + stepMs;
    else if (e.key === 'ArrowLeft') t = now - stepMs;
    else if (e.key === 'Home') t = from;
    else if (e.key === 'End') t = to;
    if (t === null) return;
    e.preventDefault();
    onCursor(Math.min(to, Math.max(from, t)), true);
  };

  const moonLabel = `Moon ${Math.round(data.moon.illumination * 100)} % lit, ${moonPhaseName(data.moon.phase)}`;
  const showCursor = cursor !== null && cursor >= from && cursor <= to;
  // the cursor's time label goes to the foot of the plot when a curve's name stands where it would be
  const cursorLabelLow =
    showCursor &&
    prepared.curves.some((cv) => {
      if (cv.best.altitude < 2) return false;
      const lx = x(Date.parse(cv.best.time)), ly = y(cv.best.altitude) - 6, cx = x(cursor!);
      return ly < M.top + 26 && lx - 50 < cx + 44 && lx + 7 * cv.name.length + 50 > cx - 44;
    });

  return (
    <svg
      ref={svgRef}
      xmlns="http://www.w3.org/2000/svg"
      viewBox={`0 0 ${width} ${height}`}
      width={fixedSize ? width : '100%'}
      height={fixedSize ? height : undefined}
      // a picture when it is only looked at; a group when it holds the time slider (an img's content is
      // presentational, so a control inside it would be hidden from assistive technology)
      role={onCursor || onPick || onPoint ? 'group' : 'img'}
      aria-labelledby={`${id}-t ${id}-d`}
      data-testid="altitude-chart"
      style={{ display: 'block', maxWidth: fixedSize ? undefined : '100%', height: fixedSize ? undefined : 'auto', fontFamily: 'system-ui, sans-serif', background: c(SURFACE.panel) }}
    >
      <title id={`${id}-t`}>{name}</title>
      <desc id={`${id}-d`}>{summary}</desc>
      <defs>
        <clipPath id={`${id}-clip`}>
          <rect x={M.left} y={M.top} width={plotW} height={plotH} />
        </clipPath>
      </defs>
      <g data-part="daylight">
        {prepared.bands.map((b, i) => (
          <rect key={i} x={x(b.start)} y={M.top} width={Math.max(0, x(b.end) - x(b.start))} height={plotH} fill={c(DAYLIGHT[b.key])} opacity={ink === 'print' ? 0.3 : 1}>
            <title>{`${DAYLIGHT[b.key].label} ${clock(b.start, timeZone)}–${clock(b.end, timeZone)}`}</title>
          </rect>
        ))}
      </g>
      <g data-part="limits">
        {prepared.limits.map((b) => (
          <g key={b.limit}>
            <rect x={M.left} y={y(b.high)} width={plotW} height={Math.max(0, y(b.low) - y(b.high))} fill={c(PLAN.forbidden)} opacity={0.14}>
              <title>{b.label}</title>
            </rect>
            <line x1={M.left} x2={M.left + plotW} y1={y(b.limit === 'minAltitude' ? b.high : b.low)} y2={y(b.limit === 'minAltitude' ? b.high : b.low)} stroke={c(PLAN_LINES.envelopeFloor)} strokeWidth={1.2} strokeDasharray={dashArray(PLAN_LINES.envelopeFloor.pattern)} />
          </g>
        ))}
      </g>
      <g data-part="grid" stroke={c(PLAN_LINES.altitudeRing)} strokeWidth={0.6} strokeDasharray="2 4">
        {[15, 30, 45, 60, 75].map((a) => (
          <line key={a} x1={M.left} x2={M.left + plotW} y1={y(a)} y2={y(a)} />
        ))}
        {ticks.map((t) => (
          <line key={t} x1={x(t)} x2={x(t)} y1={M.top} y2={M.top + plotH} />
        ))}
      </g>
      <g data-part="axes" fontSize={11} fill={muted}>
        {[0, 15, 30, 45, 60, 75, 90].map((a) => (
          <text key={a} x={M.left - 6} y={y(a) + 4} textAnchor="end">{`${a}°`}</text>
        ))}
        <text x={12} y={M.top + plotH / 2} transform={`rotate(-90 12 ${M.top + plotH / 2})`} textAnchor="middle" fill={text}>
          Altitude
        </text>
        {airmassTicks().map((a) => (
          <text key={a.airmass} x={width - M.right + 6} y={y(a.altitude) + 4}>
            {a.airmass.toFixed(1)}
          </text>
        ))}
        <text x={width - 8} y={M.top + plotH / 2} transform={`rotate(90 ${width - 8} ${M.top + plotH / 2})`} textAnchor="middle" fill={text}>
          Airmass
        </text>
        {ticks.map((t) => (
          <text key={t} x={x(t)} y={height - M.bottom + 16} textAnchor="middle">
            {clock(t, timeZone)}
          </text>
        ))}
        <text x={M.left + plotW} y={height - 2} textAnchor="end" fontSize={10}>
          {timeZone}
        </text>
      </g>
      <g clipPath={`url(#${id}-clip)`} fill="none" strokeLinejoin="round" strokeLinecap="round">
        <g data-part="moon">
          <title>{moonLabel}</title>
          {prepared.moon.map((_, i) => (
            <path key={i} d={drawn.moon[i]} stroke={moonInk} strokeWidth={1.6} strokeDasharray="1 5" opacity={0.9} />
          ))}
        </g>
        {prepared.bodies.map((b, bi) => (
          <g key={b.body} data-part="body" data-body={b.body}>
            {b.runs.map((_, i) => (
              <path key={i} d={drawn.bodies[bi][i]} stroke={c(BODIES.planet)} strokeWidth={1.4} strokeDasharray="6 3 1 3" />
            ))}
          </g>
        ))}
        {prepared.curves.map((cv) => {
          const s = seriesAt(cv.i);
          const dim = highlight !== null && highlight !== cv.name;
          const hot = highlight === cv.name;
          return (
            <g key={cv.name + cv.i} className="night-curve" data-target={cv.name} opacity={dim ? 0.25 : 1}>
              {cv.runs.map((r, i) => (
                <path
                  key={i}
                  d={drawn.curves[cv.i].paths[i]}
                  stroke={r.inside ? c(s) : c(s)}
                  strokeWidth={r.inside ? (hot ? 3.6 : s.widthPx + 0.4) : 1.1}
                  strokeDasharray={r.inside ? dashArray(s.pattern) : '1 3'}
                  opacity={r.inside ? 1 : 0.55}
                  data-inside={r.inside ? 'true' : 'false'}
                />
              ))}
              {drawn.curves[cv.i].edges.map((e, i) => (
                <line key={`e${i}`} x1={e.x} x2={e.x} y1={e.y - 5} y2={e.y + 5} stroke={c(s)} strokeWidth={2} data-part="window-edge" />
              ))}
              {cv.best.inWindow && <circle cx={x(Date.parse(cv.best.time))} cy={y(cv.best.altitude)} r={hot ? 4.5 : 3} fill={c(s)} stroke={c(SURFACE.panel)} strokeWidth={1} />}
            </g>
          );
        })}
      </g>
      <g data-part="labels" fontSize={11}>
        {prepared.curves.map((cv) => {
          const best = cv.best;
          const t = Date.parse(best.time);
          if (best.altitude < 2) return null;
          const s = seriesAt(cv.i);
          const right = x(t) > width - M.right - 90;
          return (
            <text key={cv.name + cv.i} x={x(t) + (right ? -6 : 6)} y={y(best.altitude) - 6} textAnchor={right ? 'end' : 'start'} fill={c(s)} opacity={highlight !== null && highlight !== cv.name ? 0.35 : 1} paintOrder="stroke" stroke={c(SURFACE.panel)} strokeWidth={3}>
              {cv.name}
            </text>
          );
        })}
        {data.moon.samples.length > 0 && (() => {
          const top = data.moon.samples.reduce((a, b) => (b.altitude > a.altitude ? b : a));
          if (top.altitude < 3) return null;
          const t = Date.parse(top.time);
          return (
            <text x={Math.min(x(t) + 6, width - M.right - 4)} y={y(top.altitude) + 14} fill={moonInk} textAnchor={x(t) > width - M.right - 120 ? 'end' : 'start'} paintOrder="stroke" stroke={c(SURFACE.panel)} strokeWidth={3}>
              {moonLabel}
            </text>
          );
        })()}
      </g>
      <g data-part="comments">
        {comments.map((cm, i) => {
          const tg = data.targets.find((t) => t.name === cm.target);
          const t = Date.parse(cm.time);
          if (!tg || !(t >= from && t <= to)) return null;
          const a = altitudeAt(tg.samples, t);
          const cx = x(t), cy = y(Math.max(0, Math.min(90, a)));
          return (
            <g key={cm.id} data-comment={cm.id} data-target={cm.target} data-time={cm.time}>
              <path d={`M${cx},${cy} l-6,-12 h12 z`} fill={cm.resolved ? c(SURFACE.panel) : c(PLAN.comment)} stroke={cm.resolved ? c(PLAN.comment) : c(SURFACE.panel)} strokeWidth={cm.resolved ? 1.5 : 1} />
              {numbered && (
                <text x={cx} y={cy - 16} textAnchor="middle" fontSize={11} fontWeight={700} fill={c(PLAN.comment)} paintOrder="stroke" stroke={c(SURFACE.panel)} strokeWidth={3}>
                  {i + 1}
                </text>
              )}
              <title>{`${numbered ? `${i + 1}. ` : ''}${cm.author ? `${cm.author}: ` : ''}${cm.body} — ${cm.target} at ${clock(t, timeZone)}${cm.resolved ? ' (resolved)' : ''}`}</title>
            </g>
          );
        })}
        {pending && (() => {
          const tg = data.targets.find((t) => t.name === pending.target);
          if (!tg || !(pending.time >= from && pending.time <= to)) return null;
          const cx = x(pending.time), cy = y(Math.max(0, Math.min(90, altitudeAt(tg.samples, pending.time))));
          return (
            <g data-part="pending-comment" pointerEvents="none">
              <path d={`M${cx},${cy} l-7,-14 h14 z`} fill="none" stroke={c(PLAN.comment)} strokeWidth={2} strokeDasharray="3 2" />
              <circle cx={cx} cy={cy} r={2.5} fill={c(PLAN.comment)} />
            </g>
          );
        })()}
      </g>
      {showCursor && (
        <g data-part="cursor" pointerEvents="none">
          <line x1={x(cursor!)} x2={x(cursor!)} y1={M.top} y2={M.top + plotH} stroke={c(LABELS.cardinal)} strokeWidth={1.5} />
          <text x={x(cursor!)} y={cursorLabelLow ? M.top + plotH - 5 : M.top + 11} data-low={cursorLabelLow ? 'true' : undefined} textAnchor={x(cursor!) > width - M.right - 40 ? 'end' : 'start'} dx={x(cursor!) > width - M.right - 40 ? -4 : 4} fontSize={11} fill={c(LABELS.cardinal)}>
            {clock(cursor!, timeZone)}
          </text>
        </g>
      )}
      {(onCursor || onPick || onPoint) && (
        <rect
          data-testid="altitude-chart-cursor"
          x={M.left}
          y={M.top}
          width={plotW}
          height={plotH}
          fill="transparent"
          style={{ cursor: picking ? 'crosshair' : 'ew-resize', touchAction: 'none' }}
          tabIndex={0}
          role="slider"
          aria-label="Scene time on the chart"
          aria-valuemin={from}
          aria-valuemax={to}
          aria-valuenow={cursor ?? from}
          aria-valuetext={cursor !== null ? clock(cursor, timeZone) : undefined}
          aria-keyshortcuts={onEnter ? 'Enter' : undefined}
          onPointerDown={onDown}
          onPointerMove={onMove}
          onPointerUp={onUp}
          onPointerCancel={onUp}
          onKeyDown={onKey}
        />
      )}
    </svg>
  );
}
