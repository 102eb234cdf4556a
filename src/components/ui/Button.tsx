import type { ComponentProps } from 'react';

const VARIANTS = {
  primary: 'bg-brass-400 text-ink-950 hover:bg-brass-300 disabled:bg-ink-700 disabled:text-ink-300',
  secondary: 'border border-ink-500 text-ink-100 hover:border-brass-300 hover:text-brass-200 disabled:text-ink-500',
  danger: 'border border-danger-300/60 text-danger-300 hover:bg-danger-600/20 disabled:text-ink-500',
  ghost: 'text-ink-300 hover:text-brass-200 disabled:text-ink-500',
} as const;

export type ButtonProps = ComponentProps<'button'> & { variant?: keyof typeof VARIANTS; busy?: boolean };

export function Button({ variant = 'primary', busy = false, className = '', children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${VARIANTS[variant]} ${className}`}
      {...rest}
    >
      {children}
    </button>
  );
}
