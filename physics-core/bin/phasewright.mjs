#!/usr/bin/env node
// The `phasewright` command. Runs the TypeScript sources through tsx so that no build step is
// needed; `npx phasewright --help` lists the commands.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../cli/main.ts');
process.exitCode = await main(process.argv);
