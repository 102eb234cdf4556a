/**
 * Review: comments anchored to a sky position (drawn as markers on the sphere) or to a step; replies;
 * resolve / reopen; filter open / resolved; deep links #comment-<id>.
 */
import { useEffect, useId, useMemo, useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPatch, apiPost, errorText } from '../../lib/client/api';
import type { Anchor, CommentOut } from '../../lib/contracts/comment';
import type { Step } from '../../lib/contracts/scene-doc';
import { describeAnchor, threads, timeAgo } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { Markdown } from '../briefing/Markdown';
import { INPUT, LABEL } from '../scenes/controls';
import { commentsKey, useComments, type ReviewAccess } from './comments';

export { commentsKey, useComments, type ReviewAccess } from './comments';

const GUEST_NAME_KEY = 'armilla.guestName';

export function Composer({ access, parentId, steps, anchor, onPick, onClearAnchor, onDone, label }: { access: ReviewAccess; parentId?: string; steps: Step[]; anchor?: Anchor | null; onPick?: () => void; onClearAnchor?: () => void; onDone?: () => void; label: string }) {
  const id = useId();
  const qc = useQueryClient();
  const [body, setBody] = useState('');
  const [stepId, setStepId] = useState('');
  const [name, setName] = useState(() => (typeof localStorage !== 'undefined' ? (localStorage.getItem(GUEST_NAME_KEY) ?? '') : ''));
  const post = useMutation({
    mutationFn: () => {
      const payload: Record<string, unknown> = { body };
      if (anchor && !parentId) payload.anchor = anchor;
      if (stepId && !parentId) payload.stepId = stepId;
      if (parentId) payload.parentId = parentId;
      if (access.kind === 'guest') {
        payload.authorName = name;
        try {
          localStorage.setItem(GUEST_NAME_KEY, name);
        } catch {
          /* private mode */
        }
        return apiPost(`/api/shared/${encodeURIComponent(access.token)}/comments`, payload);
      }
      return apiPost(`/api/scenes/${access.sceneId}/comments`, payload);
    },
    onSuccess: () => {
      setBody('');
      setStepId('');
      onClearAnchor?.();
      onDone?.();
      void qc.invalidateQueries({ queryKey: commentsKey(access) });
    },
  });
  return (
    <form
      className="flex flex-col gap-2"
      aria-label={label}
      onSubmit={(e) => {
        e.preventDefault();
        post.mutate();
      }}
    >
      {access.kind === 'guest' && (
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-name`} className={LABEL}>
            Your name (shown with your comment)
          </label>
          <input id={`${id}-name`} className={INPUT} value={name} maxLength={80} required onChange={(e) => setName(e.target.value)} autoComplete="name" />
        </div>
      )}
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-body`} className={LABEL}>
          {parentId ? 'Reply' : 'Comment'}
        </label>
        <textarea id={`${id}-body`} className={`${INPUT} min-h-16`} value={body} required maxLength={10_000} onChange={(e) => setBody(e.target.value)} />
      </div>
      {!parentId && (
        <div className="flex flex-col gap-2">
          <div className="flex flex-wrap items-center gap-2 text-xs">
            {anchor ? (
              <>
                <span className="rounded-full border border-brass-500/60 px-2 py-0.5 text-brass-200" data-testid="comment-anchor">
                  {'chart' in anchor ? 'On the chart' : 'On the sky'}: {describeAnchor(anchor)}
                </span>
                {onClearAnchor && (
                  <button type="button" className="text-ink-300 underline" onClick={onClearAnchor}>
                    clear
                  </button>
                )}
              </>
            ) : (
              onPick && (
                <Button variant="secondary" className="px-2 py-1 text-xs" onClick={onPick}>
                  Pick a point on the sky
                </Button>
              )
            )}
          </div>
          {steps.length > 0 && (
            <div className="flex flex-col gap-1">
              <label htmlFor={`${id}-step`} className="text-xs text-ink-300">
                About a step (optional)
              </label>
              <select id={`${id}-step`} className={INPUT} value={stepId} onChange={(e) => setStepId(e.target.value)}>
                <option value="">No step</option>
                {steps.map((s, i) => (
                  <option key={s.id} value={s.id}>
                    {i + 1}. {s.title || 'Untitled step'}
                  </option>
                ))}
              </select>
            </div>
          )}
        </div>
      )}
      {post.isError && <Alert tone="error">{errorText(post.error)}</Alert>}
      <div className="flex gap-2">
        <Button type="submit" busy={post.isPending} disabled={!body.trim() || (access.kind === 'guest' && !name.trim())}>
          {parentId ? 'Post reply' : 'Post comment'}
        </Button>
        {onDone && parentId && (
          <Button variant="ghost" onClick={onDone}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}

function CommentView({ c, steps }: { c: CommentOut; steps: Step[] }) {
  const stepIdx = c.stepId ? steps.findIndex((s) => s.id === c.stepId) : -1;
  return (
    <div className="flex flex-col gap-1">
      <p className="text-xs text-ink-300">
        <span className="font-medium text-ink-100">{c.author.name}</span>
        {c.author.guest ? ' (guest)' : ''} · <time dateTime={c.createdAt} title={new Date(c.createdAt).toLocaleString()}>{timeAgo(c.createdAt)}</time>
        {c.anchor ? ` · ${describeAnchor(c.anchor)}` : ''}
        {stepIdx >= 0 ? ` · step ${stepIdx + 1}` : ''}
      </p>
      <Markdown source={c.body} className="text-sm" />
    </div>
  );
}

export function ReviewPanel({ access, steps, anchor, onPick, onClearAnchor, onFocus, focusedId }: { access: ReviewAccess; steps: Step[]; anchor: Anchor | null; onPick: () => void; onClearAnchor: () => void; onFocus?: (c: CommentOut) => void; focusedId?: string | null }) {
  const qc = useQueryClient();
  const q = useComments(access);
  const [filter, setFilter] = useState<'open' | 'resolved' | 'all'>('open');
  const [replyTo, setReplyTo] = useState<string | null>(null);
  const [hash, setHash] = useState(() => (typeof location !== 'undefined' ? location.hash : ''));
  const canResolve = access.kind === 'member' && access.canResolve;
  const resolve = useMutation({
    mutationFn: ({ id, resolved }: { id: string; resolved: boolean }) => apiPatch(`/api/comments/${id}`, { resolved }),
    onSuccess: () => qc.invalidateQueries({ queryKey: commentsKey(access) }),
  });
  const all = useMemo(() => threads(q.data ?? []), [q.data]);
  const shown = all.filter((t) => (filter === 'all' ? true : filter === 'open' ? !t.root.resolved : t.root.resolved));
  const openCount = all.filter((t) => !t.root.resolved).length;

  useEffect(() => {
    const on = () => setHash(location.hash);
    window.addEventListener('hashchange', on);
    return () => window.removeEventListener('hashchange', on);
  }, []);
  // A deep link to a resolved comment switches the filter so the comment is visible, then scrolls to it.
  useEffect(() => {
    const m = /^#comment-(.+)$/.exec(hash);
    if (!m || !q.data) return;
    const target = q.data.find((c) => c.id === decodeURIComponent(m[1]!));
    if (!target) return;
    const root = target.parentId ? q.data.find((c) => c.id === target.parentId) ?? target : target;
    if (root.resolved && filter === 'open') setFilter('all');
    requestAnimationFrame(() => {
      const el = document.getElementById(`comment-${target.id}`);
      el?.scrollIntoView({ block: 'center' });
      el?.focus();
    });
    onFocus?.(root);
  }, [hash, q.data]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <div className="flex flex-col gap-4">
      {access.canComment ? (
        <div className="rounded border border-ink-700 p-3">
          <Composer access={access} steps={steps} anchor={anchor} onPick={onPick} onClearAnchor={onClearAnchor} label="New comment" />
        </div>
      ) : (
        <p className="text-sm text-ink-300">Your role can read comments, not post them.</p>
      )}
      <div className="flex items-center justify-between gap-2">
        <h3 className="text-sm font-semibold">
          Comments <span className="text-ink-300">({openCount} open)</span>
        </h3>
        <div role="radiogroup" aria-label="Show comments" className="flex gap-1 text-xs">
          {(['open', 'resolved', 'all'] as const).map((f) => (
            <button key={f} type="button" role="radio" aria-checked={filter === f} onClick={() => setFilter(f)} className="rounded-full border border-ink-700 px-2 py-0.5 aria-checked:border-brass-400 aria-checked:text-brass-200">
              {f[0]!.toUpperCase() + f.slice(1)}
            </button>
          ))}
        </div>
      </div>
      {q.isPending && <p className="text-sm text-ink-300">Loading comments…</p>}
      {q.isError && <Alert tone="error">{errorText(q.error)}</Alert>}
      {resolve.isError && <Alert tone="error">{errorText(resolve.error)}</Alert>}
      {q.data && shown.length === 0 && <p className="text-sm text-ink-300">No {filter === 'all' ? '' : filter} comments.</p>}
      <ul className="flex flex-col gap-3" aria-label="Comment threads">
        {shown.map(({ root, replies }) => (
          <li
            key={root.id}
            id={`comment-${root.id}`}
            tabIndex={-1}
            data-testid="comment"
            data-resolved={root.resolved}
            className={`flex flex-col gap-2 rounded border p-3 outline-none focus-visible:border-brass-300 ${focusedId === root.id || hash === `#comment-${root.id}` ? 'border-brass-400' : 'border-ink-700'} ${root.resolved ? 'opacity-75' : ''}`}
          >
            <CommentView c={root} steps={steps} />
            {replies.length > 0 && (
              <ul className="ml-3 flex flex-col gap-2 border-l border-ink-700 pl-3" aria-label="Replies">
                {replies.map((r) => (
                  <li key={r.id} id={`comment-${r.id}`} tabIndex={-1}>
                    <CommentView c={r} steps={steps} />
                  </li>
                ))}
              </ul>
            )}
            <div className="flex flex-wrap items-center gap-2 text-xs">
              {root.resolved && <span className="rounded-full border border-ok-300/50 px-2 py-0.5 text-ok-300">Resolved</span>}
              {root.anchor && onFocus && (
                <Button variant="ghost" className="px-2 py-1 text-xs" onClick={() => onFocus(root)}>
                  Show on the sky
                </Button>
              )}
              {access.canComment && (
                <Button variant="ghost" className="px-2 py-1 text-xs" onClick={() => setReplyTo(replyTo === root.id ? null : root.id)}>
                  Reply
                </Button>
              )}
              {canResolve && (
                <Button variant="secondary" className="px-2 py-1 text-xs" busy={resolve.isPending && resolve.variables?.id === root.id} onClick={() => resolve.mutate({ id: root.id, resolved: !root.resolved })}>
                  {root.resolved ? 'Reopen' : 'Resolve'}
                </Button>
              )}
              <a href={`#comment-${root.id}`} className="text-ink-300 underline hover:text-brass-200">
                Link
              </a>
            </div>
            {replyTo === root.id && <Composer access={access} parentId={root.id} steps={steps} onDone={() => setReplyTo(null)} label={`Reply to ${root.author.name}`} />}
          </li>
        ))}
      </ul>
    </div>
  );
}
