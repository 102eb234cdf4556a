/** "Import scene file (.json)": an armilla-scene file (from "Scene file (JSON)") → a new scene in the team. */
import { useId, useState } from 'react';
import { errorText, readError } from '../../lib/client/api';
import type { SceneOut } from '../../lib/contracts/scene';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { FileInput, Labelled } from './controls';
import { postFile, tooBigText, MAX_UPLOAD_BYTES } from './TargetsImport';

export function SceneFileImport({ teamId, teamName }: { teamId: string; teamName: string }) {
  const id = useId();
  const [file, setFile] = useState<File | null>(null);
  const [busy, setBusy] = useState(false);
  const [err, setErr] = useState<string | null>(null);
  const submit = async () => {
    if (!file) return setErr('file: choose a scene file (.json)');
    if (!teamId) return setErr('teamId: choose a team');
    if (file.size > MAX_UPLOAD_BYTES) return setErr(tooBigText(5));
    setBusy(true);
    setErr(null);
    try {
      const r = await postFile('/api/scenes/import', file, { teamId });
      if (r.status === 413) return setErr(tooBigText(5));
      if (!r.ok) return setErr(errorText(await readError(r)));
      const out = (await r.json()) as { scene: SceneOut };
      location.assign(`/scenes/${encodeURIComponent(out.scene.id)}`);
    } catch (e) {
      setErr(errorText(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <section aria-labelledby={`${id}-h`} className="mt-8 flex max-w-2xl flex-col gap-3 rounded-md border border-ink-700 bg-ink-900 p-4" data-testid="scene-file-import">
      <h2 id={`${id}-h`} className="text-lg font-semibold">
        Import scene file (.json)
      </h2>
      <p id={`${id}-help`} className="text-sm text-ink-300">
        A scene file saved with “Scene file (JSON)” from a scene’s Export &amp; print section becomes a new scene{teamName ? ` in ${teamName}` : ''}. Its comments and share links are not part of the file.
      </p>
      <Labelled id={`${id}-file`} label="Scene file">
        <FileInput
          id={`${id}-file`}
          accept=".json,application/json"
          aria-describedby={`${id}-help`}
          onFile={(f) => {
            setErr(null);
            setFile(f);
          }}
        />
      </Labelled>
      {err && <Alert tone="error">{err}</Alert>}
      <div>
        <Button variant="secondary" onClick={() => void submit()} disabled={!file} busy={busy}>
          Import scene file
        </Button>
      </div>
    </section>
  );
}
