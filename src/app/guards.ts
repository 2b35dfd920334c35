// Loader guards: who is signed in, and whether their role may open a page.
import type { QueryClient } from '@tanstack/react-query';
import { data, redirect } from 'react-router';
import type { Me } from '#shared/api';
import type { Permission } from '#shared/permissions';
import { getMeQueryOptions } from '../features/auth/api/get-me.ts';
import { statusOf } from '../lib/api-client.ts';
import { paths } from './paths.ts';

/** The signed-in person, or a redirect to the sign-in page that comes back here. */
export async function requireMe(queryClient: QueryClient, request: Request): Promise<Me> {
  try {
    return await queryClient.ensureQueryData(getMeQueryOptions());
  } catch (error) {
    if (statusOf(error) === 401) {
      const url = new URL(request.url);
      throw redirect(paths.signIn.getHref(url.pathname + url.search));
    }
    throw error;
  }
}

/** The same rule the server enforces: a page the role cannot open answers 403 before it loads. */
export async function requirePermission(queryClient: QueryClient, request: Request, permission: Permission): Promise<Me> {
  const me = await requireMe(queryClient, request);
  if (!me.permissions.includes(permission)) throw data({ requiredPermission: permission }, { status: 403 });
  return me;
}

