/**
 * Loading a scene for an export, either as a signed-in team member (viewer+) or through a live share link.
 */
import type { User } from 'lucia';
import type { DbOrTx } from '../db/client';
import { resolveToken } from '../links';
import type { SceneOut } from '../../contracts/scene';
import { publicScene, sceneFor, toSceneOut } from '../scene-service';
import { cataloguePosition } from '../../exports/sky-targets';
import type { VoTarget } from '../../exports/votable';

export async function sceneForMember(db: DbOrTx, user: User, id: string): Promise<SceneOut> {
  const { row } = await sceneFor(db, user, id, 'scene.read');
  return toSceneOut(db, row);
}

/** A share link's scene (account ids blanked). 404 for unknown, revoked or expired tokens. */
export async function sceneForToken(db: DbOrTx, token: string): Promise<SceneOut> {
  const { scene } = await resolveToken(db, token);
  const out = await toSceneOut(db, scene);
  return { ...publicScene(out), createdBy: null, updatedBy: null };
}

export function voTargets(scene: SceneOut): VoTarget[] {
  return scene.targets.map((t) => {
    const p = cataloguePosition(t);
    const notes = [t.kind === 'star' ? `HR ${t.hr} (Bright Star Catalogue, J2000)` : t.kind === 'body' ? `solar-system body (${t.body}): no fixed position` : '', t.notes ?? '']
      .filter(Boolean)
      .join('; ');
    return {
      name: t.name,
      kind: t.kind,
      ra: p?.ra ?? null,
      dec: p?.dec ?? null,
      epoch: t.kind === 'custom' ? (t.epoch ?? null) : null,
      pmra: t.kind === 'custom' ? (t.pmra ?? null) : null,
      pmdec: t.kind === 'custom' ? (t.pmdec ?? null) : null,
      notes,
    };
  });
}
