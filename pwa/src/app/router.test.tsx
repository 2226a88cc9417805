import { CORE_VERSION } from '@phasewright/physics-core';
import { cleanup, render, screen, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { AppProvider } from './provider.js';
import { routes } from './router.js';
import { createQueryClient } from '../lib/query-client.js';

function renderAt(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <AppProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return router;
}

describe('app shell', () => {
  it('renders the navigation, the home page and the core version from physics-core', async () => {
    renderAt('/');
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'Home' }).getAttribute('aria-current')).toBe('page');
    expect(within(nav).getByRole('link', { name: 'Status' }).getAttribute('href')).toBe('/status');
    expect(await screen.findByRole('heading', { level: 1, name: /phase diagrams/i })).toBeTruthy();
    expect(screen.getByText('Fidelity peaks indicate, they do not prove')).toBeTruthy();
    expect(screen.getByTestId('core-version').textContent).toBe(`physics-core v${CORE_VERSION}`);
    expect(CORE_VERSION).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('shows the 404 page inside the shell for an unknown path', async () => {
    renderAt('/no/such/page');
    expect(await screen.findByRole('heading', { name: 'No page here' })).toBeTruthy();
    expect(screen.getByText('/no/such/page')).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });

  it('opens the reset link of the e-mail (/reset-password#token=…) as the new-password form, and without a token as the request form', async () => {
    renderAt('/reset-password#token=abc123');
    expect(await screen.findByRole('heading', { level: 1, name: 'Choose a new password' })).toBeTruthy();
    expect(screen.getByRole('form', { name: 'Choose a new password' })).toBeTruthy();
    cleanup();
    renderAt('/reset-password?email=pim%40example.org');
    expect(await screen.findByRole('heading', { level: 1, name: 'Forgot your password?' })).toBeTruthy();
    expect((screen.getByRole('textbox', { name: 'E-mail address' }) as HTMLInputElement).value).toBe('pim@example.org');
  });

  it('routes the review link of a review-request e-mail to the review page (not the 404 page)', async () => {
    // The address sync-server/src/reviews/reviews.service.ts puts into the e-mail; signed out here.
    renderAt('/projects/p1/maps/m1/reviews/r1');
    expect(await screen.findByText('Sign in to open this review')).toBeTruthy();
    expect(screen.getByTestId('review-sign-in').getAttribute('href')).toBe(`/sign-in?next=${encodeURIComponent('/projects/p1/maps/m1/reviews/r1')}`);
    expect(screen.queryByRole('heading', { name: 'No page here' })).toBeNull();
  });
});
