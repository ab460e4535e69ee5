import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate } from 'react-router';
import { createGuildSchema, roleLabels, type CreateGuildInput } from '@shared/schemas/guilds';
import { TimeZoneField, deviceTimeZone } from '@/components/ui/time-zone-field';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { EmptyState, Loading, PageHeader, QueryError } from '@/components/ui/page';
import { applyServerErrors } from '@/components/ui/form-errors';
import { paths } from '@/lib/paths';
import { useGuilds } from '@/entities/guild/api/get-guilds';
import { useCreateGuild } from '../api/create-guild';

export function GuildListPage() {
  const guilds = useGuilds();
  return (
    <div className="space-y-8">
      <PageHeader title="Your guilds" lead="Pick a guild to see its swaps, sew days and members." />
      {guilds.isPending ? (
        <Loading />
      ) : guilds.isError ? (
        <QueryError error={guilds.error} what="your guilds" />
      ) : guilds.data.length === 0 ? (
        <EmptyState title="You are not in a guild yet">
          Open the invitation link your guild sent you, or start a guild below.
        </EmptyState>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2">
          {guilds.data.map((g) => (
            <li key={g.id}>
              <Link
                to={paths.guild(g.id)}
                className="seam block rounded-card bg-card p-6 shadow-sm ring-1 ring-walnut/10 hover:ring-indigo"
              >
                <span className="relative block font-display text-2xl font-semibold text-indigo-deep">{g.name}</span>
                <span className="relative mt-1 block text-walnut-soft">
                  {roleLabels[g.myRole]} · {g.memberCount} {g.memberCount === 1 ? 'member' : 'members'}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      <CreateGuildCard />
    </div>
  );
}

function CreateGuildCard() {
  const navigate = useNavigate();
  const create = useCreateGuild();
  const [formError, setFormError] = useState('');
  const timeZone = deviceTimeZone();
  const { register, handleSubmit, setError, formState } = useForm<CreateGuildInput>({
    resolver: zodResolver(createGuildSchema),
    defaultValues: { name: '', timeZone },
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      const guild = await create.mutateAsync(values);
      navigate(paths.members(guild.id));
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['name', 'timeZone']));
    }
  });
  return (
    <Card title="Start a guild">
      <p className="mb-4 text-walnut-soft">You become its admin and can invite members, coordinators and other admins.</p>
      <form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-2">
        {formError && (
          <div className="sm:col-span-2">
            <Alert tone="error">{formError}</Alert>
          </div>
        )}
        <TextField label="Guild name" error={formState.errors.name?.message} {...register('name')} />
        <TimeZoneField
          hint={`Every date the guild sees or is e-mailed is in this zone. Type a city or region to find yours; it starts on this device's zone.`}
          error={formState.errors.timeZone?.message}
          {...register('timeZone')}
        />
        <div className="sm:col-span-2">
          <Button type="submit" pending={create.isPending} pendingLabel="Creating…">
            Create guild
          </Button>
        </div>
      </form>
    </Card>
  );
}
