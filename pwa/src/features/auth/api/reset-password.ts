import { useMutation } from '@tanstack/react-query';
import { requestJson } from '../../../lib/api-client.js';

export interface ResetPasswordInput {
  /** The token from the e-mailed link's fragment (#token=…). */
  token: string;
  password: string;
}

/**
 * POST /api/auth/password/reset (204). The token works once; the new password signs out every
 * session of the account. A used, expired or mistyped token is a 400 at `token`; a weak password a
 * 400 at `password`.
 */
export async function resetPassword(input: ResetPasswordInput): Promise<void> {
  await requestJson('/api/auth/password/reset', { method: 'POST', body: input });
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
