/**
 * The page frame of the sky pages (scene workspace, shared link): a slim title strip, the sky filling the
 * rest of the screen, and a drawer beside it (the editor, steps, review, share, history, night data) that
 * can be closed; whether it is open is remembered in this browser. On a phone the sky comes first, full
 * width, and the drawer's tabs follow it.
 */
import { useId, type ReactNode } from 'react';
import { usePref } from '../ui/persist';

export function SkyWorkspace({ strip, sky, drawer, drawerLabel, below }: { strip: ReactNode; sky: ReactNode; drawer: ReactNode; drawerLabel: string; below?: ReactNode }) {
  const [open, setOpen] = usePref<boolean>('drawer.open', true);
  const id = useId();
  return (
    <div className="flex flex-col lg:grid lg:h-[calc(100svh-3.5rem)] lg:grid-cols-[minmax(0,1fr)_auto] lg:grid-rows-[auto_minmax(0,1fr)]" data-testid="sky-workspace">
      <div className="order-2 flex flex-wrap items-center justify-between gap-x-3 gap-y-1 px-3 py-2 lg:col-span-2 lg:row-start-1 lg:py-1.5">
        <div className="min-w-0 flex-1">{strip}</div>
        <button
          type="button"
          className="hidden rounded-md border border-ink-500 px-3 py-1.5 text-sm text-ink-100 hover:border-brass-300 hover:text-brass-200 lg:inline-flex"
          aria-expanded={open}
          aria-controls={id}
          onClick={() => setOpen(!open)}
          data-testid="drawer-toggle"
        >
          {open ? 'Hide side panel' : `Show ${drawerLabel.toLowerCase()}`}
        </button>
      </div>
      <div className="order-1 min-w-0 lg:col-start-1 lg:row-start-2 lg:min-h-0 lg:px-2 lg:pb-1" data-testid="sky">
        {sky}
      </div>
      <aside
        id={id}
        aria-label={drawerLabel}
        className={`order-3 flex min-w-0 flex-col gap-3 px-3 pb-6 pt-2 lg:col-start-2 lg:row-start-2 lg:min-h-0 lg:w-[22rem] lg:overflow-y-auto lg:border-l lg:border-ink-800 lg:pb-3 2xl:w-[26rem] ${open ? '' : 'lg:hidden'}`}
        data-testid="drawer"
      >
        {drawer}
      </aside>
      {below}
    </div>
  );
}
