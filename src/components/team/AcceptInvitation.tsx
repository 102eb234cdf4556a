import { useState } from 'react';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { apiPost, ApiError } from '../../lib/client/api';

export default function AcceptInvitation({ token, teamName, role }: { token: string; teamName: string; role: string }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const accept = async () => {
    setBusy(true);
    setError(null);
    try {
      const r = await apiPost<{ team: { id: string } }>(`/api/invitations/${encodeURIComponent(token)}/accept`);
      window.location.assign(`/dashboard?team=${encodeURIComponent(r.team.id)}`);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
      setBusy(false);
    }
  };
  return (
    <div className="flex flex-col gap-4">
      {error && <Alert tone="error">{error}</Alert>}
      <div>
        <Button onClick={accept} busy={busy}>Join {teamName} as {role}</Button>
      </div>
    </div>
  );
}
