import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me, PreferencesBody } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';
import { setDeviceUnitSystem } from '../../../lib/units.ts';
import { getMeQueryOptions } from './get-me.ts';

export function updatePreferences(body: PreferencesBody): Promise<Me> {
  return apiRequest<Me>('/api/me/preferences', { method: 'PUT', body });
}

/** Saves the choice on the account; this device follows at once, before the server answers. */
export function useUpdatePreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePreferences,
    onMutate: (body) => setDeviceUnitSystem(body.unitSystem),
    onSuccess: (me) => queryClient.setQueryData(getMeQueryOptions().queryKey, me),
  });
}
