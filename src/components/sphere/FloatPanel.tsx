/**
 * A compact panel over (or, on a phone, under) the sky: a heading button that opens and closes it, its
 * state remembered in this browser. Closed panels keep their content in the page (hidden), so readouts
 * stay current and screen readers find the heading.
 */
import { useId, type ReactNode } from 'react';
import { usePref } from '../ui/persist';

export function FloatPanel({ id, title, children, defaultOpen = false }: { id: string; title: string; children: ReactNode; defaultOpen?: boolean }) {
  const [open, setOpen] = usePref<boolean>(`panel.${id}`, defaultOpen);
  const uid = useId();
  return (
    <section aria-labelledby={`${uid}-h`} className="pointer-events-auto rounded-md border border-slate-700 bg-slate-950/90 text-slate-100 shadow-lg" data-panel={id}>
      <h2 id={`${uid}-h`} className="text-sm font-bold">
        <button
          type="button"
          aria-expanded={open}
          aria-controls={`${uid}-b`}
          onClick={() => setOpen(!open)}
          className="flex w-full items-center justify-between gap-2 rounded-md px-3 py-1.5 text-left hover:bg-slate-800 focus-visible:outline focus-visible:outline-2 focus-visible:outline-sky-400"
          data-testid={`panel-${id}`}
        >
          <span>{title}</span>
          <span aria-hidden="true" className={`text-slate-400 transition-transform ${open ? 'rotate-90' : ''}`}>
            ›
          </span>
        </button>
      </h2>
      <div id={`${uid}-b`} hidden={!open} className="max-h-[min(60vh,32rem)] overflow-y-auto px-3 pb-3 pt-1">
        {children}
      </div>
    </section>
  );
}
