import { useState } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { AppLayout, ShellLoading } from './routes/app-layout.js';
import { RouteError } from './routes/route-error.js';

/** Route table; pages load lazily, the shell itself is in the main chunk. */
export const routes: RouteObject[] = [
  {
    path: '/',
    Component: AppLayout,
    HydrateFallback: ShellLoading,
    ErrorBoundary: RouteError,
    children: [
      { index: true, lazy: () => import('./routes/home.js') },
      { path: 'status', lazy: () => import('./routes/status.js') },
      { path: 'models/new', lazy: () => import('./routes/model-edit.js') },
      { path: 'models/:id', lazy: () => import('./routes/model-edit.js') },
      { path: 'models/:id/sweep', lazy: () => import('./routes/sweep-new.js') },
      { path: 'sweeps/:id', lazy: () => import('./routes/sweep-run.js') },
      { path: 'maps/:id', lazy: () => import('./routes/map-page.js') },
      { path: 'projects', lazy: () => import('./routes/projects.js') },
      { path: 'projects/device', lazy: () => import('./routes/workspace.js') },
      { path: 'projects/:id', lazy: () => import('./routes/project-home.js') },
      { path: 'projects/:id/members', lazy: () => import('./routes/members.js') },
      { path: 'projects/:projectId/maps/:mapId/review', lazy: () => import('./routes/review-page.js') },
      // The address a review-request e-mail links to (sync-server/src/reviews/reviews.service.ts).
      { path: 'projects/:projectId/maps/:mapId/reviews/:reviewId', lazy: () => import('./routes/review-page.js') },
      { path: 'sign-in', lazy: () => import('./routes/sign-in.js') },
      { path: 'register', lazy: () => import('./routes/register.js') },
      { path: 'reset-password', lazy: () => import('./routes/reset-password.js') },
      { path: 'invitations/accept', lazy: () => import('./routes/invitation-accept.js') },
      { path: 'admin/mail', lazy: () => import('./routes/admin-mail.js') },
      { path: 'sync', lazy: () => import('./routes/sync.js') },
      { path: 'compare', lazy: () => import('./routes/compare.js') },
      { path: '*', lazy: () => import('./routes/not-found.js') },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
