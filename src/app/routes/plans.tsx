import type { QueryClient } from '@tanstack/react-query';
import { PageHeading } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { getPlansQueryOptions, usePlans } from '../../features/plans/api/get-plans.ts';
import { PlanList } from '../../features/plans/components/plan-list.tsx';
import { paths } from '../paths.ts';
import { requirePermission } from '../guards.ts';
import type { LoaderFunctionArgs } from 'react-router';

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requirePermission(queryClient, request, 'read:plan');
  void queryClient.prefetchQuery(getPlansQueryOptions());
  return null;
};

export default function PlansRoute() {
  const query = usePlans();
  return (
    <>
      <PageHeading title="Bake days" kicker="Production plans" />
      <QueryState query={query} label="Fetching the bake days…">
        {(data) => <PlanList plans={data.plans} hrefOf={(d) => paths.plan.getHref(d)} />}
      </QueryState>
    </>
  );
}
