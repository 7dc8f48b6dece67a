import { useMutation, useQueryClient, type UseMutationOptions } from '@tanstack/react-query';
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
import { api, setCsrfToken, type ApiError } from '@client/lib/api-client';
import { authKeys } from './auth-keys';

type MutationConfig<TData, TVars> = Omit<UseMutationOptions<TData, ApiError, TVars>, 'mutationFn'>;

/** A mutation that signs someone in: the new user goes straight into the cache. */
function useSignedInMutation<TVars>(path: string, mutationConfig?: MutationConfig<Me, TVars>) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = mutationConfig ?? {};
  return useMutation<Me, ApiError, TVars>({
    ...rest,
    mutationFn: (input) => api.post<SignedIn>(path, input).then((r) => r.user),
    onSuccess: (user, ...args) => {
      queryClient.setQueryData(authKeys.me(), user);
      return onSuccess?.(user, ...args);
    },
  });
}

export const useSignIn = (options?: { mutationConfig?: MutationConfig<Me, SignInInput> }) =>
  useSignedInMutation<SignInInput>('/api/auth/login', options?.mutationConfig);

export const useSignUp = (options?: { mutationConfig?: MutationConfig<Me, SignUpInput> }) =>
  useSignedInMutation<SignUpInput>('/api/auth/signup', options?.mutationConfig);

export const useCompleteGithub = (options?: { mutationConfig?: MutationConfig<Me, GithubCompleteInput> }) =>
  useSignedInMutation<GithubCompleteInput>('/api/auth/github/complete', options?.mutationConfig);

export function useSignOut(options?: { mutationConfig?: MutationConfig<void, void> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<void, ApiError, void>({
    ...rest,
    mutationFn: () => api.post<void>('/api/auth/logout'),
    onSuccess: (...args) => {
      setCsrfToken(undefined);
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
      return onSuccess?.(...args);
    },
  });
}

export const useRequestPasswordReset = (options?: { mutationConfig?: MutationConfig<unknown, PasswordResetRequestInput> }) =>
  useMutation<unknown, ApiError, PasswordResetRequestInput>({
    ...options?.mutationConfig,
    mutationFn: (input) => api.post('/api/auth/password-reset/request', input),
  });

export const useConfirmPasswordReset = (options?: { mutationConfig?: MutationConfig<unknown, PasswordResetConfirmInput> }) =>
  useMutation<unknown, ApiError, PasswordResetConfirmInput>({
    ...options?.mutationConfig,
    mutationFn: (input) => api.post('/api/auth/password-reset/confirm', input),
  });

/** Changes the signed-in person's password; their other devices are signed out, this one stays. */
export const useChangePassword = (options?: { mutationConfig?: MutationConfig<unknown, ChangePasswordInput> }) =>
  useMutation<unknown, ApiError, ChangePasswordInput>({
    ...options?.mutationConfig,
    mutationFn: (input) => api.post('/api/auth/password', input),
  });

export function useVerifyEmail(options?: { mutationConfig?: MutationConfig<unknown, { token: string }> }) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = options?.mutationConfig ?? {};
  return useMutation<unknown, ApiError, { token: string }>({
    ...rest,
    mutationFn: (input) => api.post('/api/auth/verify-email', input),
    onSuccess: (...args) => {
      void queryClient.invalidateQueries({ queryKey: authKeys.me() });
      return onSuccess?.(...args);
    },
  });
}

export const useResendVerification = (options?: { mutationConfig?: MutationConfig<unknown, void> }) =>
  useMutation<unknown, ApiError, void>({
    ...options?.mutationConfig,
    mutationFn: () => api.post('/api/auth/verify-email/resend'),
  });
