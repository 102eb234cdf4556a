/**
 * The team's calendar subscription (editors and owners): a secret URL listing the team's upcoming scenes,
 * for the calendar program the team already uses. The URL is shown once when made; making a new one
 * replaces it, revoking stops it.
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { apiDelete, apiGet, apiPost, errorText } from '../../lib/client/api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { QueryRoot } from '../ui/QueryRoot';

interface Feed {
  id: string;
  createdAt: string;
  lastUsedAt: string | null;
}

const when = (iso: string) => new Date(iso).toISOString().slice(0, 16).replace('T', ' ') + ' UTC';

function Subscription({ teamId }: { teamId: string }) {
  const qc = useQueryClient();
  const key = ['calendar-feed', teamId];
  const feed = useQuery({ queryKey: key, queryFn: () => apiGet<{ feed: Feed | null }>(`/api/teams/${teamId}/calendar-feed`) });
  const [url, setUrl] = useState<string | null>(null);
  const [err, setErr] = useState<string | null>(null);
  const make = useMutation({
    mutationFn: () => apiPost<{ url: string }>(`/api/teams/${teamId}/calendar-feed`),
    onSuccess: (r) => {
      setUrl(r.url);
      void qc.invalidateQueries({ queryKey: key });
    },
    onError: (e) => setErr(errorText(e)),
  });
  const revoke = useMutation({
    mutationFn: () => apiDelete(`/api/teams/${teamId}/calendar-feed`),
    onSuccess: () => {
      setUrl(null);
      void qc.invalidateQueries({ queryKey: key });
    },
    onError: (e) => setErr(errorText(e)),
  });
  const current = feed.data?.feed ?? null;
  return (
    <Card title="Calendar subscription">
      <div className="flex flex-col gap-3 text-sm">
        <p className="text-ink-300">
          A secret address your calendar program can subscribe to: every upcoming scene of the team as an event at its time, with the site and a
          link. Anyone who has the address can read those titles, times and sites.
        </p>
        {err && <Alert tone="error">{err}</Alert>}
        {url && (
          <div className="flex flex-col gap-1" data-testid="calendar-url">
            <label className="font-medium" htmlFor="calendar-url">
              Subscription address (shown once: copy it now)
            </label>
            <div className="flex gap-2">
              <input id="calendar-url" readOnly value={url} className="w-full rounded-md border border-ink-700 bg-ink-950 px-3 py-2 font-mono text-xs" onFocus={(e) => e.target.select()} />
              <Button variant="secondary" onClick={() => void navigator.clipboard?.writeText(url)}>
                Copy
              </Button>
            </div>
          </div>
        )}
        {current && !url && (
          <p>
            An address is active (made {when(current.createdAt)}
            {current.lastUsedAt ? `, last read ${when(current.lastUsedAt)}` : ', not read yet'}).
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" busy={make.isPending} onClick={() => (setErr(null), make.mutate())}>
            {current ? 'Replace with a new address' : 'Make a subscription address'}
          </Button>
          {current && (
            <Button variant="danger" busy={revoke.isPending} onClick={() => (setErr(null), revoke.mutate())}>
              Revoke
            </Button>
          )}
        </div>
      </div>
    </Card>
  );
}

export default function TeamCalendarPanel({ teamId }: { teamId: string }) {
  return (
    <QueryRoot>
      <Subscription teamId={teamId} />
    </QueryRoot>
  );
}
