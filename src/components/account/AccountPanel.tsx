import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { Card } from '../ui/Card';
import { TextField } from '../ui/Field';
import { api, ApiError } from '../ui/api';
import { zodResolver } from '../ui/zod-resolver';
import { passwordForm, profileForm } from './schemas';
import { TokensCard } from './TokensCard';

const message = (e: unknown) => (e instanceof ApiError ? e.message : 'Could not reach the server; try again.');

function ProfileCard({ name, email }: { name: string; email: string }) {
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState } = useForm<z.infer<typeof profileForm>>({ resolver: zodResolver(profileForm), defaultValues: { name } });
  const onSubmit = handleSubmit(async (v) => {
    setNote(null);
    try {
      await api('PATCH', '/api/me', v);
      setNote({ tone: 'success', text: 'Saved.' });
    } catch (e) {
      setNote({ tone: 'error', text: message(e) });
    }
  });
  return (
    <Card title="Profile">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {note && <Alert tone={note.tone}>{note.text}</Alert>}
        <TextField label="Name" autoComplete="name" error={formState.errors.name?.message} {...register('name')} />
        <div className="flex flex-col gap-1">
          <span className="text-sm font-medium">E-mail</span>
          <span className="text-ink-300">{email}</span>
        </div>
        <div>
          <Button type="submit" busy={formState.isSubmitting}>Save name</Button>
        </div>
      </form>
    </Card>
  );
}

function PasswordCard() {
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<z.infer<typeof passwordForm>>({
    resolver: zodResolver(passwordForm),
    defaultValues: { currentPassword: '', newPassword: '', repeat: '' },
  });
  const onSubmit = handleSubmit(async (v) => {
    setNote(null);
    try {
      await api('POST', '/api/auth/password', { currentPassword: v.currentPassword, newPassword: v.newPassword });
      reset();
      setNote({ tone: 'success', text: 'Password changed. Your other sessions have been signed out.' });
    } catch (e) {
      if (e instanceof ApiError && e.field === 'currentPassword') setError('currentPassword', { message: e.message });
      else setNote({ tone: 'error', text: message(e) });
    }
  });
  return (
    <Card title="Password">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {note && <Alert tone={note.tone}>{note.text}</Alert>}
        <TextField label="Current password" type="password" autoComplete="current-password" error={formState.errors.currentPassword?.message} {...register('currentPassword')} />
        <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={formState.errors.newPassword?.message} {...register('newPassword')} />
        <TextField label="Repeat the new password" type="password" autoComplete="new-password" error={formState.errors.repeat?.message} {...register('repeat')} />
        <div>
          <Button type="submit" busy={formState.isSubmitting}>Change password</Button>
        </div>
      </form>
    </Card>
  );
}

export default function AccountPanel({ name, email }: { name: string; email: string }) {
  const [busy, setBusy] = useState(false);
  const signOut = async () => {
    setBusy(true);
    try {
      await api('POST', '/api/auth/sign-out');
    } finally {
      window.location.assign('/');
    }
  };
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <ProfileCard name={name} email={email} />
      <PasswordCard />
      <TokensCard />
      <Card title="Session" className="md:col-span-2">
        <p className="mb-4 text-ink-300">Signing out ends this session on the server at once.</p>
        <Button variant="secondary" busy={busy} onClick={signOut}>Sign out</Button>
      </Card>
    </div>
  );
}
