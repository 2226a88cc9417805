import { Command, CommanderError } from 'commander';
import { CORE_VERSION } from '../src/version.js';
import { PhasewrightError } from '../src/errors.js';
import { commands } from './commands/index.js';

/** Runs the CLI; returns the exit code. Errors end with one line on stderr saying what to fix. */
export async function main(argv: string[]): Promise<number> {
  const program = new Command('phasewright')
    .description('Phasewright physics core: solve models, sweep parameters, merge and check maps.')
    .version(CORE_VERSION)
    .exitOverride()
    .showHelpAfterError(false);
  for (const register of commands) register(program);
  try {
    await program.parseAsync(argv);
    return 0;
  } catch (error) {
    if (error instanceof CommanderError) {
      return error.exitCode === 0 ? 0 : 2;
    }
    if (error instanceof PhasewrightError) {
      process.stderr.write(`phasewright: ${error.message}\n`);
      return 1;
    }
    const message = error instanceof Error ? error.message : String(error);
    process.stderr.write(`phasewright: ${message}\n`);
    return 1;
  }
}
