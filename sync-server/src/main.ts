import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { createApp } from './app.js';
import { ConfigError, loadConfig } from './config/app-config.js';

async function main(): Promise<void> {
  const config = loadConfig();
  const app = await createApp(config);
  try {
    await app.listen(config.port, config.host);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') {
      process.stderr.write(
        `[phasewright] error: port ${config.port} on ${config.host} is already in use; stop the program using it or start with another port, e.g. PW_PORT=${config.port + 1} npm start\n`,
      );
      process.exit(1);
    }
    throw err;
  }
  new Logger('Phasewright').log(`listening on ${config.publicUrl} (API docs at ${config.publicUrl}/api/docs)`);
}

main().catch((err: unknown) => {
  if (err instanceof ConfigError) process.stderr.write(`[phasewright] error: ${err.message}\n`);
  else process.stderr.write(`[phasewright] server failed to start: ${(err as Error)?.stack ?? String(err)}\n`);
  process.exit(1);
});
