/** Small pieces shared by the scene islands (on top of the ui primitives). */
import { useEffect, useId, useState, type ComponentProps, type ReactNode } from 'react';
import { Button } from '../ui/Button';
import type { SaveStatus } from '../../lib/client/autosave';

export const INPUT =
  'w-full rounded-md border border-ink-700 bg-ink-950 px-3 py-2 text-sm text-ink-100 placeholder:text-ink-500 focus-visible:border-brass-300 aria-[invalid=true]:border-danger-300';
export const LABEL = 'text-sm font-medium text-ink-100';

const FILE_INPUT =
  'text-sm text-ink-100 file:mr-3 file:rounded-md file:border file:border-ink-500 file:bg-transparent file:px-3 file:py-1 file:text-ink-100 hover:file:border-brass-300';

/** The file chooser of the import forms: `onFile` gets the file chosen (null when the choice is cleared). */
export function FileInput({ onFile, ...input }: Omit<ComponentProps<'input'>, 'type' | 'className' | 'onChange'> & { onFile: (f: File | null) => void }) {
  return <input type="file" className={FILE_INPUT} onChange={(e) => onFile(e.target.files?.[0] ?? null)} {...input} />;
}

/** A form row of the editors: the label above its control (give the control the same `id`). */
export function Labelled({ id, label, children, className }: { id: string; label: ReactNode; children: ReactNode; className?: string }) {
  return (
    <div className={className ? `flex flex-col gap-1 ${className}` : 'flex flex-col gap-1'}>
      <label htmlFor={id} className={LABEL}>
        {label}
      </label>
      {children}
    </div>
  );
}

export function Tabs<K extends string>({ tabs, current, onChange, label }: { tabs: { key: K; label: string; badge?: ReactNode }[]; current: K; onChange: (k: K) => void; label: string }) {
  const base = useId();
  return (
    <div role="tablist" aria-label={label} className="flex flex-wrap gap-1 border-b border-ink-700">
      {tabs.map((t, i) => (
        <button
          key={t.key}
          id={`${base}-${t.key}`}
          role="tab"
          type="button"
          aria-selected={current === t.key}
          tabIndex={current === t.key ? 0 : -1}
          onClick={() => onChange(t.key)}
          onKeyDown={(e) => {
            const d = e.key === 'ArrowRight' ? 1 : e.key === 'ArrowLeft' ? -1 : 0;
            if (!d) return;
            e.preventDefault();
            const next = tabs[(i + d + tabs.length) % tabs.length]!;
            onChange(next.key);
            document.getElementById(`${base}-${next.key}`)?.focus();
          }}
          className="-mb-px rounded-t-md border-b-2 border-transparent px-3 py-2 text-sm text-ink-300 hover:text-brass-200 aria-selected:border-brass-400 aria-selected:text-brass-200"
        >
          {t.label}
          {t.badge}
        </button>
      ))}
    </div>
  );
}

const STATUS_TEXT: Record<SaveStatus, string> = {
  saved: 'All changes saved',
  dirty: 'Unsaved changes…',
  saving: 'Saving…',
  conflict: 'Conflict: choose a version',
  error: 'Not saved',
};
const STATUS_CLASS: Record<SaveStatus, string> = {
  saved: 'border-ok-300/50 text-ok-300',
  dirty: 'border-ink-500 text-ink-300',
  saving: 'border-brass-500/60 text-brass-300',
  conflict: 'border-danger-300/60 text-danger-300',
  error: 'border-danger-300/60 text-danger-300',
};

export function SaveBadge({ status, version }: { status: SaveStatus; version: number }) {
  return (
    <span role="status" aria-live="polite" data-save-status={status} className={`inline-flex items-center gap-2 rounded-full border px-3 py-1 text-xs ${STATUS_CLASS[status]}`}>
      <span aria-hidden="true" className={`inline-block h-2 w-2 rounded-full bg-current ${status === 'saving' ? 'animate-pulse' : ''}`} />
      {STATUS_TEXT[status]} · v{version}
    </span>
  );
}

export function CopyButton({ text, label = 'Copy' }: { text: string; label?: string }) {
  const [done, setDone] = useState(false);
  useEffect(() => {
    if (!done) return;
    const t = setTimeout(() => setDone(false), 1500);
    return () => clearTimeout(t);
  }, [done]);
  return (
    <Button
      variant="secondary"
      className="px-2 py-1 text-xs"
      onClick={async () => {
        try {
          await navigator.clipboard.writeText(text);
          setDone(true);
        } catch {
          window.prompt('Copy this:', text);
        }
      }}
    >
      <span aria-live="polite">{done ? 'Copied' : label}</span>
    </Button>
  );
}

export function Section({ title, children, defaultOpen = false }: { title: string; children: ReactNode; defaultOpen?: boolean }) {
  return (
    <details open={defaultOpen} className="group rounded-md border border-ink-700 bg-ink-900">
      <summary className="cursor-pointer select-none rounded-md px-3 py-2 text-sm font-semibold text-ink-100 hover:text-brass-200">{title}</summary>
      <div className="flex flex-col gap-3 border-t border-ink-800 p-3">{children}</div>
    </details>
  );
}

export function NumberField({ label, value, onCommit, min, max, step = 'any', suffix, id: idProp }: { label: string; value: number | undefined; onCommit: (v: number | undefined) => void; min?: number; max?: number; step?: number | 'any'; suffix?: string; id?: string }) {
  const auto = useId();
  const id = idProp ?? auto;
  const [text, setText] = useState(value === undefined ? '' : String(value));
  const [err, setErr] = useState<string | null>(null);
  useEffect(() => setText(value === undefined ? '' : String(value)), [value]);
  const commit = () => {
    if (text.trim() === '') {
      setErr(null);
      onCommit(undefined);
      return;
    }
    const n = Number(text);
    if (!Number.isFinite(n)) return setErr('must be a number');
    if (min !== undefined && n < min) return setErr(`must be ≥ ${min}`);
    if (max !== undefined && n > max) return setErr(`must be ≤ ${max}`);
    setErr(null);
    if (n !== value) onCommit(n);
  };
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className={LABEL}>
        {label}
        {suffix ? <span className="text-ink-300"> ({suffix})</span> : null}
      </label>
      <input
        id={id}
        inputMode="decimal"
        className={INPUT}
        value={text}
        aria-invalid={err ? true : undefined}
        aria-describedby={err ? `${id}-err` : undefined}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => e.key === 'Enter' && commit()}
        min={min}
        max={max}
        step={step}
      />
      {err && (
        <p id={`${id}-err`} className="text-xs text-danger-300">
          {label}: {err}
        </p>
      )}
    </div>
  );
}
