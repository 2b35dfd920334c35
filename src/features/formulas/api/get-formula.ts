import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FormulaDetail } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

/** The formula at its reference batch; the viewer scales it itself with shared/scale. */
export function getFormula(id: string, signal?: AbortSignal): Promise<FormulaDetail> {
  return apiRequest<FormulaDetail>(`/api/formulas/${encodeURIComponent(id)}`, { signal });
}

export function getFormulaQueryOptions(id: string) {
  return queryOptions({ queryKey: ['formulas', 'detail', id], queryFn: ({ signal }) => getFormula(id, signal) });
}

export function useFormula(id: string) {
  return useQuery(getFormulaQueryOptions(id));
}
