import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest, withQuery } from '../../../lib/api-client.ts';
import type { FrictionProposal, FrictionResponse } from './types.ts';

export function getFriction(params: { mixer?: string; formula?: string; date?: string }, signal?: AbortSignal): Promise<FrictionResponse> {
  return apiRequest<FrictionResponse>(withQuery('/api/friction', params), { signal });
}

export function getFrictionQueryOptions(params: { mixer?: string; formula?: string; date?: string }) {
  return queryOptions({ queryKey: ['friction', params.mixer ?? '', params.formula ?? '', params.date ?? ''], queryFn: ({ signal }) => getFriction(params, signal) });
}

/** The bench's friction for one mixer and formula, learned from the records; undefined while unknown or when there is none. */
export function useFrictionProposal(mixer: string, formula: string, date: string, enabled: boolean): FrictionProposal | undefined {
  const query = useQuery({ ...getFrictionQueryOptions({ mixer, formula, date: date || undefined }), enabled: enabled && mixer !== '' && formula !== '' });
  return query.data?.proposals.find((p) => p.mixer === mixer && p.formula === formula);
}
