/**
 * The page frame of the sky pages (scene workspace, shared link): a slim title strip, the sky filling the
 * rest of the screen, a drawer beside it (the editor, steps, review, share, history) that can be closed,
 * and an optional bottom sheet under the sky for wide content (the night charts) that opens from the
 * strip. Open/closed is remembered in this browser. On a phone the sky comes first, full width, then the
 * strip, the sheet and the drawer's tabs.
 */
import { useId, type ReactNode } from 'react';
import { usePref } from '../ui/persist';

const TOGGLE = 'rounded-md border border-ink-500 px-3 py-1.5 text-sm text-ink-100 hover:border-brass-300 hover:text-brass-200 aria-expanded:border-brass-400';

export function SkyWorkspace({ strip, sky, drawer, drawerLabel, sheet }: { strip: ReactNode; sky: ReactNode; drawer: ReactNode; drawerLabel: string; sheet?: { label: string; content: ReactNode } }) {
  const [open, setOpen] = usePref<boolean>('drawer.open', true);
  const [sheetOpen, setSheetOpen] = usePref<boolean>('sheet.open', false);
  const id = useId();
  return (
    <div
      className="flex flex-col lg:grid lg:h-[calc(100svh-3.5rem)] lg:grid-cols-[minmax(0,1fr)_auto] lg:grid-rows-[auto_minmax(0,1fr)_auto]"
      data-testid="sky-workspace"
    >
      <div className="order-2 flex flex-wrap items-center justify-between gap-x-3 gap-y-1 px-3 py-2 lg:col-span-2 lg:row-start-1 lg:py-1.5">
        <div className="min-w-0 flex-1">{strip}</div>
        <div className="flex gap-2">
          {sheet && (
            <button type="button" className={TOGGLE} aria-expanded={sheetOpen} aria-controls={`${id}-sheet`} onClick={() => setSheetOpen(!sheetOpen)} data-testid="sheet-toggle">
              {sheet.label} <span aria-hidden="true">{sheetOpen ? '▾' : '▴'}</span>
            </button>
          )}
          <button type="button" className={`hidden lg:inline-flex ${TOGGLE}`} aria-expanded={open} aria-controls={id} onClick={() => setOpen(!open)} data-testid="drawer-toggle">
            {open ? 'Hide side panel' : `Show ${drawerLabel.toLowerCase()}`}
          </button>
        </div>
      </div>
      <div className="order-1 min-w-0 lg:col-start-1 lg:row-start-2 lg:min-h-0 lg:px-2 lg:pb-1" data-testid="sky">
        {sky}
      </div>
      {sheet && sheetOpen && (
        <section
          id={`${id}-sheet`}
          aria-label={sheet.label}
          className="order-3 min-w-0 border-ink-800 lg:col-start-1 lg:row-start-3 lg:h-[42svh] lg:overflow-y-auto lg:border-t"
          data-testid="sheet"
        >
          {sheet.content}
        </section>
      )}
      <aside
        id={id}
        aria-label={drawerLabel}
        className={`order-4 flex min-w-0 flex-col gap-3 px-3 pb-6 pt-2 lg:col-start-2 lg:row-span-2 lg:row-start-2 lg:min-h-0 lg:w-[22rem] lg:overflow-y-auto lg:border-l lg:border-ink-800 lg:pb-3 2xl:w-[26rem] ${open ? '' : 'lg:hidden'}`}
        data-testid="drawer"
      >
        {drawer}
      </aside>
    </div>
  );
}
