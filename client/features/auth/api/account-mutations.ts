import type { ChangeEmailInput, DeleteAccountInput } from '@shared/schemas/account';
import type { QueryClient } from '@tanstack/react-query';
import { api, setCsrfToken } from '@client/lib/api-client';
import { type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { authKeys } from './auth-keys';

/** The session has ended (signed out, or the account deleted): its token and everything cached go, and nobody is signed in. */
export function forgetSession(queryClient: QueryClient) {
  setCsrfToken(undefined);
  queryClient.clear();
  queryClient.setQueryData(authKeys.me(), null);
}

/** Asks to move the account to a new address; the link goes there and the address changes only once it is followed. */
export const useChangeEmail = (options?: MutationOptions<{ pendingEmail: string }, ChangeEmailInput>) =>
  useApiMutation((input: ChangeEmailInput) => api.post<{ pendingEmail: string }>('/api/me/email', input), { refreshes: () => [authKeys.me()] }, options?.mutationConfig);

/** Follows the link mailed to the new address. */
export const useConfirmEmailChange = (options?: MutationOptions<{ email: string }, { token: string }>) =>
  useApiMutation((input: { token: string }) => api.post<{ email: string }>('/api/me/email/confirm', input), { refreshes: () => [authKeys.me()] }, options?.mutationConfig);

/** Deletes the account: the session ends with it, so everything cached goes and the person is signed out. */
export const useDeleteAccount = (options?: MutationOptions<unknown, DeleteAccountInput>) =>
  useApiMutation(
    (input: DeleteAccountInput) => api.post('/api/me/delete', input),
    { update: forgetSession },
    options?.mutationConfig,
  );
