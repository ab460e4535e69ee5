import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  ConfirmEmailInput,
  LoginInput,
  ProfileUpdateInput,
  RegisterInput,
  ResetInput,
  ResetRequestInput,
} from '@shared/schemas/auth';
import type { MeDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import { closeSocket } from '@/lib/socket';
import { meKeys } from '@/entities/me/api/me-keys';

export const login = (input: LoginInput) => api.post<MeDto>('/auth/login', input);
/** Asks for an account: the answer is the same whether or not the address has one; the mail says which. */
export const register = (input: RegisterInput) => api.post<{ message: string }>('/auth/register', input);
/** Opens the link from the sign-up mail: makes the account and signs in. */
export const confirmEmail = (input: ConfirmEmailInput) => api.post<MeDto>('/auth/confirm-email', input);
export const logout = () => api.post<void>('/auth/logout');
export const requestReset = (input: ResetRequestInput) => api.post<{ message: string }>('/auth/reset-request', input);
export const resetPassword = (input: ResetInput) => api.post<{ message: string }>('/auth/reset', input);
export const updateProfile = (input: ProfileUpdateInput) => api.patch<MeDto>('/me', input);

/** Signing in or out changes everything a page shows, so the whole cache starts over. */
function useSessionChange<I>(fn: (input: I) => Promise<MeDto | void>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (me) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== meKeys.all[0] });
      queryClient.setQueryData(meKeys.me(), me ?? null);
    },
  });
}

export const useLogin = () => useSessionChange(login);
export const useRegister = () => useMutation({ mutationFn: register });
export const useConfirmEmail = () => useSessionChange(confirmEmail);
/**
 * Signing out ends with a full page load of the sign-in page: nothing the last person saw stays in
 * memory, and the page guards never see a half-cleared cache (which used to race them to a
 * "sign in to come back here" redirect).
 */
export const useLogout = () =>
  useMutation({
    mutationFn: () => logout(),
    onSuccess: () => {
      closeSocket(); // the live connection belonged to the session that just ended
      window.location.replace(paths.signIn);
    },
  });
export const useRequestReset = () => useMutation({ mutationFn: requestReset });
export const useResetPassword = () => useMutation({ mutationFn: resetPassword });

export function useUpdateProfile() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateProfile, onSuccess: (me) => queryClient.setQueryData(meKeys.me(), me) });
}
