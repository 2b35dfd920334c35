import { Link } from 'react-router';
import type { PlanSummary } from '#shared/api';
import { dayParts, longDate } from '../../../lib/format.ts';

export function PlanList({ plans, hrefOf }: { plans: PlanSummary[]; hrefOf: (date: string) => string }) {
  if (plans.length === 0) {
    return <p className="rounded-2xl border-2 border-dashed border-line p-6 text-center text-lg text-muted">No bake days are planned yet.</p>;
  }
  return (
    <ul aria-label="Bake days" className="grid gap-3 md:grid-cols-2">
      {plans.map((p) => (
        <li key={p.date}>
          <Link
            to={hrefOf(p.date)}
            data-plan={p.date}
            className="group flex h-full gap-4 rounded-2xl border border-line bg-card p-4 shadow-[0_2px_0_var(--color-line)] hover:border-crust"
          >
            <DayStamp date={p.date} />
            <div className="min-w-0">
              <h2 className="text-2xl font-semibold group-hover:text-crust">{longDate(p.date)}</h2>
              <p className="text-muted">
                first bake out by <span className="figure font-bold text-ink">{p.readyBy}</span> · {p.orders} {p.orders === 1 ? 'order' : 'orders'}
              </p>
              <p className="mt-1 truncate">{p.formulas.join(', ')}</p>
            </div>
          </Link>
        </li>
      ))}
    </ul>
  );
}

function DayStamp({ date }: { date: string }) {
  const p = dayParts(date);
  if (!p) return null;
  return (
    <div aria-hidden="true" className="grid h-20 w-20 shrink-0 place-content-center rounded-xl bg-crust text-center text-on-crust">
      <span className="text-sm uppercase tracking-wider">{p.weekday.slice(0, 3)}</span>
      <span className="figure text-3xl font-bold leading-none">{p.day}</span>
      <span className="text-sm uppercase tracking-wider">{p.month.slice(0, 3)}</span>
    </div>
  );
}
