import { Link, Navigate } from 'react-router';
import { useMe } from '@/entities/me/api/get-me';
import { buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Loading } from '@/components/ui/page';
import { paths } from '@/lib/paths';

export function WelcomePage() {
  const me = useMe();
  if (me.isPending) return <Loading />;
  if (me.data) return <Navigate to={paths.guilds} replace />;
  return (
    <div className="grid gap-8 md:grid-cols-[3fr_2fr] md:items-center">
      <div>
        <h1 className="text-4xl font-bold text-indigo-deep sm:text-5xl">Block swaps and sew days, without the spreadsheet.</h1>
        <p className="mt-4 text-xl text-walnut-soft">
          Blockpost keeps your guild’s swaps in one place: the block and its cut list, who pledged how many, the photos, every
          block measured against its unfinished size, and who gets which blocks back.
        </p>
        <div className="mt-6 flex flex-wrap gap-3">
          <Link className={buttonClass('primary')} to={paths.signIn}>
            Sign in
          </Link>
          <Link className={buttonClass('secondary')} to={paths.register}>
            Create an account
          </Link>
        </div>
      </div>
      <Card as="div" title="What your guild gets">
        <ul className="list-disc space-y-2 pl-5">
          <li>Cut sizes, strip sets and yardage worked out for each pledge.</li>
          <li>A board of who owes what, updated as blocks arrive.</li>
          <li>Each block checked against the size and tolerance you set.</li>
          <li>Chat for sew days, and reminders before deadlines.</li>
        </ul>
      </Card>
    </div>
  );
}
