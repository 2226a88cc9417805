import { fireEvent, render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { PHASE_PALETTE, phaseColor, textOn } from '../../../lib/phase-colors.js';
import { MapLegend } from './map-legend.js';

const entries = [
  { labelId: 'density-wave', name: 'density-wave', color: phaseColor('density-wave', ['density-wave', 'superfluid']), count: 4 },
  { labelId: 'superfluid', name: 'SF (ours)', color: '#0072b2', count: 9 },
];

describe('MapLegend', () => {
  it('lists labels with their counts; a renamed label also shows its original id', () => {
    render(<MapLegend entries={entries} onRename={() => {}} onRecolor={() => {}} />);
    expect(screen.getAllByTestId('legend-name').map((n) => n.textContent)).toEqual(['density-wave', 'SF (ours)']);
    expect(screen.getByText('(superfluid)')).toBeTruthy();
    expect(screen.getByText('9 points')).toBeTruthy();
  });

  it('rename: the new name is handed on with the label id', () => {
    const onRename = vi.fn();
    render(<MapLegend entries={entries} onRename={onRename} onRecolor={() => {}} />);
    fireEvent.click(screen.getByRole('button', { name: 'Rename density-wave' }));
    fireEvent.change(screen.getByRole('textbox', { name: 'New name for density-wave' }), { target: { value: 'charge density wave' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(onRename).toHaveBeenCalledWith('density-wave', 'charge density wave');
  });

  it('recolour: picks from the colour-blind-safe palette', () => {
    const onRecolor = vi.fn();
    render(<MapLegend entries={entries} onRename={() => {}} onRecolor={onRecolor} />);
    fireEvent.click(screen.getByRole('button', { name: 'Change the colour of SF (ours)' }));
    fireEvent.click(screen.getByRole('button', { name: 'vermillion' }));
    expect(onRecolor).toHaveBeenCalledWith('superfluid', '#d55e00');
  });

  it('palette: first colours in order, overrides win, unknown labels grey; readable text colour', () => {
    expect(phaseColor('a', ['a', 'b'])).toBe(PHASE_PALETTE[0].hex);
    expect(phaseColor('b', ['a', 'b'])).toBe(PHASE_PALETTE[1].hex);
    expect(phaseColor('b', ['a', 'b'], { b: '#123456' })).toBe('#123456');
    expect(phaseColor(undefined, ['a'])).toBe('#bdb6a6');
    // WCAG: white on Okabe–Ito blue (#0072b2) reads better than ink; ink on yellow (#f0e442).
    expect(textOn('#0072b2')).toBe('#ffffff');
    expect(textOn('#f0e442')).toBe('#141a2e');
  });
});
