import { queryOptions } from '@tanstack/react-query';
import type { DeletionCheck } from '@shared/schemas/account';
import type { Me, PendingGithubAnswer, SessionAnswer } from '@shared/schemas/auth';
import { api } from '@client/lib/api-client';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
  pendingGithub: () => [...authKeys.all, 'pending-github'] as const,
  deletion: () => [...authKeys.all, 'deletion'] as const,
};

/**
 * The signed-in person, or null when signed out. Asked of /api/auth/session, which
 * answers 200 either way, so a signed-out visitor's browser logs no failed request.
 */
export async function getMe(): Promise<Me | null> {
  const { user } = await api.get<SessionAnswer>('/api/auth/session');
  return user;
}

export const authQueries = {
  me: () => queryOptions({ queryKey: authKeys.me(), queryFn: getMe, staleTime: 60_000 }),
  pendingGithub: () =>
    queryOptions({
      queryKey: authKeys.pendingGithub(),
      queryFn: () => api.get<PendingGithubAnswer>('/api/auth/github/pending').then((r) => r.pending),
      retry: false,
    }),
  /** Whether the account can be deleted now, and what stands in the way. */
  deletion: () => queryOptions({ queryKey: authKeys.deletion(), queryFn: () => api.get<DeletionCheck>('/api/me/deletion') }),
};
