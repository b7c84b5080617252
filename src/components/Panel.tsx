import type { ReactNode } from 'react';

/** A white card with an optional heading row. */
export function Panel({ title, actions, children, className = '' }: { title?: ReactNode; actions?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-lg border border-graphite-200 bg-white shadow-[0_1px_0_rgb(20_22_24/0.04)] ${className}`}>
      {(title || actions) && (
        <header className="flex items-center justify-between gap-3 border-b border-graphite-200 px-4 py-2.5">
          {title && <h2 className="text-base font-semibold text-graphite-900">{title}</h2>}
          {actions}
        </header>
      )}
      <div className="p-4">{children}</div>
    </section>
  );
}

/** The heading of a screen. */
export function PageHeader({ title, lead, actions }: { title: ReactNode; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1 className="text-2xl font-bold tracking-tight text-graphite-950">{title}</h1>
        {lead && <p className="mt-1 max-w-3xl text-graphite-600">{lead}</p>}
      </div>
      {actions && <div className="flex gap-2">{actions}</div>}
    </div>
  );
}

export function Loading({ what = 'Loading' }: { what?: string }) {
  return (
    <p className="flex items-center gap-2 text-graphite-500" role="status">
      <span aria-hidden className="size-4 animate-spin rounded-full border-2 border-copper-500 border-r-transparent" />
      {what}…
    </p>
  );
}
