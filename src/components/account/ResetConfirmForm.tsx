import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { apiPost, ApiError } from '../../lib/client/api';
import { zodResolver } from '../ui/zod-resolver';
import { resetConfirmForm } from './schemas';

type Values = z.infer<typeof resetConfirmForm>;

export default function ResetConfirmForm({ token }: { token: string }) {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(resetConfirmForm), defaultValues: { password: '', repeat: '' } });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      await apiPost('/api/auth/password-reset/confirm', { token, password: v.password });
      window.location.assign('/dashboard');
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Choose a new password">
      {error && (
        <Alert tone="error">
          {error} <a className="underline" href="/reset">Ask for a new link</a>.
        </Alert>
      )}
      <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={formState.errors.password?.message} {...register('password')} />
      <TextField label="Repeat the new password" type="password" autoComplete="new-password" error={formState.errors.repeat?.message} {...register('repeat')} />
      <Button type="submit" busy={formState.isSubmitting}>
        Set the new password
      </Button>
    </form>
  );
}
