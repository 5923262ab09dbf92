import type { ReactNode } from 'react';

export function PageHeader({ title, viewOnly, children }: { title: string; viewOnly?: boolean; children?: ReactNode }) {
  return (
    <div className="mb-6">
      <div className="flex flex-wrap items-baseline gap-3">
        <h1 className="text-2xl font-semibold text-ink">{title}</h1>
        {viewOnly && (
          <span className="rounded-pill border border-line-strong bg-sunken px-2.5 py-0.5 text-xs font-semibold text-ink-muted">
            View only
          </span>
        )}
      </div>
      {children && <p className="mt-2 max-w-prose text-ink-muted">{children}</p>}
    </div>
  );
}
