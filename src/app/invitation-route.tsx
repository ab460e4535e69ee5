import { AcceptInvitationPage } from '@/features/guilds/components/accept-invitation-page';
import { useMe } from '@/entities/me/api/get-me';
import { Loading } from '@/components/ui/page';

export function InvitationRoute() {
  const me = useMe();
  if (me.isPending) return <Loading />;
  return <AcceptInvitationPage signedIn={Boolean(me.data)} />;
}
