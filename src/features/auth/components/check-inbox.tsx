import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { AuthFrame } from './auth-frame';
import { ForgotPasswordLink, SignInInstead } from './auth-links';

/**
 * After the sign-up form: what happens next. It reads the same whether or not the address already
 * had an account (the mail tells that person which it is).
 */
export function CheckInbox({
  email,
  signInLink,
  onChangeAddress,
}: {
  email: string;
  signInLink: string;
  onChangeAddress: () => void;
}) {
  return (
    <AuthFrame
      title="Check your inbox"
      lead="One more step before your account is ready."
      footer={
        <>
          <SignInInstead to={signInLink} />
          <ForgotPasswordLink />
        </>
      }
    >
      <div className="space-y-4">
        <Alert tone="success" title="We sent you an e-mail">
          <p className="break-words">
            It went to <strong>{email}</strong>. Open the link in it within 24 hours to confirm your address and finish signing
            up.
          </p>
        </Alert>
        <ul className="list-disc space-y-1 pl-5 text-walnut-soft">
          <li>
            Nothing there after a few minutes? Look in your spam or junk folder, or go back to check the address and send it
            again.
          </li>
          <li>If this address already has an account, the e-mail says so and tells you how to sign in.</li>
        </ul>
        <Button variant="secondary" className="w-full" onClick={onChangeAddress}>
          Back to the form
        </Button>
      </div>
    </AuthFrame>
  );
}
