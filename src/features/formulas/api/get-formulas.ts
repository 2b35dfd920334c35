import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { FormulaListResponse } from '#shared/api';
import { apiRequest, withQuery } from '../../../lib/api-client.ts';

export interface FormulaFilters {
  q?: string;
  category?: string;
  tag?: string;
  status?: string;
}

/** The filters as the formulas page keeps them in its URL. */
export function filtersFromSearch(params: URLSearchParams): FormulaFilters {
  return {
    q: params.get('q') ?? undefined,
    category: params.get('category') ?? undefined,
    tag: params.get('tag') ?? undefined,
    status: params.get('status') ?? undefined,
  };
}

export function getFormulas(filters: FormulaFilters, signal?: AbortSignal): Promise<FormulaListResponse> {
  return apiRequest<FormulaListResponse>(withQuery('/api/formulas', { ...filters }), { signal });
}

export function getFormulasQueryOptions(filters: FormulaFilters = {}) {
  const key = { q: filters.q?.trim() || undefined, category: filters.category || undefined, tag: filters.tag || undefined, status: filters.status || undefined };
  return queryOptions({
    queryKey: ['formulas', key],
    queryFn: ({ signal }) => getFormulas(key, signal),
    // Keep the last rows on screen while the next letter's answer comes in.
    placeholderData: keepPreviousData,
  });
}

export function useFormulas(filters: FormulaFilters) {
  return useQuery(getFormulasQueryOptions(filters));
}
