import { useCallback } from 'react';
import { useSearchParams } from 'react-router';
import { PageHeading } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useMe } from '../../features/auth/api/get-me.ts';
import { filtersFromSearch, useFormulas, type FormulaFilters as Filters } from '../../features/formulas/api/get-formulas.ts';
import { FormulaFilters } from '../../features/formulas/components/formula-filters.tsx';
import { FormulaList } from '../../features/formulas/components/formula-list.tsx';
import { paths } from '../paths.ts';

export default function FormulasRoute() {
  const [params, setParams] = useSearchParams();
  const me = useMe().data;
  const canSeeDrafts = me?.permissions.includes('read:formula:draft') ?? false;
  const filters = filtersFromSearch(params);
  if (!canSeeDrafts) filters.status = undefined;
  const query = useFormulas(filters);

  const onChange = useCallback(
    (next: Filters) => {
      const s = new URLSearchParams();
      for (const [k, v] of Object.entries(next)) if (v) s.set(k, v);
      setParams(s, { replace: true });
    },
    [setParams],
  );

  return (
    <>
      <PageHeading title="Formulas" kicker="The dough book" />
      <div className="mb-5">
        <FormulaFilters
          value={filters}
          onChange={onChange}
          categories={query.data?.categories ?? []}
          tags={query.data?.tags ?? []}
          showStatus={canSeeDrafts}
        />
      </div>
      <QueryState query={query} label="Fetching the formulas…">
        {(data) => (
          <>
            <p className="mb-2 text-muted" aria-live="polite">
              {data.formulas.length === 1 ? '1 formula' : `${data.formulas.length} formulas`}
            </p>
            <FormulaList formulas={data.formulas} busy={query.isPlaceholderData} hrefOf={(id) => paths.formula.getHref(id)} />
          </>
        )}
      </QueryState>
    </>
  );
}
