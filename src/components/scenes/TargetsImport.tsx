/**
 * Target-list import (editors+): choose a CSV, see every row checked by the server (nothing written), then
 * import all rows in one go. The import is all or nothing, so the button stays off while any row is bad.
 */
import { useId, useRef, useState } from 'react';
import { errorText, readError, request } from '../../lib/client/api';
import { formatDecDms, formatRaHms } from '../../lib/imports/angles';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { FileInput, LABEL } from './controls';

export const MAX_UPLOAD_BYTES = 5 * 1024 * 1024;

interface PreviewRow {
  line: number;
  name: string;
  ra: number | null;
  dec: number | null;
  errors: { field: string | null; message: string }[];
}
interface Preview {
  rows: PreviewRow[];
  valid: boolean;
  errorCount?: number;
  ignoredColumns?: string[];
}
type RowErr = { line: number; field?: string | null; message: string };

/** Posts one file as multipart (field `file`), plus text fields. */
export function postFile(path: string, file: File, fields: Record<string, string> = {}): Promise<Response> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append('file', file, file.name);
  return request(path, { method: 'POST', body: form });
}

export function tooBigText(limitMb: number) {
  return `The file is larger than ${limitMb} MB, the most an import accepts. Split the list into smaller files.`;
}

const isDuplicate = (r: PreviewRow) => r.errors.some((e) => /duplicate|already in the scene/i.test(e.message));

export function TargetsImport({ sceneId, beforeImport, onImported }: { sceneId: string; beforeImport?: () => Promise<void>; onImported: (added: number) => Promise<void> | void }) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<Preview | null>(null);
  const [busy, setBusy] = useState<'preview' | 'import' | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [rowErrors, setRowErrors] = useState<RowErr[]>([]);
  const [done, setDone] = useState<string | null>(null);

  const reset = () => {
    setFile(null);
    setPreview(null);
    setError(null);
    setRowErrors([]);
    if (input.current) input.current.value = '';
  };

  /**
   * Sends the file to `route` (preview or import) after saving pending edits. Returns the parsed body,
   * or null after showing the error (413, row errors, anything else).
   */
  const send = async <T,>(route: 'preview' | 'import', f: File): Promise<T | null> => {
    await beforeImport?.();
    const r = await postFile(`/api/scenes/${encodeURIComponent(sceneId)}/targets/${route}`, f);
    if (r.status === 413) {
      setError(tooBigText(5));
      return null;
    }
    if (!r.ok) {
      const e = await readError(r);
      setError(errorText(e));
      setRowErrors(((e.body as { rows?: RowErr[] })?.rows ?? []) as RowErr[]);
      return null;
    }
    return (await r.json()) as T;
  };

  /** Runs one step with the busy state set and any thrown error shown. */
  const withBusy = async (what: 'preview' | 'import', fn: () => Promise<void>) => {
    setBusy(what);
    try {
      await fn();
    } catch (e) {
      setError(errorText(e));
    } finally {
      setBusy(null);
    }
  };

  const check = async (f: File) => {
    setFile(f);
    setPreview(null);
    setError(null);
    setRowErrors([]);
    setDone(null);
    if (f.size > MAX_UPLOAD_BYTES) return setError(tooBigText(5));
    await withBusy('preview', async () => {
      const p = await send<Preview>('preview', f);
      if (!p) return;
      setPreview(p);
      requestAnimationFrame(() => heading.current?.focus());
    });
  };

  const doImport = async () => {
    if (!file || !preview?.valid) return;
    setError(null);
    setRowErrors([]);
    await withBusy('import', async () => {
      const out = await send<{ added: number }>('import', file);
      if (!out) return;
      await onImported(out.added);
      reset();
      setDone(`Imported ${out.added} target${out.added === 1 ? '' : 's'}.`);
    });
  };

  const good = preview ? preview.rows.filter((r) => r.errors.length === 0).length : 0;
  const bad = preview ? preview.rows.length - good : 0;
  const n = preview?.rows.length ?? 0;

  return (
    <fieldset className="flex flex-col gap-2 rounded border border-ink-800 p-2" data-testid="targets-import">
      <legend className="px-1 text-sm font-medium">Import a target list (CSV)</legend>
      <div id={`${id}-help`} className="flex flex-col gap-1 text-xs text-ink-300">
        <p>
          A UTF-8 CSV file up to 5 MB with a header line. Columns: <code>name</code>, <code>ra</code>, <code>dec</code>; optional <code>epoch</code> (e.g. 2000 or J2000),{' '}
          <code>pmra</code>, <code>pmdec</code> (mas/yr), <code>notes</code>. Positions are ICRS/J2000.
        </p>
        <p>
          RA in degrees or hours-minutes-seconds: <code>213.915</code>, <code>14 15 39.7</code>, <code>14:15:39.7</code> or <code>14h15m39.7s</code>. Dec in degrees or ± degrees-minutes-seconds:{' '}
          <code>+19.18</code>, <code>+19 10 57</code>, <code>-05:30:00</code>.
        </p>
        <p>Nothing is added until you press Import; the whole file goes in, or none of it.</p>
      </div>
      <label htmlFor={`${id}-file`} className={LABEL}>
        Target list file
      </label>
      <FileInput ref={input} id={`${id}-file`} accept=".csv,text/csv" aria-describedby={`${id}-help`} onFile={(f) => f && void check(f)} />
      {busy === 'preview' && (
        <p role="status" className="text-xs text-ink-300">
          Checking the file…
        </p>
      )}
      {error && (
        <Alert tone="error">
          <p>{error}</p>
          {rowErrors.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-xs" aria-label="Rows that did not validate">
              {rowErrors.map((r, i) => (
                <li key={i}>
                  Line {r.line}
                  {r.field && !r.message.startsWith(r.field) ? ` (${r.field})` : ''}: {r.message}
                </li>
              ))}
            </ul>
          )}
        </Alert>
      )}
      {done && <Alert tone="success">{done}</Alert>}
      {preview && (
        <div className="flex flex-col gap-2">
          <h4 ref={heading} tabIndex={-1} className="text-sm font-semibold focus-visible:outline-2 focus-visible:outline-brass-300">
            Preview of {file?.name ?? 'the file'}: {good} ready, {bad} with errors
          </h4>
          {(preview.ignoredColumns?.length ?? 0) > 0 && <p className="text-xs text-ink-300">Columns ignored: {preview.ignoredColumns!.join(', ')}</p>}
          <div className="max-h-72 overflow-auto rounded border border-ink-700">
            <table className="w-full text-left text-xs" data-testid="targets-preview">
              <caption className="sr-only">Rows of the target list, as they would be imported</caption>
              <thead className="sticky top-0 bg-ink-850">
                <tr>
                  <th scope="col" className="px-2 py-1">Line</th>
                  <th scope="col" className="px-2 py-1">Name</th>
                  <th scope="col" className="px-2 py-1">RA</th>
                  <th scope="col" className="px-2 py-1">Dec</th>
                  <th scope="col" className="px-2 py-1">Check</th>
                </tr>
              </thead>
              <tbody>
                {preview.rows.map((r) => {
                  const ok = r.errors.length === 0;
                  return (
                    <tr key={r.line} data-row-ok={ok} className={ok ? 'border-t border-ink-800' : 'border-t border-danger-300/40 bg-danger-600/15'}>
                      <td className="px-2 py-1 tabular-nums">{r.line}</td>
                      <td className="px-2 py-1">
                        {r.name || <span className="text-ink-500">(empty)</span>}
                        {isDuplicate(r) && <span className="ml-1 rounded border border-danger-300/60 px-1 text-[10px] uppercase text-danger-300">duplicate</span>}
                      </td>
                      <td className="px-2 py-1 tabular-nums">{r.ra === null ? '—' : formatRaHms(r.ra, 1)}</td>
                      <td className="px-2 py-1 tabular-nums">{r.dec === null ? '—' : formatDecDms(r.dec, 0)}</td>
                      <td className={`px-2 py-1 ${ok ? 'text-ok-300' : 'text-danger-300'}`}>
                        {ok ? (
                          'OK'
                        ) : (
                          <ul>
                            {r.errors.map((e, i) => (
                              <li key={i}>
                                <span className="sr-only">Error: </span>
                                {e.field && !e.message.startsWith(e.field) ? `${e.field}: ` : ''}
                                {e.message}
                              </li>
                            ))}
                          </ul>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          {!preview.valid && (
            <p id={`${id}-why`} className="text-xs text-danger-300">
              Fix the {bad === 1 ? 'row' : `${bad} rows`} marked in red and choose the file again; nothing is imported while any row is bad.
            </p>
          )}
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => void doImport()} disabled={!preview.valid || n === 0} busy={busy === 'import'} aria-describedby={!preview.valid ? `${id}-why` : undefined}>
              Import {n} target{n === 1 ? '' : 's'}
            </Button>
            <Button variant="ghost" onClick={reset}>
              Cancel
            </Button>
          </div>
        </div>
      )}
    </fieldset>
  );
}
