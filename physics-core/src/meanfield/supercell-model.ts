/**
 * Reduction of a compiled model onto a supercell: the operator entries a translation-invariant
 * product state (or a Bloch Hamiltonian) needs.
 *
 * How supercell images are treated. The model is compiled on a periodic cluster that is a
 * multiple of the supercell and large enough that no two neighbours of a site coincide
 * (`clusterSize`). Every compiled entry is one member of an orbit under the supercell
 * translations; we keep exactly the member whose `from` site (`i` for interactions) lies in the
 * home supercell, and map the other sites to their images in the home supercell. The
 * expectation value is then taken as if all sites of the entry were different sites carrying
 * the same site state as their image — a hop from a site to its own image gives
 * ⟨b†⟩⟨b⟩ = |β|², not ⟨n⟩. This is the standard Gutzwiller treatment of a periodic ansatz: the
 * energy per supercell of the infinite lattice. No division by the number of copies is needed.
 *
 * Twists: the spec's boundary twist θ_a on an L_a-cell axis is applied as the gauge-equivalent
 * uniform vector potential θ_a/L_a per unit-cell step along axis a (the ED cluster's twist,
 * spread evenly), so a flux quantum (θ = 2π) on a cluster of the supercell's length is a pure
 * gauge for the ansatz.
 */
import type { CompiledModel, Lattice } from '../model/types.js';
import { cellDisplacement, reduceCell, type Supercell } from './supercell.js';

export interface SupercellSite {
  x: number;
  y: number;
  sublattice: number;
  cell: number[];
}

/** A pair of supercell sites with a fixed cell displacement (a translation class of bonds). */
export interface Link {
  from: number;
  to: number;
  /** Cell displacement from → to. */
  dcell: number[];
  dx: number;
  dy: number;
  classes: string[];
}

export interface SupercellPlaquette {
  sites: number[];
  steps: { link: number; sign: 1 | -1 }[];
  area: number;
  cx: number;
  cy: number;
  /** Unit-cell class of the plaquette (same for translated copies). */
  type: string;
  /** Unit cell containing the centroid (home representative). */
  cell: number[];
}

export interface SupercellModel {
  nSites: number;
  /** Supercell image of every site of the compiled cluster. */
  image: Int32Array;
  sites: SupercellSite[];
  supercell: Supercell;
  /** Plain hops t·b†_to b_from + h.c. (twist phase included). */
  hop: { from: Int32Array; to: Int32Array; re: Float64Array; im: Float64Array; dcell: Int32Array; link: Int32Array; sign: Int8Array; term: Int32Array; source: Int32Array };
  /** Conditional hops t·b†_to (alpha + gamma·n_via) b_from + h.c.: empty → (1, −1), occupied → (0, 1). */
  cond: {
    from: Int32Array; via: Int32Array; to: Int32Array; re: Float64Array; im: Float64Array;
    alpha: Float64Array; gamma: Float64Array; dcell: Int32Array; link: Int32Array; sign: Int8Array; term: Int32Array; source: Int32Array;
  };
  inter: { i: Int32Array; j: Int32Array; value: Float64Array; term: Int32Array; source: Int32Array };
  /** Summed on-site values per supercell site. */
  onsite: Float64Array;
  /** Compiled on-site entries (term, entry index) summed into each supercell site. */
  onsiteSources: { site: number; term: number; source: number }[];
  links: Link[];
  plaquettes: SupercellPlaquette[];
  translations: number[][];
}

/**
 * Builds the supercell model from a model compiled on a periodic cluster whose size per axis is a
 * multiple of `supercell.period` (see the module comment). `twistPerCell[a]` is the phase per
 * unit-cell step along axis a.
 */
export function buildSupercellModel(compiled: CompiledModel, supercell: Supercell, twistPerCell: number[]): SupercellModel {
  const lattice = compiled.lattice;
  const dim = supercell.dim;
  const nb = lattice.basis.length;
  const T = lattice.translations;
  const L = lattice.size;
  const homeIndex = new Map<string, number>();
  supercell.homeCells.forEach((c, k) => homeIndex.set(c.join(','), k));
  const nSites = supercell.cells * nb;
  const image = new Int32Array(lattice.sites.length);
  const inHome = new Uint8Array(lattice.sites.length);
  const sites: SupercellSite[] = new Array(nSites);
  const mod = (x: number, n: number): number => ((x % n) + n) % n;
  for (const s of lattice.sites) {
    const rep = reduceCell(supercell, s.cell);
    const k = homeIndex.get(rep.join(','));
    if (k === undefined) throw new Error(`internal: cell ${s.cell.join(',')} has no home image`);
    const idx = k * nb + s.sublattice;
    image[s.index] = idx;
    if (rep.every((c, a) => mod(c, L[a]) === s.cell[a])) {
      inHome[s.index] = 1;
      let x = lattice.basis[s.sublattice].x;
      let y = lattice.basis[s.sublattice].y;
      for (let a = 0; a < dim; a++) {
        x += rep[a] * T[a][0];
        y += rep[a] * T[a][1];
      }
      sites[idx] = { x, y, sublattice: s.sublattice, cell: rep };
    }
  }
  const dcellOf = (from: number, to: number, dx: number, dy: number): number[] => {
    const bf = lattice.basis[lattice.sites[from].sublattice];
    const bt = lattice.basis[lattice.sites[to].sublattice];
    return cellDisplacement(T, dx - (bt.x - bf.x), dy - (bt.y - bf.y));
  };

  // Links: translation classes of bonds, oriented as first met.
  const links: Link[] = [];
  const linkOf = new Map<string, number>();
  const findLink = (from: number, to: number, dcell: number[]): { link: number; sign: 1 | -1 } | undefined => {
    const fwd = linkOf.get(`${from}|${to}|${dcell.join(',')}`);
    if (fwd !== undefined) return { link: fwd, sign: 1 };
    const rev = linkOf.get(`${to}|${from}|${dcell.map((c) => -c).join(',')}`);
    if (rev !== undefined) return { link: rev, sign: -1 };
    return undefined;
  };
  const addLink = (from: number, to: number, dcell: number[], dx: number, dy: number, classes: string[]): { link: number; sign: 1 | -1 } => {
    const found = findLink(from, to, dcell);
    if (found) return found;
    linkOf.set(`${from}|${to}|${dcell.join(',')}`, links.length);
    links.push({ from, to, dcell, dx, dy, classes });
    return { link: links.length - 1, sign: 1 };
  };
  const bondLink: { link: number; sign: 1 | -1 }[] = [];
  // Register home bonds first so links are oriented like the lattice's bonds from home sites.
  const order = [...lattice.bonds].sort((a, b) => inHome[b.from] - inHome[a.from]);
  for (const b of order) {
    const dcell = dcellOf(b.from, b.to, b.dx, b.dy);
    bondLink[b.index] = addLink(image[b.from], image[b.to], dcell, b.dx, b.dy, b.classes);
  }

  const phaseOf = (dcell: number[]): number => dcell.reduce((s, c, a) => s + c * (twistPerCell[a] ?? 0), 0);

  const hop = { from: [] as number[], to: [] as number[], re: [] as number[], im: [] as number[], dcell: [] as number[], link: [] as number[], sign: [] as number[], term: [] as number[], source: [] as number[] };
  const cond = { from: [] as number[], via: [] as number[], to: [] as number[], re: [] as number[], im: [] as number[], alpha: [] as number[], gamma: [] as number[], dcell: [] as number[], link: [] as number[], sign: [] as number[], term: [] as number[], source: [] as number[] };
  const inter = { i: [] as number[], j: [] as number[], value: [] as number[], term: [] as number[], source: [] as number[] };
  const onsite = new Float64Array(nSites);
  const onsiteSources: { site: number; term: number; source: number }[] = [];

  for (const term of compiled.terms) {
    if (term.kind === 'hop') {
      for (const [src, e] of term.entries.entries()) {
        if (!inHome[e.from]) continue;
        hop.source.push(src);
        const b = lattice.bonds[e.bond];
        const along = b.from === e.from && b.to === e.to;
        const dx = along ? b.dx : -b.dx;
        const dy = along ? b.dy : -b.dy;
        const dcell = dcellOf(e.from, e.to, dx, dy);
        const ph = phaseOf(dcell);
        const c = Math.cos(ph);
        const s = Math.sin(ph);
        const l = addLink(image[e.from], image[e.to], dcell, dx, dy, b.classes);
        hop.from.push(image[e.from]);
        hop.to.push(image[e.to]);
        hop.re.push(e.re * c - e.im * s);
        hop.im.push(e.re * s + e.im * c);
        hop.dcell.push(...padCell(dcell));
        hop.link.push(l.link);
        hop.sign.push(l.sign);
        hop.term.push(term.termIndex);
      }
    } else if (term.kind === 'conditional-hop') {
      const alpha = term.when === 'empty' ? 1 : 0;
      const gamma = term.when === 'empty' ? -1 : 1;
      for (const [src, e] of term.entries.entries()) {
        if (!inHome[e.from]) continue;
        cond.source.push(src);
        const p = lattice.paths[e.path];
        const along = p.from === e.from && p.to === e.to;
        const dx = along ? p.dx : -p.dx;
        const dy = along ? p.dy : -p.dy;
        const dcell = dcellOf(e.from, e.to, dx, dy);
        const ph = phaseOf(dcell);
        const c = Math.cos(ph);
        const s = Math.sin(ph);
        const pairClasses = p.pair ? lattice.bonds[p.pair.bond].classes : ['path'];
        const l = addLink(image[e.from], image[e.to], dcell, dx, dy, pairClasses);
        cond.from.push(image[e.from]);
        cond.via.push(image[e.via]);
        cond.to.push(image[e.to]);
        cond.re.push(e.re * c - e.im * s);
        cond.im.push(e.re * s + e.im * c);
        cond.alpha.push(alpha);
        cond.gamma.push(gamma);
        cond.dcell.push(...padCell(dcell));
        cond.link.push(l.link);
        cond.sign.push(l.sign);
        cond.term.push(term.termIndex);
      }
    } else if (term.kind === 'interaction') {
      for (const [src, e] of term.entries.entries()) {
        if (!inHome[e.i]) continue;
        inter.term.push(term.termIndex);
        inter.source.push(src);
        inter.i.push(image[e.i]);
        inter.j.push(image[e.j]);
        inter.value.push(e.value);
      }
    } else {
      for (const [src, e] of term.entries.entries()) {
        if (!inHome[e.i]) continue;
        onsite[image[e.i]] += e.value;
        onsiteSources.push({ site: image[e.i], term: term.termIndex, source: src });
      }
    }
  }

  const plaquettes = homePlaquettes(lattice, supercell, image, bondLink);

  return {
    nSites,
    image,
    sites,
    supercell,
    hop: {
      from: Int32Array.from(hop.from), to: Int32Array.from(hop.to), re: Float64Array.from(hop.re), im: Float64Array.from(hop.im),
      dcell: Int32Array.from(hop.dcell), link: Int32Array.from(hop.link), sign: Int8Array.from(hop.sign), term: Int32Array.from(hop.term), source: Int32Array.from(hop.source),
    },
    cond: {
      from: Int32Array.from(cond.from), via: Int32Array.from(cond.via), to: Int32Array.from(cond.to),
      re: Float64Array.from(cond.re), im: Float64Array.from(cond.im), alpha: Float64Array.from(cond.alpha), gamma: Float64Array.from(cond.gamma),
      dcell: Int32Array.from(cond.dcell), link: Int32Array.from(cond.link), sign: Int8Array.from(cond.sign), term: Int32Array.from(cond.term), source: Int32Array.from(cond.source),
    },
    inter: { i: Int32Array.from(inter.i), j: Int32Array.from(inter.j), value: Float64Array.from(inter.value), term: Int32Array.from(inter.term), source: Int32Array.from(inter.source) },
    onsite,
    onsiteSources,
    links,
    plaquettes,
    translations: T,
  };
}

/** Cell displacements are stored with two components (the second is 0 on 1D lattices). */
function padCell(dcell: number[]): [number, number] {
  return [dcell[0] ?? 0, dcell[1] ?? 0];
}

function homePlaquettes(
  lattice: Lattice,
  supercell: Supercell,
  image: Int32Array,
  bondLink: { link: number; sign: 1 | -1 }[],
): SupercellPlaquette[] {
  const T = lattice.translations;
  const dim = T.length;
  const out: SupercellPlaquette[] = [];
  const recipCoords = (x: number, y: number): number[] => {
    // Fractional cell coordinates of a point (inverse of the translation matrix).
    if (dim === 1) {
      const l2 = T[0][0] ** 2 + T[0][1] ** 2;
      return [(x * T[0][0] + y * T[0][1]) / l2];
    }
    const [[ax, ay], [bx, by]] = T;
    const det = ax * by - ay * bx;
    return [(x * by - y * bx) / det, (ay * -x + ax * y) / det];
  };
  const mod = (x: number, n: number): number => ((x % n) + n) % n;
  for (const p of lattice.plaquettes) {
    // A tiny fixed shift makes centroids on cell boundaries fall consistently on one side.
    const f = recipCoords(p.cx + 1.234e-7, p.cy + 2.345e-7);
    const cellRaw = f.map((x) => Math.floor(x));
    const cell = cellRaw.map((c, a) => mod(c, lattice.size[a]));
    const rep = reduceCell(supercell, cell);
    const home = rep.every((c, a) => mod(c, lattice.size[a]) === cell[a]);
    if (!home) continue;
    const frac = f.map((x) => (x - Math.floor(x)).toFixed(5));
    let cx = p.cx;
    let cy = p.cy;
    for (let a = 0; a < dim; a++) {
      cx += (rep[a] - cellRaw[a]) * T[a][0];
      cy += (rep[a] - cellRaw[a]) * T[a][1];
    }
    out.push({
      sites: p.sites.map((s) => image[s]),
      steps: p.steps.map((st) => ({ link: bondLink[st.bond].link, sign: (bondLink[st.bond].sign * st.sign) as 1 | -1 })),
      area: p.area,
      cx,
      cy,
      type: `${frac.join(',')}|${p.sites.length}`,
      cell: rep,
    });
  }
  return out;
}
