import type { ReactNode } from 'react';
import { Card } from '@/components/ui/card';

/** The narrow column the sign-in pages share. */
export function AuthFrame({
  title,
  lead,
  children,
  footer,
}: {
  title: string;
  lead?: ReactNode;
  children: ReactNode;
  footer?: ReactNode;
}) {
  return (
    <div className="mx-auto w-full max-w-md py-6">
      <h1 className="mb-2 text-3xl font-bold text-indigo-deep">{title}</h1>
      {lead && <p className="mb-6 text-walnut-soft">{lead}</p>}
      <Card as="div">{children}</Card>
      {footer && <div className="mt-6 space-y-2 text-center">{footer}</div>}
    </div>
  );
}
