#!/usr/bin/env node
// Stop this checkout's private MariaDB cleanly (mariadb-admin shutdown, then wait).
import { stopDatabase } from './lib/db.mjs';
import { info, runMain } from './lib/log.mjs';

runMain(async () => {
  const stopped = await stopDatabase();
  info(stopped ? 'database stopped' : 'database was not running');
});
