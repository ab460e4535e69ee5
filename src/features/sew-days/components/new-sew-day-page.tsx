import { useNavigate, useParams } from 'react-router';
import { Card } from '@/components/ui/card';
import { Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useSewDays } from '../api/get-sew-days';
import { useScheduleSewDay } from '../api/schedule-sew-day';
import { SewDayForm } from './sew-day-form';

/** Next Saturday 10:00–15:00, as a starting point to change. */
function nextSaturday(): { startsAt: string; endsAt: string } {
  const d = new Date();
  d.setDate(d.getDate() + ((6 - d.getDay() + 7) % 7 || 7));
  const day = `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
  return { startsAt: `${day}T10:00`, endsAt: `${day}T15:00` };
}

export function NewSewDayPage() {
  const guildId = Number(useParams().guildId);
  const navigate = useNavigate();
  const list = useSewDays(guildId, 'upcoming');
  const schedule = useScheduleSewDay(guildId);
  if (list.isPending) return <Loading />;
  if (list.isError) return <QueryError error={list.error} what="the sew days" />;
  return (
    <Card title="Schedule a sew day">
      <SewDayForm
        timeZone={list.data.timeZone}
        defaultValues={{ title: '', ...nextSaturday(), place: '', videoUrl: '', notes: '' }}
        submitLabel="Schedule it"
        pendingLabel="Scheduling…"
        onSubmit={async (values) => {
          const sewDay = await schedule.mutateAsync(values);
          navigate(paths.sewDay(guildId, sewDay.id));
        }}
      />
    </Card>
  );
}
