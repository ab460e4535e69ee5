import type { ReactNode } from 'react';
import { ApiError } from '@/lib/api-client';
import { Alert } from './alert';

export function PageHeader({ title, lead, actions }: { title: ReactNode; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-3xl font-bold text-indigo-deep sm:text-4xl">{title}</h1>
        {lead && <p className="mt-2 max-w-2xl text-walnut-soft">{lead}</p>}
      </div>
      {actions}
    </header>
  );
}

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" aria-live="polite" className="py-8 text-center text-walnut-soft">
      {label}
    </p>
  );
}

/** Shows a query's failure in plain words. */
export function QueryError({ error, what = 'this page' }: { error: unknown; what?: string }) {
  const message = error instanceof ApiError ? error.message : 'Something went wrong.';
  return (
    <Alert tone="error" title={`We could not load ${what}.`}>
      {message}
    </Alert>
  );
}

export function EmptyState({ title, children }: { title: ReactNode; children?: ReactNode }) {
  return (
    <div className="rounded-card border-2 border-dashed border-walnut/25 p-8 text-center">
      <p className="text-xl font-semibold">{title}</p>
      {children && <div className="mt-2 text-walnut-soft">{children}</div>}
    </div>
  );
}
