import type { Request } from 'express';

export const SITE_ROLES = ['admin', 'member'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

/** Project roles, strongest first (design.md: owner, editor, reviewer, viewer). */
export const PROJECT_ROLES = ['owner', 'editor', 'reviewer', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

/** Who sent the request, as the JWT guard leaves it on `request.user`. */
export interface AuthUser {
  id: string;
  email: string;
  displayName: string;
  siteRole: SiteRole;
}

/** What the project-role guard adds for routes under /projects/:projectId. */
export interface ProjectAccess {
  projectId: string;
  role: ProjectRole;
}

export interface AuthedRequest extends Request {
  user?: AuthUser;
  projectAccess?: ProjectAccess;
}
