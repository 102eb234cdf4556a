/**
 * Sky coverage: an azimuth/altitude polar plot (zenith at the centre, horizon at the rim, north up, east
 * right) of what the envelope forbids — below the floor, above the ceiling / the keyhole, outside the
 * azimuth ranges, under the horizon mask — with each target's track across the night (its windows bold)
 * and the Sun and Moon avoidance zones at the cursor's time. SVG through React, like AltitudeChart.
 */
import { useId, useMemo } from 'react';
import { azAltAt, clock, polarXY, smallCircle, trackRuns } from '../../lib/night/chart';
import { maskAltitudeDeg, prepareMask, azimuthMarginDeg } from '../../lib/sky/envelope';
import { BODIES, LABELS, PLAN, PLAN_LINES, SURFACE, dashArray, seriesAt } from '../../lib/style/palette';
import type { NightAnswer } from '../../lib/sky/night';

export function CoverageChart({ data, cursor, highlight = null, timeZone, ink = 'screen', size = 320, fixedSize = false }: { data: NightAnswer; cursor: number | null; highlight?: string | null; timeZone: string; ink?: 'screen' | 'print'; size?: number; fixedSize?: boolean }) {
  const id = useId().replace(/[^a-zA-Z0-9_-]/g, '');
  const c = (k: { screen: string; print: string }) => k[ink];
  const cx = size / 2, cy = size / 2, R = size / 2 - 22;
  const P = (az: number, alt: number) => polarXY(az, alt, cx, cy, R);
  const env = (data.envelope ?? {}) as { minAltitude?: number; maxAltitude?: number; keyholeRadius?: number; azimuthRanges?: [number, number][]; horizonMask?: [number, number][]; sunAvoidance?: number; moonAvoidance?: number };

  const forbidden = useMemo(() => {
    // one path, even-odd: the rim circle, then the allowed boundary as the lowest allowed altitude per azimuth
    const parts: string[] = [];
    const circle = (alt: number) => {
      const r = (R * (90 - alt)) / 90;
      return r <= 0 ? '' : `M${cx - r},${cy} a${r},${r} 0 1,0 ${2 * r},0 a${r},${r} 0 1,0 ${-2 * r},0 Z`;
    };
    const mask = env.horizonMask?.length ? prepareMask(env.horizonMask) : null;
    const ranges = env.azimuthRanges?.length ? env.azimuthRanges : null;
    const floorAt = (az: number) => {
      if (ranges && azimuthMarginDeg(az, ranges) < 0) return 90;
      return Math.max(0, env.minAltitude ?? 0, mask ? maskAltitudeDeg(mask, az) : 0);
    };
    // lower forbidden region: between the rim and the floor profile
    const pts: string[] = [];
    for (let az = 0; az <= 360; az += 1) {
      const [x, y] = P(az % 360, Math.min(90, floorAt(az % 360)));
      pts.push(`${az ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`);
    }
    parts.push(circle(0) + pts.join('') + 'Z');
    const top = Math.min(env.maxAltitude ?? 90, env.keyholeRadius !== undefined ? 90 - env.keyholeRadius : 90);
    const upper = top < 90 ? circle(top) : '';
    return { lower: parts.join(''), upper };
  }, [data.envelope, size]);

  const tracks = useMemo(() => data.targets.map((t, i) => ({ name: t.name, i, runs: trackRuns(t.samples, t.windows) })), [data]);
  const at = cursor ?? Date.parse(data.from);
  const sun = azAltAt(data.sun.samples, at), moon = azAltAt(data.moon.samples, at);
  const zone = (p: { az: number; alt: number } | null, r: number | undefined) => {
    if (!p || r === undefined) return null;
    return smallCircle(p.az, p.alt, r, 6).map((q, k) => { const [x, y] = P(q.az, q.alt); return `${k ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`; }).join('') + 'Z';
  };
  const sunZone = zone(sun, env.sunAvoidance), moonZone = zone(moon, env.moonAvoidance);
  const line = (pts: { az: number; alt: number }[]) => pts.map((p, k) => { const [x, y] = P(p.az, p.alt); return `${k ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`; }).join('');
  const title = `Sky coverage (azimuth and altitude), ${data.targets.length} target track${data.targets.length === 1 ? '' : 's'}, limits at ${clock(at, timeZone)}`;
  const desc = `Zenith at the centre, horizon at the rim, north up, east to the right. Shaded: directions the envelope forbids${env.sunAvoidance !== undefined && sun && sun.alt > -env.sunAvoidance ? '; red ring: Sun avoidance' : ''}${env.moonAvoidance !== undefined && moon && moon.alt > -env.moonAvoidance ? '; blue ring: Moon avoidance' : ''}. Tracks are bold inside each target's windows.`;

  return (
    <svg xmlns="http://www.w3.org/2000/svg" viewBox={`0 0 ${size} ${size}`} width={fixedSize ? size : '100%'} height={fixedSize ? size : undefined} role="img" aria-labelledby={`${id}-t ${id}-d`} data-testid="coverage-chart" style={{ display: 'block', maxWidth: fixedSize ? undefined : '100%', height: fixedSize ? undefined : 'auto', background: c(SURFACE.panel), fontFamily: 'system-ui, sans-serif' }}>
      <title id={`${id}-t`}>{title}</title>
      <desc id={`${id}-d`}>{desc}</desc>
      <defs>
        <clipPath id={`${id}-sky`}>
          <circle cx={cx} cy={cy} r={R} />
        </clipPath>
      </defs>
      <circle cx={cx} cy={cy} r={R} fill={c(SURFACE.sky)} stroke={c(LABELS.axis)} strokeWidth={1} />
      <g clipPath={`url(#${id}-sky)`}>
        <path d={forbidden.lower} fill={c(PLAN.forbidden)} fillRule="evenodd" opacity={0.22} data-part="forbidden" />
        {forbidden.upper && <path d={forbidden.upper} fill={c(PLAN.forbidden)} opacity={0.22} data-part="forbidden-top" />}
        {[30, 60].map((a) => (
          <circle key={a} cx={cx} cy={cy} r={(R * (90 - a)) / 90} fill="none" stroke={c(PLAN_LINES.altitudeRing)} strokeWidth={0.6} strokeDasharray="2 4" />
        ))}
        {sunZone && <path d={sunZone} fill={c(PLAN.sunKeepOut)} fillOpacity={0.12} stroke={c(PLAN.sunKeepOut)} strokeWidth={1.4} strokeDasharray={dashArray(PLAN_LINES.keepOut.pattern)} data-part="sun-zone" />}
        {moonZone && <path d={moonZone} fill={c(PLAN.moonKeepOut)} fillOpacity={0.12} stroke={c(PLAN.moonKeepOut)} strokeWidth={1.4} strokeDasharray={dashArray(PLAN_LINES.keepOut.pattern)} data-part="moon-zone" />}
        {tracks.map((tr) => {
          const s = seriesAt(tr.i);
          const dim = highlight !== null && highlight !== tr.name;
          return (
            <g key={tr.name + tr.i} data-target={tr.name} fill="none" opacity={dim ? 0.25 : 1} strokeLinecap="round">
              {tr.runs.map((r, k) => (
                <path key={k} d={line(r.points)} stroke={c(s)} strokeWidth={r.inside ? (highlight === tr.name ? 3.4 : 2.2) : 1} strokeDasharray={r.inside ? dashArray(s.pattern) : '1 3'} opacity={r.inside ? 1 : 0.55} />
              ))}
              {(() => {
                const p = azAltAt(data.targets[tr.i].samples, at);
                if (!p || p.alt < 0) return null;
                const [x, y] = P(p.az, p.alt);
                return <circle cx={x} cy={y} r={3} fill={c(s)} />;
              })()}
            </g>
          );
        })}
        {sun && sun.alt > -1 && (() => { const [x, y] = P(sun.az, Math.max(0, sun.alt)); return <circle cx={x} cy={y} r={5} fill={c(BODIES.sun)} />; })()}
        {moon && moon.alt > -1 && (() => { const [x, y] = P(moon.az, Math.max(0, moon.alt)); return <circle cx={x} cy={y} r={4} fill={c(BODIES.moon)} />; })()}
      </g>
      <g fontSize={11} fill={c(LABELS.cardinal)} textAnchor="middle">
        {([['N', 0], ['E', 90], ['S', 180], ['W', 270]] as const).map(([l, az]) => {
          const [x, y] = polarXY(az, 0, cx, cy, R + 11);
          return (
            <text key={l} x={x} y={y + 4}>
              {l}
            </text>
          );
        })}
      </g>
    </svg>
  );
}
