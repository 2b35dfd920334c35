import { PageHeading } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { usePlans } from '../../features/plans/api/get-plans.ts';
import { PlanList } from '../../features/plans/components/plan-list.tsx';
import { localDay } from '../../features/plans/lib/bake-days.ts';
import { useClock } from '../../features/plans/lib/use-clock.ts';
import { paths } from '../paths.ts';

export default function PlansRoute() {
  const query = usePlans();
  const today = localDay(useClock(60_000)).day;
  return (
    <>
      <PageHeading title="Bake days" kicker="Production plans" />
      <QueryState query={query} label="Fetching the bake days…">
        {(data) => <PlanList plans={data.plans} hrefOf={(d) => paths.plan.getHref(d)} today={today} />}
      </QueryState>
    </>
  );
}
