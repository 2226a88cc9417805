/**
 * Energy of a Gutzwiller product state on a supercell and its gradient with respect to the
 * per-site moments (⟨n⟩, Re β, Im β), β = ⟨b⟩. With distinct physical sites (see
 * supercell-model.ts), every expectation factorises:
 *   hop          t·b†_to b_from + h.c.            → 2 Re(t·conj(β_to)·β_from)
 *   conditional  t·b†_to (α + γ n_via) b_from + h.c. → 2 Re(t·conj(β_to)·β_from)·(α + γ n_via)
 *   interaction  V·n_i n_j                           → V n_i n_j
 *   onsite       ε·n_i (− μ n_i for the grand potential)
 */
import type { SupercellModel } from './supercell-model.js';

/**
 * Grand potential Ω = E − μ·N per supercell at the moments `m` (stride 3); writes ∂Ω/∂m into
 * `dm` (overwritten) when given.
 */
export function supercellEnergy(model: SupercellModel, m: Float64Array, mu: number, dm?: Float64Array): number {
  let e = 0;
  if (dm) dm.fill(0);
  const { hop, cond, inter, onsite } = model;
  for (let k = 0; k < hop.from.length; k++) {
    const f = 3 * hop.from[k];
    const t = 3 * hop.to[k];
    const tr = hop.re[k];
    const ti = hop.im[k];
    const uf = m[f + 1], vf = m[f + 2], ut = m[t + 1], vt = m[t + 2];
    // X = t·conj(β_to)·β_from; conj(β_to)β_from = (ut uf + vt vf) + i(ut vf − vt uf)
    const pr = ut * uf + vt * vf;
    const pi = ut * vf - vt * uf;
    e += 2 * (tr * pr - ti * pi);
    if (dm) {
      // ∂/∂uf: 2(tr ut + ti vt); ∂/∂vf: 2(tr vt − ti ut); ∂/∂ut: 2(tr uf − ti vf); ∂/∂vt: 2(tr vf + ti uf)
      dm[f + 1] += 2 * (tr * ut + ti * vt);
      dm[f + 2] += 2 * (tr * vt - ti * ut);
      dm[t + 1] += 2 * (tr * uf - ti * vf);
      dm[t + 2] += 2 * (tr * vf + ti * uf);
    }
  }
  for (let k = 0; k < cond.from.length; k++) {
    const f = 3 * cond.from[k];
    const t = 3 * cond.to[k];
    const v = 3 * cond.via[k];
    const w = cond.alpha[k] + cond.gamma[k] * m[v];
    const tr = cond.re[k];
    const ti = cond.im[k];
    const uf = m[f + 1], vf = m[f + 2], ut = m[t + 1], vt = m[t + 2];
    const pr = ut * uf + vt * vf;
    const pi = ut * vf - vt * uf;
    const x = 2 * (tr * pr - ti * pi);
    e += x * w;
    if (dm) {
      dm[f + 1] += 2 * (tr * ut + ti * vt) * w;
      dm[f + 2] += 2 * (tr * vt - ti * ut) * w;
      dm[t + 1] += 2 * (tr * uf - ti * vf) * w;
      dm[t + 2] += 2 * (tr * vf + ti * uf) * w;
      dm[v] += x * cond.gamma[k];
    }
  }
  for (let k = 0; k < inter.i.length; k++) {
    const i = 3 * inter.i[k];
    const j = 3 * inter.j[k];
    const val = inter.value[k];
    e += val * m[i] * m[j];
    if (dm) {
      dm[i] += val * m[j];
      dm[j] += val * m[i];
    }
  }
  for (let s = 0; s < model.nSites; s++) {
    const c = onsite[s] - mu;
    e += c * m[3 * s];
    if (dm) dm[3 * s] += c;
  }
  return e;
}

/** Total density Σ⟨n_i⟩ over the supercell. */
export function supercellParticles(model: SupercellModel, m: Float64Array): number {
  let n = 0;
  for (let s = 0; s < model.nSites; s++) n += m[3 * s];
  return n;
}
