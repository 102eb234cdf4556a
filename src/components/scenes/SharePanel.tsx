/** Share links: create (viewer or reviewer, optional expiry), list with their state, copy, embed, revoke. */
import { keys, useLinks } from '../../lib/client/queries';
import { useId, useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiDelete, apiPost, errorText } from '../../lib/client/api';
import type { LinkRole } from '../../lib/contracts/roles';
import { inputUtcToIso, timeAgo } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';
import { CopyButton, INPUT, Labelled } from './controls';

export const embedSnippet = (origin: string, token: string, title: string) =>
  `<iframe src="${origin}/embed/${encodeURIComponent(token)}" title="${title.replace(/[&<>"']/g, '')}" width="800" height="500" style="border:0" allow="fullscreen" loading="lazy"></iframe>`;

const fmt = (iso: string | null) => (iso ? new Date(iso).toLocaleString() : '—');

export function SharePanel({ sceneId, title }: { sceneId: string; title: string }) {
  const id = useId();
  const qc = useQueryClient();
  const [role, setRole] = useState<LinkRole>('viewer');
  const [expires, setExpires] = useState('');
  const [fresh, setFresh] = useState<{ id: string; token: string; url: string; role: LinkRole } | null>(null);
  const links = useLinks(sceneId);
  const create = useMutation({
    mutationFn: async () => {
      const expiresAt = expires ? inputUtcToIso(expires) : null;
      if (expires && !expiresAt) throw new Error('expiresAt: enter a date and time');
      return apiPost<{ id: string; token: string; url: string }>(`/api/scenes/${sceneId}/links`, { role, ...(expiresAt ? { expiresAt } : {}) });
    },
    onSuccess: (r) => {
      setFresh({ ...r, role });
      void qc.invalidateQueries({ queryKey: keys.links(sceneId) });
    },
  });
  const revoke = useMutation({
    mutationFn: (linkId: string) => apiDelete(`/api/scenes/${sceneId}/links/${linkId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: keys.links(sceneId) }),
  });
  const origin = typeof location !== 'undefined' ? location.origin : '';
  return (
    <div className="flex flex-col gap-4">
      <form
        className="flex flex-col gap-2 rounded border border-ink-700 p-3"
        onSubmit={(e) => {
          e.preventDefault();
          create.mutate();
        }}
      >
        <h3 className="text-sm font-semibold">New link</h3>
        <div className="grid grid-cols-1 gap-2 sm:grid-cols-2">
          <Labelled id={`${id}-role`} label="Role">
            <select id={`${id}-role`} className={INPUT} value={role} onChange={(e) => setRole(e.target.value as LinkRole)}>
              <option value="viewer">Viewer: watch only</option>
              <option value="reviewer">Reviewer: watch and comment</option>
            </select>
          </Labelled>
          <Labelled id={`${id}-exp`} label="Expires (UTC, optional)">
            <input id={`${id}-exp`} type="datetime-local" className={INPUT} value={expires} onChange={(e) => setExpires(e.target.value)} />
          </Labelled>
        </div>
        {create.isError && <Alert tone="error">{errorText(create.error)}</Alert>}
        <Button type="submit" busy={create.isPending}>
          Create link
        </Button>
      </form>

      {fresh && (
        <div className="flex flex-col gap-2 rounded border border-ok-300/50 p-3" data-testid="new-link">
          <p className="text-sm">
            New {fresh.role} link. Copy it now: the token is shown only once.
          </p>
          <div className="flex items-center gap-2">
            <label htmlFor={`${id}-url`} className="sr-only">
              Link URL
            </label>
            <input id={`${id}-url`} readOnly className={`${INPUT} font-mono text-xs`} value={fresh.url} onFocus={(e) => e.target.select()} data-testid="new-link-url" />
            <CopyButton text={fresh.url} />
          </div>
          {fresh.role === 'viewer' && (
            <div className="flex flex-col gap-1">
              <label htmlFor={`${id}-embed`} className="text-xs text-ink-300">
                Embed snippet
              </label>
              <textarea id={`${id}-embed`} readOnly className={`${INPUT} h-20 font-mono text-xs`} value={embedSnippet(origin, fresh.token, title)} onFocus={(e) => e.target.select()} />
              <div>
                <CopyButton text={embedSnippet(origin, fresh.token, title)} label="Copy embed snippet" />
              </div>
            </div>
          )}
        </div>
      )}

      <div>
        <h3 className="mb-2 text-sm font-semibold">Links</h3>
        {links.isError && <Alert tone="error">{errorText(links.error)}</Alert>}
        {revoke.isError && <Alert tone="error">{errorText(revoke.error)}</Alert>}
        {links.data && links.data.links.length === 0 && <p className="text-sm text-ink-300">No links yet.</p>}
        {links.data && links.data.links.length > 0 && (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-xs">
              <thead className="text-ink-300">
                <tr>
                  <th scope="col" className="py-1 pr-2">Role</th>
                  <th scope="col" className="py-1 pr-2">Created</th>
                  <th scope="col" className="py-1 pr-2">Last used</th>
                  <th scope="col" className="py-1 pr-2">Expires</th>
                  <th scope="col" className="py-1 pr-2">State</th>
                  <th scope="col" className="py-1"><span className="sr-only">Actions</span></th>
                </tr>
              </thead>
              <tbody>
                {[...links.data.links].reverse().map((l) => {
                  const state = l.revokedAt ? 'revoked' : l.expired || (l.expiresAt && Date.parse(l.expiresAt) <= Date.now()) ? 'expired' : 'active';
                  return (
                    <tr key={l.id} className="border-t border-ink-800">
                      <td className="py-1 pr-2">{l.role}</td>
                      <td className="py-1 pr-2" title={fmt(l.createdAt)}>{timeAgo(l.createdAt)}</td>
                      <td className="py-1 pr-2" title={fmt(l.lastUsedAt)}>{timeAgo(l.lastUsedAt)}</td>
                      <td className="py-1 pr-2">{l.expiresAt ? fmt(l.expiresAt) : 'never'}</td>
                      <td className={`py-1 pr-2 ${state === 'active' ? 'text-ok-300' : 'text-ink-300'}`}>{state}</td>
                      <td className="py-1 text-right">
                        {state === 'active' && (
                          <Button variant="danger" className="px-2 py-1 text-xs" busy={revoke.isPending && revoke.variables === l.id} onClick={() => revoke.mutate(l.id)} aria-label={`Revoke ${l.role} link created ${fmt(l.createdAt)}`}>
                            Revoke
                          </Button>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
      </div>
    </div>
  );
}
