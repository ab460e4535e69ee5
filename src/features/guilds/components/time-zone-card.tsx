import { useState } from 'react';
import { timeZoneSchema } from '@shared/schemas/guilds';
import type { GuildDto } from '@shared/types';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TimeZoneField } from '@/components/ui/time-zone-field';
import { ApiError } from '@/lib/api-client';
import { useUpdateTimeZone } from '../api/update-time-zone';

/** Admins change the guild's time zone; what was typed stays in the box if it is refused. */
export function TimeZoneCard({ guild }: { guild: GuildDto }) {
  const update = useUpdateTimeZone(guild.id);
  const [zone, setZone] = useState(guild.timeZone);
  const [error, setError] = useState('');
  return (
    <Card title="Time zone">
      <form
        className="space-y-3"
        onSubmit={(e) => {
          e.preventDefault();
          setError('');
          const parsed = timeZoneSchema.safeParse(zone);
          if (!parsed.success) return setError(parsed.error.issues[0]?.message ?? 'Choose a time zone from the list.');
          update.mutate(parsed.data, {
            onError: (err) =>
              setError(err instanceof ApiError ? (err.fields.timeZone ?? err.message) : 'That did not work. Please try again.'),
          });
        }}
      >
        <p>
          Deadlines, sew days, e-mails, calendar files and exports of this guild use this zone. It is{' '}
          {guild.timeZone.replace(/_/g, ' ')} now.
        </p>
        <TimeZoneField value={zone} onChange={(e) => setZone(e.target.value)} error={error} />
        <Button type="submit" pending={update.isPending} pendingLabel="Saving…" disabled={zone === guild.timeZone}>
          Save the time zone
        </Button>
        {update.isSuccess && !update.isPending && !error && (
          <Alert tone="success">Saved: dates now show in {guild.timeZone.replace(/_/g, ' ')}.</Alert>
        )}
      </form>
    </Card>
  );
}
