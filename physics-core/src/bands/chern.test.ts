import { describe, expect, it } from 'vitest';
import { blochHamiltonian, bandPath, highSymmetryPoints } from './bloch.js';
import { chernNumbers } from './chern.js';
import { hermitianEigen } from './hermitian-eigen.js';
import { haldaneBlochModel } from './haldane-fixture.js';

const t1 = 1;
const t2 = 0.1;

describe('Chern numbers of the Haldane model (Haldane, Phys. Rev. Lett. 1988; method of Fukui, Hatsugai & Suzuki, J. Phys. Soc. Jpn. 2005)', () => {
  it('has six next-nearest hops and three nearest per cell (fixture sanity)', () => {
    const m = haldaneBlochModel(t1, t2, 0.5, 0);
    expect(m.hops.filter((h) => h.from !== h.to)).toHaveLength(3);
    expect(m.hops.filter((h) => h.from === h.to)).toHaveLength(6);
  });

  it('band energies at K and K′ are −3 t2 cos φ ± |M ∓ 3√3 t2 sin φ| (Haldane 1988)', () => {
    const phi = 0.7;
    const M = 0.2;
    const model = haldaneBlochModel(t1, t2, phi, M);
    const K = highSymmetryPoints(model.translations)[1].k;
    const re = new Float64Array(4);
    const im = new Float64Array(4);
    const masses: number[] = [];
    for (const k of [K, [-K[0], -K[1]]]) {
      blochHamiltonian(model, k, re, im);
      const { values } = hermitianEigen(re, im, 2);
      expect((values[0] + values[1]) / 2).toBeCloseTo(-3 * t2 * Math.cos(phi), 12);
      masses.push((values[1] - values[0]) / 2);
    }
    const expected = [Math.abs(M - 3 * Math.sqrt(3) * t2 * Math.sin(phi)), Math.abs(M + 3 * Math.sqrt(3) * t2 * Math.sin(phi))];
    expect([...masses].sort()).toEqual(expected.sort().map((v) => expect.closeTo(v, 12)));
  });

  it('lower band has |C| = 1 for |M| < 3√3 t2 |sin φ|, opposite sign for −φ, 0 beyond; total 0', () => {
    const phi = Math.PI / 2;
    const boundary = 3 * Math.sqrt(3) * t2 * Math.abs(Math.sin(phi));
    for (const M of [0, 0.5 * boundary, -0.8 * boundary]) {
      const plus = chernNumbers(haldaneBlochModel(t1, t2, phi, M), { mesh: 18 });
      const minus = chernNumbers(haldaneBlochModel(t1, t2, -phi, M), { mesh: 18 });
      expect(plus.groups).toHaveLength(2);
      expect(Math.abs(plus.groups[0].chern)).toBe(1);
      expect(minus.groups[0].chern).toBe(-plus.groups[0].chern);
      expect(plus.total).toBe(0);
      expect(minus.total).toBe(0);
    }
    for (const M of [1.3 * boundary, -2 * boundary]) {
      const r = chernNumbers(haldaneBlochModel(t1, t2, phi, M), { mesh: 18 });
      expect(r.groups.map((g) => g.chern)).toEqual([0, 0]);
    }
  });

  it('reports the reciprocal vectors of its mesh: G_a · t_b = 2π δ_ab (definition of the reciprocal lattice)', () => {
    const model = haldaneBlochModel(t1, t2, Math.PI / 2, 0.1);
    const r = chernNumbers(model, { mesh: 6 });
    for (let a = 0; a < 2; a++) {
      for (let b = 0; b < 2; b++) {
        const dot = r.reciprocal[a][0] * model.translations[b][0] + r.reciprocal[a][1] * model.translations[b][1];
        expect(dot).toBeCloseTo(a === b ? 2 * Math.PI : 0, 12);
      }
    }
  });

  it('sign agrees with the winding of d̂(k) for H = d₀ + d·σ: C_lower = (1/4π)∫ d̂·(∂₁d̂ × ∂₂d̂) (spin-½ Berry curvature, Berry, Proc. R. Soc. A 1984)', () => {
    // Independent of eigenvectors: sum of signed solid angles (Van Oosterom & Strackee, IEEE
    // Trans. Biomed. Eng. 1983) of the mesh triangles mapped onto the sphere by d̂(k).
    for (const phi of [Math.PI / 2, -Math.PI / 3, 2.5]) {
      const model = haldaneBlochModel(t1, t2, phi, 0.1);
      const N = 40;
      const [g1, g2] = [[2 * Math.PI / Math.sqrt(3), -2 * Math.PI / 3], [0, 4 * Math.PI / 3]];
      const re = new Float64Array(4);
      const im = new Float64Array(4);
      const dhat = (i: number, j: number): number[] => {
        blochHamiltonian(model, [(i / N) * g1[0] + (j / N) * g2[0], (i / N) * g1[1] + (j / N) * g2[1]], re, im);
        const d = [re[1], -im[1], (re[0] - re[3]) / 2];
        const l = Math.hypot(d[0], d[1], d[2]);
        return d.map((x) => x / l);
      };
      const solid = (a: number[], b: number[], c: number[]): number => {
        const triple = a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);
        const dot = (u: number[], v: number[]): number => u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
        return 2 * Math.atan2(triple, 1 + dot(a, b) + dot(b, c) + dot(c, a));
      };
      let total = 0;
      for (let i = 0; i < N; i++) {
        for (let j = 0; j < N; j++) {
          const a = dhat(i, j), b = dhat(i + 1, j), c = dhat(i + 1, j + 1), d = dhat(i, j + 1);
          total += solid(a, b, c) + solid(a, c, d);
        }
      }
      // g1 × g2 > 0 here, so the (i, j) mesh is positively oriented.
      expect(g1[0] * g2[1] - g1[1] * g2[0]).toBeGreaterThan(0);
      const winding = Math.round(total / (4 * Math.PI));
      expect(Math.abs(winding)).toBe(1);
      expect(chernNumbers(model, { mesh: 12 }).groups[0].chern).toBe(winding);
    }
  });

  it('Chern number does not depend on the mesh (integer by construction)', () => {
    const model = haldaneBlochModel(t1, t2, 1.1, 0.1);
    const values = [6, 11, 30].map((mesh) => chernNumbers(model, { mesh }).groups[0].chern);
    expect(new Set(values).size).toBe(1);
  });

  it('bands along Γ–K–M–Γ: gap at K equals twice the Dirac mass; Berry curvature sums to 2πC', () => {
    const model = haldaneBlochModel(t1, t2, Math.PI / 2, 0);
    const path = bandPath(model, { points: 91 });
    expect(path.labels.map((l) => l.label)).toEqual(['Γ', 'K', 'M', 'Γ']);
    const iK = path.labels[1].index;
    expect(path.energies[1][iK] - path.energies[0][iK]).toBeCloseTo(2 * 3 * Math.sqrt(3) * t2, 10);
    const r = chernNumbers(model, { mesh: 16, curvature: true });
    const G = 4 * Math.PI / 3; // |G| for nearest-neighbour distance 1 (|a| = √3)
    const bzArea = (Math.sqrt(3) / 2) * G * G;
    const integral = r.groups[0].curvature!.reduce((a, b) => a + b, 0) * bzArea / (16 * 16);
    expect(integral / (2 * Math.PI)).toBeCloseTo(r.groups[0].chern, 10);
  });
});
