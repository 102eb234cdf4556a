/** Shown on a 409: keep mine, take theirs, or compare the changed fields side by side. */
import { useState } from 'react';
import type { SceneOut } from '../../lib/contracts/scene';
import { diffScenes, FIELD_LABELS, lineDiff, stableStringify } from '../../lib/client/scene-diff';
import { Button } from '../ui/Button';

function Side({ lines, title }: { lines: { text: string; changed: boolean }[]; title: string }) {
  return (
    <div className="min-w-0 flex-1">
      <p className="mb-1 text-xs font-semibold uppercase tracking-wider text-ink-300">{title}</p>
      <pre className="max-h-64 overflow-auto rounded bg-ink-950 p-2 text-xs leading-5">
        {lines.map((l, i) => (
          <div key={i} className={l.changed ? 'bg-brass-500/25 text-brass-200' : 'text-ink-300'}>
            {l.changed ? '▍' : ' '}
            {l.text}
          </div>
        ))}
      </pre>
    </div>
  );
}

export function ConflictDialog({ mine, theirs, dirty, onKeepMine, onTakeTheirs, busy }: { mine: SceneOut; theirs: SceneOut; dirty: string[]; onKeepMine: () => void; onTakeTheirs: () => void; busy?: boolean }) {
  const [compare, setCompare] = useState(false);
  const diffs = diffScenes(mine, theirs);
  return (
    <section role="alertdialog" aria-labelledby="conflict-title" aria-describedby="conflict-desc" className="flex flex-col gap-3 rounded-lg border border-danger-300/60 bg-danger-600/15 p-4" data-testid="conflict">
      <h2 id="conflict-title" className="text-base font-semibold text-danger-300">
        This scene was changed elsewhere (now v{theirs.version})
      </h2>
      <p id="conflict-desc" className="text-sm">
        Your unsaved changes ({dirty.map((f) => FIELD_LABELS[f as keyof typeof FIELD_LABELS] ?? f).join(', ') || 'none'}) are kept here until you choose. Keep mine saves
        your changed fields on top of their version; take theirs drops your changes.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button onClick={onKeepMine} busy={busy}>
          Keep mine
        </Button>
        <Button variant="secondary" onClick={onTakeTheirs} disabled={busy}>
          Take theirs
        </Button>
        <Button variant="ghost" aria-expanded={compare} onClick={() => setCompare(!compare)}>
          {compare ? 'Hide comparison' : 'Compare'}
        </Button>
      </div>
      {compare && (
        <div className="flex flex-col gap-4">
          {diffs.length === 0 && <p className="text-sm">No field differs.</p>}
          {diffs.map((d) => {
            const ld = lineDiff(stableStringify(d.mine, 2), stableStringify(d.theirs, 2));
            return (
              <div key={d.field}>
                <h3 className="mb-1 text-sm font-semibold">{FIELD_LABELS[d.field]}</h3>
                <div className="flex flex-col gap-2 md:flex-row">
                  <Side title="Mine" lines={ld.left} />
                  <Side title="Theirs" lines={ld.right} />
                </div>
              </div>
            );
          })}
        </div>
      )}
    </section>
  );
}
