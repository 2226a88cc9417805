import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { blankDraft } from '../lib/model-draft.js';
import { ModelEditor } from './model-editor.js';

function field(path: string): HTMLInputElement {
  const el = document.querySelector<HTMLInputElement>(`[data-path="${path}"]`);
  if (!el) throw new Error(`no field for ${path}`);
  return el;
}

/** The error text the field at `path` shows (Headless UI links it by aria-describedby). */
function errorOf(path: string): string {
  const ids = field(path).getAttribute('aria-describedby') ?? '';
  return ids
    .split(' ')
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ');
}

describe('ModelEditor validation as you type', () => {
  it('a bad amplitude shows the validator message next to that field, and saving is blocked', async () => {
    const onSave = vi.fn();
    render(<ModelEditor initial={blankDraft()} onSave={onSave} />);
    expect(await screen.findByText('The model is valid.')).toBeTruthy();
    fireEvent.change(field('$.terms[0].amplitude'), { target: { value: '-J*q' } });
    await waitFor(() => expect(errorOf('$.terms[0].amplitude')).toMatch(/unknown symbol 'q'/));
    expect(field('$.terms[0].amplitude').getAttribute('aria-invalid')).toBe('true');
    // Other fields stay clean.
    expect(errorOf('$.terms[1].amplitude')).not.toMatch(/unknown symbol/);
    const save = screen.getByRole('button', { name: 'Save model' });
    expect(save.hasAttribute('disabled') || save.getAttribute('data-disabled') !== null).toBe(true);
    const summary = screen.getByTestId('validation-summary');
    expect(within(summary).getByText('$.terms[0].amplitude')).toBeTruthy();
  });

  it('a non-integer cell count is reported at $.lattice.size[0]; fixing it clears the error', async () => {
    render(<ModelEditor initial={blankDraft()} onSave={() => {}} />);
    fireEvent.change(field('$.lattice.size[0]'), { target: { value: 'eight' } });
    await waitFor(() => expect(errorOf('$.lattice.size[0]')).toMatch(/positive integer/));
    fireEvent.change(field('$.lattice.size[0]'), { target: { value: '10' } });
    await waitFor(() => expect(screen.getByText('The model is valid.')).toBeTruthy());
    // C(10, 5) = 252 states for 10 sites at half filling.
    expect(screen.getByTestId('hilbert-dimension').textContent).toBe('252');
  });

  it('an unknown bond class for the lattice names the classes it has', async () => {
    render(<ModelEditor initial={{ ...blankDraft(), terms: [{ kind: 'hop', class: 'rung', amplitude: '-J' }] }} onSave={() => {}} />);
    await waitFor(() => expect(screen.getByTestId('validation-summary').textContent).toMatch(/\$\.terms\[0\]\.class/));
    expect(screen.getByTestId('validation-summary').textContent).toMatch(/rung/);
  });

  it('saves the parsed spec and warns when ED is beyond a browser', async () => {
    const onSave = vi.fn();
    render(<ModelEditor initial={blankDraft()} onSave={onSave} />);
    fireEvent.change(field('$.lattice.size[0]'), { target: { value: '40' } });
    await waitFor(() => expect(screen.getByTestId('size-estimate').getAttribute('data-verdict')).toBe('too-large'));
    expect(screen.getByText(/Too large for a browser/)).toBeTruthy();
    fireEvent.change(field('$.lattice.size[0]'), { target: { value: '12' } });
    await waitFor(() => expect(screen.getByTestId('size-estimate').getAttribute('data-verdict')).toBe('fine'));
    fireEvent.click(screen.getByRole('button', { name: 'Save model' }));
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1));
    expect(onSave.mock.calls[0][0].lattice.size).toEqual([12]);
    expect(screen.getByTestId('lattice-preview')).toBeTruthy();
  });
});
