/** `phasewright merge A.json B.json … --out MAP.json`: the physics-aware union of maps of one identity. */
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import { parseMap, serializeMap } from '../../src/maps/map-format.js';
import { mergeMaps } from '../../src/maps/merge.js';
import { inFile, readJsonFile, writeFileAtomic } from '../io.js';

export function mergeCommand(files: string[], opts: { out: string; edTolerance: string }): void {
  const tol = Number(opts.edTolerance);
  if (!(tol > 0)) throw new PhasewrightError(`--ed-tolerance must be a positive number (got "${opts.edTolerance}")`, 'usage');
  const maps = files.map((f) => inFile(f, () => parseMap(readJsonFile(f))));
  const different = maps.findIndex((m) => m.id !== maps[0].id);
  if (different > 0) {
    throw new PhasewrightError(
      `${files[different]} is a map of another sweep than ${files[0]} (identities ${maps[different].id.slice(0, 12)}… and ${maps[0].id.slice(0, 12)}…): maps of different model, sweep, solver options or core version do not merge`,
      'merge',
    );
  }
  const merged = mergeMaps(maps, { edRelativeTolerance: tol });
  writeFileAtomic(opts.out, serializeMap(merged));
  const points = Object.values(merged.points);
  const disputed = points.filter((p) => p.disputed).length;
  process.stderr.write(`${files.length} maps merged: ${points.length} points, ${disputed} disputed → ${opts.out}\n`);
}

export function registerMerge(program: Command): void {
  program
    .command('merge')
    .description('merge maps of the same sweep (ED must agree within tolerance; mean-field: lowest energy wins)')
    .argument('<maps...>', 'map JSON files')
    .requiredOption('--out <map>', 'merged map file')
    .option('--ed-tolerance <relative>', 'relative energy tolerance for ED results of one point', '1e-8')
    .action((files: string[], opts: { out: string; edTolerance: string }) => mergeCommand(files, opts));
}
