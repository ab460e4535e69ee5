import { useNavigate, useParams } from 'react-router';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useSewDay } from '../api/get-sew-day';
import { useUpdateSewDay } from '../api/update-sew-day';
import { SewDayForm } from './sew-day-form';

export function EditSewDayPage() {
  const params = useParams();
  const guildId = Number(params.guildId);
  const sewDayId = Number(params.sewDayId);
  const navigate = useNavigate();
  const sewDay = useSewDay(sewDayId);
  const update = useUpdateSewDay(guildId, sewDayId);
  if (sewDay.isPending) return <Loading />;
  if (sewDay.isError) return <QueryError error={sewDay.error} what="the sew day" />;
  const s = sewDay.data;
  if (!s.canManage || s.cancelledAt) {
    return (
      <Alert tone="warning">
        {s.cancelledAt
          ? 'This sew day was cancelled, so it can no longer be changed.'
          : 'Only guild admins and coordinators can change a sew day.'}
      </Alert>
    );
  }
  return (
    <Card title={`Change “${s.title}”`}>
      <SewDayForm
        timeZone={s.timeZone}
        defaultValues={{
          title: s.title,
          startsAt: s.startsAtLocal,
          endsAt: s.endsAtLocal,
          place: s.place ?? '',
          videoUrl: s.videoUrl ?? '',
          notes: s.notes ?? '',
        }}
        submitLabel="Save changes"
        pendingLabel="Saving…"
        onSubmit={async (values) => {
          await update.mutateAsync(values);
          navigate(paths.sewDay(guildId, sewDayId));
        }}
      />
    </Card>
  );
}
