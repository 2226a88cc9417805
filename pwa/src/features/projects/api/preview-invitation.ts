import { queryOptions, useQuery } from '@tanstack/react-query';
import { requestJson } from '../../../lib/api-client.js';
import type { ProjectRole } from '../../../lib/db.js';

export interface InvitationPreview {
  projectName: string;
  role: ProjectRole;
  email: string;
  invitedBy: string | null;
  expiresAt: string;
  accountExists: boolean;
}

export const invitationKeys = {
  preview: (token: string) => ['invitations', 'preview', token] as const,
};

/** POST /api/invitations/preview (public): what the link offers. The token travels in the body. */
export async function previewInvitation(token: string, { signal }: { signal?: AbortSignal } = {}): Promise<InvitationPreview> {
  return (await requestJson('/api/invitations/preview', { method: 'POST', body: { token }, signal })) as InvitationPreview;
}

export const invitationPreviewQueryOptions = (token: string) =>
  queryOptions({ queryKey: invitationKeys.preview(token), queryFn: ({ signal }) => previewInvitation(token, { signal }), retry: false, staleTime: Infinity });

export function useInvitationPreview(token: string | null) {
  return useQuery({ ...invitationPreviewQueryOptions(token ?? ''), enabled: !!token });
}
