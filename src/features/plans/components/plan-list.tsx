import { Link } from 'react-router';
import type { PlanSummary } from '#shared/api';
import { dayParts, longDate } from '../../../lib/format.ts';
import { orderBakeDays, whenOf, type When } from '../lib/bake-days.ts';

/** The bake days: today first and marked, then the days to come, then the days gone by. */
export function PlanList({ plans, hrefOf, today }: { plans: PlanSummary[]; hrefOf: (date: string) => string; today: string }) {
  if (plans.length === 0) {
    return <p className="rounded-2xl border-2 border-dashed border-line p-6 text-center text-lg text-muted">No bake days are planned yet.</p>;
  }
  const ordered = orderBakeDays(plans, today);
  const firstPast = ordered.findIndex((p) => p.date < today);
  return (
    <ul aria-label="Bake days" className="grid gap-3 md:grid-cols-2">
      {ordered.map((p, i) => {
        const when = whenOf(p.date, today);
        return (
          <li key={p.date} className={i === firstPast ? 'md:col-span-2 md:mt-2' : ''} data-when={when}>
            {i === firstPast && <h2 className="mb-2 text-lg font-semibold text-muted">Days gone by</h2>}
            <Link
              to={hrefOf(p.date)}
              data-plan={p.date}
              aria-current={when === 'today' ? 'date' : undefined}
              className={`group flex h-full gap-4 rounded-2xl border bg-card p-4 shadow-[0_2px_0_var(--color-line)] hover:border-crust ${
                when === 'today' ? 'border-2 border-crust' : 'border-line'
              } ${when === 'past' ? 'opacity-80' : ''} ${i === firstPast ? 'md:w-[calc(50%-0.375rem)]' : ''}`}
            >
              <DayStamp date={p.date} when={when} />
              <div className="min-w-0">
                {when === 'today' && (
                  <p className="mb-1 inline-flex rounded-full bg-crust px-2.5 py-0.5 text-sm font-bold uppercase tracking-wider text-on-crust" data-testid="today">
                    Today
                  </p>
                )}
                <h2 className="text-2xl font-semibold group-hover:text-crust">{longDate(p.date)}</h2>
                <p className="text-muted">
                  first bake out by <span className="figure font-bold text-ink">{p.readyBy}</span> · {p.orders} {p.orders === 1 ? 'order' : 'orders'}
                </p>
                <p className="mt-1">{p.titles.join(', ')}</p>
                {p.notes && <p className="mt-1 text-sm text-muted">{p.notes}</p>}
              </div>
            </Link>
          </li>
        );
      })}
    </ul>
  );
}

function DayStamp({ date, when }: { date: string; when: When }) {
  const p = dayParts(date);
  if (!p) return null;
  return (
    <div aria-hidden="true" className={`grid h-20 w-20 shrink-0 place-content-center rounded-xl text-center ${when === 'past' ? 'bg-sunk text-ink' : 'bg-crust text-on-crust'}`}>
      <span className="text-sm uppercase tracking-wider">{p.weekday.slice(0, 3)}</span>
      <span className="figure text-3xl font-bold leading-none">{p.day}</span>
      <span className="text-sm uppercase tracking-wider">{p.month.slice(0, 3)}</span>
    </div>
  );
}
