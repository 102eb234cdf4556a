import { nanoid } from 'nanoid';
import type { Tx } from './db/client';
import { auditLog } from './db/schema';

export interface AuditEntry {
  teamId?: string | null;
  userId?: string | null;
  /** Dotted verb, e.g. `scene.update`, `member.role`, `link.create`. */
  action: string;
  subjectType?: string;
  subjectId?: string;
  detail?: Record<string, unknown>;
}

/** Appends one line to the activity log; call it inside the same transaction as the change. */
export async function audit(db: Tx, e: AuditEntry): Promise<void> {
  await db.insert(auditLog).values({
    id: nanoid(),
    at: new Date(),
    teamId: e.teamId ?? null,
    userId: e.userId ?? null,
    action: e.action,
    subjectType: e.subjectType ?? null,
    subjectId: e.subjectId ?? null,
    detail: e.detail ?? null,
  });
}
