import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { apiPost, ApiError } from '../../lib/client/api';
import { zodResolver } from '../ui/zod-resolver';
import { resetRequestForm } from './schemas';

type Values = z.infer<typeof resetRequestForm>;

export default function ResetRequestForm() {
  const [sent, setSent] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(resetRequestForm), defaultValues: { email: '' } });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      await apiPost('/api/auth/password-reset', v);
      setSent(true);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
    }
  });
  if (sent) return <Alert tone="success">If an account uses this address, a reset link is on its way. It works once, for one hour.</Alert>;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Ask for a reset link">
      {error && <Alert tone="error">{error}</Alert>}
      <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
      <Button type="submit" busy={formState.isSubmitting}>
        Send the reset link
      </Button>
    </form>
  );
}
