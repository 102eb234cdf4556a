/** Pins: placed by clicking on the sky. A draft collects points until it has enough for its kind. */
import { useId } from 'react';
import type { Pin } from '../../lib/contracts/scene-doc';
import { MIN_POINTS, newId } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { INPUT, Labelled } from './controls';

export interface PinDraft {
  kind: Pin['kind'];
  frame: Pin['frame'];
  label: string;
  color: string;
  points: [number, number][];
}

export const emptyDraft = (): PinDraft => ({ kind: 'label', frame: 'horizontal', label: '', color: '#e4c27a', points: [] });

const KIND_HELP: Record<Pin['kind'], string> = {
  label: 'one click',
  arrow: 'click the tail, then the head',
  arc: 'click two or more points along the arc',
  region: 'click three or more corners',
};

export function draftToPin(d: PinDraft): Pin {
  return { id: newId('p'), kind: d.kind, frame: d.frame, label: d.label.trim(), color: d.color, points: d.points };
}

const fmtPoint = (p: [number, number], frame: Pin['frame']) => (frame === 'horizontal' ? `Az ${p[0].toFixed(1)}°, Alt ${p[1].toFixed(1)}°` : `RA ${p[0].toFixed(2)}°, Dec ${p[1].toFixed(2)}°`);

export function PinsEditor(props: {
  pins: Pin[];
  onChange: (p: Pin[]) => void;
  readOnly: boolean;
  draft: PinDraft | null;
  setDraft: (d: PinDraft | null) => void;
}) {
  const { pins, onChange, readOnly, draft, setDraft } = props;
  const id = useId();
  const finish = () => {
    if (!draft || draft.points.length < MIN_POINTS[draft.kind]) return;
    onChange([...pins, draftToPin(draft)]);
    setDraft(null);
  };
  return (
    <div className="flex flex-col gap-3">
      {pins.length === 0 ? (
        <p className="text-sm text-ink-300">No pins yet.</p>
      ) : (
        <ul className="flex flex-col gap-2" aria-label="Pins">
          {pins.map((p, i) => (
            <li key={p.id} className="flex flex-col gap-1 rounded bg-ink-850 p-2 text-sm">
              <div className="flex items-center justify-between gap-2">
                <span className="text-xs text-ink-300">
                  {p.kind} · {p.frame} · {p.points.length} point{p.points.length === 1 ? '' : 's'}
                </span>
                {!readOnly && (
                  <Button variant="ghost" className="px-2 py-1 text-xs" aria-label={`Delete pin ${p.label || i + 1}`} onClick={() => onChange(pins.filter((x) => x.id !== p.id))}>
                    Delete
                  </Button>
                )}
              </div>
              {readOnly ? (
                <span>{p.label || '(no label)'}</span>
              ) : (
                <div className="flex items-center gap-2">
                  <label className="sr-only" htmlFor={`${id}-l-${p.id}`}>
                    Label of pin {i + 1}
                  </label>
                  <input
                    id={`${id}-l-${p.id}`}
                    className={INPUT}
                    defaultValue={p.label}
                    maxLength={200}
                    onBlur={(e) => e.target.value !== p.label && onChange(pins.map((x) => (x.id === p.id ? { ...x, label: e.target.value } : x)))}
                  />
                  <label className="sr-only" htmlFor={`${id}-c-${p.id}`}>
                    Colour of pin {i + 1}
                  </label>
                  <input
                    id={`${id}-c-${p.id}`}
                    type="color"
                    className="h-9 w-10 rounded border border-ink-700 bg-ink-950"
                    value={p.color ?? '#e4c27a'}
                    onChange={(e) => onChange(pins.map((x) => (x.id === p.id ? { ...x, color: e.target.value } : x)))}
                  />
                </div>
              )}
            </li>
          ))}
        </ul>
      )}
      {!readOnly &&
        (draft ? (
          <fieldset className="flex flex-col gap-2 rounded border border-brass-500/60 p-2" aria-describedby={`${id}-help`}>
            <legend className="px-1 text-sm font-medium text-brass-200">New pin</legend>
            <div className="grid grid-cols-2 gap-2">
              <Labelled id={`${id}-kind`} label="Kind">
                <select id={`${id}-kind`} className={INPUT} value={draft.kind} onChange={(e) => setDraft({ ...draft, kind: e.target.value as Pin['kind'], points: [] })}>
                  <option value="label">Label</option>
                  <option value="arrow">Arrow</option>
                  <option value="arc">Arc</option>
                  <option value="region">Region</option>
                </select>
              </Labelled>
              <Labelled id={`${id}-frame`} label="Frame">
                <select id={`${id}-frame`} className={INPUT} value={draft.frame} onChange={(e) => setDraft({ ...draft, frame: e.target.value as Pin['frame'], points: [] })}>
                  <option value="horizontal">Horizontal (stays on the landscape)</option>
                  <option value="equatorial">Equatorial (turns with the sky)</option>
                </select>
              </Labelled>
            </div>
            <Labelled id={`${id}-label`} label="Label">
              <input id={`${id}-label`} className={INPUT} value={draft.label} maxLength={200} onChange={(e) => setDraft({ ...draft, label: e.target.value })} />
            </Labelled>
            <p id={`${id}-help`} className="text-xs text-brass-200" aria-live="polite">
              Click on the sky to place it ({KIND_HELP[draft.kind]}). {draft.points.length} of at least {MIN_POINTS[draft.kind]} placed
              {draft.points.length ? `; last: ${fmtPoint(draft.points[draft.points.length - 1]!, draft.frame)}` : ''}.
            </p>
            <div className="flex flex-wrap gap-2">
              <Button onClick={finish} disabled={draft.points.length < MIN_POINTS[draft.kind]}>
                Add pin
              </Button>
              <Button variant="secondary" disabled={!draft.points.length} onClick={() => setDraft({ ...draft, points: draft.points.slice(0, -1) })}>
                Undo point
              </Button>
              <Button variant="ghost" onClick={() => setDraft(null)}>
                Cancel
              </Button>
            </div>
          </fieldset>
        ) : (
          <Button variant="secondary" onClick={() => setDraft(emptyDraft())}>
            Place a pin on the sky
          </Button>
        ))}
    </div>
  );
}
