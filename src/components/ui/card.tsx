import type { HTMLAttributes, ReactNode } from 'react';

interface CardProps extends Omit<HTMLAttributes<HTMLElement>, 'title'> {
  as?: 'section' | 'article' | 'div';
  title?: ReactNode;
  actions?: ReactNode;
}

/** A panel with the seam-line motif. */
export function Card({ as: Tag = 'section', title, actions, className = '', children, ...rest }: CardProps) {
  return (
    <Tag className={`seam rounded-card bg-card p-6 shadow-sm ring-1 ring-walnut/10 ${className}`} {...rest}>
      {(title || actions) && (
        <div className="relative mb-4 flex flex-wrap items-center justify-between gap-3">
          {title && <h2 className="text-2xl font-semibold text-indigo-deep">{title}</h2>}
          {actions}
        </div>
      )}
      <div className="relative">{children}</div>
    </Tag>
  );
}
