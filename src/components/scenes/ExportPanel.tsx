/**
 * "Export & print": the printable handout and the scene's data files, for every role that can read the
 * scene (members by id, guests by share token). Tables are computed at the time shown in the view.
 */
import { useId, useState } from 'react';
import { INPUT, LABEL } from './controls';

export type ExportSource = { kind: 'scene'; id: string } | { kind: 'shared'; token: string };

/** The links of the section (pure; exported for tests). */
export function exportLinks(src: ExportSource, time: string, spanHours: number) {
  const from = new Date(time);
  const to = new Date(from.getTime() + spanHours * 3600_000);
  const iso = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, 'Z');
  const q = (o: Record<string, string>) => new URLSearchParams(o).toString();
  if (src.kind === 'scene') {
    const base = `/api/scenes/${encodeURIComponent(src.id)}`;
    return {
      handout: `/scenes/${encodeURIComponent(src.id)}/handout`,
      positions: `${base}/export.csv?${q({ time: iso(from) })}`,
      windows: `${base}/windows.csv?${q({ from: iso(from), to: iso(to) })}`,
      json: `${base}/export.json`,
      votable: `${base}/targets.vot`,
      calendar: `${base}/calendar.ics`,
    };
  }
  const base = `/api/shared/${encodeURIComponent(src.token)}`;
  return {
    handout: `/s/${encodeURIComponent(src.token)}/handout`,
    positions: `${base}/export.csv?${q({ time: iso(from) })}`,
    windows: `${base}/export-windows.csv?${q({ from: iso(from), to: iso(to) })}`,
    json: `${base}/export.json`,
    votable: `${base}/export.vot`,
    calendar: `${base}/calendar.ics`,
  };
}

const LINK = 'text-brass-300 underline hover:text-brass-200';

export function ExportPanel({ source, time }: { source: ExportSource; time: string }) {
  const id = useId();
  const [span, setSpan] = useState(24);
  const valid = Number.isFinite(new Date(time).getTime());
  if (!valid) return null;
  const l = exportLinks(source, time, span);
  const shown = new Date(time).toISOString().slice(0, 16).replace('T', ' ');
  return (
    <div className="flex flex-col gap-2 text-sm" data-testid="export-panel">
      <p>
        <a className={LINK} href={l.handout} target="_blank" rel="noopener">
          Printable handout
        </a>{' '}
        <span className="text-xs text-ink-300">(opens a page to print or save as PDF)</span>
      </p>
      <ul className="flex flex-col gap-1" aria-label="Data files">
        <li>
          <a className={LINK} href={l.positions} download>
            Targets at {shown} UTC (CSV)
          </a>
          <span className="block text-xs text-ink-300">Azimuth, altitude, airmass, next rise/transit/set, inside the envelope, at the time in the view.</span>
        </li>
        <li>
          <a className={LINK} href={l.windows} download>
            Visibility windows (CSV)
          </a>
          <div className="mt-1 flex items-center gap-2">
            <label htmlFor={`${id}-span`} className={`${LABEL} text-xs`}>
              Span from the view time
            </label>
            <select id={`${id}-span`} className={`${INPUT} w-auto py-1 text-xs`} value={span} onChange={(e) => setSpan(Number(e.target.value))}>
              <option value={12}>12 hours</option>
              <option value={24}>24 hours</option>
              <option value={72}>3 days</option>
              <option value={168}>7 days</option>
            </select>
          </div>
        </li>
        <li>
          <a className={LINK} href={l.json} download>
            Scene file (JSON)
          </a>
          <span className="block text-xs text-ink-300">Re-import it as a new scene from “New scene”.</span>
        </li>
        <li>
          <a className={LINK} href={l.votable} download>
            Targets (VOTable)
          </a>
        </li>
        <li>
          <a className={LINK} href={l.calendar} download data-testid="calendar-download">
            The night in your calendar (iCalendar)
          </a>
          <span className="block text-xs text-ink-300">
            Sunset, twilights, Moon, each target’s windows and the briefing steps of the scene’s night, in UTC with the site’s zone named. Importing it again updates the events.
          </span>
        </li>
      </ul>
      <p className="text-xs text-ink-300">Computed times and positions are for planning; site rules and the instrument’s own interlocks take precedence.</p>
    </div>
  );
}
