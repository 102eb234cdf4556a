/**
 * Horizon-mask import (editors+): choose a CSV `azimuth,elevation`, say which azimuth convention it uses,
 * see the skyline drawn from the file (read here with the server's own parser) and confirm. A team envelope
 * is replaced on the server; an inline envelope takes the mask as a scene edit.
 */
import { useId, useRef, useState } from 'react';
import { errorText, readError } from '../../lib/client/api';
import { FileError, type RowError } from '../../lib/imports/csv';
import { HORIZON_CONVENTIONS, parseHorizonCsv, type HorizonConvention } from '../../lib/imports/horizon-csv';
import { AZIMUTH_TICKS, elevationRange, skylinePath, type MaskPoint } from '../../lib/client/skyline';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { FileInput, INPUT, LABEL, Labelled } from './controls';
import { postFile } from './TargetsImport';

const MAX_HORIZON_BYTES = 1024 * 1024;

const CONVENTION_LABEL: Record<HorizonConvention, string> = {
  'north-east': 'From north through east, 0–360° (default)',
  south: 'From south through west, 0–360°',
  signed: 'From north, −180…180°, east positive',
};

/** The skyline as an SVG profile: azimuth 0–360° across, elevation up, the obstructed part filled. */
export function SkylineProfile({ mask, title }: { mask: readonly MaskPoint[]; title: string }) {
  const W = 360;
  const H = 120;
  const [elMin, elMax] = elevationRange(mask);
  const sk = skylinePath(mask, { width: W, height: H, elMin, elMax });
  const y = (el: number) => H - ((el - elMin) / (elMax - elMin)) * H;
  const gridEls: number[] = [];
  for (let e = elMin; e <= elMax; e += elMax - elMin > 60 ? 20 : 10) gridEls.push(e);
  const titleId = useId();
  return (
    <svg viewBox={`-28 -8 ${W + 36} ${H + 26}`} role="img" aria-labelledby={titleId} className="w-full rounded border border-ink-700 bg-ink-950" data-testid="skyline">
      <title id={titleId}>{title}</title>
      {gridEls.map((e) => (
        <g key={e}>
          <line x1={0} x2={W} y1={y(e)} y2={y(e)} stroke="currentColor" className={e === 0 ? 'text-ink-300' : 'text-ink-800'} strokeWidth={e === 0 ? 0.8 : 0.5} />
          <text x={-4} y={y(e) + 3} textAnchor="end" fontSize={8} fill="currentColor" className="text-ink-300">
            {e}°
          </text>
        </g>
      ))}
      {AZIMUTH_TICKS.map((t) => (
        <g key={t.az}>
          <line x1={(t.az / 360) * W} x2={(t.az / 360) * W} y1={H} y2={H + 4} stroke="currentColor" className="text-ink-300" strokeWidth={0.6} />
          <text x={(t.az / 360) * W} y={H + 13} textAnchor="middle" fontSize={t.label.length === 1 ? 9 : 7} fontWeight={t.label.length === 1 ? 700 : 400} fill="currentColor" className="text-ink-300">
            {t.label}
          </text>
        </g>
      ))}
      {sk.fill && <path d={sk.fill} className="fill-brass-500/35" data-testid="skyline-fill" />}
      {sk.line && <path d={sk.line} fill="none" stroke="currentColor" strokeWidth={1.2} className="text-brass-300" data-testid="skyline-line" />}
    </svg>
  );
}

type Parsed = { mask: [number, number][]; errors: RowError[] } | { fileError: string };

export function HorizonImport({
  envelopeId,
  currentMask,
  onApplyInline,
  onDone,
}: {
  /** A team envelope: the mask is replaced on the server. Null: an inline envelope (`onApplyInline`). */
  envelopeId: string | null;
  currentMask: readonly MaskPoint[] | null;
  onApplyInline?: (mask: [number, number][]) => void;
  onDone?: (points: number) => Promise<void> | void;
}) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [open, setOpen] = useState(false);
  const [file, setFile] = useState<File | null>(null);
  const [bytes, setBytes] = useState<Uint8Array | null>(null);
  const [convention, setConvention] = useState<HorizonConvention>('north-east');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  let parsed: Parsed | null = null;
  if (bytes) {
    try {
      parsed = parseHorizonCsv(bytes, convention);
    } catch (e) {
      parsed = { fileError: e instanceof FileError ? e.message : errorText(e) };
    }
  }
  const ready = parsed && !('fileError' in parsed) && parsed.errors.length === 0 && parsed.mask.length > 0 ? parsed.mask : null;

  const reset = () => {
    setFile(null);
    setBytes(null);
    setError(null);
    if (input.current) input.current.value = '';
  };

  const choose = async (f: File) => {
    setDone(null);
    setError(null);
    setFile(f);
    setBytes(null);
    if (f.size > MAX_HORIZON_BYTES) return setError('The file is larger than 1 MB, the most a horizon-mask import accepts.');
    setBytes(new Uint8Array(await f.arrayBuffer()));
  };

  const confirm = async () => {
    if (!ready || !file) return;
    setError(null);
    if (!envelopeId) {
      onApplyInline?.(ready);
      reset();
      setOpen(false);
      setDone(`Horizon mask set: ${ready.length} points (saved with the scene).`);
      return;
    }
    setBusy(true);
    try {
      const r = await postFile(`/api/envelopes/${encodeURIComponent(envelopeId)}/horizon`, file, { convention });
      if (r.status === 413) return setError('The file is larger than 1 MB, the most a horizon-mask import accepts.');
      if (!r.ok) {
        const e = await readError(r);
        const rows = ((e.body as { rows?: RowError[] })?.rows ?? []).map((x) => `line ${x.line}: ${x.message}`);
        return setError([errorText(e), ...rows.slice(0, 5)].join(' · '));
      }
      const out = (await r.json()) as { points: number };
      await onDone?.(out.points);
      reset();
      setOpen(false);
      setDone(`Horizon mask replaced: ${out.points} points.`);
    } catch (e) {
      setError(errorText(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="flex flex-col gap-2" data-testid="horizon-import">
      {currentMask && currentMask.length > 0 && !ready && <SkylineProfile mask={currentMask} title={`Current horizon mask, ${currentMask.length} points`} />}
      {!open ? (
        <div>
          <Button variant="secondary" onClick={() => setOpen(true)}>
            Import horizon mask…
          </Button>
          {done && (
            <div className="mt-2">
              <Alert tone="success">{done}</Alert>
            </div>
          )}
        </div>
      ) : (
        <fieldset className="flex flex-col gap-2 rounded border border-ink-800 p-2">
          <legend className="px-1 text-sm font-medium">Import horizon mask (CSV)</legend>
          <p id={`${id}-help`} className="text-xs text-ink-300">
            One line per point, <code>azimuth,elevation</code> in degrees (a header line is optional). Elevation is the apparent altitude of the skyline. Between points the mask is
            interpolated linearly and wraps at 360°. {envelopeId ? 'Importing replaces the envelope’s whole mask, in every scene that uses it.' : 'The mask becomes part of this scene’s inline envelope.'}
          </p>
          <Labelled id={`${id}-conv`} label="Azimuth in the file is measured">
            <select id={`${id}-conv`} className={INPUT} value={convention} onChange={(e) => setConvention(e.target.value as HorizonConvention)}>
              {HORIZON_CONVENTIONS.map((c) => (
                <option key={c} value={c}>
                  {CONVENTION_LABEL[c]}
                </option>
              ))}
            </select>
          </Labelled>
          <label htmlFor={`${id}-file`} className={LABEL}>
            Horizon mask file
          </label>
          <FileInput ref={input} id={`${id}-file`} accept=".csv,text/csv,text/plain" aria-describedby={`${id}-help`} onFile={(f) => f && void choose(f)} />
          {parsed && 'fileError' in parsed && <Alert tone="error">{parsed.fileError}</Alert>}
          {parsed && !('fileError' in parsed) && parsed.errors.length > 0 && (
            <Alert tone="error">
              <p>
                {new Set(parsed.errors.map((e) => e.line)).size} line(s) did not validate; fix them and choose the file again.
              </p>
              <ul className="mt-1 list-disc pl-5 text-xs">
                {parsed.errors.slice(0, 20).map((e, i) => (
                  <li key={i}>
                    Line {e.line}: {e.message}
                  </li>
                ))}
              </ul>
            </Alert>
          )}
          {ready && (
            <div className="flex flex-col gap-1">
              <p className="text-xs text-ink-300" role="status">
                {ready.length} points read, azimuth converted to north through east. Check the skyline before confirming.
              </p>
              <SkylineProfile mask={ready} title={`Skyline from ${file?.name ?? 'the file'}: ${ready.length} points, elevation against azimuth from north through east`} />
            </div>
          )}
          {error && <Alert tone="error">{error}</Alert>}
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => void confirm()} disabled={!ready} busy={busy}>
              {ready ? `Replace mask with ${ready.length} points` : 'Replace mask'}
            </Button>
            <Button
              variant="ghost"
              onClick={() => {
                reset();
                setOpen(false);
              }}
            >
              Cancel
            </Button>
          </div>
        </fieldset>
      )}
    </div>
  );
}
