import { useState } from 'react';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { api, ApiError } from '../ui/api';

export default function AcceptInvitation({ token, teamName, role }: { token: string; teamName: string; role: string }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  /** The account's address is not confirmed yet: offer to mail the confirmation link again. */
  const [unverified, setUnverified] = useState(false);
  const [resent, setResent] = useState<string | null>(null);
  const accept = async () => {
    setBusy(true);
    setError(null);
    try {
      const r = await api<{ team: { id: string } }>('POST', `/api/invitations/${encodeURIComponent(token)}/accept`);
      window.location.assign(`/dashboard?team=${encodeURIComponent(r.team.id)}`);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
      setUnverified(e instanceof ApiError && e.code === 'email_unverified');
      setBusy(false);
    }
  };
  const resend = async () => {
    try {
      const r = await api<{ message: string }>('POST', '/api/auth/verify-email');
      setResent(r.message);
    } catch (e) {
      setResent(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
    }
  };
  return (
    <div className="flex flex-col gap-4">
      {error && <Alert tone="error">{error}</Alert>}
      {unverified && (
        <div className="flex flex-col gap-2">
          <div>
            <Button variant="secondary" onClick={resend}>Mail me the confirmation link again</Button>
          </div>
          {resent && <p className="text-sm text-ink-300">{resent} Open it, then come back to this page.</p>}
        </div>
      )}
      <div>
        <Button onClick={accept} busy={busy}>Join {teamName} as {role}</Button>
      </div>
    </div>
  );
}
