/**
 * Target-list import into a scene: parse and validate everything first, then one versioned scene update
 * (all or nothing). A concurrent edit between the read and the write is retried on the fresh scene.
 */
import { nanoid } from 'nanoid';
import type { User } from 'lucia';
import type { DbOrTx } from '../db/client';
import { HttpError } from '../http';
import { MAX_TARGETS } from '../../contracts/scene';
import { docOf, sceneFor, sceneRow, updateScene } from '../scene-service';
import type { Target } from '../../contracts/scene-doc';
import { FileError } from '../../imports/csv';
import { parseTargetCsv, type TargetCsvResult } from '../../imports/targets-csv';
import { fileErrorResponse, rowErrors } from '../upload';

function parseOrThrow(bytes: Uint8Array, existing: Target[]): TargetCsvResult {
  try {
    return parseTargetCsv(bytes, { existingNames: existing.map((t) => t.name), maxRows: Math.max(0, MAX_TARGETS - existing.length) });
  } catch (e) {
    if (e instanceof FileError) throw fileErrorResponse(e);
    throw e;
  }
}

/** Parses against the scene's current targets; writes nothing. Caller has checked the role. */
export async function previewTargets(db: DbOrTx, user: User, sceneId: string, bytes: Uint8Array) {
  const { row } = await sceneFor(db, user, sceneId, 'scene.write');
  const r = parseOrThrow(bytes, docOf(row).targets);
  return {
    rows: r.rows.map((x) => ({ line: x.line, name: x.name, ra: x.ra, dec: x.dec, errors: x.errors.map((e) => ({ field: e.field ?? null, message: e.message })) })),
    valid: r.errors.length === 0,
    errorCount: r.errors.length,
    ignoredColumns: r.ignoredColumns,
  };
}

export async function importTargets(db: DbOrTx, user: User, sceneId: string, bytes: Uint8Array) {
  await sceneFor(db, user, sceneId, 'scene.write');
  for (let attempt = 0; ; attempt++) {
    const row = (await sceneRow(db, sceneId))!;
    const existing = docOf(row).targets;
    const r = parseOrThrow(bytes, existing);
    if (r.errors.length) throw rowErrors(r.errors);
    const added: Target[] = r.rows.map((x) => ({ id: `t-${nanoid(12)}`, kind: 'custom' as const, ...x.target! }));
    try {
      const scene = await updateScene(db, user.id, sceneId, { version: row.version, targets: [...existing, ...added] }, 'scene.import-targets');
      return { added: added.length, version: scene.version, ignoredColumns: r.ignoredColumns, targets: added };
    } catch (e) {
      if (e instanceof HttpError && e.status === 409 && attempt < 3) continue;
      throw e;
    }
  }
}
