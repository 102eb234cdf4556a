/** Per-target figures beside the altitude chart: windows, best moment, airmass, Moon/Sun separations, closing limit. Sortable; hovering a row highlights its curve. */
import { useMemo, useState } from 'react';
import { clock, figureRows, limitWords, sortRows, type SortKey } from '../../lib/night/chart';
import { seriesAt } from '../../lib/style/palette';
import type { NightAnswer } from '../../lib/sky/night';

const COLUMNS: { key: SortKey; label: string; title: string }[] = [
  { key: 'name', label: 'Target', title: 'Target name' },
  { key: 'window', label: 'Inside the limits', title: 'Windows inside the envelope, and the limit that closes each' },
  { key: 'best', label: 'Best', title: 'Time of the highest altitude inside a window' },
  { key: 'altitude', label: 'Alt', title: 'Apparent altitude then (degrees)' },
  { key: 'airmass', label: 'Airmass', title: 'Lowest airmass inside a window (Kasten & Young 1989)' },
  { key: 'moon', label: 'Moon', title: 'Separation from the Moon then (degrees)' },
  { key: 'sun', label: 'Sun', title: 'Separation from the Sun then (degrees)' },
];

export function FiguresTable({ data, timeZone, highlight, onHighlight, onSelectTime }: { data: NightAnswer; timeZone: string; highlight?: string | null; onHighlight?: (name: string | null) => void; onSelectTime?: (t: number) => void }) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 'asc' | 'desc' }>({ key: 'window', dir: 'asc' });
  const rows = useMemo(() => sortRows(figureRows(data), sort.key, sort.dir), [data, sort]);
  const c = (t: number) => clock(t, timeZone);
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-xs" data-testid="night-figures">
        <caption className="pb-1 text-left text-xs text-ink-300">
          Moon {Math.round(data.moon.illumination * 100)} % lit. Times {timeZone}. Click a heading to sort; hover a row to find its curve.
        </caption>
        <thead>
          <tr className="border-b border-ink-700">
            {COLUMNS.map((col) => {
              const active = sort.key === col.key;
              return (
                <th key={col.key} scope="col" className="px-1.5 py-1 font-semibold" aria-sort={active ? (sort.dir === 'asc' ? 'ascending' : 'descending') : 'none'} title={col.title}>
                  <button type="button" className="underline-offset-2 hover:underline" onClick={() => setSort({ key: col.key, dir: active && sort.dir === 'asc' ? 'desc' : 'asc' })}>
                    {col.label}
                    {active ? (sort.dir === 'asc' ? ' ▲' : ' ▼') : ''}
                  </button>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr
              key={r.index}
              data-target={r.name}
              className={`border-b border-ink-800 ${highlight === r.name ? 'bg-white/10' : ''}`}
              onMouseEnter={() => onHighlight?.(r.name)}
              onMouseLeave={() => onHighlight?.(null)}
              onFocus={() => onHighlight?.(r.name)}
              onBlur={() => onHighlight?.(null)}
            >
              <th scope="row" className="px-1.5 py-1 font-medium">
                <span aria-hidden="true" className="mr-1 inline-block h-0.5 w-4 align-middle" style={{ background: seriesAt(r.index).screen }} />
                {r.name}
              </th>
              <td className="px-1.5 py-1">
                {r.windows.length
                  ? r.windows.map((w, i) => (
                      <span key={i} className="block whitespace-nowrap">
                        {c(w.start)}–{c(w.end)} <span className="text-ink-300">({limitWords(w.closedBy)})</span>
                      </span>
                    ))
                  : <span className="text-ink-300">none{data.targets[r.index].reasons?.length ? ` — ${limitWords(data.targets[r.index].reasons[0])}` : ''}</span>}
              </td>
              <td className="px-1.5 py-1">
                {r.inWindow ? (
                  <button type="button" className="underline-offset-2 hover:underline" onClick={() => onSelectTime?.(r.bestTime)} title="Move the scene time here">
                    {c(r.bestTime)}
                  </button>
                ) : (
                  '—'
                )}
              </td>
              <td className="px-1.5 py-1 tabular-nums">{r.inWindow ? `${r.altitude.toFixed(1)}°` : '—'}</td>
              <td className="px-1.5 py-1 tabular-nums">{r.inWindow && r.airmass !== null ? r.airmass.toFixed(2) : '—'}</td>
              <td className="px-1.5 py-1 tabular-nums">{r.inWindow ? `${r.moonSeparation.toFixed(0)}°` : '—'}</td>
              <td className="px-1.5 py-1 tabular-nums">{r.inWindow ? `${r.sunSeparation.toFixed(0)}°` : '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
