import type { ModelSpec } from '@phasewright/physics-core';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { beforeEach, describe, expect, it } from 'vitest';
import { db, LOCAL_PROJECT_ID } from '../../../lib/db.js';
import { ProjectItems } from './project-items.js';

const spec = { spec: 'phasewright.model/1', lattice: { kind: 'chain', size: [6], boundary: ['periodic'] }, particles: { kind: 'hardcore', filling: 0.5 }, parameters: { J: 1 }, terms: [] } as unknown as ModelSpec;

beforeEach(async () => {
  await db.models.clear();
  await db.models.bulkAdd([
    { id: 'm-local', projectId: LOCAL_PROJECT_ID, ownerId: null, name: 'local chain', spec, createdAt: 1, updatedAt: 1 },
    { id: 'm-shared', projectId: 'p1', ownerId: 'u-otto', name: 'shared chain', spec, createdAt: 2, updatedAt: 2 },
  ]);
});

const show = (el: React.ReactElement) => render(<MemoryRouter>{el}</MemoryRouter>);

describe('ProjectItems', () => {
  it("this device's own space names no author (nothing there has an owner) and offers no author filter", async () => {
    show(<ProjectItems projectId={LOCAL_PROJECT_ID} myUserId="u-otto" />);
    const item = (await screen.findByRole('link', { name: 'local chain' })).closest('li') as HTMLElement;
    expect(within(item).queryByText(/^by /)).toBeNull();
    expect(screen.queryByRole('combobox', { name: 'Author' })).toBeNull();
  });

  it('a project names each author, the signed-in one as "me"', async () => {
    show(<ProjectItems projectId="p1" myUserId="u-otto" authors={{ 'u-otto': 'Otto Vane', 'u-lena': 'Lena Quartz' }} />);
    const item = (await screen.findByRole('link', { name: 'shared chain' })).closest('li') as HTMLElement;
    expect(within(item).getByText('by Otto Vane (me)')).toBeTruthy();
    expect(screen.getByRole('combobox', { name: 'Author' })).toBeTruthy();
  });

  it('deletes an item of this device after the dialog is confirmed; "Keep it" keeps it', async () => {
    show(<ProjectItems projectId={LOCAL_PROJECT_ID} deletable={{ isRunning: () => false }} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Delete model local chain' }));
    const dialog = await screen.findByRole('dialog');
    expect(within(dialog).getByText(/This deletes the model "local chain" with 0 sweeps, 0 maps and 0 computed points from this browser/)).toBeTruthy();
    fireEvent.click(within(dialog).getByRole('button', { name: 'Keep it' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(await db.models.get('m-local')).toBeDefined();
    fireEvent.click(screen.getByRole('button', { name: 'Delete model local chain' }));
    fireEvent.click(within(await screen.findByRole('dialog')).getByRole('button', { name: 'Delete for good' }));
    await waitFor(() => expect(screen.queryByRole('link', { name: 'local chain' })).toBeNull());
    expect(await db.models.get('m-local')).toBeUndefined();
    expect(await db.models.get('m-shared')).toBeDefined();
  });

  it('offers no Delete in a server project', async () => {
    show(<ProjectItems projectId="p1" myUserId="u-otto" authors={{ 'u-otto': 'Otto Vane' }} />);
    await screen.findByRole('link', { name: 'shared chain' });
    expect(screen.queryByRole('button', { name: /^Delete/ })).toBeNull();
  });
});
