/**
 * Presenter follow mode. The presenter's position lives in the database (presenter_state), not in
 * process memory, so followers connected to any app instance see the same step. Each stream polls
 * its row about every 500 ms and sends `event: step` when it changes.
 */
import { eq } from 'drizzle-orm';
import { writeTx, type DbOrTx } from './db/client';
import { presenterState, scenes } from './db/schema';
import { badRequest } from './http';
import type { PresenterOut } from '../contracts/presenter';

export type { PresenterOut };
import { docOf } from './scene-service';

type SceneRow = typeof scenes.$inferSelect;


export async function readPresenter(db: DbOrTx, sceneId: string): Promise<PresenterOut | null> {
  const rows = await db.select().from(presenterState).where(eq(presenterState.sceneId, sceneId)).limit(1);
  const r = rows[0];
  if (!r) return null;
  const scene = await db.select({ steps: scenes.steps }).from(scenes).where(eq(scenes.id, sceneId)).limit(1);
  const steps = (scene[0]?.steps as { id?: string }[] | undefined) ?? [];
  return { sceneId, stepIndex: r.stepIndex, stepId: steps[r.stepIndex]?.id ?? null, time: r.time, updatedAt: r.updatedAt.toISOString() };
}

export async function setPresenter(db: DbOrTx, userId: string, scene: SceneRow, stepIndex: number, time: string | null) {
  const steps = docOf(scene).steps;
  if (stepIndex > 0 && stepIndex >= steps.length) {
    throw badRequest(`stepIndex: the scene has ${steps.length} step(s); indexes start at 0`, 'stepIndex');
  }
  const at = new Date();
  await writeTx(db, (tx) =>
    tx
      .insert(presenterState)
      .values({ sceneId: scene.id, stepIndex, time, updatedBy: userId, updatedAt: at })
      .onConflictDoUpdate({ target: presenterState.sceneId, set: { stepIndex, time, updatedBy: userId, updatedAt: at } }),
  );
  return (await readPresenter(db, scene.id))!;
}

export const POLL_MS = 500;
export const HEARTBEAT_MS = 15_000;

/**
 * A server-sent-events response. `poll` returns the current state, `null` when there is none yet,
 * or `'gone'` when the stream must end (scene deleted, link revoked or expired).
 */
export function presenterStream(
  poll: () => Promise<PresenterOut | null | 'gone'>,
  signal: AbortSignal,
  opts: { pollMs?: number; heartbeatMs?: number } = {},
): Response {
  const enc = new TextEncoder();
  let timer: ReturnType<typeof setTimeout> | undefined;
  let closed = false;
  let last = '';
  let lastBeat = Date.now();

  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      const send = (s: string) => {
        if (!closed) controller.enqueue(enc.encode(s));
      };
      const close = () => {
        if (closed) return;
        closed = true;
        if (timer) clearTimeout(timer);
        try {
          controller.close();
        } catch {
          /* already closed by the client */
        }
      };
      signal.addEventListener('abort', close, { once: true });
      send(`retry: 2000\n: presenter stream\n\n`);
      const tick = async () => {
        if (closed) return;
        try {
          const state = await poll();
          if (state === 'gone') {
            send(`event: end\ndata: {}\n\n`);
            close();
            return;
          }
          const key = state ? `${state.stepIndex}|${state.time}|${state.updatedAt}` : '';
          if (state && key !== last) {
            last = key;
            send(`event: step\nid: ${Date.parse(state.updatedAt)}\ndata: ${JSON.stringify(state)}\n\n`);
          } else if (Date.now() - lastBeat >= (opts.heartbeatMs ?? HEARTBEAT_MS)) {
            lastBeat = Date.now();
            send(`: heartbeat\n\n`);
          }
        } catch (e) {
          console.error('[presenter] poll failed', e);
        }
        if (!closed) timer = setTimeout(tick, opts.pollMs ?? POLL_MS);
      };
      void tick();
    },
    cancel() {
      closed = true;
      if (timer) clearTimeout(timer);
    },
  });
  return new Response(stream, {
    status: 200,
    headers: {
      'content-type': 'text/event-stream; charset=utf-8',
      'cache-control': 'no-store, no-transform',
      connection: 'keep-alive',
      'x-accel-buffering': 'no',
    },
  });
}
