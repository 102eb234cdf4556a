/**
 * The on-screen list of keys, opened with `?` (anywhere outside a text field) or its button. A native
 * modal <dialog>: focus moves in, Esc closes, focus returns. When several views are on the page (the
 * presenter's stage over the workspace), the most recently mounted one answers `?`.
 */
import { useEffect, useId, useRef } from 'react';
import { KEY_HELP, type KeyHelpRow } from './keys';

const stack: (() => void)[] = [];

export function isTypingTarget(t: EventTarget | null): boolean {
  const el = t as HTMLElement | null;
  if (!el || !el.tagName) return false;
  const tag = el.tagName;
  return tag === 'INPUT' || tag === 'TEXTAREA' || tag === 'SELECT' || el.isContentEditable;
}

if (typeof document !== 'undefined') {
  document.addEventListener('keydown', (e) => {
    if (e.key !== '?' || e.defaultPrevented || isTypingTarget(e.target) || e.ctrlKey || e.metaKey || e.altKey) return;
    const top = stack[stack.length - 1];
    if (!top) return;
    e.preventDefault();
    top();
  });
}

export function KeyHelp({ extra, buttonClassName }: { extra?: { group: string; rows: KeyHelpRow[] }; buttonClassName: string }) {
  const ref = useRef<HTMLDialogElement>(null);
  const hid = useId();
  useEffect(() => {
    const toggle = () => {
      const d = ref.current;
      if (!d) return;
      if (d.open) d.close();
      else d.showModal();
    };
    stack.push(toggle);
    return () => {
      const i = stack.lastIndexOf(toggle);
      if (i >= 0) stack.splice(i, 1);
    };
  }, []);
  const groups = extra ? [extra, ...KEY_HELP] : KEY_HELP;
  return (
    <>
      <button type="button" className={buttonClassName} onClick={() => ref.current?.showModal()} aria-haspopup="dialog" title="Keys (?)" data-testid="key-help-open">
        <span aria-hidden="true">?</span>
        <span className="sr-only">Keyboard keys</span>
      </button>
      <dialog
        ref={ref}
        aria-labelledby={hid}
        className="m-auto max-h-[90svh] w-[min(40rem,calc(100vw-2rem))] overflow-y-auto rounded-lg border border-slate-600 bg-slate-950 p-5 text-slate-100 shadow-2xl backdrop:bg-black/60"
        data-testid="key-help"
        onClick={(e) => {
          if (e.target === ref.current) ref.current?.close(); // a click on the backdrop closes
        }}
      >
        <div className="mb-3 flex items-start justify-between gap-4">
          <h2 id={hid} className="text-lg font-bold">
            Keys
          </h2>
          <button type="button" className="rounded border border-slate-600 px-2 py-0.5 text-sm hover:bg-slate-800" onClick={() => ref.current?.close()}>
            Close
          </button>
        </div>
        <p className="mb-3 text-xs text-slate-300">Click the sky (or move to it with Tab) first, then use these keys.</p>
        {groups.map((g) => (
          <section key={g.group} className="mb-3">
            <h3 className="mb-1 text-xs uppercase tracking-wide text-slate-400">{g.group}</h3>
            <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-4 gap-y-1 text-sm">
              {g.rows.map((r) => (
                <div key={r.does} className="contents">
                  <dt className="flex flex-wrap gap-1">
                    {r.keys.map((k) => (
                      <kbd key={k} className="rounded border border-slate-500 bg-slate-800 px-1.5 font-mono text-xs">
                        {k}
                      </kbd>
                    ))}
                  </dt>
                  <dd className="text-slate-200">{r.does}</dd>
                </div>
              ))}
            </dl>
          </section>
        ))}
      </dialog>
    </>
  );
}
