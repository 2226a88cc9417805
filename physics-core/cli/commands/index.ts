import type { Command } from 'commander';

/** Each CLI command lives in its own file and registers itself on the program. */
export type RegisterCommand = (program: Command) => void;

export const commands: RegisterCommand[] = [];
