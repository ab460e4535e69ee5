import { Link, useNavigate, useParams } from 'react-router';
import { roleLabels } from '@shared/schemas/guilds';
import { Card } from '@/components/ui/card';
import { Button, buttonClass } from '@/components/ui/button';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import { useAcceptInvitation, useInvitationPreview } from '../api/invitations';

/** Works signed in or out: signed-out visitors go to sign-in or registration and come back here. */
export function AcceptInvitationPage({ signedIn }: { signedIn: boolean }) {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const preview = useInvitationPreview(token);
  const accept = useAcceptInvitation();
  const back = encodeURIComponent(paths.invitation(token));

  if (preview.isPending) return <Loading label="Opening the invitation…" />;
  if (preview.isError) return <QueryError error={preview.error} what="this invitation" />;

  return (
    <div className="mx-auto max-w-lg py-6">
      <Card title={`Join ${preview.data.guildName}`}>
        <p>
          You are invited as <strong>{roleLabels[preview.data.role].toLowerCase()}</strong>. The invitation was sent to{' '}
          <strong className="break-all">{preview.data.email}</strong>.
        </p>
        <p className="mt-2">
          {preview.data.open
            ? 'It is an open link: anyone with an account who has it may join.'
            : 'Only the account with that e-mail address can accept it: create or sign in to that account.'}
        </p>
        {accept.isError && (
          <div className="mt-4">
            <Alert tone="error">
              {accept.error instanceof ApiError ? accept.error.message : 'That did not work. Please try again.'}
            </Alert>
          </div>
        )}
        <div className="mt-6 flex flex-wrap gap-3">
          {signedIn ? (
            <Button
              pending={accept.isPending}
              pendingLabel="Joining…"
              onClick={() => accept.mutate(token, { onSuccess: (r) => navigate(paths.guild(r.guildId)) })}
            >
              Join the guild
            </Button>
          ) : (
            <>
              <Link className={buttonClass('primary')} to={`${paths.register}?next=${back}`}>
                Create an account to join
              </Link>
              <Link className={buttonClass('secondary')} to={`${paths.signIn}?next=${back}`}>
                I already have an account
              </Link>
            </>
          )}
        </div>
      </Card>
    </div>
  );
}
