import { PageHeading } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useCatalog } from '../../features/ingredients/api/get-catalog.ts';
import { IngredientTable } from '../../features/ingredients/components/ingredient-table.tsx';
import { paths } from '../paths.ts';

export default function IngredientsRoute() {
  const query = useCatalog();
  return (
    <>
      <PageHeading title="Ingredients" kicker="The bakehouse's catalog" />
      <QueryState query={query} label="Fetching the ingredients…">
        {(data) => <IngredientTable data={data} formulaHref={(id) => paths.formula.getHref(id)} />}
      </QueryState>
    </>
  );
}
