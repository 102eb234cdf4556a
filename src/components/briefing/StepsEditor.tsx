/** Briefing steps: ordered stops (time, camera, layers, caption, optional pin focus). */
import { useId, useState } from 'react';
import type { Pin, Step } from '../../lib/contracts/scene-doc';
import type { SceneOut } from '../../lib/contracts/scene';
import { inputUtcToIso, isoToInputUtc, moveItem, newId, formatInZone } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { INPUT, LABEL } from '../scenes/controls';
import { Markdown, MarkdownText } from './Markdown';

function StepForm({ step, pins, onSave, onCancel, scene }: { step: Step; pins: Pin[]; onSave: (s: Step) => void; onCancel: () => void; scene: SceneOut }) {
  const id = useId();
  const [s, setS] = useState(step);
  const [time, setTime] = useState(isoToInputUtc(step.time));
  const [preview, setPreview] = useState(false);
  const [err, setErr] = useState<string | null>(null);
  return (
    <form
      className="flex flex-col gap-2 rounded border border-brass-500/60 p-3"
      onSubmit={(e) => {
        e.preventDefault();
        const iso = inputUtcToIso(time);
        if (!iso) return setErr('time: enter a date and time');
        if (s.caption.length > 10_000) return setErr('caption: at most 10 000 characters');
        onSave({ ...s, time: iso });
      }}
    >
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-title`} className={LABEL}>
          Step title
        </label>
        <input id={`${id}-title`} className={INPUT} value={s.title} maxLength={120} onChange={(e) => setS({ ...s, title: e.target.value })} />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-time`} className={LABEL}>
          Instant (UTC)
        </label>
        <input id={`${id}-time`} type="datetime-local" className={INPUT} value={time} onChange={(e) => setTime(e.target.value)} />
      </div>
      <div className="flex flex-col gap-1">
        <div className="flex items-center justify-between">
          <label htmlFor={`${id}-cap`} className={LABEL}>
            Caption (Markdown: **bold**, *italic*, `code`, lists, links)
          </label>
          <Button variant="ghost" className="px-2 py-0 text-xs" aria-pressed={preview} onClick={() => setPreview(!preview)}>
            {preview ? 'Edit' : 'Preview'}
          </Button>
        </div>
        {preview ? (
          <div className="min-h-24 rounded border border-ink-700 p-2 text-sm">
            <Markdown source={s.caption} />
          </div>
        ) : (
          <textarea id={`${id}-cap`} className={`${INPUT} min-h-24`} value={s.caption} onChange={(e) => setS({ ...s, caption: e.target.value })} />
        )}
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-pin`} className={LABEL}>
          Focus on a pin
        </label>
        <select id={`${id}-pin`} className={INPUT} value={s.pinId ?? ''} onChange={(e) => setS({ ...s, pinId: e.target.value || null })}>
          <option value="">None</option>
          {pins.map((p, i) => (
            <option key={p.id} value={p.id}>
              {p.label || `${p.kind} ${i + 1}`}
            </option>
          ))}
        </select>
      </div>
      <p className="text-xs text-ink-300">
        Camera: {s.camera?.mode ?? 'scene'} view{s.camera?.azDeg !== undefined ? `, az ${s.camera.azDeg.toFixed(0)}°, alt ${(s.camera.altDeg ?? 0).toFixed(0)}°` : ''}.{' '}
        <button type="button" className="text-brass-300 underline" onClick={() => { setS({ ...s, camera: { ...scene.camera }, layers: { ...scene.layers } }); setTime(isoToInputUtc(scene.time)); }}>
          Use the scene's current view, layers and time
        </button>
      </p>
      {err && (
        <p role="alert" className="text-xs text-danger-300">
          {err}
        </p>
      )}
      <div className="flex gap-2">
        <Button type="submit">Save step</Button>
        <Button variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

export function StepsEditor({ scene, onChange, readOnly, onPresent, onShowStep, shownStepId }: { scene: SceneOut; onChange: (steps: Step[]) => void; readOnly: boolean; onPresent: (index: number) => void; onShowStep: (id: string | null) => void; shownStepId: string | null }) {
  const [editing, setEditing] = useState<string | null>(null);
  const [draft, setDraft] = useState<Step | null>(null);
  const steps = scene.steps;
  const fromScene = (): Step => ({ id: newId('s'), title: `Step ${steps.length + 1}`, time: scene.time, camera: { ...scene.camera }, layers: { ...scene.layers }, caption: '', pinId: null });
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-2">
        <Button onClick={() => onPresent(0)} disabled={!steps.length}>
          Present
        </Button>
        {!readOnly && (
          <Button variant="secondary" onClick={() => setDraft(fromScene())} disabled={!!draft}>
            Add step
          </Button>
        )}
      </div>
      {draft && (
        <StepForm
          step={draft}
          pins={scene.pins}
          scene={scene}
          onCancel={() => setDraft(null)}
          onSave={(s) => {
            onChange([...steps, s]);
            setDraft(null);
          }}
        />
      )}
      {steps.length === 0 && !draft && <p className="text-sm text-ink-300">No steps yet. A step keeps a time, a view, layers and a caption.</p>}
      <ol className="flex flex-col gap-2" aria-label="Steps">
        {steps.map((st, i) =>
          editing === st.id ? (
            <li key={st.id}>
              <StepForm
                step={st}
                pins={scene.pins}
                scene={scene}
                onCancel={() => setEditing(null)}
                onSave={(s) => {
                  onChange(steps.map((x) => (x.id === s.id ? s : x)));
                  setEditing(null);
                }}
              />
            </li>
          ) : (
            <li key={st.id} id={`step-${st.id}`} className={`flex flex-col gap-1 rounded border p-2 text-sm ${shownStepId === st.id ? 'border-brass-400' : 'border-ink-700'}`}>
              <div className="flex items-start justify-between gap-2">
                <div className="min-w-0">
                  <p className="font-medium">
                    {i + 1}. {st.title || 'Untitled step'}
                  </p>
                  <p className="text-xs text-ink-300">{formatInZone(st.time, scene.site.timeZone ?? 'UTC')}</p>
                </div>
                <div className="flex flex-wrap justify-end gap-1">
                  <Button variant="ghost" className="px-2 py-1 text-xs" aria-pressed={shownStepId === st.id} onClick={() => onShowStep(shownStepId === st.id ? null : st.id)}>
                    {shownStepId === st.id ? 'Back to scene' : 'Show'}
                  </Button>
                  <Button variant="ghost" className="px-2 py-1 text-xs" onClick={() => onPresent(i)}>
                    Present from here
                  </Button>
                  {!readOnly && (
                    <>
                      <Button variant="ghost" className="px-2 py-1 text-xs" aria-label={`Move step ${i + 1} up`} disabled={i === 0} onClick={() => onChange(moveItem(steps, i, i - 1))}>
                        ↑
                      </Button>
                      <Button variant="ghost" className="px-2 py-1 text-xs" aria-label={`Move step ${i + 1} down`} disabled={i === steps.length - 1} onClick={() => onChange(moveItem(steps, i, i + 1))}>
                        ↓
                      </Button>
                      <Button variant="ghost" className="px-2 py-1 text-xs" onClick={() => setEditing(st.id)} aria-label={`Edit step ${i + 1}`}>
                        Edit
                      </Button>
                      <Button variant="ghost" className="px-2 py-1 text-xs text-danger-300" aria-label={`Delete step ${i + 1}`} onClick={() => window.confirm(`Delete step ${i + 1}?`) && onChange(steps.filter((x) => x.id !== st.id))}>
                        Delete
                      </Button>
                    </>
                  )}
                </div>
              </div>
              {st.caption && <p className="line-clamp-2 text-xs text-ink-300"><MarkdownText source={st.caption} /></p>}
            </li>
          ),
        )}
      </ol>
    </div>
  );
}
