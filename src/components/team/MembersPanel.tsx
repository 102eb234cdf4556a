/** Members of one team; owners also see pending invitations, invite, change roles and remove members. */
import { keys, useInvitations, useMembers } from '../../lib/client/queries';
import { ROLES, type Role } from '../../lib/contracts/roles';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Badge, Card } from '../ui/Card';
import { Button } from '../ui/Button';
import { SelectField, TextField } from '../ui/Field';
import { QueryRoot } from '../ui/QueryRoot';
import { apiDelete, apiPatch, apiPost, ApiError } from '../../lib/client/api';
import { zodResolver } from '../ui/zod-resolver';

const ROLE_HELP: Record<Role, string> = {
  owner: 'manages members and everything else',
  editor: 'builds and shares scenes',
  reviewer: 'checks scenes and comments',
  viewer: 'watches read-only',
};


const inviteForm = z.object({
  email: z.string().trim().min(1, 'Enter an e-mail address.').email('Enter an e-mail address such as name@example.org.'),
  role: z.enum(ROLES),
});

const message = (e: unknown) => (e instanceof ApiError ? e.message : 'Could not reach the server; try again.');

interface Props { teamId: string; currentUserId: string; canManage: boolean }

function InviteForm({ teamId, onDone }: { teamId: string; onDone: (text: string) => void }) {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState, reset } = useForm<z.infer<typeof inviteForm>>({
    resolver: zodResolver(inviteForm),
    defaultValues: { email: '', role: 'viewer' },
  });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      const r = await apiPost<{ mailed: boolean }>(`/api/teams/${teamId}/invitations`, v);
      reset();
      onDone(r.mailed ? `Invitation sent to ${v.email}.` : `Invitation created for ${v.email}, but the mail could not be sent.`);
    } catch (e) {
      setError(message(e));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-[1fr_auto_auto] sm:items-end" aria-label="Invite someone">
      {error && <div className="sm:col-span-3"><Alert tone="error">{error}</Alert></div>}
      <TextField label="E-mail to invite" type="email" autoComplete="off" error={formState.errors.email?.message} {...register('email')} />
      <SelectField label="Role" error={formState.errors.role?.message} {...register('role')}>
        {ROLES.map((r) => (
          <option key={r} value={r}>{r} — {ROLE_HELP[r]}</option>
        ))}
      </SelectField>
      <Button type="submit" busy={formState.isSubmitting}>Invite</Button>
    </form>
  );
}

function Panel({ teamId, currentUserId, canManage }: Props) {
  const qc = useQueryClient();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const members = useMembers(teamId);
  const invitations = useInvitations(teamId, canManage);
  const refresh = () => {
    void qc.invalidateQueries({ queryKey: keys.members(teamId) });
    void qc.invalidateQueries({ queryKey: keys.invitations(teamId) });
  };
  const change = useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) => apiPatch(`/api/teams/${teamId}/members/${userId}`, { role }),
    onSuccess: () => { setNote({ tone: 'success', text: 'Role changed.' }); refresh(); },
    onError: (e) => { setNote({ tone: 'error', text: message(e) }); refresh(); },
  });
  const remove = useMutation({
    mutationFn: (userId: string) => apiDelete(`/api/teams/${teamId}/members/${userId}`),
    onSuccess: (_d, userId) => {
      if (userId === currentUserId) window.location.assign('/dashboard');
      else { setNote({ tone: 'success', text: 'Member removed.' }); refresh(); }
    },
    onError: (e) => setNote({ tone: 'error', text: message(e) }),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => apiDelete(`/api/teams/${teamId}/invitations/${id}`),
    onSuccess: () => { setNote({ tone: 'success', text: 'Invitation withdrawn.' }); refresh(); },
    onError: (e) => setNote({ tone: 'error', text: message(e) }),
  });

  return (
    <Card title="Members">
      <div className="flex flex-col gap-4">
        {note && <Alert tone={note.tone}>{note.text}</Alert>}
        {members.isPending && <p className="text-ink-300">Loading members…</p>}
        {members.isError && <Alert tone="error">{message(members.error)}</Alert>}
        {members.data && (
          <ul className="divide-y divide-ink-700" aria-label="Team members">
            {members.data.members.map((m) => {
              const self = m.userId === currentUserId;
              return (
                <li key={m.userId} className="flex flex-wrap items-center gap-3 py-3">
                  <div className="min-w-0 flex-1">
                    <p className="font-medium">{m.name}{self && <span className="text-ink-300"> (you)</span>}</p>
                    <p className="truncate text-sm text-ink-300">{m.email}</p>
                  </div>
                  {canManage ? (
                    <label className="flex items-center gap-2 text-sm">
                      <span className="sr-only">Role of {m.name}</span>
                      <select
                        className="rounded-md border border-ink-700 bg-ink-950 px-2 py-1"
                        value={m.role}
                        disabled={change.isPending}
                        onChange={(e) => change.mutate({ userId: m.userId, role: e.target.value as Role })}
                      >
                        {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
                      </select>
                    </label>
                  ) : (
                    <Badge>{m.role}</Badge>
                  )}
                  {(canManage || self) && (
                    <Button
                      variant={self ? 'secondary' : 'danger'}
                      disabled={remove.isPending}
                      onClick={() => {
                        if (window.confirm(self ? 'Leave this team?' : `Remove ${m.name} from the team?`)) remove.mutate(m.userId);
                      }}
                    >
                      {self ? 'Leave team' : 'Remove'}
                      {!self && <span className="sr-only"> {m.name}</span>}
                    </Button>
                  )}
                </li>
              );
            })}
          </ul>
        )}
        {canManage && (
          <>
            <h3 className="mt-2 text-base font-semibold">Invite someone</h3>
            <InviteForm teamId={teamId} onDone={(text) => { setNote({ tone: 'success', text }); refresh(); }} />
            <h3 className="mt-2 text-base font-semibold">Pending invitations</h3>
            {invitations.data?.invitations.length === 0 && <p className="text-sm text-ink-300">No pending invitations.</p>}
            {invitations.data && invitations.data.invitations.length > 0 && (
              <ul className="divide-y divide-ink-700" aria-label="Pending invitations">
                {invitations.data.invitations.map((i) => (
                  <li key={i.id} className="flex flex-wrap items-center gap-3 py-2 text-sm">
                    <span className="min-w-0 flex-1 truncate">{i.email}</span>
                    <Badge>{i.role}</Badge>
                    <span className="text-ink-300">until {new Date(i.expiresAt).toLocaleDateString()}</span>
                    <Button variant="ghost" onClick={() => revoke.mutate(i.id)} disabled={revoke.isPending}>
                      Withdraw<span className="sr-only"> the invitation to {i.email}</span>
                    </Button>
                  </li>
                ))}
              </ul>
            )}
          </>
        )}
      </div>
    </Card>
  );
}

export default function MembersPanel(props: Props) {
  return (
    <QueryRoot>
      <Panel {...props} />
    </QueryRoot>
  );
}
