import type { Command } from 'commander';

/** Each CLI command lives in its own file and registers itself on the program. */
export type RegisterCommand = (program: Command) => void;

export const commands: RegisterCommand[] = [];
import { registerSweep } from './sweep.js';
import { registerMerge } from './merge.js';
import { registerSpotCheck } from './spot-check.js';
import { registerExport } from './export.js';
import { registerSolve } from './solve.js';
import { registerBands } from './bands.js';

commands.push(registerSweep, registerMerge, registerSpotCheck, registerExport);
commands.push(registerSolve);
commands.push(registerBands);
