import { useMutation } from '@tanstack/react-query';
import { requestJson } from '../../../lib/api-client.js';
import { startSession, type SessionUser } from '../../../lib/auth.js';

export interface SignInInput {
  email: string;
  password: string;
}

/** POST /api/auth/sign-in; stores the session on this device. */
export async function signIn(input: SignInInput): Promise<SessionUser> {
  return startSession(await requestJson('/api/auth/sign-in', { method: 'POST', body: input }));
}

export function useSignIn() {
  return useMutation({ mutationFn: signIn });
}
