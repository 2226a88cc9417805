/** `phasewright export MAP.json --csv [--out FILE]`: one row per point, one column per scalar observable. */
import { writeFileSync } from 'node:fs';
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import type { PhaseMap } from '../../src/maps/map-format.js';
import { parseMap } from '../../src/maps/map-format.js';
import { pointsCsv } from '../../src/maps/points-csv.js';
import { inFile, readJsonFile } from '../io.js';

/** The CSV text of a map (physics-core's one points CSV, with plain line feeds for shell tools). */
export function mapToCsv(map: PhaseMap): string {
  return pointsCsv(map, { lineEnd: '\n' });
}

export function registerExport(program: Command): void {
  program
    .command('export')
    .description('export a map as CSV (one row per point, one column per scalar observable)')
    .argument('<map>', 'map JSON file')
    .option('--csv', 'CSV output (the only format for now)')
    .option('--out <file>', 'write to a file instead of stdout')
    .action((file: string, opts: { csv?: boolean; out?: string }) => {
      if (!opts.csv) throw new PhasewrightError('choose a format: --csv', 'usage');
      const text = mapToCsv(inFile(file, () => parseMap(readJsonFile(file))));
      if (opts.out) writeFileSync(opts.out, text);
      else process.stdout.write(text);
    });
}
