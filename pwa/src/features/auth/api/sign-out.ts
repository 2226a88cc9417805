import { useMutation, useQueryClient } from '@tanstack/react-query';
import { signOut } from '../../../lib/auth.js';

/** Signs out (server and device); cached server data of the account is dropped from the query cache. */
export function useSignOut() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => client.removeQueries(),
  });
}
