import { Link, useNavigate, useSearchParams } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { paths, safeNext } from '@/lib/paths';
import { useConfirmEmail } from '../api/auth-mutations';
import { AuthFrame } from './auth-frame';
import { SignInInstead } from './auth-links';

/**
 * Where the link in the sign-up mail leads. The account is made only when the person presses the
 * button, not when the page loads: mail scanners that open links must not use them up.
 */
export function ConfirmEmailPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token') ?? '';
  const next = safeNext(params.get('next'));
  const confirm = useConfirmEmail();

  const onConfirm = async () => {
    try {
      await confirm.mutateAsync({ token });
      navigate(next, { replace: true });
    } catch {
      // The message is shown below.
    }
  };

  const registerLink = `${paths.register}${params.get('next') ? `?next=${encodeURIComponent(next)}` : ''}`;

  return (
    <AuthFrame
      title="Confirm your address"
      lead="Press the button to finish making your account. You will be signed in straight away."
      footer={<SignInInstead />}
    >
      <div className="space-y-4">
        {!token && (
          <Alert tone="error" title="This link is incomplete">
            Open the link from the e-mail again, or copy the whole link into the address bar.
          </Alert>
        )}
        {confirm.isError && (
          <Alert tone="error">
            <p>{confirm.error.message}</p>
            <p className="mt-2">
              <Link className="font-semibold underline" to={registerLink}>
                Sign up again
              </Link>
            </p>
          </Alert>
        )}
        <Button
          className="w-full"
          disabled={!token}
          pending={confirm.isPending}
          pendingLabel="Making your account…"
          onClick={() => void onConfirm()}
        >
          Confirm and sign in
        </Button>
      </div>
    </AuthFrame>
  );
}
