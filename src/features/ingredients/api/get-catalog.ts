import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CatalogResponse } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

export function getCatalog(signal?: AbortSignal): Promise<CatalogResponse> {
  return apiRequest<CatalogResponse>('/api/catalog', { signal });
}

export function getCatalogQueryOptions() {
  return queryOptions({ queryKey: ['catalog'], queryFn: ({ signal }) => getCatalog(signal) });
}

export function useCatalog() {
  return useQuery(getCatalogQueryOptions());
}
