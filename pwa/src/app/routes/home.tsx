import { Link } from 'react-router-dom';

const STEPS = [
  {
    name: 'Model',
    text: 'A lattice, the particle content and parameterised terms: plain and conditional hops with Peierls phases, density interactions, on-site fields.',
  },
  {
    name: 'Sweep',
    text: 'A plan over two or three couplings — a grid or a cut — with the method (exact diagonalization or Gutzwiller mean-field) and its settings.',
  },
  {
    name: 'Map',
    text: 'Points fill in as they are computed: energies, densities, currents, structure factors, fidelity, a suggested phase label and full provenance.',
  },
  {
    name: 'Review',
    text: 'Colleagues compare maps, spot-check sampled points by re-running them, annotate phases and give a verdict.',
  },
] as const;

const LIMITS = [
  {
    title: 'Finite clusters',
    text: 'Exact diagonalization sees a few dozen sites at most. Boundaries move with cluster size, shape, boundary conditions and twist; compare at least two sizes before trusting a line on a map.',
  },
  {
    title: 'Mean-field artefacts',
    text: 'Gutzwiller mean-field ignores correlations between sites. Its energy is a variational upper bound, but it tends to favour ordered and superfluid states and cannot show phases without a local order parameter.',
  },
  {
    title: 'Fidelity peaks indicate, they do not prove',
    text: 'A peak in the fidelity susceptibility says the ground state changes quickly there. Level crossings on a small cluster and smooth crossovers give peaks too; look at how the peak scales with size and at an order parameter.',
  },
  {
    title: 'Phase labels are suggestions',
    text: 'The classifier proposes a label with the evidence behind it. A person’s annotation and a review decide what a region is called.',
  },
] as const;

export function Component() {
  return (
    <div className="space-y-10">
      <title>Phasewright</title>
      <section className="max-w-3xl">
        <h1 className="text-3xl font-bold tracking-tight text-ink-900 sm:text-4xl">
          Ground-state phase diagrams of lattice bosons, mapped where you work
        </h1>
        <p className="mt-4 text-lg leading-relaxed text-ink-700">
          Phasewright is a workbench for theorists who study hardcore bosons on lattices with complex and
          density-dependent (“conditional”) hopping and density interactions. Describe a model, sweep its couplings
          and watch a phase map fill in — computed in this browser, offline if need be — then share the map with your
          group, where it can be compared, annotated and reviewed.
        </p>
      </section>

      <section aria-labelledby="how-heading">
        <h2 id="how-heading" className="text-xl font-bold text-ink-900">
          How the work flows
        </h2>
        <ol className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          {STEPS.map((step, index) => (
            <li key={step.name} className="rounded-xl border border-line bg-surface p-4">
              <p className="text-sm font-semibold text-accent-700">
                <span aria-hidden="true">{index + 1}. </span>
                {step.name}
              </p>
              <p className="mt-2 text-sm leading-relaxed text-ink-700">{step.text}</p>
            </li>
          ))}
        </ol>
      </section>

      <section aria-labelledby="now-heading" className="max-w-3xl">
        <h2 id="now-heading" className="text-xl font-bold text-ink-900">
          What exists today
        </h2>
        <p className="mt-3 leading-relaxed text-ink-700">
          This is an early build. The app installs and opens without a network, the numerical core is linked into it
          (its version is in the footer), and the{' '}
          <Link to="/status" className="font-semibold text-accent-700 underline underline-offset-2 hover:text-accent-600">
            Status
          </Link>{' '}
          page checks the sync server and its database. The model editor, sweeps, maps, sync and review are being
          built next.
        </p>
      </section>

      <section aria-labelledby="limits-heading">
        <h2 id="limits-heading" className="text-xl font-bold text-ink-900">
          Reading the numbers with care
        </h2>
        <ul className="mt-4 grid gap-4 sm:grid-cols-2">
          {LIMITS.map((limit) => (
            <li key={limit.title} className="rounded-xl border-l-4 border-amber-mark bg-surface p-4 ring-1 ring-line">
              <p className="font-semibold text-ink-900">{limit.title}</p>
              <p className="mt-1.5 text-sm leading-relaxed text-ink-700">{limit.text}</p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
