import { useMutation } from '@tanstack/react-query';
import type { ChangePasswordInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export interface ChangePasswordAnswer {
  message: string;
  /** How many other sign-ins (devices) were signed out. */
  signedOutElsewhere: number;
}

export const changePassword = (input: ChangePasswordInput) => api.post<ChangePasswordAnswer>('/me/password', input);

export const useChangePassword = () => useMutation({ mutationFn: changePassword });
