import type { ReactNode } from 'react';

export function Card({ title, children, actions, className = '' }: { title?: string; children: ReactNode; actions?: ReactNode; className?: string }) {
  return (
    <section className={`rounded-lg border border-ink-700 bg-ink-900 p-5 ${className}`}>
      {(title || actions) && (
        <div className="mb-4 flex flex-wrap items-center justify-between gap-2">
          {title && <h2 className="text-lg font-semibold text-ink-100">{title}</h2>}
          {actions}
        </div>
      )}
      {children}
    </section>
  );
}

export function Badge({ children }: { children: ReactNode }) {
  return <span className="inline-block rounded-full border border-brass-500/60 px-2 py-0.5 text-xs font-medium text-brass-300">{children}</span>;
}
