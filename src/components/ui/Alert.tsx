import type { ReactNode } from 'react';

const TONES = {
  error: 'border-danger-300/60 bg-danger-600/15 text-danger-300',
  info: 'border-ink-500 bg-ink-850 text-ink-100',
  success: 'border-ok-300/50 bg-ok-300/10 text-ok-300',
} as const;

/** Errors interrupt screen readers (role=alert); info and success are announced politely. */
export function Alert({ tone = 'info', children }: { tone?: keyof typeof TONES; children: ReactNode }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-md border px-3 py-2 text-sm ${TONES[tone]}`}>
      {children}
    </div>
  );
}
