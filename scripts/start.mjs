#!/usr/bin/env node
// `npm start`: everything needed to use Phasewright on this machine, then the server in the
// foreground. Safe to re-run: nothing is re-initialised, no data is lost, finished builds are skipped.
//   install deps → private MariaDB → migrate → seed demo → build → serve on http://127.0.0.1:8080
//   → the demo project's first map (computed and pushed once, scripts/lib/demo-maps.mjs)
// Ctrl-C or SIGTERM stops the server, then the database (when this command started it).
import { buildAll } from './lib/build.mjs';
import { startDatabase, stopDatabase } from './lib/db.mjs';
import { dbTask } from './lib/db-tasks.mjs';
import { ensureDemoMap } from './lib/demo-maps.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { fail, info, onParentExit, runMain, ScriptError } from './lib/log.mjs';
import { canBind, portFromEnv } from './lib/ports.mjs';
import { startServer } from './lib/server.mjs';

runMain(async () => {
  const t0 = Date.now();
  const port = portFromEnv('PW_PORT', 8080);
  if (!(await canBind(port))) {
    throw new ScriptError(
      `port ${port} on 127.0.0.1 is already in use (another Phasewright server or another program); stop it or choose another port, e.g. PW_PORT=${port + 1} npm start`,
    );
  }

  await ensureNodeModules();
  const { settings, startedHere } = await startDatabase();

  let stopping = false;
  let server = null;
  const shutdown = async (why, code = 0) => {
    if (stopping) return;
    stopping = true;
    info(`${why}: stopping…`);
    try {
      if (server) await server.stop();
      if (startedHere) {
        await stopDatabase();
        info('server and database stopped');
      } else {
        info('server stopped; the database was already running before `npm start` and stays up (`npm run db:stop` stops it)');
      }
    } catch (err) {
      fail(err);
    }
    process.exit(code);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  process.on('SIGHUP', () => void shutdown('SIGHUP'));
  onParentExit(() => void shutdown('npm was stopped'));

  try {
    const { applied } = await dbTask('migrate', settings);
    info(applied.length ? `migrations applied: ${applied.join(', ')}` : 'database schema is up to date');
    const seed = await dbTask('seed', settings);

    await buildAll();

    server = await startServer({ port, env: { PW_DB_HOST: '127.0.0.1', PW_DB_PORT: String(settings.port), PW_DB_NAME: settings.database, PW_DB_USER: settings.user, PW_DB_PASSWORD: settings.password } });
    server.exited.then((exit) => {
      if (!stopping) void shutdown(`the server exited (${exit.code ?? exit.signal})`, 1);
    });

    // The demo project's first map, through the server's own push (once; skipped when it has maps).
    const editor = seed.signIns.find((s) => s.role === 'editor');
    if (editor) {
      try {
        info(await ensureDemoMap(server.url, { email: editor.email, password: editor.password }));
      } catch (err) {
        info(`the demo map could not be added (the app works without it): ${err instanceof Error ? err.message : String(err)}`);
      }
    }

    const signIns = seed.signIns.length
      ? seed.signIns.map((s) => `    ${s.email} / ${s.password} (${s.role})`).join('\n')
      : '    none yet: accounts arrive with a later version; the app works without signing in';
    const lines = [
      '',
      `  Phasewright is running at ${server.url}   (ready in ${((Date.now() - t0) / 1000).toFixed(1)} s)`,
      `    status page   ${server.url}/status`,
      `    API docs      ${server.url}/api/docs`,
      `    database      127.0.0.1:${settings.port} ${server.health.database.status} (data in .data/mariadb)`,
      '  Demo sign-ins:',
      signIns,
      '  Press Ctrl-C to stop the server and the database.',
      '',
    ];
    process.stdout.write(`${lines.join('\n')}\n`);
  } catch (err) {
    if (server) await server.stop();
    if (startedHere) await stopDatabase().catch(() => {});
    throw err;
  }
});
