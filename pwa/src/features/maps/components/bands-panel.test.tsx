import type { ModelSpec } from '@phasewright/physics-core';
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { computeBands } from '../lib/bands.js';
import { BandsPanel } from './bands-panel.js';

/**
 * Haldane's honeycomb model (F. D. M. Haldane, Phys. Rev. Lett. 61, 2015 (1988)) as a model spec:
 * nearest-neighbour hop t1, second-neighbour hop t2·e^{i·turn·φ} written as a conditional hop
 * through the common neighbour (one particle always finds it empty), sublattice offset ±M, and an
 * interaction that a single particle never feels. Haldane's phase diagram: the two bands carry
 * Chern numbers ±1 for |M| < 3√3 |t2 sin φ| and 0 beyond.
 */
const haldane: ModelSpec = {
  spec: 'phasewright.model/1',
  lattice: { kind: 'honeycomb', size: [3, 3], boundary: ['periodic', 'periodic'] },
  particles: { kind: 'hardcore', filling: 0.5 },
  parameters: { t1: 1, t2: 0.1, phi: 'pi/2', M: 0, V: 1 },
  terms: [
    { kind: 'hop', neighbors: 1, amplitude: 't1' },
    { kind: 'conditional-hop', neighbors: 2, via: 'common-neighbor', when: 'empty', amplitude: 't2', phase: 'turn*phi' },
    { kind: 'onsite', amplitude: 'M*(1-2*sublattice)' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
  ],
};

/** physics-core's example "honeycomb, one particle: nearest hops and conditional second-neighbour hops". */
const honeycombExample = Object.values(import.meta.glob('../../../../../physics-core/examples/honeycomb-conditional-nnn.json', { eager: true, import: 'default' }))[0] as ModelSpec;

/** In-thread (the app runs the same function in its bands worker); a 12-mesh keeps the test quick — integers on any mesh. */
const MESH = 12;
const here = (model: ModelSpec, parameters: Record<string, number>) => Promise.resolve(computeBands(model, parameters, MESH));

async function renderPanel(model: ModelSpec, parameters: Record<string, number>) {
  render(<BandsPanel model={model} parameters={parameters} compute={here} />);
  await screen.findByTestId('band-structure');
  return screen.getByTestId('bands-panel');
}

const cherns = () => Array.from(screen.getByTestId('chern-numbers').querySelectorAll('li')).map((li) => Number(li.getAttribute('data-chern')));

describe('BandsPanel (one-particle bands of the point model)', { timeout: 20_000 }, () => {
  it('Haldane model, M = 0, φ = π/2: two band lines, Chern numbers ±1 summing to 0, the grid caveat, the dropped interaction', async () => {
    const panel = await renderPanel(haldane, { phi: Math.PI / 2, M: 0 });
    expect(panel.querySelectorAll('[data-testid="band-line"]')).toHaveLength(2);
    const c = cherns();
    expect(c).toHaveLength(2);
    expect(c.map(Math.abs)).toEqual([1, 1]);
    expect(c[0] + c[1]).toBe(0); // a lattice model's Chern numbers sum to zero (invariant)
    expect(screen.getByTestId('chern-caveat').textContent).toMatch(/12×12 k-grid.*a gap closing makes it ill-defined/);
    expect(screen.getByTestId('bands-warnings').textContent).toMatch(/interaction/);
    expect(screen.getByRole('heading', { name: /One-particle bands of this model \(N = 1\), not of the many-body state/ })).toBeTruthy();
    // Curvature heatmap: one cell per mesh plaquette, plus the cell outline.
    expect(screen.getByTestId('berry-curvature').querySelectorAll('polygon')).toHaveLength(MESH * MESH + 1);
  });

  it('the honeycomb example (conditional second-neighbour hops, phase turn·θ): two bands, Chern ±1 at θ = π/2 — the Haldane-type check (Haldane, Phys. Rev. Lett. 1988)', async () => {
    expect(honeycombExample.lattice.kind).toBe('honeycomb');
    const panel = await renderPanel(honeycombExample, {});
    expect(panel.querySelectorAll('[data-testid="band-line"]')).toHaveLength(2);
    expect(cherns().map(Math.abs)).toEqual([1, 1]);
    expect(screen.queryByTestId('bands-warnings')).toBeNull(); // nothing dropped: no interactions in this example
    // t2 = 0 is graphene: the bands touch at K and K′ (on any mesh divisible by 3), one group with C = 0.
    const graphene = computeBands(honeycombExample, { t2: 0 }, MESH);
    expect(graphene.chern?.groups).toHaveLength(1);
    expect(graphene.chern?.groups[0]).toMatchObject({ bands: [0, 1], chern: 0 });
  });

  it('time reversal φ → −φ flips the lowest Chern number; M beyond 3√3 t2 |sin φ| makes it 0 (Haldane 1988)', async () => {
    const c = computeBands(haldane, { phi: Math.PI / 2, M: 0 }, MESH).chern?.groups.map((g) => g.chern);
    const reversed = computeBands(haldane, { phi: -Math.PI / 2, M: 0 }, MESH).chern?.groups.map((g) => g.chern);
    expect(reversed).toEqual(c?.map((x) => -x));
    const boundary = 3 * Math.sqrt(3) * 0.1;
    await renderPanel(haldane, { phi: Math.PI / 2, M: 1.3 * boundary });
    expect(cherns()).toEqual([0, 0]);
  });

  it('the Berry curvature integrates to 2π C over the reciprocal cell (FHS field strengths sum exactly)', () => {
    const v = computeBands(haldane, { phi: 1.0, M: 0.1 }, MESH);
    const cv = v.curvature;
    expect(cv).not.toBeNull();
    if (!cv) return;
    const [g1, g2] = cv.reciprocal;
    const cellArea = Math.abs(g1[0] * g2[1] - g1[1] * g2[0]) / cv.mesh ** 2;
    const flux = cv.values.reduce((s, x) => s + x * cellArea, 0);
    expect(flux / (2 * Math.PI)).toBeCloseTo(v.chern?.groups[0].chern ?? NaN, 9);
  });

  it('a chain: one band −2J cos k, no Chern number (one dimension)', async () => {
    const chain: ModelSpec = {
      spec: 'phasewright.model/1',
      lattice: { kind: 'chain', size: [8], boundary: ['periodic'] },
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1 },
      terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J' }],
    };
    const panel = await renderPanel(chain, { J: 0.5 });
    expect(panel.querySelectorAll('[data-testid="band-line"]')).toHaveLength(1);
    expect(screen.queryByTestId('chern-numbers')).toBeNull();
    expect(screen.getByText(/One-dimensional lattice: no Berry curvature and no Chern number/)).toBeTruthy();
    const v = computeBands(chain, { J: 0.5 });
    // Tight-binding chain, textbook: ε(k) = −2J cos k, from −2J at Γ to +2J at X = π.
    expect(v.path.energies[0][0]).toBeCloseTo(-1, 12);
    expect(v.path.energies[0].at(-1)).toBeCloseTo(1, 12);
  });

  it('a failed computation is shown with its reason', async () => {
    render(<BandsPanel model={haldane} parameters={{}} compute={() => Promise.reject(new Error('$.lattice: something is wrong'))} />);
    expect((await screen.findByRole('alert')).textContent).toMatch(/No one-particle bands for this model: \$\.lattice: something is wrong/);
  });
});
