import { Link } from 'react-router';
import { ALLERGEN_CAUTION, ALLERGEN_NAMES } from '#shared/allergens';
import type { CatalogResponse } from '#shared/api';
import type { CatalogItem } from '#shared/model';
import { money } from '../../../lib/format.ts';

const KIND_WORD: Record<string, string> = {
  flour: 'Flour',
  water: 'Water',
  salt: 'Salt',
  yeast: 'Yeast',
  culture: 'Culture',
};

function waterText(item: CatalogItem): { value: string; source: string } {
  if (item.waterSource) return { value: `${item.water} %`, source: item.waterSource };
  // A default is shown as one, with where it comes from.
  return { value: `${item.water} %`, source: item.kind === 'water' ? 'water itself' : 'none given: Panform counts no water for this kind (a default)' };
}

/**
 * Every ingredient in the catalog: kind, allergens, water content with its source, the price
 * and its date when the server sent them (author and admin), and the formulas that use it.
 */
export function IngredientTable({ data, formulaHref }: { data: CatalogResponse; formulaHref: (id: string) => string }) {
  const items = Object.values(data.catalog).sort((a, b) => a.name.localeCompare(b.name));
  const prices = items.some((i) => i.costPerKg !== undefined);
  return (
    <div className="space-y-3">
      <div className="overflow-x-auto rounded-2xl border border-line bg-card">
        <table className="w-full text-left" data-testid="ingredients">
          <thead>
            <tr className="border-b-2 border-line text-sm text-muted">
              <th scope="col" className="px-3 py-2">Ingredient</th>
              <th scope="col" className="px-3 py-2">Kind</th>
              <th scope="col" className="px-3 py-2">Allergens</th>
              <th scope="col" className="px-3 py-2">Water</th>
              {prices && <th scope="col" className="px-3 py-2 text-right">Price per kg</th>}
              <th scope="col" className="px-3 py-2">Used in</th>
            </tr>
          </thead>
          <tbody>
            {items.map((item) => {
              const water = waterText(item);
              const used = data.usedBy[item.name] ?? [];
              return (
                <tr key={item.name} data-ingredient={item.name} className="border-b border-dashed border-line align-top">
                  <th scope="row" className="px-3 py-2 text-lg font-semibold">
                    {item.name}
                    {item.note && <span className="block text-sm font-normal text-muted">{item.note}</span>}
                  </th>
                  <td className="px-3 py-2">{KIND_WORD[item.kind] ?? item.kind[0].toUpperCase() + item.kind.slice(1)}</td>
                  <td className="px-3 py-2" data-testid="allergens">
                    {item.allergens.length === 0 ? <span className="text-muted">none listed</span> : item.allergens.map((a) => ALLERGEN_NAMES[a] ?? a).join(', ')}
                  </td>
                  <td className="px-3 py-2">
                    <span className="figure font-semibold">{water.value}</span>
                    <span className="block text-sm text-muted">{water.source}</span>
                  </td>
                  {prices && (
                    <td className="figure px-3 py-2 text-right" data-testid="price">
                      {item.costPerKg === undefined ? (
                        <span className="text-muted">no price</span>
                      ) : (
                        <>
                          {money(item.costPerKg)}
                          {item.costDate && <span className="block text-sm text-muted">as of {item.costDate}</span>}
                        </>
                      )}
                    </td>
                  )}
                  <td className="px-3 py-2">
                    {used.length === 0 ? (
                      <span className="text-muted">no formula</span>
                    ) : (
                      <ul className="flex flex-wrap gap-x-3">
                        {used.map((f) => (
                          <li key={f.id}>
                            <Link to={formulaHref(f.id)} className="text-crust underline underline-offset-2">
                              {f.title}
                            </Link>
                          </li>
                        ))}
                      </ul>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-muted">{ALLERGEN_CAUTION}</p>
    </div>
  );
}
