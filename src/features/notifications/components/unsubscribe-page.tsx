import { Link, useSearchParams } from 'react-router';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { Alert } from '@/components/ui/alert';
import { Loading, PageHeader } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import { useUnsubscribeInfo } from '../api/get-unsubscribe-info';
import { useUnsubscribe } from '../api/unsubscribe';
import { useUndoUnsubscribe } from '../api/undo-unsubscribe';

const problemText = (error: unknown) => (error instanceof ApiError ? error.message : 'That did not work. Please try again.');

/**
 * Where an e-mail's "stop these e-mails" link lands: it asks before changing anything, because
 * mail scanners open links on their own. No sign-in is needed; the link's signed token decides.
 */
export function UnsubscribePage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const info = useUnsubscribeInfo(token);
  const stop = useUnsubscribe(token);
  const undo = useUndoUnsubscribe(token);

  const choices = (
    <p>
      <Link to={paths.mailPreferences} className="font-semibold text-indigo underline underline-offset-4">
        See all your e-mail choices
      </Link>{' '}
      (you will be asked to sign in).
    </p>
  );

  let body;
  if (!token)
    body = (
      <Alert tone="error" title="This link is incomplete.">
        Open the link from the e-mail again, or sign in and choose your e-mails.
      </Alert>
    );
  else if (info.isPending) body = <Loading label="Checking the link…" />;
  else if (info.isError)
    body = (
      <Alert tone="error" title="We could not use this link.">
        {problemText(info.error)}
      </Alert>
    );
  else {
    const { label, description, enabled, emailHint } = info.data;
    body = enabled ? (
      <div className="space-y-4">
        {undo.isSuccess && <Alert tone="success">They are back on: we will send {label.toLowerCase()} again.</Alert>}
        <p className="text-xl">
          Stop e-mails about <strong>{label.toLowerCase()}</strong> to <strong className="break-all">{emailHint}</strong>?
        </p>
        <p className="text-walnut-soft">{description}</p>
        {stop.isError && <Alert tone="error">{problemText(stop.error)}</Alert>}
        <Button variant="danger" pending={stop.isPending} pendingLabel="Stopping…" onClick={() => stop.mutate()}>
          Stop these e-mails
        </Button>
        <p className="text-walnut-soft">Other kinds of e-mail from Blockpost are not affected.</p>
      </div>
    ) : (
      <div className="space-y-4">
        <Alert tone="success" title="Done.">
          We will not send you {label.toLowerCase()} any more. Other kinds of e-mail are not affected.
        </Alert>
        <p>Changed your mind?</p>
        {undo.isError && <Alert tone="error">{problemText(undo.error)}</Alert>}
        <Button variant="secondary" pending={undo.isPending} pendingLabel="Turning them back on…" onClick={() => undo.mutate()}>
          Send me {label.toLowerCase()} again
        </Button>
      </div>
    );
  }

  return (
    <div className="mx-auto max-w-2xl space-y-6">
      <PageHeader title="Stop an e-mail" />
      <Card>{body}</Card>
      {choices}
    </div>
  );
}
