import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiCall } from '../../../lib/auth.js';

/** GET /api/admin/mail — what the server's fake SMTP store captured (site admins). */
export interface MailMessage {
  id: number;
  from: string;
  to: string;
  subject: string;
  text: string;
  html: string;
  links: string[];
  receivedAt: string;
}

export const mailKeys = {
  list: (to: string) => ['admin', 'mail', to] as const,
};

export function getMail(to: string, { signal }: { signal?: AbortSignal } = {}): Promise<MailMessage[]> {
  const q = new URLSearchParams({ limit: '100', ...(to ? { to } : {}) });
  return apiCall<MailMessage[]>(`/api/admin/mail?${q.toString()}`, { signal });
}

export const mailQueryOptions = (to: string) => queryOptions({ queryKey: mailKeys.list(to), queryFn: ({ signal }) => getMail(to, { signal }), retry: false, staleTime: 0 });

export function useMail(to: string) {
  return useQuery(mailQueryOptions(to));
}
