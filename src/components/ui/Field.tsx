import { useId, type ComponentProps, type ReactNode } from 'react';

const CONTROL =
  'w-full rounded-md border bg-ink-950 px-3 py-2 text-ink-100 placeholder:text-ink-500 focus-visible:border-brass-300 aria-[invalid=true]:border-danger-300';

interface FieldShell {
  label: string;
  error?: string | undefined;
  hint?: ReactNode;
}

function Shell({ id, label, error, hint, children }: FieldShell & { id: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink-100">
        {label}
      </label>
      {children}
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-ink-300">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="text-sm text-danger-300">
          {error}
        </p>
      )}
    </div>
  );
}

/** A labelled input; pass react-hook-form's register(...) spread (React 19 passes `ref` as a prop). */
export function TextField({ label, error, hint, id: idProp, className = '', ...input }: FieldShell & ComponentProps<'input'>) {
  const auto = useId();
  const id = idProp ?? auto;
  return (
    <Shell id={id} label={label} error={error} hint={hint}>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        className={`${CONTROL} border-ink-700 ${className}`}
        {...input}
      />
    </Shell>
  );
}

export function SelectField({ label, error, hint, id: idProp, className = '', children, ...select }: FieldShell & ComponentProps<'select'>) {
  const auto = useId();
  const id = idProp ?? auto;
  return (
    <Shell id={id} label={label} error={error} hint={hint}>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={`${CONTROL} border-ink-700 ${className}`}
        {...select}
      >
        {children}
      </select>
    </Shell>
  );
}
