import { useMutation } from '@tanstack/react-query';
import { requestJson } from '../../../lib/api-client.js';
import { startSession, type SessionUser } from '../../../lib/auth.js';

export interface RegisterInput {
  email: string;
  displayName: string;
  password: string;
}

/** POST /api/auth/register; the new account is signed in on this device. */
export async function register(input: RegisterInput): Promise<SessionUser> {
  return startSession(await requestJson('/api/auth/register', { method: 'POST', body: input }));
}

export function useRegister() {
  return useMutation({ mutationFn: register });
}
