import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { apiPost, ApiError, safeNext } from '../../lib/client/api';
import { zodResolver } from '../ui/zod-resolver';
import { signInForm } from './schemas';

type Values = z.infer<typeof signInForm>;

export default function SignInForm({ next }: { next?: string | null }) {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(signInForm), defaultValues: { email: '', password: '' } });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      await apiPost('/api/auth/sign-in', v);
      window.location.assign(safeNext(next));
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      {error && <Alert tone="error">{error}</Alert>}
      <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={formState.errors.password?.message} {...register('password')} />
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
