/** The team's saved sites: everyone reads them; editors add one (place search, location or coordinates) or delete one. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { apiDelete, apiGet, apiPost, errorText } from '../../lib/client/api';
import type { SiteOut } from '../../lib/contracts/site';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { QueryRoot } from '../ui/QueryRoot';
import { SiteEditor } from './SiteEditor';

const BLANK = { name: '', lat: 0, lon: 0, height: 0, timeZone: 'UTC' };

function Sites({ teamId, canWrite }: { teamId: string; canWrite: boolean }) {
  const qc = useQueryClient();
  const key = ['sites', teamId];
  const sites = useQuery({ queryKey: key, queryFn: () => apiGet<{ sites: SiteOut[] }>(`/api/teams/${teamId}/sites`) });
  const [adding, setAdding] = useState(false);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const add = useMutation({
    mutationFn: (site: typeof BLANK) => apiPost<{ site: SiteOut }>(`/api/teams/${teamId}/sites`, site),
    onSuccess: (r) => {
      setAdding(false);
      setNote({ tone: 'success', text: `Saved “${r.site.name}”.` });
      void qc.invalidateQueries({ queryKey: key });
    },
    onError: (e) => setNote({ tone: 'error', text: errorText(e) }),
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiDelete(`/api/sites/${id}`),
    onSuccess: () => void qc.invalidateQueries({ queryKey: key }),
    onError: (e) => setNote({ tone: 'error', text: errorText(e) }),
  });
  return (
    <Card
      title="Sites"
      actions={
        canWrite && !adding ? (
          <Button variant="secondary" onClick={() => (setNote(null), setAdding(true))}>
            Add a site
          </Button>
        ) : undefined
      }
    >
      <div className="flex flex-col gap-4">
        {note && <Alert tone={note.tone}>{note.text}</Alert>}
        {sites.isError && <Alert tone="error">{errorText(sites.error)}</Alert>}
        {sites.data && sites.data.sites.length === 0 && <p className="text-sm text-ink-300">No saved sites yet. A saved site can start a new scene.</p>}
        {sites.data && sites.data.sites.length > 0 && (
          <ul className="flex flex-col divide-y divide-ink-800">
            {sites.data.sites.map((s) => (
              <li key={s.id} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
                <span>
                  <span className="font-medium">{s.name}</span>
                  <span className="text-ink-300">
                    {' '}
                    · {s.lat.toFixed(4)}°, {s.lon.toFixed(4)}° · {s.height} m · {s.timeZone}
                  </span>
                </span>
                {canWrite && (
                  <Button variant="ghost" className="px-2 py-1" onClick={() => remove.mutate(s.id)} aria-label={`Delete the site ${s.name}`}>
                    Delete
                  </Button>
                )}
              </li>
            ))}
          </ul>
        )}
        {adding && (
          <div className="rounded-md border border-ink-700 p-3">
            <SiteEditor value={BLANK} onApply={(s) => add.mutate(s)} submitLabel="Save this site" />
            <Button variant="ghost" className="mt-2" onClick={() => setAdding(false)}>
              Cancel
            </Button>
          </div>
        )}
      </div>
    </Card>
  );
}

export default function TeamSitesPanel(props: { teamId: string; canWrite: boolean }) {
  return (
    <QueryRoot>
      <Sites {...props} />
    </QueryRoot>
  );
}
