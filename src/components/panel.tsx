import type { ReactNode } from 'react';

/** A card with a heading: one independent part of a page. */
export function Panel({
  title,
  children,
  aside,
  className = '',
  id,
}: {
  title: ReactNode;
  children: ReactNode;
  aside?: ReactNode;
  className?: string;
  id?: string;
}) {
  const headingId = id ? `${id}-title` : undefined;
  return (
    <section
      aria-labelledby={headingId}
      className={`rounded-2xl border border-line bg-card p-4 shadow-[0_1px_0_var(--color-line)] sm:p-5 print:rounded-none print:border-0 print:p-0 print:shadow-none ${className}`}
    >
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2 print:mb-1">
        <h2 id={headingId} className="text-xl font-semibold text-crust print:text-base">
          {title}
        </h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

export function PageHeading({ title, kicker, children }: { title: ReactNode; kicker?: ReactNode; children?: ReactNode }) {
  return (
    <header className="mb-5 flex flex-wrap items-end justify-between gap-3 print:mb-2">
      {/* React hoists <title> into the document head: tabs, history and printouts name the page. */}
      {typeof title === 'string' && <title>{`${title} · Panform`}</title>}
      <div>
        {kicker && <p className="text-sm font-semibold uppercase tracking-[0.14em] text-muted print:text-xs">{kicker}</p>}
        <h1 className="text-3xl font-bold sm:text-4xl print:text-2xl">{title}</h1>
      </div>
      {children && <div className="flex flex-wrap gap-2 print:hidden">{children}</div>}
    </header>
  );
}

export function Badge({ tone = 'plain', children }: { tone?: 'plain' | 'draft' | 'active' | 'retired' | 'warn'; children: ReactNode }) {
  const tones = {
    plain: 'bg-sunk text-ink',
    draft: 'bg-honey-soft text-honey',
    active: 'bg-sage-soft text-sage',
    retired: 'bg-sunk text-muted line-through decoration-1',
    warn: 'bg-ember-soft text-ember',
  } as const;
  return <span className={`inline-flex items-center rounded-full px-2.5 py-0.5 text-sm font-semibold ${tones[tone]}`}>{children}</span>;
}

export function statusTone(status: string): 'draft' | 'active' | 'retired' | 'plain' {
  return status === 'draft' || status === 'active' || status === 'retired' ? status : 'plain';
}

/** Plain words for a formula's status. */
export function statusWord(status: string): string {
  return status === 'active' ? 'in use' : status === 'draft' ? 'draft' : status === 'retired' ? 'retired' : status;
}

export function Notice({ tone = 'warn', title, children }: { tone?: 'warn' | 'info'; title?: ReactNode; children: ReactNode }) {
  const cls = tone === 'warn' ? 'border-ember bg-ember-soft' : 'border-line bg-crumb';
  return (
    <div role="note" className={`rounded-xl border-l-4 px-4 py-3 ${cls}`}>
      {title && <p className="font-semibold">{title}</p>}
      <div className="text-base">{children}</div>
    </div>
  );
}
