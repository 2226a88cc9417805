import type { LogLevel } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import helmet from 'helmet';
import { AppModule } from './app.module.js';
import { AllExceptionsFilter } from './common/all-exceptions.filter.js';
import { createValidationPipe } from './common/validation.js';
import type { AppConfig } from './config/app-config.js';
import { serverVersion } from './config/repo-paths.js';

export const API_PREFIX = 'api';

export interface CreateAppOptions {
  logger?: LogLevel[] | false;
}

/** Build and configure (not yet listening) the app: the one place main.ts and the tests share. */
export async function createApp(config: AppConfig, opts: CreateAppOptions = {}): Promise<NestExpressApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule.register(config), {
    logger: opts.logger ?? ['log', 'warn', 'error'],
    abortOnError: false,
  });
  app.useBodyParser('json', { limit: config.bodyLimit });
  app.useBodyParser('urlencoded', { limit: config.bodyLimit, extended: true });
  app.use(
    helmet({
      // Served over plain HTTP on loopback by default: no HSTS, no forced upgrade to HTTPS.
      strictTransportSecurity: false,
      contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } },
    }),
  );
  app.setGlobalPrefix(API_PREFIX);
  app.useGlobalPipes(createValidationPipe());
  app.useGlobalFilters(new AllExceptionsFilter());
  app.enableShutdownHooks();

  const document = SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setTitle('Phasewright sync server')
      .setDescription('Projects, maps, sync and review for Phasewright. Errors share one shape: {statusCode, error, message, details}.')
      .setVersion(serverVersion)
      .addServer(config.publicUrl)
      .build(),
  );
  SwaggerModule.setup(`${API_PREFIX}/docs`, app, document, { jsonDocumentUrl: `${API_PREFIX}/docs-json` });
  return app;
}
