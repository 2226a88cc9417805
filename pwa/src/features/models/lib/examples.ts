/** The example model specs shipped with physics-core (physics-core/examples/*.json), bundled. */
const files = import.meta.glob('../../../../../physics-core/examples/*.json', { eager: true, import: 'default' });

export const EXAMPLE_MODELS: { file: string; spec: unknown }[] = Object.entries(files)
  .map(([path, spec]) => ({ file: path.split('/').pop() ?? path, spec }))
  .filter((e) => (e.spec as { spec?: unknown } | null)?.spec === 'phasewright.model/1')
  .sort((a, b) => a.file.localeCompare(b.file));

export function exampleName(e: { file: string; spec: unknown }): string {
  const name = (e.spec as { name?: unknown }).name;
  return typeof name === 'string' ? name : e.file;
}
