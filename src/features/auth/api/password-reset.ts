import { useMutation } from '@tanstack/react-query';
import type { PasswordResetConfirmBody, PasswordResetRequestBody } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';

/** Always answered 202, so the page cannot tell whether the e-mail has an account. */
export const useRequestPasswordReset = () =>
  useMutation({
    mutationFn: (body: PasswordResetRequestBody) => api.post<void>('/auth/password-reset/request', body),
  });

export const useConfirmPasswordReset = () =>
  useMutation({
    mutationFn: (body: PasswordResetConfirmBody) => api.post<void>('/auth/password-reset/confirm', body),
  });
