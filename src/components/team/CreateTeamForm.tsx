import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { TextField } from '../ui/Field';
import { apiPost, ApiError } from '../../lib/client/api';
import { zodResolver } from '../ui/zod-resolver';

const schema = z.object({ name: z.string().trim().min(1, 'Name the team.').max(100, 'Use at most 100 characters.') });

export default function CreateTeamForm() {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<z.infer<typeof schema>>({ resolver: zodResolver(schema), defaultValues: { name: '' } });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    try {
      const r = await apiPost<{ team: { id: string } }>('/api/teams', v);
      window.location.assign(`/dashboard?team=${encodeURIComponent(r.team.id)}`);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'Could not reach the server; try again.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Create a team">
      {error && <Alert tone="error">{error}</Alert>}
      <TextField label="New team name" error={formState.errors.name?.message} {...register('name')} />
      <Button type="submit" variant="secondary" busy={formState.isSubmitting}>Create team</Button>
    </form>
  );
}
