/**
 * Personal API tokens for scripts: make one (name, read or read-and-write), see when each was last used,
 * revoke. The secret is shown once, right after it is made. A token acts as you, within your role in
 * each team; read tokens can only read.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId, useState } from 'react';
import type { TokenOut, TokenScope } from '../../lib/contracts/tokens';
import { apiDelete, apiPost, errorText } from '../../lib/client/api';
import { keys, useTokens } from '../../lib/client/queries';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { QueryRoot } from '../ui/QueryRoot';

const INPUT = 'w-full rounded-md border border-ink-700 bg-ink-950 px-3 py-2 text-sm text-ink-100 placeholder:text-ink-500 focus-visible:border-brass-300';
const when = (iso: string | null) => (iso ? new Date(iso).toISOString().slice(0, 16).replace('T', ' ') + ' UTC' : 'never');

function Tokens() {
  const id = useId();
  const qc = useQueryClient();
  const list = useTokens();
  const [name, setName] = useState('');
  const [scope, setScope] = useState<TokenScope>('read');
  const [made, setMade] = useState<{ name: string; token: string } | null>(null);
  const [err, setErr] = useState<string | null>(null);
  const create = useMutation({
    mutationFn: () => apiPost<TokenOut & { token: string }>('/api/tokens', { name: name.trim(), scope }),
    onSuccess: (r) => {
      setMade({ name: r.name, token: r.token });
      setName('');
      void qc.invalidateQueries({ queryKey: keys.tokens() });
    },
    onError: (e) => setErr(errorText(e)),
  });
  const revoke = useMutation({
    mutationFn: (tokenId: string) => apiDelete(`/api/tokens/${tokenId}`),
    onSuccess: () => void qc.invalidateQueries({ queryKey: keys.tokens() }),
    onError: (e) => setErr(errorText(e)),
  });
  return (
    <Card title="API tokens" className="md:col-span-2">
      <div className="flex flex-col gap-4 text-sm">
        <p className="text-ink-300">
          For scripts and other tools: send <code className="text-brass-200">Authorization: Bearer &lt;token&gt;</code> to the same addresses the app uses. A token acts as
          you, never beyond your role in each team; a read token can only read. See the <a className="text-brass-300 underline" href="/docs/api">API page</a>.
        </p>
        {err && <Alert tone="error">{err}</Alert>}
        {made && (
          <div className="flex flex-col gap-1 rounded-md border border-brass-300/50 p-3" data-testid="new-token">
            <label htmlFor={`${id}-secret`} className="font-medium">
              “{made.name}”: copy the token now — it is not shown again
            </label>
            <div className="flex gap-2">
              <input id={`${id}-secret`} readOnly value={made.token} className={`${INPUT} font-mono text-xs`} onFocus={(e) => e.target.select()} />
              <Button variant="secondary" onClick={() => void navigator.clipboard?.writeText(made.token)}>
                Copy
              </Button>
            </div>
          </div>
        )}
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            setErr(null);
            if (!name.trim()) return setErr('Name: give the token a name, e.g. the script that will use it.');
            create.mutate();
          }}
        >
          <div className="flex min-w-48 flex-1 flex-col gap-1">
            <label htmlFor={`${id}-name`} className="font-medium">
              Name
            </label>
            <input id={`${id}-name`} className={INPUT} value={name} maxLength={100} placeholder="Nightly schedule export" onChange={(e) => setName(e.target.value)} />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor={`${id}-scope`} className="font-medium">
              Scope
            </label>
            <select id={`${id}-scope`} className={INPUT} value={scope} onChange={(e) => setScope(e.target.value as TokenScope)}>
              <option value="read">Read</option>
              <option value="write">Read and write</option>
            </select>
          </div>
          <Button type="submit" busy={create.isPending}>
            Make a token
          </Button>
        </form>
        {list.data && list.data.tokens.length > 0 && (
          <table className="w-full text-left text-sm">
            <thead className="text-xs text-ink-300">
              <tr>
                <th className="py-1 font-medium">Name</th>
                <th className="py-1 font-medium">Scope</th>
                <th className="py-1 font-medium">Token</th>
                <th className="py-1 font-medium">Last used</th>
                <th className="py-1" />
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-800">
              {list.data.tokens.map((t) => (
                <tr key={t.id}>
                  <td className="py-2">{t.name}</td>
                  <td className="py-2">{t.scope === 'write' ? 'read and write' : 'read'}</td>
                  <td className="py-2 font-mono text-xs text-ink-300">{t.hint}</td>
                  <td className="py-2 text-ink-300">{when(t.lastUsedAt)}</td>
                  <td className="py-2 text-right">
                    <Button variant="ghost" className="px-2 py-1" onClick={() => revoke.mutate(t.id)} aria-label={`Revoke the token ${t.name}`}>
                      Revoke
                    </Button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {list.data && list.data.tokens.length === 0 && <p className="text-ink-300">No tokens yet.</p>}
      </div>
    </Card>
  );
}

export function TokensCard() {
  return (
    <QueryRoot>
      <Tokens />
    </QueryRoot>
  );
}
