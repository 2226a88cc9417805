import { useMutation } from '@tanstack/react-query';
import { requestJson } from '../../../lib/api-client.js';

/**
 * POST /api/auth/password/forgot — the server e-mails a reset link (/reset-password#token=…) when
 * an account uses the address, and answers the same either way (so nobody learns who has an account).
 */
export async function requestPasswordReset(email: string): Promise<{ message: string }> {
  return (await requestJson('/api/auth/password/forgot', { method: 'POST', body: { email } })) as { message: string };
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
