import { Link } from 'react-router';
import { paths } from '@/lib/paths';

/** The line under a sign-up form: for someone who has an account already. */
export function SignInInstead({ to = paths.signIn }: { to?: string }) {
  return (
    <p>
      Already have an account?{' '}
      <Link className="font-semibold text-indigo underline" to={to}>
        Sign in
      </Link>
    </p>
  );
}

/** The line under the sign-in form: for someone who has no account yet. */
export function RegisterInstead() {
  return (
    <p>
      New here?{' '}
      <Link className="font-semibold text-indigo underline" to={paths.register}>
        Create an account
      </Link>
    </p>
  );
}

export function ForgotPasswordLink() {
  return (
    <p>
      <Link className="text-indigo underline" to={paths.forgotPassword}>
        Forgot your password?
      </Link>
    </p>
  );
}
