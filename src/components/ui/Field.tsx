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

/** The id of a field's control (its own, or a fresh one) and the ARIA that ties the control to its error and hint. */
function useControl(idProp: string | undefined, error: string | undefined, hint?: ReactNode) {
  const auto = useId();
  const id = idProp ?? auto;
  return { id, 'aria-invalid': error ? true : undefined, 'aria-describedby': error ? `${id}-error` : hint ? `${id}-hint` : undefined };
}

/** A labelled input; pass react-hook-form's register(...) spread (React 19 passes `ref` as a prop). */
export function TextField({ label, error, hint, id: idProp, className = '', ...input }: FieldShell & ComponentProps<'input'>) {
  const control = useControl(idProp, error, hint);
  return (
    <Shell id={control.id} label={label} error={error} hint={hint}>
      <input {...control} className={`${CONTROL} border-ink-700 ${className}`} {...input} />
    </Shell>
  );
}

/** A labelled select (its hint, if any, is not announced with it: only an error is). */
export function SelectField({ label, error, hint, id: idProp, className = '', children, ...select }: FieldShell & ComponentProps<'select'>) {
  const control = useControl(idProp, error);
  return (
    <Shell id={control.id} label={label} error={error} hint={hint}>
      <select {...control} className={`${CONTROL} border-ink-700 ${className}`} {...select}>
        {children}
      </select>
    </Shell>
  );
}
