import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { apiPost, ApiError, safeNext } from '../../lib/client/api';
import { zodResolver } from '../ui/zod-resolver';
import { signUpForm } from './schemas';

type Values = z.infer<typeof signUpForm>;

/** `personalTeam` is off when the person signs up to accept an invitation (they join that team instead). */
export default function SignUpForm({ next, personalTeam = true, email = '' }: { next?: string | null; personalTeam?: boolean; email?: string }) {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError: setFieldError } = useForm<Values>({
    resolver: zodResolver(signUpForm),
    defaultValues: { name: '', email, password: '' },
  });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      await apiPost('/api/auth/sign-up', { ...v, personalTeam });
      window.location.assign(safeNext(next));
    } catch (e) {
      if (e instanceof ApiError && (e.field === 'email' || e.field === 'password' || e.field === 'name')) setFieldError(e.field, { message: e.message });
      else setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Create an account">
      {error && <Alert tone="error">{error}</Alert>}
      <TextField label="Name" autoComplete="name" error={formState.errors.name?.message} {...register('name')} />
      <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A short sentence is easy to remember."
        error={formState.errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Creating your account…' : 'Create account'}
      </Button>
    </form>
  );
}
