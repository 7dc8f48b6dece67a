import type {
  ChangePasswordInput,
  GithubCompleteInput,
  Me,
  PasswordResetConfirmInput,
  PasswordResetRequestInput,
  SignedIn,
  SignInInput,
  SignUpInput,
} from '@shared/schemas/auth';
import { api } from '@client/lib/api-client';
import { type MutationConfig, type MutationOptions, useApiMutation } from '@client/lib/mutation';
import { forgetSession } from './account-mutations';
import { authKeys } from './auth-keys';

/** A mutation that signs someone in: the new user goes straight into the cache. */
const useSignedInMutation = <TVars>(path: string, mutationConfig?: MutationConfig<Me, TVars>) =>
  useApiMutation((input: TVars) => api.post<SignedIn>(path, input).then((r) => r.user), { update: (queryClient, user) => queryClient.setQueryData(authKeys.me(), user) }, mutationConfig);

export const useSignIn = (options?: MutationOptions<Me, SignInInput>) => useSignedInMutation<SignInInput>('/api/auth/login', options?.mutationConfig);

export const useSignUp = (options?: MutationOptions<Me, SignUpInput>) => useSignedInMutation<SignUpInput>('/api/auth/signup', options?.mutationConfig);

export const useCompleteGithub = (options?: MutationOptions<Me, GithubCompleteInput>) =>
  useSignedInMutation<GithubCompleteInput>('/api/auth/github/complete', options?.mutationConfig);

export const useSignOut = (options?: MutationOptions<void, void>) =>
  useApiMutation(
    () => api.post<void>('/api/auth/logout'),
    { update: forgetSession },
    options?.mutationConfig,
  );

export const useRequestPasswordReset = (options?: MutationOptions<unknown, PasswordResetRequestInput>) =>
  useApiMutation((input: PasswordResetRequestInput) => api.post('/api/auth/password-reset/request', input), {}, options?.mutationConfig);

export const useConfirmPasswordReset = (options?: MutationOptions<unknown, PasswordResetConfirmInput>) =>
  useApiMutation((input: PasswordResetConfirmInput) => api.post('/api/auth/password-reset/confirm', input), {}, options?.mutationConfig);

/** Changes the signed-in person's password; their other devices are signed out, this one stays. */
export const useChangePassword = (options?: MutationOptions<unknown, ChangePasswordInput>) =>
  useApiMutation((input: ChangePasswordInput) => api.post('/api/auth/password', input), {}, options?.mutationConfig);

export const useVerifyEmail = (options?: MutationOptions<unknown, { token: string }>) =>
  useApiMutation((input: { token: string }) => api.post('/api/auth/verify-email', input), { refreshes: () => [authKeys.me()] }, options?.mutationConfig);

export const useResendVerification = (options?: MutationOptions<unknown, void>) =>
  useApiMutation(() => api.post('/api/auth/verify-email/resend'), {}, options?.mutationConfig);
