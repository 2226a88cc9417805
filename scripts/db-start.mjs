#!/usr/bin/env node
// Start this checkout's private MariaDB (installing and initialising it when needed).
// Idempotent: when it already runs, this only checks it answers and that the app user exists.
import { startDatabase } from './lib/db.mjs';
import { info, runMain } from './lib/log.mjs';

runMain(async () => {
  const { settings } = await startDatabase();
  info(`connect as ${settings.user} to ${settings.database} on 127.0.0.1:${settings.port} (password in .data/db.json)`);
});
