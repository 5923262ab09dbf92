import type { ReactNode } from 'react';

/** What a list looks like before it has anything in it: what it will hold and what to do next. */
export function EmptyState({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section aria-label={title} className="rounded-card border border-dashed border-line-strong bg-surface px-6 py-8">
      <h2 className="text-lg font-semibold text-ink">{title}</h2>
      <div className="mt-2 max-w-prose space-y-3 text-sm text-ink-muted">{children}</div>
    </section>
  );
}
